import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ApiErrorBodySchema } from '@kitwright/shared/errors'
import {
  CutRunYieldReportSchema,
  FirstPassYieldReportSchema,
  LateOrdersReportSchema,
  LeadTimeReportSchema,
  OrderStatesReportSchema,
  ThroughputReportSchema,
  WipReportSchema,
  YieldOverTimeReportSchema,
} from '@kitwright/shared/reports'
import { bomLines, stockMoves } from '../../server/src/db/schema/index'
import { buildApp, signedInAs } from '../support/app'
import { insertPart, insertUser } from '../support/factories'
import {
  insertCutPart,
  insertCutRun,
  insertLeakTest,
  insertPaymentEvent,
  insertReportKit,
  insertReportOrder,
  insertReportUnit,
  insertShipment,
  insertTick,
} from '../support/report-factories'
import { createTestDb, type TestDb } from '../support/test-db'

// A small hand-made history. Range reports look at two fixed weeks, Monday 2 March to Sunday
// 15 March 2026 (UTC). The late list reads "today" from the app's clock, fixed here two seconds
// before a UTC midnight, so the promised dates count back from that day and no run can straddle a
// change of day. The benches' ages are durations the database measures from its own now(), so the
// units' times count back from the real now.
const RANGE = '?from=2026-03-02&to=2026-03-15'
const DAY = 86_400_000
const REPORT_NOW = new Date('2026-09-30T23:59:58Z')
const REPORT_TODAY = '2026-09-30'
const daysBefore = (n: number) => new Date(REPORT_NOW.getTime() - n * DAY).toISOString().slice(0, 10)
const now = Date.now()
const daysAgo = (n: number) => new Date(now - n * DAY)

let t: TestDb
let app: ReturnType<typeof buildApp>['app']
let planner: Awaited<ReturnType<typeof signedInAs>>['agent']
const serials: Record<string, string> = {}
const numbers: Record<string, string> = {}

