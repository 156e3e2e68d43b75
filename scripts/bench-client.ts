// First-load benchmark of the built client (npm run bench:client).
// Builds the client into a folder of its own, starts the app as a shop runs it (`tsx
// server/src/index.ts`, production settings, the built client served by the API) on a free loopback
// port over a fresh database with the demo shop, and opens each page cold in Debian's Chromium: a new
// browser context every time (empty cache, no cookies), signed in through the API as the role that
// works on that page. For each page it prints the JavaScript as transferred (compressed bytes on the
// wire, from the network's response body sizes, with the encodings seen), the number of script files,
// and the time to usable: from the start of the navigation until the page's own heading or scan
// field is in the page and visible (timed inside the page, so the driver's round trips do not count).
// Each page is loaded `--runs` times (default 3): the bytes of the first load and the median time are
// printed, each against its target: sign-in ≤ 150 kB of JS and usable under 1 s, each bench page ≤
// 250 kB, the home page with its charts ≤ 350 kB (1 kB = 1000 bytes). Figures only; the exit code
// says whether every page opened as its role with no console error, not whether a target was met.
//
// Where: the local PostgreSQL cluster of `npm start` (started here if it is not running, stopped
// again afterwards), in a database of its own, `kitwright_bench_client`, recreated on every run and
// dropped at the end; the build goes to `.data/bench-client/dist`. Loopback only. Options: `--runs 3`
// cold loads per page; `--files` lists every script of each page with its bytes.
import { spawn, spawnSync, type ChildProcess } from 'node:child_process'
import { randomBytes } from 'node:crypto'
import { statSync } from 'node:fs'
import path from 'node:path'
import { fileURLToPath } from 'node:url'
import { chromium, type Browser, type Request } from 'playwright-core'
import type { Role } from '@kitwright/shared/roles'
import { createDb } from '../server/src/db/client'
import { ensureDatabase } from '../server/src/db/ensure-database'
import { migrateDb } from '../server/src/db/migrate'
import { DEMO_USERS, seedDemo } from '../server/src/seeds/demo'

const DB_NAME = 'kitwright_bench_client'
const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..')
const dist = path.join(root, '.data/bench-client/dist')
const KB = 1000

const args = process.argv.slice(2)
function numberArg(name: string, fallback: number): number {
  const i = args.indexOf(name)
  if (i < 0) return fallback
  const value = Number(args[i + 1])
  if (!Number.isInteger(value) || value < 1) throw new Error(`Give ${name} a whole number of at least 1, e.g. ${name} ${fallback}`)
  return value
}
const runs = numberArg('--runs', 3)
/** `--files`: also list every script of each page's first load with its bytes on the wire. */
const listFiles = args.includes('--files')

type Cluster = { url: (db: string) => string; startedHere: boolean; stop: () => void }
// @ts-expect-error plain JavaScript module of the start-up scripts, without type declarations
const { startPostgres } = (await import('./lib/postgres.mjs')) as { startPostgres: (port: number) => Cluster }
// @ts-expect-error plain JavaScript module of the start-up scripts, without type declarations
const { localPorts } = (await import('./lib/config.mjs')) as { localPorts: { postgres: number } }
// @ts-expect-error plain JavaScript module of the start-up scripts, without type declarations
const { freePort } = (await import('./lib/ports.mjs')) as { freePort: () => Promise<number> }

/** What makes a page usable: an element matching `css`, visible, whose text contains `text`. */
type Usable = { css: string; text: string }
type PageCase = {
  label: string
  path: string
  /** Signed in as this role first; anonymous when absent. */
  role?: Role
  /** Where the browser must end up (a redirect may take it there). */
  endsAt: string
  usable: Usable
  /** What must also be drawn before the bytes are counted (the home page's charts come after it is usable). */
  complete?: { css: string; count: number }
  /** Target for the JS transferred, in bytes. */
  maxJs?: number
  /** Target for the time to usable, in ms. */
  maxMs?: number
}

