// The local certificate authority of `npm start -- --https` (scripts/lib/tls.mjs, plain JavaScript: it
// runs before the TypeScript tools), typed for the tests.
export interface Pem {
  certPem: string
  keyPem: string
}
interface LocalTls {
  createCertificateAuthority(name?: string): Pem
  issueServerCertificate(ca: Pem, hosts: string[]): Pem
  ensureLocalCertificates(dir: string, hosts: string[]): { caFile: string; caKeyFile: string; certFile: string; keyFile: string; createdCa: boolean; issued: boolean }
}
// @ts-expect-error plain JavaScript module of the start-up scripts, without type declarations
export const localTls = (await import('../../scripts/lib/tls.mjs')) as LocalTls