beforeAll(async () => {
  t = await createTestDb()
  app = buildApp(t, { now: () => REPORT_NOW }).app
  planner = (await signedInAs(app, t, 'planner')).agent
  const db = t.db
  const hand = await insertUser(db, { role: 'assembler' })
  const packer = await insertUser(db, { role: 'packer' })
  const { kit, revisions } = await insertReportKit(db, ['A', 'B'])
  const [revA, revB] = revisions as [(typeof revisions)[number], (typeof revisions)[number]]
  const step = (i: number) => revA.steps[i]!.id

  // Orders: two shipped, one released, one partly shipped, two open, one cancelled (7 in all).
  const o1 = await insertReportOrder(db, kit.id, {
    status: 'shipped',
    placedAt: new Date('2026-03-02T00:00:00Z'),
    shippedAt: new Date('2026-03-08T12:00:00Z'),
    promisedShipDate: daysBefore(3),
    quantity: 3,
  })
  const o2 = await insertReportOrder(db, kit.id, { status: 'shipped', placedAt: new Date('2026-03-01T12:00:00Z'), shippedAt: new Date('2026-03-11T12:00:00Z') })
  await insertPaymentEvent(db, o2.order.id, '2026-03-03T12:00:00Z') // came in unpaid; paid two days later
  const o3 = await insertReportOrder(db, kit.id, {
    status: 'released',
    promisedShipDate: daysBefore(5),
    quantity: 2,
    customerName: '=HYPERLINK("http://bad.example")',
  })
  const o4 = await insertReportOrder(db, kit.id, { status: 'partially_shipped', promisedShipDate: daysBefore(1), quantity: 2 })
  const o5 = await insertReportOrder(db, kit.id, { status: 'open', promisedShipDate: daysBefore(0) }) // due today: not late yet
  await insertReportOrder(db, kit.id, { status: 'open', promisedShipDate: null })
  const o6 = await insertReportOrder(db, kit.id, { status: 'cancelled', promisedShipDate: daysBefore(20) })
  Object.assign(numbers, { o3: o3.order.number, o4: o4.order.number })
  // Shipped after the range: its lead time must not count.
  const o9 = await insertReportOrder(db, kit.id, { status: 'shipped', placedAt: new Date('2026-03-10T00:00:00Z'), shippedAt: new Date('2026-03-20T00:00:00Z') })
  // o9 makes 8 orders: 3 shipped.

  const old = { createdAt: daysAgo(40), updatedAt: daysAgo(30) }
  const w1a = await insertReportUnit(db, o1, revA.id, 'shipped', old)
  const w1b = await insertReportUnit(db, o1, revA.id, 'shipped', old)
  const w1c = await insertReportUnit(db, o1, revA.id, 'shipped', old)
  const w2a = await insertReportUnit(db, o2, revB.id, 'shipped', old)
  const w4a = await insertReportUnit(db, o4, revB.id, 'shipped', old)
  const w9a = await insertReportUnit(db, o9, revB.id, 'shipped', old)
  // Units still in the shop (work in progress).
  const w4b = await insertReportUnit(db, o4, revB.id, 'built', { createdAt: daysAgo(10), updatedAt: daysAgo(3.5) })
  const w3a = await insertReportUnit(db, o3, revA.id, 'rework', { createdAt: daysAgo(6), updatedAt: daysAgo(1) })
  const w3b = await insertReportUnit(db, o3, revA.id, 'building', { createdAt: daysAgo(5), updatedAt: daysAgo(5) })
  await insertReportUnit(db, o5, revA.id, 'cut', { createdAt: daysAgo(2), updatedAt: daysAgo(2) })
  const wc1 = await insertReportUnit(db, o5, revA.id, 'waiting_cut', { createdAt: daysAgo(4), updatedAt: daysAgo(4) })
  await insertReportUnit(db, o5, revA.id, 'waiting_cut', { createdAt: daysAgo(1), updatedAt: daysAgo(1) })
  await insertReportUnit(db, o6, revA.id, 'cancelled', { createdAt: daysAgo(30), updatedAt: daysAgo(30) })
  Object.assign(serials, { w4b: w4b.serial, w3a: w3a.serial, wc1: wc1.serial })

  // Build history: step ticks and leak tests (attempt 1 is the first pass).
  await insertTick(db, w1a.id, step(0), hand.id, '2026-03-03T10:00:00Z')
  await insertTick(db, w1a.id, step(1), hand.id, '2026-03-03T11:00:00Z')
  await insertLeakTest(db, w1a.id, hand.id, 1, true, '2026-03-03T12:00:00Z') // w1a built 3 March
  await insertTick(db, w1b.id, step(0), hand.id, '2026-03-04T09:00:00Z')
  await insertLeakTest(db, w1b.id, hand.id, 1, false, '2026-03-04T10:00:00Z')
  await insertLeakTest(db, w1b.id, hand.id, 2, true, '2026-03-05T09:00:00Z') // w1b built 5 March, after a retest
  await insertTick(db, w1c.id, step(0), hand.id, '2026-03-05T10:00:00Z')
  await insertLeakTest(db, w1c.id, hand.id, 1, true, '2026-03-05T11:00:00Z') // w1c built 5 March
  await insertTick(db, w1c.id, step(1), hand.id, '2026-03-06T10:00:00Z', '2026-03-06T10:05:00Z') // an undone tick: ignored
  await insertTick(db, w2a.id, step(0), hand.id, '2026-03-01T10:00:00Z')
  await insertLeakTest(db, w2a.id, hand.id, 1, true, '2026-03-02T00:30:00Z') // w2a built 2 March
  await insertLeakTest(db, w4a.id, hand.id, 1, true, '2026-02-27T10:00:00Z') // built before the range
  await insertLeakTest(db, w9a.id, hand.id, 1, true, '2026-03-18T10:00:00Z') // built after it
  await insertLeakTest(db, w4b.id, hand.id, 1, false, '2026-03-09T10:00:00Z')
  await insertLeakTest(db, w4b.id, hand.id, 2, false, '2026-03-10T10:00:00Z')
  await insertLeakTest(db, w4b.id, hand.id, 3, true, '2026-03-12T08:00:00Z') // w4b built 12 March
  await insertTick(db, w3b.id, step(0), hand.id, '2026-03-10T09:00:00Z')
  await insertLeakTest(db, w3b.id, hand.id, 1, true, '2026-03-10T10:00:00Z') // passed, but steps remain: not built
  await insertLeakTest(db, w3a.id, hand.id, 1, false, '2026-03-16T10:00:00Z') // first test after the range

  // Shipments: 3 units on 8 March (two parcels), 1 + 1 on 11 March; one labelled, one after the range.
  await insertShipment(db, o1.order.id, packer.id, 'shipped', '2026-03-08T12:00:00Z', [[w1a.id, w1b.id], [w1c.id]])
  await insertShipment(db, o2.order.id, packer.id, 'shipped', '2026-03-11T12:00:00Z', [[w2a.id]])
  await insertShipment(db, o4.order.id, packer.id, 'shipped', '2026-03-11T23:30:00Z', [[w4a.id]])
  await insertShipment(db, o4.order.id, packer.id, 'labelled', null, [[w4b.id]])
  await insertShipment(db, o9.order.id, packer.id, 'shipped', '2026-03-16T00:30:00Z', [[w9a.id]])

  // Cut runs (lengths in base units; round numbers keep the arithmetic readable).
  const pipe = await insertPart(db, { kind: 'stock_length', sku: 'TST-PIPE', stickLengths: [100_000] })
  const riser = await insertCutPart(db, revA.id, pipe.id, 30_000)
  const piece = { partId: pipe.id, cutPartId: riser.id, workOrderId: w1a.id }
  const cut = (length: number, at = '2026-03-03T09:00:00Z') => ({ length, status: 'cut' as const, cutAt: at })
  // CR-A, done 4 March. Plan: 150 000 of pieces from 200 000 used, 20 000 back as an offcut.
  await insertCutRun(
    db,
    { status: 'done', lengthUsed: 200_000, pieceLength: 150_000, offcutLength: 20_000, completedAt: '2026-03-04T10:00:00Z' },
    [
      { length: 100_000, status: 'done', remnant: 10_000, cuts: [cut(30_000), cut(30_000), cut(30_000)] },
      { length: 100_000, status: 'done', remnant: 20_000, offcut: true, cuts: [cut(30_000), cut(30_000)] },
    ],
    piece,
  )
  // CR-B, done 10 March. Plan: 80 000 from 100 000. The first stick was miscut: one piece came off
  // whole, one was spoiled (cut, then re-planned), one not yet cut was re-planned; a new stick cut both again.
  await insertCutRun(
    db,
    { status: 'done', lengthUsed: 100_000, pieceLength: 80_000, offcutLength: 0, completedAt: '2026-03-10T09:00:00Z' },
    [
      {
        length: 100_000,
        status: 'damaged',
        remnant: 20_000,
        cuts: [cut(30_000), { length: 30_000, status: 'replanned', cutAt: '2026-03-10T08:00:00Z' }, { length: 20_000, status: 'replanned' }],
      },
      { length: 100_000, status: 'done', remnant: 48_000, offcut: true, cuts: [cut(30_000), cut(20_000)] },
    ],
    piece,
  )
  // CR-E, done 12 March: 90 000 from 100 000, as planned.
  await insertCutRun(
    db,
    { status: 'done', lengthUsed: 100_000, pieceLength: 90_000, offcutLength: 0, completedAt: '2026-03-12T15:00:00Z' },
    [{ length: 100_000, status: 'done', remnant: 10_000, cuts: [cut(30_000), cut(30_000), cut(30_000)] }],
    piece,
  )
  // Outside the report: finished after the range, and one still on the saw.
  await insertCutRun(
    db,
    { status: 'done', lengthUsed: 100_000, pieceLength: 10_000, offcutLength: 0, completedAt: '2026-03-20T10:00:00Z' },
    [{ length: 100_000, status: 'done', remnant: 90_000, cuts: [cut(10_000)] }],
    piece,
  )
  await insertCutRun(
    db,
    { status: 'published', lengthUsed: 100_000, pieceLength: 10_000, offcutLength: 0 },
    [{ length: 100_000, status: 'in_progress', remnant: 90_000, cuts: [cut(10_000)] }],
    piece,
  )

  // Shortages: revision A needs 2 fittings per unit; 4 fittings are on the shelf.
  const fitting = await insertPart(db, { sku: 'TST-TEE', name: 'Slip tee' })
  await db.insert(bomLines).values({ revisionId: revA.id, partId: fitting.id, quantity: 2, position: 1 })
  await db.insert(stockMoves).values({ partId: fitting.id, kind: 'receive', quantity: 4 })
})
afterAll(() => t.drop())

