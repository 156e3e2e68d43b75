// Headers right for where the app is served (issue 13, item 2): over plain HTTP on the shop network no
// HSTS and no upgrade-insecure-requests (a tablet would be sent to an https:// address nothing
// answers); over HTTPS, directly or behind a TLS-terminating proxy that Kitwright trusts, both. The
// content security policy names the photo store's public address and nothing more.
import { X509Certificate } from 'node:crypto'
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs'
import { createServer, type Server } from 'node:https'
import type { AddressInfo } from 'node:net'
import os from 'node:os'
import path from 'node:path'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createApp } from '../../server/src/app'
import { createStorage } from '../../server/src/lib/storage'
import { buildApp, testStorageConfig } from '../support/app'
import { localTls } from '../support/local-tls'
import { createTestDb, type TestDb } from '../support/test-db'

let t: TestDb
let built: ReturnType<typeof buildApp>
/** A stand-in for the built client (its page is all these tests need). */
let clientDist: string
beforeAll(async () => {
  t = await createTestDb()
  built = buildApp(t)
  clientDist = mkdtempSync(path.join(os.tmpdir(), 'kitwright-headers-dist-'))
  writeFileSync(path.join(clientDist, 'index.html'), '<!doctype html><div id="root"></div>')
})
afterAll(async () => {
  await t.drop()
  rmSync(clientDist, { recursive: true, force: true })
})

/** The photo store as tablets reach it; the server itself talks to the run's stand-in on loopback. */
const PUBLIC_STORE = 'http://192.0.2.10:54330'

function directives(res: request.Response): Record<string, string[]> {
  const header = String(res.headers['content-security-policy'] ?? '')
  return Object.fromEntries(
    header
      .split(';')
      .map((d) => d.trim().split(/\s+/))
      .filter((parts) => parts[0])
      .map(([name, ...values]) => [name!, values]),
  )
}

function appWith(overrides: Partial<Parameters<typeof createApp>[0]>) {
  return createApp({ ...built.deps, clientDist, ...overrides }).app
}

describe('over plain HTTP (a tablet on the shop network, or this computer)', () => {
  it('sends neither HSTS nor upgrade-insecure-requests, on the API and everything else', async () => {
    const app = appWith({ storage: createStorage({ ...testStorageConfig(), publicEndpoint: PUBLIC_STORE }) })
    for (const url of ['/api/health', '/api/no-such-route', '/bench/build']) {
      const res = await request(app).get(url).set('Host', 'shop-pc.test:3000')
      expect(res.status, url).toBe(url === '/api/no-such-route' ? 404 : 200)
      expect(res.headers['strict-transport-security'], url).toBeUndefined()
      const csp = directives(res)
      expect(csp['upgrade-insecure-requests'], url).toBeUndefined()
      // The photo store's public address, and no other outside origin.
      expect(csp['connect-src'], url).toEqual(["'self'", PUBLIC_STORE])
      expect(csp['img-src'], url).toEqual(["'self'", PUBLIC_STORE])
      expect(csp['default-src'], url).toEqual(["'self'"])
      expect(res.headers['x-content-type-options'], url).toBe('nosniff')
      // Ignored by browsers on an http:// shop address, where Chromium logs an error (COOP) or a warning
      // (Origin-Agent-Cluster) for them on every page.
      expect(res.headers['cross-origin-opener-policy'], url).toBeUndefined()
      expect(res.headers['origin-agent-cluster'], url).toBeUndefined()
    }
  })

  it('ignores X-Forwarded-Proto from a client it does not trust as a proxy', async () => {
    // A tablet (any address) claiming https gets no HSTS: only a trusted proxy may say so.
    const res = await request(appWith({ trustProxy: false })).get('/api/health').set('X-Forwarded-Proto', 'https')
    expect(res.headers['strict-transport-security']).toBeUndefined()
    expect(directives(res)['upgrade-insecure-requests']).toBeUndefined()
  })
})