const scanField: Usable = { css: 'input[placeholder^="Scan or type"]', text: '' }
const PAGES: PageCase[] = [
  {
    label: 'sign-in (opened at /)',
    path: '/',
    endsAt: '/sign-in',
    usable: { css: 'form button[type="submit"]', text: 'Sign in' },
    maxJs: 150 * KB,
    maxMs: 1000,
  },
  {
    label: 'sign-in (/sign-in)',
    path: '/sign-in',
    endsAt: '/sign-in',
    usable: { css: 'form button[type="submit"]', text: 'Sign in' },
    maxJs: 150 * KB,
    maxMs: 1000,
  },
  {
    label: 'home with charts (planner)',
    path: '/',
    role: 'planner',
    endsAt: '/',
    usable: { css: 'h1', text: 'Good day' },
    complete: { css: '.recharts-surface', count: 3 },
    maxJs: 350 * KB,
  },
  { label: 'orders (planner)', path: '/orders', role: 'planner', endsAt: '/orders', usable: { css: 'h1', text: 'Orders' } },
  { label: 'cut bench (cutter)', path: '/bench/cut', role: 'cutter', endsAt: '/bench/cut', usable: { css: 'h1', text: 'Cut bench' }, maxJs: 250 * KB },
  { label: 'build bench (assembler)', path: '/bench/build', role: 'assembler', endsAt: '/bench/build', usable: scanField, maxJs: 250 * KB },
  { label: 'pack bench (packer)', path: '/bench/pack', role: 'packer', endsAt: '/bench/pack', usable: scanField, maxJs: 250 * KB },
  { label: 'scan (cutter)', path: '/scan', role: 'cutter', endsAt: '/scan', usable: scanField, maxJs: 250 * KB },
]

type Load = {
  jsBytes: number
  jsRawBytes: number
  jsFiles: number
  files: { name: string; bytes: number; raw: number }[]
  encodings: Set<string>
  usableMs: number
  title: string
  consoleProblems: string[]
}

function launchChromium(): Promise<Browser> {
  return chromium.launch({
    executablePath: '/usr/bin/chromium',
    headless: true,
    args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run'],
  })
}

/** One cold load of one page in a fresh context: bytes of every script response, time to usable. */
async function loadCold(browser: Browser, base: string, c: PageCase): Promise<Load> {
  const context = await browser.newContext({ viewport: c.role && c.role !== 'planner' ? { width: 1024, height: 768 } : { width: 1366, height: 900 } })
  try {
    if (c.role) {
      const user = DEMO_USERS.find((u) => u.role === c.role)!
      const res = await context.request.post(`${base}/api/auth/sign-in`, { data: { email: user.email, password: user.password } })
      if (res.status() !== 200) throw new Error(`signing in as ${user.email} answered ${res.status()}: ${await res.text()}`)
    }
    const page = await context.newPage()
    const consoleProblems: string[] = []
    page.on('console', (m) => {
      if (m.type() === 'error' || m.type() === 'warning') consoleProblems.push(`${m.type()}: ${m.text()}`)
    })
    page.on('pageerror', (e) => consoleProblems.push(`page error: ${e.message}`))
    const pending: Promise<void>[] = []
    const load: Load = { jsBytes: 0, jsRawBytes: 0, jsFiles: 0, files: [], encodings: new Set(), usableMs: Number.NaN, title: '', consoleProblems }
    page.on('requestfinished', (req: Request) => {
      if (req.resourceType() !== 'script') return
      pending.push(
        (async () => {
          const [sizes, response] = await Promise.all([req.sizes(), req.response()])
          load.jsFiles++
          load.jsBytes += sizes.responseBodySize
          // The uncompressed size is the built file's own.
          const { pathname } = new URL(req.url())
          const raw = statSync(path.join(dist, pathname)).size
          load.jsRawBytes += raw
          load.files.push({ name: pathname, bytes: sizes.responseBodySize, raw })
          load.encodings.add((await response?.headerValue('content-encoding')) ?? 'none')
        })(),
      )
    })
    // Watches the page from its first byte and notes when the usable element shows (performance.now()
    // counts from the start of the navigation).
    // A script string, not a function: the TypeScript runner's helpers do not exist in the page.
    await page.addInitScript(`(() => {
      const u = ${JSON.stringify(c.usable)}
      const check = () => {
        for (const el of document.querySelectorAll(u.css)) {
          if ((el.textContent || '').includes(u.text) && el.getClientRects().length > 0) {
            window.__usableAt = performance.now()
            return true
          }
        }
        return false
      }
      const observer = new MutationObserver(() => { if (check()) observer.disconnect() })
      observer.observe(document, { childList: true, subtree: true, characterData: true })
    })()`)
    await page.goto(`${base}${c.path}`)
    await page.locator(c.usable.css).filter({ hasText: c.usable.text }).first().waitFor({ state: 'visible', timeout: 30_000 })
    if (c.complete)
      await page
        .locator(c.complete.css)
        .nth(c.complete.count - 1)
        .waitFor({ state: 'visible', timeout: 30_000 })
    // Everything else the page fetches of itself.
    await page.waitForLoadState('networkidle')
    await Promise.all(pending)
    const pathname = new URL(page.url()).pathname
    if (pathname !== c.endsAt) throw new Error(`${c.label}: ended at ${pathname}, expected ${c.endsAt}`)
    load.usableMs = Number(await page.evaluate('window.__usableAt ?? NaN'))
    load.title = await page.title()
    return load
  } finally {
    await context.close()
  }
}

