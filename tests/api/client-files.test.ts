// A light client (issue 13, item 6): answers compressed (brotli or gzip, as the browser asks; the
// client's scripts and styles from copies compressed at build time), the
// built client's hashed files cached for a year as immutable, the app's page checked on every load
// (no-cache), and PDFs left as they are. Raw HTTP over a real socket, so the bytes on the wire are
// read as they were sent, before any client library decodes them.
import { spawnSync } from 'node:child_process'
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs'
import http from 'node:http'
import type { AddressInfo } from 'node:net'
import os from 'node:os'
import path from 'node:path'
import { brotliDecompressSync, gunzipSync } from 'node:zlib'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { BinSchema } from '@kitwright/shared/bins'
import { createApp } from '../../server/src/app'
import { seedDemo } from '../../server/src/seeds/demo'
import request from 'supertest'
import { SESSION_COOKIE } from '../../server/src/lib/auth'
import { buildApp } from '../support/app'
import { insertUser, TEST_PASSWORD } from '../support/factories'
import { createTestDb, type TestDb } from '../support/test-db'

const root = path.resolve(import.meta.dirname, '../..')
let t: TestDb
let dist: string
let app: ReturnType<typeof createApp>['app']
let server: http.Server
let base: string

beforeAll(async () => {
  t = await createTestDb()
  const built = buildApp(t)
  await seedDemo(t.db) // the shop's settings, which its labels print
  dist = mkdtempSync(path.join(os.tmpdir(), 'kitwright-client-files-'))
  const build = spawnSync(path.join(root, 'node_modules/.bin/vite'), ['build', '--outDir', dist, '--emptyOutDir', '--logLevel', 'warn'], { cwd: path.join(root, 'client'), encoding: 'utf8' })
  if (build.status !== 0) throw new Error(`client build failed:\n${build.stdout}${build.stderr}`)
  app = createApp({ ...built.deps, clientDist: dist }).app
  server = app.listen(0, '127.0.0.1')
  await new Promise((resolve) => server.once('listening', resolve))
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`
})
afterAll(async () => {
  await new Promise((resolve) => server?.close(resolve))
  await t.drop()
  if (dist) rmSync(dist, { recursive: true, force: true })
})

type Raw = { status: number; headers: http.IncomingHttpHeaders; body: Buffer }
/** One GET with exactly these headers; the body as it came over the socket. */
function rawGet(pathname: string, headers: Record<string, string> = {}): Promise<Raw> {
  return new Promise((resolve, reject) => {
    http
      .get(`${base}${pathname}`, { headers }, (res) => {
        const chunks: Buffer[] = []
        res.on('data', (c: Buffer) => chunks.push(c))
        res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(chunks) }))
        res.on('error', reject)
      })
      .on('error', reject)
  })
}

function decoded(res: Raw): Buffer {
  const encoding = res.headers['content-encoding']
  if (encoding === 'br') return brotliDecompressSync(res.body)
  if (encoding === 'gzip') return gunzipSync(res.body)
  return res.body
}

/** The entry script the app's page loads, and every script of the build. */
function builtScripts() {
  const html = readFileSync(path.join(dist, 'index.html'), 'utf8')
  const entry = /<script type="module"[^>]*src="(\/assets\/[^"]+\.js)"/.exec(html)?.[1]
  if (!entry) throw new Error(`no entry script in the built index.html:\n${html}`)
  const all = readdirSync(path.join(dist, 'assets')).filter((f) => f.endsWith('.js'))
  return { entry, all }
}

describe('the built client', () => {
  it('sends each script brotli- or gzip-compressed as asked (the copies written at build time), byte for byte the built file, cached for a year as immutable', async () => {
    const { entry, all } = builtScripts()
    expect(all.length).toBeGreaterThan(5)
    // The entry and the largest script of the build.
    const largest = all.map((f) => ({ f, size: readFileSync(path.join(dist, 'assets', f)).length })).sort((a, b) => b.size - a.size)[0]!
    for (const file of [entry, `/assets/${largest.f}`]) {
      const original = readFileSync(path.join(dist, file))
      for (const [accept, expected] of [
        ['gzip, deflate, br, zstd', 'br'], // what Chromium sends
        ['gzip, deflate', 'gzip'],
        ['br', 'br'],
      ] as const) {
        const res = await rawGet(file, { 'accept-encoding': accept })
        expect(res.status).toBe(200)
        expect(res.headers['content-encoding'], `${file} for "${accept}"`).toBe(expected)
        expect(res.headers['content-type']).toMatch(/javascript/)
        expect(res.headers['cache-control']).toBe('public, max-age=31536000, immutable')
        expect(res.headers.vary).toMatch(/accept-encoding/i)
        expect(res.body.length).toBeLessThan(original.length / 2)
        expect(decoded(res).equals(original)).toBe(true)
        // The copy compressed once at build time (brotli at quality 11), not one made per request.
        expect(res.body.equals(readFileSync(path.join(dist, `${file}.${expected === 'br' ? 'br' : 'gz'}`)))).toBe(true)
      }
      // A client that asks for no encoding gets the file as built.
      const plain = await rawGet(file)
      expect(plain.headers['content-encoding']).toBeUndefined()
      expect(plain.body.equals(original)).toBe(true)
    }
  })

  it('compresses the styles too, and answers a file missing from this build with 404, not the app page', async () => {
    const css = readdirSync(path.join(dist, 'assets')).find((f) => f.endsWith('.css'))!
    const res = await rawGet(`/assets/${css}`, { 'accept-encoding': 'gzip' })
    expect(res.headers['content-encoding']).toBe('gzip')
    expect(res.headers['cache-control']).toBe('public, max-age=31536000, immutable')
    const missing = await rawGet('/assets/index-00000000.js', { 'accept-encoding': 'gzip' })
    expect(missing.status).toBe(404)
    expect(missing.headers['content-type']).toMatch(/^application\/json/)
    expect(missing.headers['cache-control'] ?? '').not.toMatch(/immutable/)
  })

  it('has the browser check the app page on every load (no-cache), at / , at a client route and as /index.html', async () => {
    const html = readFileSync(path.join(dist, 'index.html'))
    for (const p of ['/', '/orders', '/bench/pack?x=1', '/index.html']) {
      const res = await rawGet(p, { 'accept-encoding': 'gzip, deflate, br' })
      expect(res.status, p).toBe(200)
      expect(res.headers['content-type']).toMatch(/^text\/html/)
      expect(res.headers['cache-control'], p).toBe('no-cache')
      expect(decoded(res).equals(html)).toBe(true)
    }
  })
})

describe('the API', () => {
  it('compresses a JSON answer and leaves a PDF as it is', async () => {
    const planner = await insertUser(t.db, { role: 'planner' })
    const signIn = await request(app).post('/api/auth/sign-in').send({ email: planner.email, password: TEST_PASSWORD })
    const cookie = (signIn.headers['set-cookie'] as unknown as string[]).find((c) => c.startsWith(SESSION_COOKIE))!.split(';')[0]!
    expect((await request(app).post('/api/bins').set('Cookie', cookie).send({ count: 40 })).status).toBe(201)
    const list = await rawGet('/api/bins', { cookie, 'accept-encoding': 'gzip, deflate, br' })
    expect(list.status).toBe(200)
    expect(list.headers['content-encoding']).toBe('br')
    expect(list.headers['content-type']).toMatch(/^application\/json/)
    const bins = BinSchema.array().parse(JSON.parse(decoded(list).toString('utf8')))
    expect(bins.length).toBeGreaterThanOrEqual(40)
    expect(list.body.length).toBeLessThan(decoded(list).length / 2)

    // A PDF is compressed inside already; left alone it keeps its length for the browser's viewer.
    const pdf = await rawGet('/api/bins/labels.pdf?size=letter', { cookie, 'accept-encoding': 'gzip, deflate, br' })
    expect(pdf.status, decoded(pdf).toString('utf8').slice(0, 300)).toBe(200)
    expect(pdf.headers['content-type']).toBe('application/pdf')
    expect(pdf.headers['content-encoding']).toBeUndefined()
    expect(Number(pdf.headers['content-length'])).toBe(pdf.body.length)
    expect(pdf.body.subarray(0, 5).toString('latin1')).toBe('%PDF-')
  })
})
