// Benchmark of the owner's reports (npm run bench:reports).
// Seeds a year of invented history — 20 000 orders with their lines, work orders, step ticks, leak
// tests, cut runs, shipments and parcels — into a fresh database, then runs every report N times
// and prints its median and worst time and whether it answers under 300 ms.
//
// Where: the local PostgreSQL cluster of `npm start` (started here if it is not running, and
// stopped again afterwards), in a database of its own, `kitwright_bench_reports`, recreated on every
// run and dropped at the end (`--keep` leaves it, e.g. to look at the home page over it). Set
// BENCH_DATABASE_URL to use another server; that database is recreated too, so never point it at
// real data. Options: `--runs 30` (default 20); `--reuse` times the reports again over the history a
// `--keep` run left, without seeding it anew.
import { createDb } from '../server/src/db/client'
import { ensureDatabase } from '../server/src/db/ensure-database'
import { migrateDb } from '../server/src/db/migrate'
import { seedDemo } from '../server/src/seeds/demo'
import { REPORTS, reportContext } from '../server/src/features/reports/reports.service'
import { seedReportHistory } from './lib/seed-report-history'

const LIMIT_MS = 300
const args = process.argv.slice(2)
const reuse = args.includes('--reuse')
const keep = args.includes('--keep') || reuse
const runsArg = args.indexOf('--runs')
const runs = runsArg >= 0 ? Number(args[runsArg + 1]) : 20
if (!Number.isInteger(runs) || runs < 1) throw new Error('Give --runs a whole number of at least 1, e.g. --runs 20')

async function databaseUrl(): Promise<{ url: string; stop: () => void }> {
  if (process.env.BENCH_DATABASE_URL) return { url: process.env.BENCH_DATABASE_URL, stop: () => {} }
  // The same cluster `npm start` and `npm test` use (scripts/lib/postgres.mjs): reused when running.
  type Cluster = { url: (db: string) => string; startedHere: boolean; stop: () => void }
  // @ts-expect-error plain JavaScript module of the start-up scripts, without type declarations
  const { startPostgres } = (await import('./lib/postgres.mjs')) as { startPostgres: (port: number) => Cluster }
  // @ts-expect-error plain JavaScript module of the start-up scripts, without type declarations
  const { localPorts } = (await import('./lib/config.mjs')) as { localPorts: { postgres: number } }
  const pg = startPostgres(localPorts.postgres)
  return { url: pg.url('kitwright_bench_reports'), stop: () => (pg.startedHere ? pg.stop() : undefined) }
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b)
  const mid = Math.floor(s.length / 2)
  return s.length % 2 ? s[mid]! : (s[mid - 1]! + s[mid]!) / 2
}

const today = new Date().toISOString().slice(0, 10)
const yearAgo = new Date(Date.now() - 365 * 86_400_000).toISOString().slice(0, 10)
// Each report as the home page asks for it (30 days), and the ranged ones over a whole year too.
const CASES: { path: string; label: string; query: Record<string, string>; forExport: boolean }[] = REPORTS.flatMap((r) => {
  const ranged = ['throughput', 'cut-run-yield', 'yield-over-time', 'first-pass-yield', 'lead-time'].includes(r.path)
  const cases = [{ path: r.path, label: r.json ? r.path : `${r.path} (export)`, query: {}, forExport: !r.json }]
  if (ranged) cases.push({ path: r.path, label: `${r.path}, 365 days`, query: { from: yearAgo, to: today }, forExport: false })
  if (r.path === 'late-orders') cases.push({ path: r.path, label: 'late-orders, all (export)', query: {}, forExport: true })
  return cases
})

const { url, stop } = await databaseUrl()
const name = decodeURIComponent(new URL(url).pathname.slice(1))
console.log(`Database ${name} (${reuse ? 'reused' : 'recreated'})`)
if (!reuse) await ensureDatabase(url, { recreate: true })
const { db, pool } = createDb(url)
let slow = 0
try {
  await migrateDb(db)
  if (!reuse) {
    await seedDemo(db)
    console.log('Seeding 20 000 orders of history:')
    const t0 = performance.now()
    const counts = await seedReportHistory(pool, (line) => console.log(line))
    console.log(`Seeded in ${((performance.now() - t0) / 1000).toFixed(1)} s: ${Object.entries(counts).map(([t, n]) => `${t} ${n}`).join(', ')}`)
  }

  console.log(`\nEach report ${runs} times after one warm-up run (server-side: SQL and mapping, no HTTP):`)
  console.log(`${'report'.padEnd(34)}${'rows'.padStart(7)}${'median ms'.padStart(11)}${'worst ms'.padStart(10)}  under ${LIMIT_MS} ms`)
  for (const c of CASES) {
    const report = REPORTS.find((r) => r.path === c.path)!
    const answer = async () => (await report.answer(db, c.query, reportContext(c.forExport))).table('in').rows.length
    const rows = await answer()
    const times: number[] = []
    for (let i = 0; i < runs; i++) {
      const t = performance.now()
      await answer()
      times.push(performance.now() - t)
    }
    const worst = Math.max(...times)
    const ok = worst < LIMIT_MS
    if (!ok) slow++
    console.log(`${c.label.padEnd(34)}${String(rows).padStart(7)}${median(times).toFixed(1).padStart(11)}${worst.toFixed(1).padStart(10)}  ${ok ? 'yes' : 'NO'}`)
  }
  console.log(slow === 0 ? `\nEvery report answered under ${LIMIT_MS} ms, worst case included.` : `\n${slow} report(s) took ${LIMIT_MS} ms or more at worst.`)
} finally {
  await pool.end()
  if (!keep) await dropDatabase(url)
  else console.log(`Kept ${name}: DATABASE_URL=${url.replace(/:[^:@/]+@/, ':…@')}`)
  stop()
}
process.exitCode = slow === 0 ? 0 : 1

async function dropDatabase(target: string) {
  const admin = new URL(target)
  admin.pathname = '/postgres'
  const { default: pg } = await import('pg')
  const client = new pg.Client({ connectionString: admin.toString() })
  await client.connect()
  await client.query(`drop database if exists ${name} with (force)`)
  await client.end()
}