describe('reports on a hand-made history', () => {
  it('counts orders per state, every state listed', async () => {
    const res = await planner.get('/api/reports/order-states')
    expect(res.status).toBe(200)
    const body = OrderStatesReportSchema.parse(res.body)
    expect(body.timeZone).toBe('UTC')
    // open: o5 and the undated one; released: o3; partly shipped: o4; shipped: o1, o2, o9; cancelled: o6.
    expect(body.rows).toEqual([
      { status: 'open', count: 2 },
      { status: 'released', count: 1 },
      { status: 'partially_shipped', count: 1 },
      { status: 'shipped', count: 3 },
      { status: 'cancelled', count: 1 },
    ])
    expect(body.total).toBe(8) // 2 + 1 + 1 + 3 + 1
  })

  it('lists late orders, oldest promise first, with days late and units', async () => {
    const res = await planner.get('/api/reports/late-orders')
    expect(res.status).toBe(200)
    const body = LateOrdersReportSchema.parse(res.body)
    // Late: promised before today and neither shipped nor cancelled. o1 was promised 3 days ago but
    // shipped; o6 is cancelled; o5 is due today; the undated order has no promise.
    expect(body.total).toBe(2)
    expect(body.rows.map((r) => [r.number, r.daysLate, r.units, r.unitsShipped])).toEqual([
      [numbers.o3, 5, 2, 0], // promised 5 days ago, 2 units, none shipped
      [numbers.o4, 1, 2, 1], // promised yesterday, 1 of its 2 units shipped
    ])
    expect(body.today).toBe(REPORT_TODAY)
    expect(body.asOf).toBe(REPORT_NOW.toISOString())
    const limited = LateOrdersReportSchema.parse((await planner.get('/api/reports/late-orders?limit=1')).body)
    expect(limited.rows).toHaveLength(1)
    expect(limited.total).toBe(2)
  })

  it('shows work in progress per bench with the stuck units and the oldest one', async () => {
    const res = await planner.get('/api/reports/work-in-progress')
    expect(res.status).toBe(200)
    const body = WipReportSchema.parse(res.body)
    expect(body.stuckDays).toBe(3)
    const rows = body.rows.map(({ oldestAgeDays, oldestReleasedAt: _at, oldestOrderNumber: _n, ...r }) => ({ ...r, age: Math.round(oldestAgeDays ?? -1) }))
    expect(rows).toEqual([
      // waiting to cut: released 4 and 1 days ago; the first has not changed for 4 ≥ 3 days.
      { bench: 'cut', units: 2, rework: 0, stuck: 1, oldestSerial: serials.wc1, age: 4 },
      // cut (2 days), building (no change for 5 days: stuck), rework (changed yesterday); oldest released 6 days ago.
      { bench: 'build', units: 3, rework: 1, stuck: 1, oldestSerial: serials.w3a, age: 6 },
      // built, waiting for the pack bench for 3.5 days: stuck; released 10 days ago.
      { bench: 'pack', units: 1, rework: 0, stuck: 1, oldestSerial: serials.w4b, age: 10 },
    ])
    // With a 6-day threshold nothing has sat that long (5 days is the longest).
    const relaxed = WipReportSchema.parse((await planner.get('/api/reports/work-in-progress?stuckDays=6')).body)
    expect(relaxed.rows.map((r) => r.stuck)).toEqual([0, 0, 0])
  })

  it('counts units built and shipped per day of the range', async () => {
    const res = await planner.get(`/api/reports/throughput${RANGE}`)
    expect(res.status).toBe(200)
    const body = ThroughputReportSchema.parse(res.body)
    expect(body.rows).toHaveLength(14) // 2 to 15 March, both included
    const busy = body.rows.filter((r) => r.unitsBuilt > 0 || r.unitsShipped > 0)
    expect(busy).toEqual([
      { day: '2026-03-02', unitsBuilt: 1, unitsShipped: 0 }, // w2a passed its test at 00:30
      { day: '2026-03-03', unitsBuilt: 1, unitsShipped: 0 }, // w1a
      { day: '2026-03-05', unitsBuilt: 2, unitsShipped: 0 }, // w1b (after its retest) and w1c; w1c's undone tick on the 6th does not count
      { day: '2026-03-08', unitsBuilt: 0, unitsShipped: 3 }, // o1: parcels of 2 + 1 units
      { day: '2026-03-11', unitsBuilt: 0, unitsShipped: 2 }, // o2 at noon, o4's first unit at 23:30 UTC
      { day: '2026-03-12', unitsBuilt: 1, unitsShipped: 0 }, // w4b, after its third test
    ])
    // w3b passed a test but is still building; w4a and w9a were built outside the range; the
    // labelled shipment has not left; the one on 16 March is after the range.
    expect(body.totals).toEqual({ unitsBuilt: 5, unitsShipped: 5 })
  })

  it('gives planned and actual material yield per cut run, miscuts included', async () => {
    const res = await planner.get(`/api/reports/cut-run-yield${RANGE}`)
    expect(res.status).toBe(200)
    const body = CutRunYieldReportSchema.parse(res.body)
    const rows = body.rows.map((r) => ({ planned: r.planned, actual: r.actual, damaged: r.damagedSticks, spoiled: r.spoiledPieces }))
    expect(rows).toHaveLength(3) // newest first: CR-E, CR-B, CR-A
    // CR-E: 90 000 ÷ 100 000 planned and cut.
    expect(rows[0]).toEqual({
      planned: { pieceLength: 90_000, consumedLength: 100_000, yield: 0.9 },
      actual: { pieceLength: 90_000, consumedLength: 100_000, yield: 0.9 },
      damaged: 0,
      spoiled: 0,
    })
    // CR-B: planned 80 000 ÷ 100 000 = 0.8. Actual pieces 30 000 (whole, from the miscut stick) +
    // 30 000 + 20 000 (cut again) = 80 000; consumed = the miscut stick's 100 000 + (100 000 − 48 000
    // put back as an offcut) = 152 000; 80 000 ÷ 152 000 = 0.526…
    expect(rows[1]).toMatchObject({
      planned: { pieceLength: 80_000, consumedLength: 100_000, yield: 0.8 },
      actual: { pieceLength: 80_000, consumedLength: 152_000 },
      damaged: 1,
      spoiled: 1,
    })
    expect(rows[1]!.actual.yield).toBeCloseTo(80_000 / 152_000, 10)
    // CR-A: planned 150 000 ÷ (200 000 − 20 000 offcut) = 0.833…; actual 5 × 30 000 = 150 000 ÷
    // (100 000 + 100 000 − 20 000 offcut) = 0.833…
    expect(rows[2]).toMatchObject({ planned: { consumedLength: 180_000 }, actual: { pieceLength: 150_000, consumedLength: 180_000 }, damaged: 0, spoiled: 0 })
    expect(rows[2]!.actual.yield).toBeCloseTo(150_000 / 180_000, 10)
  })

  it('gives material yield per week as the sum of pieces over the sum consumed', async () => {
    const body = YieldOverTimeReportSchema.parse((await planner.get(`/api/reports/yield-over-time${RANGE}`)).body)
    expect(body.rows.map((r) => [r.weekStart, r.runs, r.damagedSticks, r.spoiledPieces])).toEqual([
      ['2026-03-02', 1, 0, 0], // CR-A
      ['2026-03-09', 2, 1, 1], // CR-B and CR-E
    ])
    expect(body.rows[0]!.actualYield).toBeCloseTo(150_000 / 180_000, 10)
    // Week of 9 March: planned (80 000 + 90 000) ÷ (100 000 + 100 000) = 0.85; actual (80 000 + 90 000)
    // ÷ (152 000 + 100 000) = 0.6746… (not the mean of the two runs' yields, 0.713…).
    expect(body.rows[1]!.plannedYield).toBeCloseTo(0.85, 10)
    expect(body.rows[1]!.actualYield).toBeCloseTo(170_000 / 252_000, 10)
  })

  it('gives first-pass leak test yield per kit revision', async () => {
    const body = FirstPassYieldReportSchema.parse((await planner.get(`/api/reports/first-pass-yield${RANGE}`)).body)
    // First-pass yield = units that passed their first test ÷ units tested (common practice).
    // Revision A, first tests in the range: w1a pass, w1b fail (its retest passed: not a first
    // pass), w1c pass, w3b pass → 3 of 4. w3a's first test is after the range.
    // Revision B: w2a pass, w4b fail → 1 of 2; w4a's first test was before the range.
    expect(body.rows.map((r) => [r.revisionCode, r.unitsTested, r.passedFirst, r.yield])).toEqual([
      ['A', 4, 3, 0.75],
      ['B', 2, 1, 0.5],
    ])
  })

  it('gives the lead time from paid to shipped, per week and overall', async () => {
    const body = LeadTimeReportSchema.parse((await planner.get(`/api/reports/lead-time${RANGE}`)).body)
    // o1: placed 2 March 00:00, no payment event, shipped 8 March 12:00 → 6.5 days.
    // o2: placed 1 March, paid 3 March 12:00 (the payment event), shipped 11 March 12:00 → 8 days.
    // o9 shipped on 20 March, after the range.
    expect(body.rows).toEqual([
      { weekStart: '2026-03-02', orders: 1, averageDays: 6.5, medianDays: 6.5, longestDays: 6.5 },
      { weekStart: '2026-03-09', orders: 1, averageDays: 8, medianDays: 8, longestDays: 8 },
    ])
    // (6.5 + 8) ÷ 2 = 7.25; the median of two values is their mean (PostgreSQL docs, percentile_cont).
    expect(body.overall).toEqual({ orders: 2, averageDays: 7.25, medianDays: 7.25, longestDays: 8 })
  })
})

