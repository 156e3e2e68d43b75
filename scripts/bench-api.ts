// Load benchmark of the API over HTTP (npm run bench:api).
// Starts the API as its own process (`tsx server/src/index.ts`) on a free loopback port over a fresh
// database with the demo shop, signs in, and loads four routes in turn with autocannon, 50
// connections each for a bounded time: a trivial route as the floor (GET /api/health), the scan
// lookup of a demo part SKU, the orders list as a planner, and the store webhook with a freshly
// signed delivery (its own event id and order number) on every request. Prints p50/p95/p99 latency
// and throughput for each, each p95 as a multiple of the floor's p95, and whether the scan lookup
// meets its target: p95 under 20 ms and within 5× the floor. Figures only; the exit code says
// whether every request was answered 2xx, not whether a target was met (machines differ).
//
// Where: the local PostgreSQL cluster of `npm start` (started here if it is not running, stopped
// again afterwards), in a database of its own, `kitwright_bench_api`, recreated on every run and
// dropped at the end. Loopback only. Options: `--duration 8` seconds per route (default 8),
// `--connections 50` (default 50).
import { spawn, type ChildProcess } from 'node:child_process'
import { randomBytes } from 'node:crypto'
import path from 'node:path'
import { fileURLToPath } from 'node:url'
import { createDb } from '../server/src/db/client'
import { ensureDatabase } from '../server/src/db/ensure-database'
import { migrateDb } from '../server/src/db/migrate'
import { DEMO_PART_SKUS } from '../server/src/seeds/catalog'
import { DEMO_USERS, seedDemo } from '../server/src/seeds/demo'
import { signStoreDelivery } from '../server/src/features/webhooks/store-signature'

const SCAN_P95_LIMIT_MS = 20
const SCAN_FLOOR_RATIO_LIMIT = 5
const DB_NAME = 'kitwright_bench_api'
const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..')

const args = process.argv.slice(2)
function numberArg(name: string, fallback: number): number {
  const i = args.indexOf(name)
  if (i < 0) return fallback
  const value = Number(args[i + 1])
  if (!Number.isInteger(value) || value < 1) throw new Error(`Give ${name} a whole number of at least 1, e.g. ${name} ${fallback}`)
  return value
}
const duration = numberArg('--duration', 8)
const connections = numberArg('--connections', 50)

// autocannon ships no type declarations; the part of its API used here.
type CannonRequest = { method?: string; path?: string; headers?: Record<string, string>; body?: string }
type CannonOptions = {
  url: string
  connections: number
  duration: number
  headers?: Record<string, string>
  requests?: (CannonRequest & { setupRequest?: (req: CannonRequest) => CannonRequest })[]
}
type CannonResult = { duration: number; errors: number; timeouts: number; non2xx: number; statusCodeStats: Record<string, { count: number }> }
type CannonInstance = { on: (event: 'response', fn: (client: unknown, statusCode: number, bytes: number, ms: number) => void) => void }
type Cannon = (opts: CannonOptions, done: (err: Error | null, result: CannonResult) => void) => CannonInstance
// @ts-expect-error autocannon has no type declarations (typed locally above)
const autocannon = (await import('autocannon')).default as Cannon

type Cluster = { url: (db: string) => string; startedHere: boolean; stop: () => void }
// @ts-expect-error plain JavaScript module of the start-up scripts, without type declarations
const { startPostgres } = (await import('./lib/postgres.mjs')) as { startPostgres: (port: number) => Cluster }
// @ts-expect-error plain JavaScript module of the start-up scripts, without type declarations
const { localPorts } = (await import('./lib/config.mjs')) as { localPorts: { postgres: number } }
// @ts-expect-error plain JavaScript module of the start-up scripts, without type declarations
const { freePort } = (await import('./lib/ports.mjs')) as { freePort: () => Promise<number> }

type Figures = { label: string; requests: number; perSecond: number; p50: number; p95: number; p99: number; refused: string }

/** Nearest-rank percentile of sorted values. */
function percentile(sorted: number[], p: number): number {
  if (sorted.length === 0) return Number.NaN
  return sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1))]!
}

/** Runs autocannon once and keeps every 2xx response time (autocannon's own summary has no p95). */
function load(opts: CannonOptions): Promise<{ times: number[]; result: CannonResult }> {
  return new Promise((resolve, reject) => {
    const times: number[] = []
    const instance = autocannon(opts, (err, result) => (err ? reject(err) : resolve({ times, result })))
    instance.on('response', (_client, status, _bytes, ms) => {
      if (status >= 200 && status < 300) times.push(ms)
    })
  })
}