function startApi(env: Record<string, string>): Promise<ChildProcess> {
  const child = spawn(path.join(root, 'node_modules/.bin/tsx'), ['server/src/index.ts'], {
    cwd: root,
    env: { ...process.env, ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  })
  return new Promise((resolve, reject) => {
    let out = ''
    child.stdout!.on('data', (d: Buffer) => {
      out += d.toString()
      if (out.includes('listening on')) resolve(child)
    })
    child.stderr!.on('data', (d: Buffer) => process.stderr.write(`[api] ${d.toString()}`))
    child.once('exit', (code) => reject(new Error(`the API exited before it listened (${code}):\n${out}`)))
  })
}

function stopApi(child: ChildProcess): Promise<void> {
  if (child.exitCode !== null) return Promise.resolve()
  return new Promise((resolve) => {
    const t = setTimeout(() => child.kill('SIGKILL'), 10_000)
    child.once('exit', () => {
      clearTimeout(t)
      resolve()
    })
    child.kill('SIGTERM')
  })
}

async function dropDatabase(target: string) {
  const admin = new URL(target)
  admin.pathname = '/postgres'
  const { default: pg } = await import('pg')
  const client = new pg.Client({ connectionString: admin.toString() })
  await client.connect()
  await client.query(`drop database if exists ${DB_NAME} with (force)`)
  await client.end()
}

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b)
  const mid = Math.floor(s.length / 2)
  return s.length % 2 ? s[mid]! : (s[mid - 1]! + s[mid]!) / 2
}
const kB = (bytes: number) => (bytes / KB).toFixed(1)
const verdict = (ok: boolean) => (ok ? 'met' : 'NOT met')

const cluster = startPostgres(localPorts.postgres)
const url = cluster.url(DB_NAME)
let api: ChildProcess | undefined
let browser: Browser | undefined
let failed = false
const stopEverything = async () => {
  await browser?.close().catch((err: Error) => console.error(`could not close Chromium: ${err.message}`))
  if (api) await stopApi(api)
  await dropDatabase(url).catch((err: Error) => console.error(`could not drop ${DB_NAME}: ${err.message}`))
  if (cluster.startedHere) cluster.stop()
}
for (const sig of ['SIGINT', 'SIGTERM'] as const) process.once(sig, () => void stopEverything().finally(() => process.exit(130)))