describe('report exports', () => {
  it('exports every late order as CSV with formula cells neutralised', async () => {
    const res = await planner.get('/api/reports/late-orders/export.csv?limit=1')
    expect(res.status).toBe(200)
    expect(res.headers['content-type']).toMatch(/^text\/csv/)
    expect(res.headers['content-disposition']).toMatch(/^attachment; filename="?kitwright-late-orders-2026-09-30\.csv"?$/)
    const lines = res.text
      .replace(/^\ufeff/, '')
      .trim()
      .split('\r\n')
    expect(lines[0]).toBe('Order,Customer,State,Placed (UTC),Promised ship date,Days late,Units,Units shipped,State code')
    expect(lines).toHaveLength(3) // the header and both late orders, whatever the screen's limit
    // OWASP "CSV Injection": a cell starting with = gets a leading apostrophe.
    expect(lines[1]).toContain(`${numbers.o3},"'=HYPERLINK(""http://bad.example"")",Released,`)
    // The state in words as on screen; its code in the last column for a program.
    expect(lines[1]!.endsWith(',released')).toBe(true)
  })

  it('exports the order states in words, with the code beside (partially_shipped is "Partly shipped")', async () => {
    const res = await planner.get('/api/reports/order-states/export.csv')
    expect(res.status).toBe(200)
    const lines = res.text
      .replace(/^\ufeff/, '')
      .trim()
      .split('\r\n')
    expect(lines[0]).toBe('Order state,Orders,State code')
    expect(lines).toContain('Partly shipped,1,partially_shipped')
    for (const line of lines.slice(1)) expect(line.split(',')[0]).not.toMatch(/_/)
  })

  it('exports the numbers behind the throughput chart', async () => {
    const res = await planner.get(`/api/reports/throughput/export.csv${RANGE}`)
    expect(res.status).toBe(200)
    const lines = res.text
      .replace(/^\ufeff/, '')
      .trim()
      .split('\r\n')
    expect(lines[0]).toBe('Day (UTC),Units built,Units shipped')
    expect(lines).toHaveLength(15)
    expect(lines).toContain('2026-03-05,2,0')
    expect(lines).toContain('2026-03-08,0,3')
  })

  it('exports yields as percentages and lengths in the shop unit', async () => {
    const runs = (await planner.get(`/api/reports/cut-run-yield/export.csv${RANGE}`)).text
      .replace(/^\ufeff/, '')
      .trim()
      .split('\r\n')
    // No shop settings in this database: inches. 1 in = 25.4 mm exactly (NIST SP 811, B.8) and the base
    // unit is 1/1600 mm, so 40 640 per inch: 152 000 ÷ 40 640 = 3.740 in.
    expect(runs[0]).toContain('Actual consumed (in)')
    // CR-B: 80 000 → 1.969 in, 100 000 → 2.461 in, 80 %; actual 1.969 in of 3.740 in, 52.6 %.
    expect(runs[2]).toMatch(/,2026-03-10T09:00:00Z,1\.969,2\.461,80,1\.969,3\.74,52\.6,1,1$/)
    const fpy = (await planner.get(`/api/reports/first-pass-yield/export.csv${RANGE}`)).text
    expect(fpy).toMatch(/,A,4,3,75\r\n/)
    const lead = (await planner.get(`/api/reports/lead-time/export.csv${RANGE}`)).text
    expect(lead.trim().split('\r\n').at(-1)).toBe('All weeks,2,7.3,7.3,8')
  })

  it('exports the shortages from the shortages query', async () => {
    const res = await planner.get('/api/reports/shortages/export.csv')
    expect(res.status).toBe(200)
    const lines = res.text
      .replace(/^\ufeff/, '')
      .trim()
      .split('\r\n')
    // Revision A's open units: w3a, w3b, wcut, wc1, wc2 = 5 × 2 tees = 10 needed, 4 free → 6 short.
    // Pipe for the 2 units waiting to cut: 2 × 30 000 (no kerf without shop settings) ÷ 100 000 → 1 stick, none free.
    expect(lines.slice(1).map((l) => l.split(',').slice(0, 7).join(','))).toEqual([
      'TST-TEE,Slip tee,each,10,0,4,6',
      expect.stringMatching(/^TST-PIPE,Test part \w+,sticks,1,0,0,1$/),
    ])
  })
})

