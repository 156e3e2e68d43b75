// "Connect a tablet" (issue 13, items 1 and 4): the owner sees the address tablets open, as text and
// QR code, what stops tablets from reaching the app, and, over HTTPS, the local authority to trust.
import { X509Certificate } from 'node:crypto'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ApiErrorBodySchema } from '@kitwright/shared/errors'
import { ConnectTabletSchema } from '@kitwright/shared/tablets'
import { createApp } from '../../server/src/app'
import { createStorage } from '../../server/src/lib/storage'
import { buildApp, signedInAs, testStorageConfig } from '../support/app'
import { localTls } from '../support/local-tls'
import { createTestDb, type TestDb } from '../support/test-db'

let t: TestDb
let built: ReturnType<typeof buildApp>
beforeAll(async () => {
  t = await createTestDb()
  built = buildApp(t)
})
afterAll(() => t.drop())

/** The app as `npm start -- --lan` serves it: on every address, public address and photo store on the shop network. */
function lanApp(caCertificate: Buffer | null = null) {
  const scheme = caCertificate ? 'https' : 'http'
  return createApp({
    ...built.deps,
    publicUrl: `${scheme}://192.0.2.2:3400`,
    served: { listenHost: '0.0.0.0', https: !!caCertificate, caCertificate },
    storage: createStorage({ ...testStorageConfig(), publicEndpoint: `${scheme}://192.0.2.2:54340` }),
  }).app
}

describe('GET /api/tablets/connect', () => {
  it('gives the owner the bench sign-in at the public address, with nothing in the way in LAN mode', async () => {
    const { agent } = await signedInAs(lanApp(), t, 'admin')
    const res = await agent.get('/api/tablets/connect')
    expect(res.status).toBe(200)
    expect(ConnectTabletSchema.parse(res.body)).toEqual({
      publicUrl: 'http://192.0.2.2:3400',
      signInUrl: 'http://192.0.2.2:3400/sign-in?with=pin',
      https: false,
      problems: [],
      caCertificateUrl: null,
    })
  })

  it('says what to change when the app, its public address and the photo store are on this computer only', async () => {
    // buildApp: http://localhost:3000, the stand-in on 127.0.0.1, no `served` (loopback, as by default).
    const { agent } = await signedInAs(built.app, t, 'admin')
    const body = ConnectTabletSchema.parse((await agent.get('/api/tablets/connect')).body)
    expect(body.signInUrl).toBe('http://localhost:3000/sign-in?with=pin')
    expect(body.problems).toHaveLength(3)
    expect(body.problems[0]).toContain('Kitwright listens on this computer only (HOST=127.0.0.1). Restart it with `npm start -- --lan`')
    expect(body.problems[1]).toContain('The public address http://localhost:3000 names this computer to itself')
    expect(body.problems[2]).toContain("The photo store's address http://127.0.0.1:")
    expect(body.problems[2]).toContain('S3_PUBLIC_URL')
  })

  it('is for the owner only: 403 for a planner and a bench role, 401 signed out', async () => {
    const app = lanApp()
    for (const role of ['planner', 'assembler'] as const) {
      const { agent } = await signedInAs(app, t, role)
      for (const url of ['/api/tablets/connect', '/api/tablets/sign-in-qr.svg', '/api/tablets/ca-certificate-qr.svg']) {
        const res = await agent.get(url)
        expect(res.status, `${role} ${url}`).toBe(403)
        expect(ApiErrorBodySchema.parse(res.body).error.code).toBe('forbidden')
      }
    }
    expect((await request(app).get('/api/tablets/connect')).status).toBe(401)
    expect((await request(app).get('/api/tablets/sign-in-qr.svg')).status).toBe(401)
  })

  it('draws the QR code as an SVG image', async () => {
    const { agent } = await signedInAs(lanApp(), t, 'admin')
    const res = await agent.get('/api/tablets/sign-in-qr.svg').buffer(true)
    expect(res.status).toBe(200)
    expect(res.headers['content-type']).toMatch(/^image\/svg\+xml/)
    const svg = res.body instanceof Buffer ? res.body.toString() : String(res.text)
    expect(svg).toMatch(/^<svg xmlns="http:\/\/www\.w3\.org\/2000\/svg"[^>]*viewBox="0 0 (\d+) \1"/)
    // What the code holds is read back by a decoder in tests/e2e/shop-network.test.ts.
  })
})

describe('over HTTPS with the local certificate authority', () => {
  it('offers its certificate to anyone (a tablet before sign-in) as DER, and its QR code to the owner', async () => {
    const ca = localTls.createCertificateAuthority()
    const der = new X509Certificate(ca.certPem).raw
    const app = lanApp(der)
    const { agent } = await signedInAs(app, t, 'admin')
    const body = ConnectTabletSchema.parse((await agent.get('/api/tablets/connect')).body)
    expect(body).toMatchObject({ https: true, signInUrl: 'https://192.0.2.2:3400/sign-in?with=pin', caCertificateUrl: 'https://192.0.2.2:3400/api/tablets/ca-certificate.crt', problems: [] })

    const download = await request(app).get('/api/tablets/ca-certificate.crt').buffer(true).parse((res, done) => {
      const chunks: Buffer[] = []
      res.on('data', (c: Buffer) => chunks.push(c))
      res.on('end', () => done(null, Buffer.concat(chunks)))
    })
    expect(download.status).toBe(200)
    expect(download.headers['content-type']).toBe('application/x-x509-ca-cert')
    expect(download.headers['content-disposition']).toBe('attachment; filename=kitwright-local-ca.crt')
    expect(Buffer.compare(download.body as Buffer, der)).toBe(0)
    // It is a certificate authority, and the file holds no private key.
    expect(new X509Certificate(download.body as Buffer).ca).toBe(true)
    expect((download.body as Buffer).toString('latin1')).not.toContain('PRIVATE KEY')
    expect((await agent.get('/api/tablets/ca-certificate-qr.svg')).status).toBe(200)
  })

  it('answers 404 with what to do when the app serves no local authority', async () => {
    const res = await request(lanApp()).get('/api/tablets/ca-certificate.crt')
    expect(res.status).toBe(404)
    expect(ApiErrorBodySchema.parse(res.body).error.message).toContain('npm start -- --https')
  })
})