describe('over HTTPS, served by Kitwright itself (npm start -- --https)', () => {
  let server: Server
  let ca: string
  beforeAll(async () => {
    const authority = localTls.createCertificateAuthority()
    const cert = localTls.issueServerCertificate(authority, ['localhost', '127.0.0.1'])
    ca = authority.certPem
    server = createServer({ cert: cert.certPem, key: cert.keyPem }, appWith({}))
    await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve))
  })
  afterAll(() => new Promise<void>((resolve) => server.close(() => resolve())))

  it('sends HSTS and upgrade-insecure-requests over a certificate the local authority issued', async () => {
    const { port } = server.address() as AddressInfo
    // Trusting only the local authority: the TLS handshake itself checks the issued certificate.
    const res = await request(`https://127.0.0.1:${port}`).get('/api/health').ca(ca)
    expect(res.status).toBe(200)
    expect(res.headers['strict-transport-security']).toMatch(/^max-age=\d{7,}; includeSubDomains$/)
    expect(directives(res)['upgrade-insecure-requests']).toEqual([])
    expect(res.headers['cross-origin-opener-policy']).toBe('same-origin')
    expect(res.headers['origin-agent-cluster']).toBe('?1')
    expect(directives(res)['connect-src']).toEqual(["'self'", new URL(testStorageConfig().endpoint!).origin])
  })

  it('issues a server certificate that names every host and is signed by the authority, for at most 825 days', () => {
    const authority = localTls.createCertificateAuthority()
    const issued = new X509Certificate(localTls.issueServerCertificate(authority, ['shop-pc.test', '192.0.2.2']).certPem)
    const caCert = new X509Certificate(authority.certPem)
    expect(caCert.ca).toBe(true)
    expect(issued.ca).toBe(false)
    expect(issued.checkIssued(caCert) && issued.verify(caCert.publicKey)).toBe(true)
    expect(issued.subjectAltName).toBe('DNS:shop-pc.test, IP Address:192.0.2.2')
    expect(issued.checkHost('shop-pc.test')).toBe('shop-pc.test')
    expect(issued.checkIP('192.0.2.2')).toBe('192.0.2.2')
    expect(issued.keyUsage).toEqual(['1.3.6.1.5.5.7.3.1']) // extended key usage: serverAuth (RFC 5280, 4.2.1.12)
    // Apple, "Requirements for trusted certificates in iOS 13 and macOS 10.15" (HT210176): at most 825 days.
    const days = (Date.parse(issued.validTo) - Date.parse(issued.validFrom)) / 86_400_000
    expect(days).toBeLessThanOrEqual(825)
  })
})

describe('behind a TLS-terminating proxy (TRUST_PROXY)', () => {
  it('sends HSTS and upgrade-insecure-requests when the trusted proxy says X-Forwarded-Proto: https', async () => {
    // supertest connects from loopback; the proxy is trusted by address, as TRUST_PROXY=127.0.0.1 would.
    const app = appWith({ trustProxy: ['127.0.0.1'] })
    const res = await request(app).get('/api/health').set('X-Forwarded-Proto', 'https').set('X-Forwarded-For', '192.0.2.40')
    expect(res.headers['strict-transport-security']).toMatch(/max-age=\d{7,}/)
    expect(directives(res)['upgrade-insecure-requests']).toEqual([])
  })

  it('sends neither when the same proxy forwards a plain-HTTP request', async () => {
    const app = appWith({ trustProxy: ['127.0.0.1'] })
    const res = await request(app).get('/api/health').set('X-Forwarded-Proto', 'http')
    expect(res.headers['strict-transport-security']).toBeUndefined()
    expect(directives(res)['upgrade-insecure-requests']).toBeUndefined()
  })
})

describe('the photo store public address (S3_PUBLIC_URL)', () => {
  it('signs upload and photo URLs for the address tablets reach, while the server talks to its own endpoint', async () => {
    const config = testStorageConfig()
    const storage = createStorage({ ...config, publicEndpoint: PUBLIC_STORE })
    const put = new URL((await storage.presignPut('units/x/photo.png', { contentType: 'image/png', size: 10 }, 60)).url)
    const get = new URL(await storage.presignGet('units/x/photo.png', 60))
    expect(put.origin).toBe(PUBLIC_STORE)
    expect(get.origin).toBe(PUBLIC_STORE)
    expect(put.pathname).toBe(`/${config.bucket}/units/x/photo.png`)
    expect(put.searchParams.get('X-Amz-SignedHeaders')).toBe('content-length;content-type;host')
    // HEAD goes to the real endpoint (the run's stand-in): a missing object is null, not an error.
    expect(await storage.head('units/x/none.png')).toBeNull()
    expect(storage.origin).toBe(PUBLIC_STORE)
  })
})