describe('report input and roles', () => {
  it('refuses a backwards or too long range with a message that says what to fix', async () => {
    const backwards = await planner.get('/api/reports/throughput?from=2026-03-15&to=2026-03-02')
    expect(backwards.status).toBe(400)
    expect(ApiErrorBodySchema.parse(backwards.body).error.fields).toEqual({ from: 'The range must start on or before its end' })
    const long = await planner.get('/api/reports/throughput?from=2025-01-01&to=2026-03-02')
    expect(long.status).toBe(400)
    expect(ApiErrorBodySchema.parse(long.body).error.message).toBe('Choose at most 366 days (this range has 426)')
    const bad = await planner.get('/api/reports/lead-time?from=March')
    expect(bad.status).toBe(400)
    expect(ApiErrorBodySchema.parse(bad.body).error.fields).toEqual({ from: 'Use a date as YYYY-MM-DD' })
  })

  const paths = [
    'order-states',
    'late-orders',
    'work-in-progress',
    'throughput',
    'cut-run-yield',
    'yield-over-time',
    'first-pass-yield',
    'lead-time',
    'shortages/export.csv',
    'throughput/export.csv',
  ]

  it('lets the admin and the planner read every report', async () => {
    const admin = (await signedInAs(app, t, 'admin')).agent
    for (const p of paths) {
      expect([p, (await admin.get(`/api/reports/${p}`)).status]).toEqual([p, 200])
      expect([p, (await planner.get(`/api/reports/${p}`)).status]).toEqual([p, 200])
    }
  })

  it('refuses bench roles (403) and anonymous callers (401)', async () => {
    for (const role of ['cutter', 'assembler', 'packer'] as const) {
      const { agent } = await signedInAs(app, t, role)
      for (const p of paths) expect([role, p, (await agent.get(`/api/reports/${p}`)).status]).toEqual([role, p, 403])
    }
    for (const p of paths) expect([p, (await request(app).get(`/api/reports/${p}`)).status]).toEqual([p, 401])
  })
})