async function measure(label: string, opts: Omit<CannonOptions, 'connections' | 'duration'>): Promise<Figures> {
  await load({ ...opts, connections, duration: 1 }) // warm-up, not counted
  const { times, result } = await load({ ...opts, connections, duration })
  times.sort((a, b) => a - b)
  const bad = Object.entries(result.statusCodeStats).filter(([code]) => !code.startsWith('2'))
  const refused = [
    ...bad.map(([code, s]) => `${s.count}×${code}`),
    ...(result.errors ? [`${result.errors} errors`] : []),
    ...(result.timeouts ? [`${result.timeouts} timeouts`] : []),
  ].join(', ')
  return {
    label,
    requests: times.length,
    perSecond: times.length / result.duration,
    p50: percentile(times, 50),
    p95: percentile(times, 95),
    p99: percentile(times, 99),
    refused,
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

const ms = (v: number) => v.toFixed(1).padStart(8)
const cluster = startPostgres(localPorts.postgres)
const url = cluster.url(DB_NAME)
let api: ChildProcess | undefined
let failed = false
const stopEverything = async () => {
  if (api) await stopApi(api)
  await dropDatabase(url).catch((err: Error) => console.error(`could not drop ${DB_NAME}: ${err.message}`))
  if (cluster.startedHere) cluster.stop()
}
for (const sig of ['SIGINT', 'SIGTERM'] as const) process.once(sig, () => void stopEverything().finally(() => process.exit(130)))

try {
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
  const webhookSecret = randomBytes(32).toString('base64url')
  // Production settings (secure cookies, production Express); job workers off so the measured
  // process only answers HTTP; the relay is never reached with workers off, but production requires one.
  api = await startApi({
    NODE_ENV: 'production',
    HOST: '127.0.0.1',
    PORT: String(port),
    DATABASE_URL: url,
    SESSION_SECRET: randomBytes(32).toString('base64url'),
    STORE_WEBHOOK_SECRET: webhookSecret,
    SMTP_URL: `smtp://127.0.0.1:${await freePort()}`,
    RUN_WORKERS: 'false',
    LOG_LEVEL: 'warn',
  })
  const base = `http://127.0.0.1:${port}`
  console.log(`API process ${api.pid} on ${base}; ${connections} connections, ${duration} s per route after a 1 s warm-up\n`)

  const planner = DEMO_USERS.find((u) => u.role === 'planner')!
  const signIn = await fetch(`${base}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email: planner.email, password: planner.password }),
  })
  if (signIn.status !== 200) throw new Error(`signing in as ${planner.email} answered ${signIn.status}: ${await signIn.text()}`)
  const cookie = signIn.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ')
  const sku = DEMO_PART_SKUS.elbowHalfInch
  const scanPath = `/api/scan/${encodeURIComponent(sku)}`
  for (const p of [scanPath, '/api/orders']) {
    const r = await fetch(`${base}${p}`, { headers: { cookie } })
    if (r.status !== 200) throw new Error(`GET ${p} answered ${r.status} before the load: ${await r.text()}`)
  }

  const runTag = Date.now().toString(36)
  let delivery = 0
  const signedDelivery = (req: CannonRequest): CannonRequest => {
    delivery++
    const now = new Date()
    const body = JSON.stringify({
      eventId: `evt-bench-${runTag}-${delivery}`,
      type: 'order.paid',
      occurredAt: new Date(now.getTime() - 60_000).toISOString(),
      orderNumber: `MW-BENCH-${runTag}-${delivery}`,
      order: {
        placedAt: new Date(now.getTime() - 120_000).toISOString(),
        customer: { name: 'Bench Buyer', email: `bench-${delivery}@buyer.example` },
        shipTo: { name: 'Bench Buyer', line1: '1 Loadtest Row', city: 'Brookmere', region: 'OR', postalCode: '97000', country: 'US' },
        currency: 'USD',
        lines: [{ productId: 'mw-store-1012', title: '12-site aeroponic tote kit', quantity: 1, unitPriceCents: 18900 }],
      },
    })
    const ts = Math.floor(now.getTime() / 1000)
    return {
      ...req,
      method: 'POST',
      path: '/api/webhooks/store',
      body,
      headers: {
        ...req.headers,
        'content-type': 'application/json',
        'x-store-timestamp': String(ts),
        'x-store-signature': signStoreDelivery(webhookSecret, ts, body),
      },
    }
  }

  const rows: Figures[] = []
  rows.push(await measure('GET /api/health (floor)', { url: `${base}/api/health` }))
  rows.push(await measure(`GET /api/scan/${sku}`, { url: `${base}${scanPath}`, headers: { cookie } }))
  rows.push(await measure('GET /api/orders (planner)', { url: `${base}/api/orders`, headers: { cookie } }))
  rows.push(await measure('POST /api/webhooks/store', { url: base, requests: [{ setupRequest: signedDelivery }] }))

  const floor = rows[0]!
  console.log(
    `${'route'.padEnd(32)}${'requests'.padStart(9)}${'req/s'.padStart(9)}${'p50 ms'.padStart(8)}${'p95 ms'.padStart(8)}${'p99 ms'.padStart(8)}${'p95/floor'.padStart(11)}  refused`,
  )
  for (const r of rows) {
    console.log(
      `${r.label.padEnd(32)}${String(r.requests).padStart(9)}${r.perSecond.toFixed(0).padStart(9)}${ms(r.p50)}${ms(r.p95)}${ms(r.p99)}${(r.p95 / floor.p95).toFixed(1).padStart(10)}×  ${r.refused || 'none'}`,
    )
    if (r.refused) failed = true
  }
  const scan = rows[1]!
  const under = scan.p95 < SCAN_P95_LIMIT_MS
  const within = scan.p95 <= SCAN_FLOOR_RATIO_LIMIT * floor.p95
  console.log(
    `\nScan lookup p95 ${scan.p95.toFixed(1)} ms: under ${SCAN_P95_LIMIT_MS} ms ${under ? 'yes' : 'NO'}; within ${SCAN_FLOOR_RATIO_LIMIT}× the floor (${floor.p95.toFixed(1)} ms) ${within ? 'yes' : 'NO'} (${(scan.p95 / floor.p95).toFixed(1)}×)`,
  )
  console.log(`Webhook: ${delivery} signed deliveries built, each with its own event id`)
  if (failed) console.log('Some requests were not answered 2xx (see "refused"); their times are left out of the figures.')
} catch (err) {
  failed = true
  console.error(err instanceof Error ? err.message : err)
} finally {
  await stopEverything()
}
process.exitCode = failed ? 1 : 0
