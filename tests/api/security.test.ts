// Security headers and secrets (issue 10, item 6): helmet's headers and the content security policy
// on the app page and on API answers, the policy against what the built client really loads, session
// cookies httpOnly + SameSite and Secure in production, the password and PIN rules, and no secret in
// the client bundle or in the repository.
// Sign-in throttling is proved in tests/api/auth.test.ts, "throttling repeated failures".
import { spawnSync } from 'node:child_process'
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import request from 'supertest'
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest'
import { ApiErrorBodySchema } from '@kitwright/shared/errors'
import { createApp } from '../../server/src/app'
import { users } from '../../server/src/db/schema/index'
import { SESSION_COOKIE } from '../../server/src/lib/auth'
import { buildApp, signedInAs, TEST_STORE_SECRET, TEST_TOKENS, testStorageConfig } from '../support/app'
import { insertUser, TEST_PASSWORD } from '../support/factories'
import { createTestDb, type TestDb } from '../support/test-db'

const root = path.resolve(import.meta.dirname, '../..')
let t: TestDb
let built: ReturnType<typeof buildApp>
let dist: string
/** The app as `npm start` serves it: the API with the built client beside it. */
let served: ReturnType<typeof createApp>['app']

beforeAll(async () => {
  t = await createTestDb()
  built = buildApp(t)
  // The client built as a shop runs it (like tests/setup/e2e-global-setup.ts), into a folder of its own.
  dist = mkdtempSync(path.join(os.tmpdir(), 'kitwright-security-dist-'))
  const build = spawnSync(path.join(root, 'node_modules/.bin/vite'), ['build', '--outDir', dist, '--emptyOutDir', '--logLevel', 'warn'], {
    cwd: path.join(root, 'client'),
    encoding: 'utf8',
  })
  if (build.status !== 0) throw new Error(`client build failed:\n${build.stdout}${build.stderr}`)
  served = createApp({ ...built.deps, clientDist: dist }).app
})
afterEach(() => t.truncate())
afterAll(async () => {
  await t.drop()
  if (dist) rmSync(dist, { recursive: true, force: true })
})

function cspOf(res: request.Response): Map<string, string[]> {
  const header = String(res.headers['content-security-policy'] ?? '')
  return new Map(
    header
      .split(';')
      .map((d) => d.trim().split(/\s+/))
      .filter((parts) => parts[0])
      .map(([name, ...values]) => [name!, values]),
  )
}

function bundleFiles(): string[] {
  const out: string[] = []
  const walk = (dir: string) => {
    for (const e of readdirSync(dir, { withFileTypes: true })) {
      const p = path.join(dir, e.name)
      if (e.isDirectory()) walk(p)
      else out.push(p)
    }
  }
  walk(dist)
  return out
}