try {
  console.log(`Building the client into ${path.relative(root, dist)}`)
  const build = spawnSync(path.join(root, 'node_modules/.bin/vite'), ['build', '--outDir', dist, '--emptyOutDir', '--logLevel', 'warn'], {
    cwd: path.join(root, 'client'),
    encoding: 'utf8',
  })
  if (build.status !== 0) throw new Error(`the client build failed:\n${build.stdout}${build.stderr}`)

  console.log(`Database ${DB_NAME} (recreated), demo shop seeded`)
  await ensureDatabase(url, { recreate: true })
  const { db, pool } = createDb(url)
  try {
    await migrateDb(db)
    await seedDemo(db)
  } finally {
    await pool.end()
  }

  const port = await freePort()
  // Production settings, as a shop runs it; job workers off so the process only answers HTTP; the
  // relay is never reached with workers off, but production requires one.
  api = await startApi({
    NODE_ENV: 'production',
    HOST: '127.0.0.1',
    PORT: String(port),
    DATABASE_URL: url,
    SESSION_SECRET: randomBytes(32).toString('base64url'),
    STORE_WEBHOOK_SECRET: randomBytes(32).toString('base64url'),
    SMTP_URL: `smtp://127.0.0.1:${await freePort()}`,
    CLIENT_DIST: dist,
    RUN_WORKERS: 'false',
    LOG_LEVEL: 'warn',
  })
  const base = `http://127.0.0.1:${port}`
  browser = await launchChromium()
  console.log(`API process ${api.pid} on ${base}; Chromium ${browser.version()}; ${runs} cold loads per page, each in a fresh context\n`)

  // One load first, not counted: the server's first answers pay for its own warm-up (module loading,
  // database connections), which no shop sees twice.
  await loadCold(browser, base, PAGES[0]!)

  const head = `${'page'.padEnd(28)}${'JS kB'.padStart(8)}${'raw kB'.padStart(9)}${'files'.padStart(7)}  ${'encoding'.padEnd(10)}${'usable ms (min–max)'.padStart(21)}  title · targets`
  console.log(head)
  const misses: string[] = []
  for (const c of PAGES) {
    const loads: Load[] = []
    for (let i = 0; i < runs; i++) loads.push(await loadCold(browser, base, c))
    const first = loads[0]!
    const times = loads.map((l) => l.usableMs)
    const ms = median(times)
    const targets: string[] = []
    if (c.maxJs !== undefined) {
      const ok = first.jsBytes <= c.maxJs
      targets.push(`JS ≤ ${kB(c.maxJs)} kB ${verdict(ok)}`)
      if (!ok) misses.push(`${c.label}: ${kB(first.jsBytes)} kB of JS (target ${kB(c.maxJs)} kB)`)
    }
    if (c.maxMs !== undefined) {
      const ok = ms < c.maxMs
      targets.push(`usable < ${c.maxMs} ms ${verdict(ok)}`)
      if (!ok) misses.push(`${c.label}: usable after ${ms.toFixed(0)} ms (target under ${c.maxMs} ms)`)
    }
    console.log(
      `${c.label.padEnd(28)}${kB(first.jsBytes).padStart(8)}${kB(first.jsRawBytes).padStart(9)}${String(first.jsFiles).padStart(7)}  ${[...first.encodings].join(',').padEnd(10)}${`${ms.toFixed(0)} (${Math.min(...times).toFixed(0)}–${Math.max(...times).toFixed(0)})`.padStart(21)}  "${first.title}"${targets.length ? ` · ${targets.join(' · ')}` : ''}`,
    )
    if (listFiles)
      for (const f of [...first.files].sort((a, b) => b.bytes - a.bytes)) console.log(`    ${kB(f.bytes).padStart(7)} kB (${kB(f.raw)} kB raw) ${f.name}`)
    const problems = [...new Set(loads.flatMap((l) => l.consoleProblems))]
    if (problems.length) {
      failed = true
      for (const p of problems.slice(0, 5)) console.log(`    console ${p}`)
    }
  }
  console.log(`\nTimes are medians of ${runs} cold loads (the min–max spread shows how loaded the machine was); bytes are the compressed bodies on the wire.`)
  console.log(misses.length ? `Targets not met:\n  ${misses.join('\n  ')}` : 'Every target met.')
  if (failed) console.log('Some pages logged console errors or warnings (shown under them).')
} catch (err) {
  failed = true
  console.error(err instanceof Error ? (err.stack ?? err.message) : err)
} finally {
  await stopEverything()
}
process.exitCode = failed ? 1 : 0
