// Benchmark of the promise date (npm run bench:promise): how long promising one new order takes
// when the shop has 500 open orders over 40 parts. Seeds a fresh database with the demo shop, 40
// hardware parts, a pack kit using them all and 500 open orders of it (half of them released into
// work orders), then promises a new order N times and prints the median and worst time against the
// 200 ms target. Where: the local cluster of `npm start`, in `kitwright_bench_promise`, recreated on
// every run and dropped at the end. Option: `--runs 30` (default 20).
import { eq, sql } from 'drizzle-orm'
import pgClient from 'pg'
import { createDb } from '../server/src/db/client'
import { ensureDatabase } from '../server/src/db/ensure-database'
import { migrateDb } from '../server/src/db/migrate'
import { bomLines, orderLines, orders, parts, stockMoves, users } from '../server/src/db/schema/index'
import { seedDemo } from '../server/src/seeds/demo'
import { createKit, releaseRevision, saveRevision } from '../server/src/features/kits/kits.service'
import { promiseForOrder } from '../server/src/features/orders/promise.service'
import { releaseOrder } from '../server/src/features/work-orders/release.service'

const TARGET_MS = 200
const ORDERS = 500
const PARTS = 40
const args = process.argv.slice(2)
const runsArg = args.indexOf('--runs')
const runs = runsArg >= 0 ? Number(args[runsArg + 1]) : 20
if (!Number.isInteger(runs) || runs < 1) throw new Error('Give --runs a whole number of at least 1, e.g. --runs 20')

type Cluster = { url: (db: string) => string; startedHere: boolean; stop: () => void }
// @ts-expect-error plain JavaScript module of the start-up scripts, without type declarations
const { startPostgres } = (await import('./lib/postgres.mjs')) as { startPostgres: (port: number) => Cluster }
// @ts-expect-error plain JavaScript module of the start-up scripts, without type declarations
const { localPorts } = (await import('./lib/config.mjs')) as { localPorts: { postgres: number } }
const pg = startPostgres(localPorts.postgres)
const url = pg.url('kitwright_bench_promise')
await ensureDatabase(url, { recreate: true })
const { db, pool } = createDb(url)
try {
  await migrateDb(db)
  await seedDemo(db)
  const started = Date.now()
  const made = await db
    .insert(parts)
    .values(
      Array.from({ length: PARTS }, (_, i) => ({
        sku: `BENCH-${i}`,
        name: `Bench part ${i}`,
        kind: 'hardware' as const,
        unitOfMeasure: 'each',
        leadTimeDays: 5 + (i % 20),
      })),
    )
    .returning({ id: parts.id })
  // Enough of most parts for half the orders, so some parts come up short and some do not.
  await db.insert(stockMoves).values(made.map((p, i) => ({ partId: p.id, kind: 'receive' as const, quantity: i % 3 === 0 ? 50 : 5000 })))
  const kit = await createKit(db, { sku: 'BENCH-PACK', name: 'Bench pack', storeProductId: null, description: null })
  const rev = kit.revisions[0]!.id
  const step = {
    text: 'Bag it.',
    caution: null,
    photoRequired: false,
    measurementRequired: false,
    measurementUnit: null,
    measurementMin: null,
    measurementMax: null,
    freeOrder: false,
    outOfLimitsRework: false,
  }
  await saveRevision(db, rev, {
    notes: null,
    frame: null,
    leakTest: null,
    bomLines: made.map((p) => ({ partId: p.id, quantity: 1, note: null })),
    cutParts: [],
    buildSteps: [step],
  })
  const [owner] = await db.select().from(users).where(eq(users.role, 'admin')).limit(1)
  await releaseRevision(db, rev, owner!)
  const placed = new Date()
  const inserted = await db
    .insert(orders)
    .values(
      Array.from({ length: ORDERS }, (_, i) => ({
        number: `B-${i}`,
        source: 'phone' as const,
        customerName: 'Bench',
        customerEmail: 'bench@orders.example',
        shipName: 'Bench',
        shipLine1: '1 Bench Row',
        shipCity: 'Benchton',
        shipPostalCode: '00000',
        shipCountry: 'US',
        placedAt: placed,
      })),
    )
    .returning({ id: orders.id })
  await db
    .insert(orderLines)
    .values(inserted.map((o) => ({ orderId: o.id, lineNo: 1, kitId: kit.id, sku: 'BENCH-PACK', description: 'Bench pack', quantity: 1, unitPriceCents: 100 })))
  for (const o of inserted.slice(0, ORDERS / 2)) await db.transaction((tx) => releaseOrder(tx, o.id, { allowShort: true }, null))
  console.log(`Seeded ${ORDERS} open orders (${ORDERS / 2} released) over ${PARTS} parts in ${((Date.now() - started) / 1000).toFixed(1)} s`)

  const [bom] = await db
    .select({ n: sql<number>`count(*)::int` })
    .from(bomLines)
    .where(eq(bomLines.revisionId, rev))
  const times: number[] = []
  let last = null
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now()
    last = await promiseForOrder(db, [{ kitId: kit.id, quantity: 1 }], new Date())
    times.push(performance.now() - t0)
  }
  times.sort((a, b) => a - b)
  const median = times[Math.floor(times.length / 2)]!
  const worst = times.at(-1)!
  console.log(
    `Promise for one order of a ${bom!.n}-part kit, ${runs} runs: median ${median.toFixed(1)} ms, worst ${worst.toFixed(1)} ms (target < ${TARGET_MS} ms: ${worst < TARGET_MS ? 'met' : 'NOT met'})`,
  )
  console.log(`Last promise: ${last!.date}; ${last!.reasons.join('; ')}`)
} finally {
  await pool.end()
  const admin = new pgClient.Client({ connectionString: pg.url('postgres') })
  await admin.connect()
  await admin.query('drop database if exists kitwright_bench_promise with (force)')
  await admin.end()
  if (pg.startedHere) pg.stop()
}