describe('security headers', () => {
  const storeOrigin = new URL(testStorageConfig().endpoint!).origin

  it('sends the content security policy and helmet headers on the app page, API answers and API errors', async () => {
    const answers = {
      'app page': await request(served).get('/orders'),
      'a bundle file': await request(served).get(`/${path.relative(dist, bundleFiles().find((f) => f.endsWith('.js'))!)}`),
      'API answer': await request(served).get('/api/health'),
      'API error': await request(served).get('/api/no-such-route'),
    }
    expect(answers['app page'].status).toBe(200)
    expect(answers['app page'].text).toContain('<div id="root">')
    expect(answers['a bundle file'].status).toBe(200)
    expect(answers['API answer'].status).toBe(200)
    expect(answers['API error'].status).toBe(404)
    for (const [what, res] of Object.entries(answers)) {
      const csp = cspOf(res)
      // The whole policy, directive by directive: the app's own origin, and the photo store only
      // where photos are uploaded (connect) and shown (img). No CDN, no eval, no data: or blob: URLs.
      expect(Object.fromEntries(csp), what).toEqual({
        'default-src': ["'self'"],
        'base-uri': ["'self'"],
        'font-src': ["'self'"],
        'form-action': ["'self'"],
        'frame-ancestors': ["'self'"],
        'img-src': ["'self'", storeOrigin],
        'object-src': ["'none'"],
        'script-src': ["'self'"],
        'script-src-attr': ["'none'"],
        // sonner (the toasts) injects its stylesheet as a <style> element at run time.
        'style-src': ["'self'", "'unsafe-inline'"],
        'connect-src': ["'self'", storeOrigin],
        // No upgrade-insecure-requests and no HSTS over plain HTTP (supertest here); over HTTPS and
        // behind a trusted proxy: tests/api/served-headers.test.ts.
      })
      expect(res.headers['x-content-type-options'], what).toBe('nosniff')
      expect(res.headers['x-frame-options'], what).toBe('SAMEORIGIN')
      expect(res.headers['strict-transport-security'], what).toBeUndefined()
      expect(res.headers['referrer-policy'], what).toBe('no-referrer')
      expect(res.headers['cross-origin-opener-policy'], what).toBeUndefined() // sent over HTTPS only
      expect(res.headers['origin-agent-cluster'], what).toBeUndefined() // likewise
      expect(res.headers['cross-origin-resource-policy'], what).toBe('same-origin')
      expect(res.headers['x-powered-by'], what).toBeUndefined()
    }
  })

  it('builds a client that loads nothing the policy refuses: no inline script, no outside script, style or font', () => {
    const html = readFileSync(path.join(dist, 'index.html'), 'utf8')
    // script-src 'self': every script has a same-origin src and no inline body; no inline handlers.
    const scripts = [...html.matchAll(/<script\b([^>]*)>([\s\S]*?)<\/script>/g)]
    expect(scripts.length).toBeGreaterThan(0)
    for (const [, attrs, body] of scripts) {
      // The built scripts, and the service worker's registration (vite-plugin-pwa, client/vite.config.ts).
      expect(attrs).toMatch(/\ssrc="\/(assets\/[^"]+|registerSW)\.js"/)
      expect(body!.trim()).toBe('')
    }
    expect(html).not.toMatch(/\son[a-z]+=/i)
    // Links and CSS url()s stay on the app's own origin (fonts are bundled, not fetched from a CDN).
    // (The app's icons and its manifest sit at the top of the build, on the same origin.)
    for (const [, href] of html.matchAll(/<link\b[^>]*\bhref="([^"]+)"/g)) expect(href).toMatch(/^\/(assets\/|icon[\w.-]*\.(svg|png)$|manifest\.webmanifest$)/)
    const css = bundleFiles().filter((f) => f.endsWith('.css'))
    expect(css.length).toBeGreaterThan(0)
    const urls = css.flatMap((f) => [...readFileSync(f, 'utf8').matchAll(/url\(\s*["']?([^"')]+)/g)].map((m) => m[1]!))
    expect(urls.length).toBeGreaterThan(0)
    for (const u of urls) expect(u, 'a CSS url() outside the app (font-src/img-src allow only the app and the photo store)').toMatch(/^\/assets\//)
  })
})

describe('session cookies', () => {
  function sessionCookie(res: request.Response): string {
    const raw = (res.headers['set-cookie'] as unknown as string[] | undefined) ?? []
    const cookie = raw.find((c) => c.startsWith(`${SESSION_COOKIE}=`))
    if (!cookie) throw new Error(`no ${SESSION_COOKIE} cookie in ${JSON.stringify(raw)}`)
    return cookie
  }

  it('are httpOnly, SameSite=Lax, on the whole app, and Secure when built for production and served over HTTPS', async () => {
    // server/src/index.ts sets secureCookies when NODE_ENV=production; HTTPS here is a TLS-terminating
    // proxy on loopback (trusted by default) saying so.
    const production = createApp({ ...built.deps, tokens: { ...TEST_TOKENS, secureCookies: true } }).app
    const user = await insertUser(t.db, { role: 'planner' })
    const signIn = await request(production).post('/api/auth/sign-in').set('X-Forwarded-Proto', 'https').send({ email: user.email, password: TEST_PASSWORD })
    expect(signIn.status).toBe(200)
    const cookie = sessionCookie(signIn)
    expect(cookie).toMatch(/;\s*HttpOnly/i)
    expect(cookie).toMatch(/;\s*SameSite=Lax/i)
    expect(cookie).toMatch(/;\s*Secure/i)
    expect(cookie).toMatch(/;\s*Path=\//i)
    // Signing out clears it with the same attributes, so the browser really drops it.
    const signOut = await request(production).post('/api/auth/sign-out').set('X-Forwarded-Proto', 'https').set('Cookie', cookie.split(';')[0]!)
    expect(signOut.status).toBe(204)
    const cleared = sessionCookie(signOut)
    expect(cleared).toMatch(/;\s*HttpOnly/i)
    expect(cleared).toMatch(/;\s*Secure/i)
    expect(cleared).toMatch(/Expires=Thu, 01 Jan 1970/i)
  })

  it('are not Secure in production over plain HTTP on the shop network, where a browser would drop a Secure cookie', async () => {
    const production = createApp({ ...built.deps, tokens: { ...TEST_TOKENS, secureCookies: true } }).app
    const user = await insertUser(t.db, { role: 'planner' })
    const signIn = await request(production).post('/api/auth/sign-in').set('Host', 'shop-pc.test:3000').send({ email: user.email, password: TEST_PASSWORD })
    expect(signIn.status).toBe(200)
    const cookie = sessionCookie(signIn)
    expect(cookie).toMatch(/;\s*HttpOnly/i)
    expect(cookie).not.toMatch(/;\s*Secure/i)
  })

  it('are not Secure outside production (plain http on loopback), still httpOnly and SameSite', async () => {
    const user = await insertUser(t.db, { role: 'planner' })
    const cookie = sessionCookie(await request(built.app).post('/api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD }))
    expect(cookie).toMatch(/;\s*HttpOnly/i)
    expect(cookie).toMatch(/;\s*SameSite=Lax/i)
    expect(cookie).not.toMatch(/;\s*Secure/i)
  })
})

describe('password and PIN rules', () => {
  it('refuses a password under 10 characters and a 3-digit PIN with 400 and what to fix, creating no one', async () => {
    const { agent } = await signedInAs(built.app, t, 'admin')
    const res = await agent.post('/api/users').send({ email: 'new.cutter@shop.example', name: 'New Cutter', role: 'cutter', password: 'nine-char', pin: '123' })
    expect(res.status).toBe(400)
    const body = ApiErrorBodySchema.parse(res.body)
    expect(body.error.code).toBe('invalid')
    expect(body.error.fields).toEqual({ password: 'Use at least 10 characters', pin: 'A PIN is 4 to 6 digits' })
    expect(await t.db.select().from(users)).toHaveLength(1) // the admin only
  })

  it('applies the same rules when an admin resets a password or a PIN', async () => {
    const { agent } = await signedInAs(built.app, t, 'admin')
    const cutter = await insertUser(t.db, { role: 'cutter' })
    for (const [body, field, message] of [
      [{ password: 'short' }, 'password', 'Use at least 10 characters'],
      [{ pin: '123' }, 'pin', 'A PIN is 4 to 6 digits'],
      [{ pin: '12a4' }, 'pin', 'A PIN is 4 to 6 digits'],
    ] as const) {
      const res = await agent.post(`/api/users/${cutter.id}/credentials`).send(body)
      expect(res.status, JSON.stringify(body)).toBe(400)
      expect(ApiErrorBodySchema.parse(res.body).error.fields?.[field]).toBe(message)
    }
    // The old password still signs in: nothing was changed by a refused reset.
    expect((await request(built.app).post('/api/auth/sign-in').send({ email: cutter.email, password: TEST_PASSWORD })).status).toBe(200)
  })
})

describe('secrets', () => {
  /** Every secret value that could leak into the bundle: the checkout's own and the ones tests and stand-ins use. */
  function knownSecrets(): { what: string; value: string }[] {
    const data = path.join(root, '.data')
    const files = existsSync(data) ? readdirSync(data).filter((f) => f.endsWith('.secret') || f === 'pg-password') : []
    return [
      ...files.map((f) => ({ what: `.data/${f}`, value: readFileSync(path.join(data, f), 'utf8').trim() })),
      { what: "the tests' SESSION_SECRET", value: new TextDecoder().decode(TEST_TOKENS.secret) },
      { what: "the tests' STORE_WEBHOOK_SECRET", value: TEST_STORE_SECRET },
      { what: 'the e2e SESSION_SECRET', value: 'kitwright-e2e-secret-0123456789abcdef' },
      { what: 'the two-process SESSION_SECRET', value: 'kitwright-two-process-secret-0123456789abcdef' },
      { what: 'the S3 stand-in keys', value: 'S3RVER' },
      { what: 'a PEM private key', value: 'PRIVATE KEY-----' },
      // Names of server-side settings: the client never needs to know them.
      ...['SESSION_SECRET', 'STORE_WEBHOOK_SECRET', 'S3_SECRET_ACCESS_KEY', 'S3_ACCESS_KEY_ID', 'DATABASE_URL', 'SMTP_URL'].map((name) => ({
        what: `the variable name ${name}`,
        value: name,
      })),
    ].filter((s) => s.value.length >= 6)
  }

  it('leaves every secret out of the built client bundle', () => {
    const secrets = knownSecrets()
    expect(secrets.some((s) => s.what.startsWith('.data/')) || !existsSync(path.join(root, '.data')), 'a checkout that ran npm test has .data/*.secret').toBe(
      true,
    )
    const files = bundleFiles()
    expect(files.filter((f) => f.endsWith('.js')).length).toBeGreaterThan(3)
    const found: string[] = []
    for (const f of files) {
      const text = readFileSync(f).toString('latin1')
      for (const s of secrets) if (text.includes(s.value)) found.push(`${s.what} in ${path.relative(dist, f)}`)
    }
    expect(found).toEqual([])
    // No source maps either: they would ship the client's source.
    expect(files.filter((f) => f.endsWith('.map'))).toEqual([])
  })

  it('keeps .data/, .env files and secret files out of git', () => {
    const ls = spawnSync('git', ['ls-files'], { cwd: root, encoding: 'utf8' })
    expect(ls.status).toBe(0)
    const tracked = ls.stdout.split('\n').filter(Boolean)
    expect(tracked.length).toBeGreaterThan(100)
    const bad = tracked.filter((f) => {
      const name = path.basename(f)
      return (
        f.startsWith('.data/') ||
        (/^\.env(\..+)?$/.test(name) && name !== '.env.example') ||
        /\.(secret|pem|key|p12|pfx)$/.test(name) ||
        name === 'pg-password' ||
        /^id_(rsa|ed25519|ecdsa)$/.test(name)
      )
    })
    expect(bad).toEqual([])
    // The one tracked example holds placeholders, not secrets.
    const example = readFileSync(path.join(root, '.env.example'), 'utf8')
    for (const name of ['SESSION_SECRET', 'STORE_WEBHOOK_SECRET']) expect(example).toMatch(new RegExp(`^${name}=replace-with-`, 'm'))
    expect(example).toMatch(/^S3_SECRET_ACCESS_KEY=$/m)
    // Nothing tracked holds a private key or one of this checkout's own secrets.
    const grep = spawnSync('git', ['grep', '-l', '-I', '-e', 'BEGIN [A-Z ]*PRIVATE KEY', '--', '.', ':!tests/api/security.test.ts'], {
      cwd: root,
      encoding: 'utf8',
    })
    expect(grep.stdout.trim()).toBe('')
    for (const s of knownSecrets().filter((x) => x.what.startsWith('.data/'))) {
      const hit = spawnSync('git', ['grep', '-l', '-F', '-e', s.value], { cwd: root, encoding: 'utf8' })
      expect(hit.stdout.trim(), `${s.what} is in a tracked file`).toBe('')
    }
  })
})
