// A local certificate authority and a server certificate for HTTPS on the shop network
// (`npm start -- --https`). Tablets trust the authority once ("Connect a tablet" offers it); the server
// certificate is reissued by it whenever the host names or addresses change or it nears its end.
import { generateKeyPairSync, randomBytes, X509Certificate } from 'node:crypto'
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import { isIP } from 'node:net'
import path from 'node:path'
import forge from 'node-forge'

const DAY = 24 * 60 * 60 * 1000
// Apple accepts at most 825 days for a server certificate from an authority a person installed
// (Apple support article HT210176, "Requirements for trusted certificates in iOS 13 and macOS 10.15").
const SERVER_DAYS = 825
const CA_YEARS = 10
const RENEW_BEFORE_DAYS = 30

function rsaKeyPair() {
  // node:crypto makes the key (fast, native); forge only builds and signs the certificates.
  const { privateKey, publicKey } = generateKeyPairSync('rsa', { modulusLength: 2048, privateKeyEncoding: { type: 'pkcs1', format: 'pem' }, publicKeyEncoding: { type: 'spki', format: 'pem' } })
  return { keyPem: privateKey, privateKey: forge.pki.privateKeyFromPem(privateKey), publicKey: forge.pki.publicKeyFromPem(publicKey) }
}

function serialNumber() {
  // Positive (leading 01) and random, as RFC 5280 4.1.2.2 asks of a serial.
  return `01${randomBytes(15).toString('hex')}`
}

/** A new certificate authority: `{ certPem, keyPem }`, valid ten years, allowed only to sign certificates. */
export function createCertificateAuthority(name = 'Kitwright local certificate authority') {
  const keys = rsaKeyPair()
  const cert = forge.pki.createCertificate()
  cert.publicKey = keys.publicKey
  cert.serialNumber = serialNumber()
  cert.validity.notBefore = new Date(Date.now() - DAY)
  cert.validity.notAfter = new Date(Date.now() + CA_YEARS * 365 * DAY)
  const subject = [{ name: 'commonName', value: name }, { name: 'organizationName', value: 'Kitwright' }]
  cert.setSubject(subject)
  cert.setIssuer(subject)
  cert.setExtensions([
    { name: 'basicConstraints', cA: true, pathLenConstraint: 0, critical: true },
    { name: 'keyUsage', keyCertSign: true, cRLSign: true, critical: true },
    { name: 'subjectKeyIdentifier' },
  ])
  cert.sign(keys.privateKey, forge.md.sha256.create())
  return { certPem: forge.pki.certificateToPem(cert), keyPem: keys.keyPem }
}

/**
 * A server certificate for `hosts` (names and IP addresses, all in subjectAltName), signed by `ca`.
 * `{ certPem, keyPem }`.
 */
export function issueServerCertificate(ca, hosts) {
  if (hosts.length === 0) throw new Error('a server certificate needs at least one host name or address')
  const caCert = forge.pki.certificateFromPem(ca.certPem)
  const caKey = forge.pki.privateKeyFromPem(ca.keyPem)
  const keys = rsaKeyPair()
  const cert = forge.pki.createCertificate()
  cert.publicKey = keys.publicKey
  cert.serialNumber = serialNumber()
  // A day back for clocks that run behind; the whole span stays within the limit.
  cert.validity.notBefore = new Date(Date.now() - DAY)
  cert.validity.notAfter = new Date(Date.now() + (SERVER_DAYS - 1) * DAY)
  cert.setSubject([{ name: 'commonName', value: hosts[0] }, { name: 'organizationName', value: 'Kitwright' }])
  cert.setIssuer(caCert.subject.attributes)
  cert.setExtensions([
    { name: 'basicConstraints', cA: false, critical: true },
    { name: 'keyUsage', digitalSignature: true, keyEncipherment: true, critical: true },
    { name: 'extKeyUsage', serverAuth: true },
    { name: 'subjectAltName', altNames: hosts.map((h) => (isIP(h) ? { type: 7, ip: h } : { type: 2, value: h })) },
    { name: 'subjectKeyIdentifier' },
    { name: 'authorityKeyIdentifier', keyIdentifier: caCert.generateSubjectKeyIdentifier().getBytes() },
  ])
  cert.sign(caKey, forge.md.sha256.create())
  return { certPem: forge.pki.certificateToPem(cert), keyPem: keys.keyPem }
}

/** Whether the certificate in `certPem` was issued by `caPem`, covers every host, and lasts a while yet. */
function stillGood(certPem, caPem, hosts) {
  const cert = new X509Certificate(certPem)
  if (!cert.checkIssued(new X509Certificate(caPem))) return false
  if (new Date(cert.validTo).getTime() - Date.now() < RENEW_BEFORE_DAYS * DAY) return false
  return hosts.every((h) => (isIP(h) ? cert.checkIP(h) : cert.checkHost(h, { subject: 'never' })))
}

/**
 * Makes (once) the authority in `dir` and (when needed) the server certificate for `hosts`.
 * Returns the file paths and what was done, for the start script to say.
 */
export function ensureLocalCertificates(dir, hosts) {
  mkdirSync(dir, { recursive: true, mode: 0o700 })
  const files = { caFile: path.join(dir, 'ca.crt'), caKeyFile: path.join(dir, 'ca.key'), certFile: path.join(dir, 'server.crt'), keyFile: path.join(dir, 'server.key') }
  let createdCa = false
  if (!existsSync(files.caFile) || !existsSync(files.caKeyFile)) {
    const ca = createCertificateAuthority()
    writeFileSync(files.caKeyFile, ca.keyPem, { mode: 0o600 })
    writeFileSync(files.caFile, ca.certPem)
    createdCa = true
  }
  const ca = { certPem: readFileSync(files.caFile, 'utf8'), keyPem: readFileSync(files.caKeyFile, 'utf8') }
  let issued = false
  if (createdCa || !existsSync(files.certFile) || !existsSync(files.keyFile) || !stillGood(readFileSync(files.certFile, 'utf8'), ca.certPem, hosts)) {
    const server = issueServerCertificate(ca, hosts)
    writeFileSync(files.keyFile, server.keyPem, { mode: 0o600 })
    writeFileSync(files.certFile, server.certPem)
    issued = true
  }
  return { ...files, createdCa, issued }
}
