// Lots and recalls through the API: receive by lot (form and packing list), fit lots at the build
// bench, ship by lot, then from one lot every unit built with it, as JSON and CSV, and "Tell the
// customers" once. Mail is counted only after the job queue is idle (tests/support/queue.ts).
import { readdirSync, readFileSync } from 'node:fs'
import path from 'node:path'
import { randomBytes, randomUUID } from 'node:crypto'
import { and, count, eq, like } from 'drizzle-orm'
import { simpleParser } from 'mailparser'
import Papa from 'papaparse'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { BuildPageSchema, UnitRecordSchema, type BuildPage } from '@kitwright/shared/build'
import { PublicUnitRecordSchema } from '@kitwright/shared/public-record'
import { ApiErrorBodySchema } from '@kitwright/shared/errors'
import { LotDetailSchema, LotListSchema, NotifyRecallResultSchema } from '@kitwright/shared/lots'
import { StockMovesResultSchema } from '@kitwright/shared/stock'
import { bomLines, mailMessages, orderEvents, orders, parcels, shipments, shopSettings, stockLots, stockMoves, unitLots, workOrders, type WorkOrderRow } from '../../server/src/db/schema/index'
import { unitRecordLink } from '../../server/src/features/build/public-record'
import { splitShipMovesByLot } from '../../server/src/features/lots/lots.queries'
import { startWorkers } from '../../server/src/workers'
import { buildApp, signedInAs, TEST_TOKENS } from '../support/app'
import { insertBuildRevision, insertBuildWorkOrder } from '../support/build-factories'
import { insertPart } from '../support/factories'
import { waitForQueueIdle } from '../support/queue'
import { createTestDb, type TestDb } from '../support/test-db'

let t: TestDb
let built: ReturnType<typeof buildApp>
type Agent = Awaited<ReturnType<typeof signedInAs>>['agent']
let planner: Agent
let assembler: Agent
let cutter: Agent
let packer: Agent
let admin: Agent
let plannerId: string

// One shop for the whole file: parts, a revision that fits a pump and four sprayers, lots received.
let pump: { id: string; sku: string }
let sprayer: { id: string; sku: string }
let grommet: { id: string; sku: string }
let revision: Awaited<ReturnType<typeof insertBuildRevision>>
const tag = randomBytes(2).toString('hex').toUpperCase()
const LOT_A = `PMP-A${tag}`
const LOT_B = `PMP-B${tag}`
const SPR_1 = `SPR-1${tag}`
const SPR_2 = `SPR-2${tag}`

beforeAll(async () => {
  t = await createTestDb()
  await t.db.insert(shopSettings).values({ id: 1, shopName: 'Lantern Row Totes', kerf: 0, endTrim: 0, minOffcut: 0 })
  built = buildApp(t)
  await startWorkers(built.deps)
  const p = await signedInAs(built.app, t, 'planner')
  planner = p.agent
  plannerId = p.user.id
  assembler = (await signedInAs(built.app, t, 'assembler')).agent
  cutter = (await signedInAs(built.app, t, 'cutter')).agent
  packer = (await signedInAs(built.app, t, 'packer')).agent
  admin = (await signedInAs(built.app, t, 'admin')).agent
  pump = await insertPart(t.db, { name: 'Submersible pump 400 L/h', lotTracked: true, electrical: true })
  sprayer = await insertPart(t.db, { name: 'Threaded 360° sprayer', lotTracked: true })
  grommet = await insertPart(t.db, { name: 'Drain grommet' })
  revision = await insertBuildRevision(t.db, { leakTest: false })
  await t.db.insert(bomLines).values([
    { revisionId: revision.revision.id, partId: pump.id, quantity: 1, position: 1 },
    { revisionId: revision.revision.id, partId: sprayer.id, quantity: 4, position: 2 },
    { revisionId: revision.revision.id, partId: grommet.id, quantity: 1, position: 3 },
  ])
})
afterAll(() => t.drop())

function ok<T>(res: { status: number; body: unknown }, status: number, schema: { parse: (v: unknown) => T }): T {
  expect(res.status, JSON.stringify(res.body)).toBe(status)
  return schema.parse(res.body)
}
function refused(res: { status: number; body: unknown }, status: number) {
  expect(res.status, JSON.stringify(res.body)).toBe(status)
  return ApiErrorBodySchema.parse(res.body).error
}
const fit = (agent: Agent, wo: WorkOrderRow, body: object) => agent.post(`/api/build/${wo.id}/lots`).send(body)
const lookup = async (wo: WorkOrderRow): Promise<BuildPage> => ok(await assembler.get('/api/build/lookup').query({ code: wo.serial }), 200, BuildPageSchema)
const countOf = async (table: typeof stockMoves | typeof unitLots | typeof stockLots) => (await t.db.select({ n: count() }).from(table))[0]!.n
async function lotId(code: string) {
  const [row] = await t.db.select({ id: stockLots.id }).from(stockLots).where(eq(stockLots.code, code))
  return row!.id
}

/** The messages the run's SMTP catcher holds for `to` (addresses match whatever their case). */
async function caughtFor(to: string) {
  const dir = process.env.FAKE_MAIL_DIR
  if (!dir) throw new Error('FAKE_MAIL_DIR is not set: run the suite with `npm test`')
  const files = readdirSync(dir).filter((f) => f.endsWith('.eml'))
  const parsed = await Promise.all(files.map((f) => simpleParser(readFileSync(path.join(dir, f)))))
  return parsed.filter((m) => (Array.isArray(m.to) ? m.to : m.to ? [m.to] : []).some((a) => a.value.some((v) => v.address?.toLowerCase() === to.toLowerCase())))
}

describe('receiving lot-tracked parts', () => {
  it('refuses a lot-tracked line without its lot, and a lot on a part that is not tracked, saying what to fix and writing nothing', async () => {
    const before = { moves: await countOf(stockMoves), lots: await countOf(stockLots) }
    const missing = refused(await planner.post('/api/stock/receive').send({ lines: [{ partId: grommet.id, quantity: 5 }, { partId: pump.id, quantity: 2 }] }), 400)
    expect(missing.message).toMatch(/Line 2: .*tracked by lot: give the supplier's lot/)
    expect(missing.fields?.['lines.1.lot']).toBeDefined()
    const extra = refused(await planner.post('/api/stock/receive').send({ lines: [{ partId: grommet.id, quantity: 5, lot: 'G-1' }] }), 400)
    expect(extra.message).toMatch(/not tracked by lot: leave the lot empty/)
    expect(extra.fields?.['lines.0.lot']).toBeDefined()
    expect({ moves: await countOf(stockMoves), lots: await countOf(stockLots) }).toEqual(before)
  })

  it('receives each lot on its own ledger line; the same lot again (any case) adds to it; the packing list takes a lot column', async () => {
    // Separate receipts, oldest first: the bench offers lots in the order they came in.
    ok(await planner.post('/api/stock/receive').send({ lines: [{ partId: pump.id, quantity: 2, lot: LOT_A, reference: 'PL-1' }, { partId: grommet.id, quantity: 10 }] }), 201, StockMovesResultSchema)
    ok(await planner.post('/api/stock/receive').send({ lines: [{ partId: pump.id, quantity: 1, lot: LOT_B.toLowerCase() }] }), 201, StockMovesResultSchema)
    ok(await planner.post('/api/stock/receive').send({ lines: [{ partId: pump.id, quantity: 1, lot: LOT_B }] }), 201, StockMovesResultSchema)
    // The packing list: a lot-tracked row with an empty lot cell stops the whole file.
    const bad = refused(await planner.post('/api/stock/receive/csv').send({ csv: `sku,quantity,lot\n${sprayer.sku},8,\n${grommet.sku},4,\n` }), 400)
    expect(bad.message).toMatch(/Nothing was received.*Row 2: .*fill its lot cell/)
    const csv = `SKU,Qty,Lot No\n${sprayer.sku},8,${SPR_1}\n${sprayer.sku},8,${SPR_2}\n${grommet.sku},4,\n`
    const preview = await planner.post('/api/stock/receive/preview').send({ csv })
    expect(preview.status).toBe(200)
    expect(preview.body.rows.map((r: { lot: string | null }) => r.lot)).toEqual([SPR_1, SPR_2, null])
    ok(await planner.post('/api/stock/receive/csv').send({ csv }), 201, StockMovesResultSchema)

    const lots = await t.db.select().from(stockLots).where(eq(stockLots.partId, pump.id))
    expect(lots.map((l) => l.code).sort()).toEqual([LOT_A, LOT_B.toLowerCase()].sort()) // first spelling kept, one row per lot
    const list = ok(await planner.get('/api/lots').query({ q: tag }), 200, LotListSchema)
    const byCode = new Map(list.items.map((l) => [l.code.toUpperCase(), l]))
    expect(byCode.get(LOT_A)).toMatchObject({ received: 2, onHand: 2, units: 0, part: { sku: pump.sku } })
    expect(byCode.get(LOT_B)).toMatchObject({ received: 2, onHand: 2 })
    expect(byCode.get(SPR_1)).toMatchObject({ received: 8, onHand: 8 })
    // The ledger shows the lot of each receipt.
    const ledger = await planner.get('/api/stock/moves').query({ partId: pump.id })
    expect(ledger.body.moves.map((m: { lotCode: string | null }) => (m.lotCode ?? "").toUpperCase()).sort()).toEqual([LOT_A, LOT_B, LOT_B].sort())
  })
})

describe('adjusting a lot-tracked part', () => {
  it('takes the change off the lot named, refusing no lot, an unknown lot or more than its shelf holds, writing nothing then', async () => {
    const before = await countOf(stockMoves)
    const noLot = refused(await planner.post('/api/stock/adjust').send({ partId: pump.id, quantity: -1, reason: 'Damaged' }), 400)
    expect(noLot.fields?.lot).toMatch(/tracked by lot/)
    const unknown = refused(await planner.post('/api/stock/adjust').send({ partId: pump.id, quantity: -1, lot: 'PMP-ZZ', reason: 'Damaged' }), 409)
    expect(unknown.message).toMatch(new RegExp(`No lot "PMP-ZZ" of ${pump.sku} has been received: choose one of `))
    const tooMany = refused(await planner.post('/api/stock/adjust').send({ partId: pump.id, quantity: -3, lot: LOT_B, reason: 'Damaged' }), 409)
    expect(tooMany.message).toMatch(new RegExp(`Cannot take 3 off lot ${LOT_B.toLowerCase()} of ${pump.sku}: only 2 of it are on the shelf`, 'i'))
    expect(await countOf(stockMoves)).toBe(before)
    const id = await lotId(LOT_B.toLowerCase())
    ok(await planner.post('/api/stock/adjust').send({ partId: pump.id, quantity: -1, lot: LOT_B, reason: 'Damaged: cracked housing' }), 201, StockMovesResultSchema)
    expect(ok(await planner.get(`/api/lots/${id}`), 200, LotDetailSchema).onHand).toBe(1)
    ok(await planner.post('/api/stock/adjust').send({ partId: pump.id, quantity: 1, lot: LOT_B, reason: 'Found stock' }), 201, StockMovesResultSchema)
    expect(ok(await planner.get(`/api/lots/${id}`), 200, LotDetailSchema).onHand).toBe(2)
  })
})

let woA: WorkOrderRow
let woB: WorkOrderRow
let woC: WorkOrderRow

describe('the build bench asks for the lot of each lot-tracked part', () => {
  it('offers the lots in stock oldest first, records a scanned lot (any case) and a picked one, and the unit needs them all to be done', async () => {
    woA = await insertBuildWorkOrder(t.db, revision.revision.id, revision.kit.id)
    const first = await lookup(woA)
    expect(first.readiness.lotsMissing).toBe(2)
    const pumpNeed = first.lots.find((l) => l.partId === pump.id)!
    expect(pumpNeed).toMatchObject({ quantity: 1, left: 1, fitted: [] })
    expect(pumpNeed.choices.map((c) => c.code.toUpperCase())).toEqual([LOT_A, LOT_B])
    expect(first.lots.find((l) => l.partId === grommet.id)).toBeUndefined()

    const scanned = ok(await fit(assembler, woA, { partId: pump.id, lotCode: LOT_A.toLowerCase() }), 201, BuildPageSchema)
    expect(scanned.lots.find((l) => l.partId === pump.id)).toMatchObject({ left: 0, choices: [], fitted: [{ lotCode: LOT_A, quantity: 1 }] })
    expect(scanned.workOrder.status).toBe('building') // the first lot starts the build, like the first tick
    // Sprayers from two bags: two of one lot, the rest (two) of the other.
    ok(await fit(assembler, woA, { partId: sprayer.id, lotCode: SPR_1, quantity: 2 }), 201, BuildPageSchema)
    const done = ok(await fit(assembler, woA, { partId: sprayer.id, lotCode: SPR_2 }), 201, BuildPageSchema)
    expect(done.lots.find((l) => l.partId === sprayer.id)!.fitted.map((f) => [f.lotCode, f.quantity])).toEqual([[SPR_1, 2], [SPR_2, 2]])
    expect(done.readiness.lotsMissing).toBe(0)
    // What is fitted is no longer free for the next unit.
    woB = await insertBuildWorkOrder(t.db, revision.revision.id, revision.kit.id)
    const next = await lookup(woB)
    expect(next.lots.find((l) => l.partId === pump.id)!.choices.map((c) => [c.code.toUpperCase(), c.free])).toEqual([[LOT_A, 1], [LOT_B, 2]])
  })

  it('refuses a lot not in stock (409), an unknown part or one not tracked (400), more than is left, and writes nothing', async () => {
    const before = await countOf(unitLots)
    const unknownLot = refused(await fit(assembler, woB, { partId: pump.id, lotCode: 'NOPE-404' }), 409)
    expect(unknownLot.message).toMatch(new RegExp(`No lot "NOPE-404" of ${pump.sku} has been received.*oldest first: ${LOT_A} \\(1 free\\)`, 'i'))
    expect(unknownLot.fields?.lotCode).toBeDefined()
    const unknownPart = refused(await fit(assembler, woB, { partId: randomUUID(), lotCode: LOT_A }), 400)
    expect(unknownPart.message).toMatch(/No such part/)
    const untracked = refused(await fit(assembler, woB, { partId: grommet.id, lotCode: 'G-1' }), 400)
    expect(untracked.message).toMatch(new RegExp(`${grommet.sku} .*is not tracked by lot; this unit's lot-tracked parts: `))
    const tooMany = refused(await fit(assembler, woB, { partId: sprayer.id, lotCode: SPR_1, quantity: 5 }), 400)
    expect(tooMany.message).toMatch(/takes 4 more .*not 5/)
    const blank = refused(await fit(assembler, woB, { partId: pump.id, lotCode: '   ' }), 400)
    expect(blank.fields?.lotCode).toMatch(/scan the supplier's lot/i)
    expect(await countOf(unitLots)).toBe(before)
  })

  it('refuses a lot with nothing free, and lets an assembler undo their own wrong scan', async () => {
    ok(await fit(assembler, woB, { partId: pump.id, lotCode: LOT_A }), 201, BuildPageSchema) // the last free pump of lot A
    woC = await insertBuildWorkOrder(t.db, revision.revision.id, revision.kit.id)
    const empty = refused(await fit(assembler, woC, { partId: pump.id, lotCode: LOT_A }), 409)
    expect(empty.message).toMatch(new RegExp(`Lot ${LOT_A} of ${pump.sku} has 0 free, not 1: fit from another lot`))
    // A wrong scan, undone: the lot is free again and the record keeps the undo.
    const wrong = ok(await fit(assembler, woC, { partId: pump.id, lotCode: LOT_B }), 201, BuildPageSchema)
    const fitId = wrong.lots.find((l) => l.partId === pump.id)!.fitted[0]!.id
    const undone = ok(await assembler.post(`/api/build/${woC.id}/lots/${fitId}/undo`).send({}), 200, BuildPageSchema)
    expect(undone.lots.find((l) => l.partId === pump.id)).toMatchObject({ left: 1, fitted: [] })
    const [row] = await t.db.select().from(unitLots).where(eq(unitLots.id, fitId))
    expect(row!.undoneAt).not.toBeNull()
    refused(await assembler.post(`/api/build/${woC.id}/lots/${fitId}/undo`).send({}), 409)
    ok(await fit(assembler, woC, { partId: pump.id, lotCode: LOT_B }), 201, BuildPageSchema)
    ok(await fit(assembler, woB, { partId: sprayer.id, lotCode: SPR_2 }), 201, BuildPageSchema)
    ok(await fit(assembler, woC, { partId: sprayer.id, lotCode: SPR_1 }), 201, BuildPageSchema)
  })

  it('lists the lots on the internal build record and on the customer\'s record link', async () => {
    const record = ok(await packer.get(`/api/units/${woA.serial}`), 200, UnitRecordSchema)
    expect(record.lots.find((l) => l.partId === sprayer.id)!.fitted.map((f) => [f.lotCode, f.quantity])).toEqual([[SPR_1, 2], [SPR_2, 2]])
    const link = await unitRecordLink(TEST_TOKENS, 'https://shop.example', woA.serial)
    const pub = ok(await request(built.app).get(`/api/public/unit-records/${link.split('/record/')[1]}`), 200, PublicUnitRecordSchema)
    expect(pub.lots).toEqual([
      { sku: pump.sku, name: 'Submersible pump 400 L/h', lotCode: LOT_A, quantity: 1 },
      { sku: sprayer.sku, name: 'Threaded 360° sprayer', lotCode: SPR_1, quantity: 2 },
      { sku: sprayer.sku, name: 'Threaded 360° sprayer', lotCode: SPR_2, quantity: 2 },
    ].sort((a, b) => a.sku.localeCompare(b.sku)))
  })

  it('lets only the bench roles record lots (cutter and packer refused), and only the office open recalls', async () => {
    refused(await fit(cutter, woC, { partId: pump.id, lotCode: LOT_B }), 403)
    refused(await fit(packer, woC, { partId: pump.id, lotCode: LOT_B }), 403)
    const id = await lotId(LOT_A)
    for (const agent of [assembler, cutter, packer]) {
      refused(await agent.get('/api/lots'), 403)
      refused(await agent.get(`/api/lots/${id}`), 403)
      refused(await agent.get(`/api/lots/${id}/recall.csv`), 403)
      refused(await agent.post(`/api/lots/${id}/notify`).send({ message: 'Stop using the pump, please.' }), 403)
    }
    ok(await admin.get(`/api/lots/${id}`), 200, LotDetailSchema)
  })

  it('ships lot-tracked parts off the shelf by the lots fitted into the unit', async () => {
    const moves = [
      { partId: pump.id, kind: 'ship' as const, quantity: -1, workOrderId: woA.id },
      { partId: sprayer.id, kind: 'ship' as const, quantity: -4, workOrderId: woA.id },
      { partId: grommet.id, kind: 'ship' as const, quantity: -1, workOrderId: woA.id },
    ]
    const split = await t.db.transaction((tx) => splitShipMovesByLot(tx, woA.id, moves))
    const lotIds = { a: await lotId(LOT_A), s1: await lotId(SPR_1), s2: await lotId(SPR_2) }
    expect(split.map((m) => [m.partId, m.quantity, m.lotId ?? null])).toEqual([
      [pump.id, -1, lotIds.a],
      [sprayer.id, -2, lotIds.s1],
      [sprayer.id, -2, lotIds.s2],
      [grommet.id, -1, null],
    ])
  })
})

describe('a recall from one lot', () => {
  const shippedAt = new Date('2026-11-20T15:30:00Z')
  it('finds exactly the units built with it across two orders, with customer, shipped date and where it went; the CSV neutralises formulas', async () => {
    // Unit A left the shop: shipped in one parcel with its tracking number.
    const [shipment] = await t.db
      .insert(shipments)
      .values({ orderId: woA.orderId, status: 'shipped', carrier: 'Test carrier', service: 'Ground', trackingNumber: `TRK${tag}A`, shippedAt, createdBy: plannerId })
      .returning()
    await t.db.insert(parcels).values({
      shipmentId: shipment!.id, position: 1, boxName: 'Tote box', length: 1, width: 1, height: 1, workOrderIds: [woA.id],
      estimatedGrams: 9000, actualGrams: 9000, dimensionalGrams: 8000, billableGrams: 9000, sscc: `0${String(Date.now()).padStart(17, '0')}`.slice(0, 18), trackingNumber: `TRK${tag}P1`,
    })
    await t.db.update(orders).set({ customerName: '=HYPERLINK("x") Bea', shipCity: '+Harbour Reach' }).where(eq(orders.id, woB.orderId))
    await t.db.update(workOrders).set({ status: 'shipped' }).where(eq(workOrders.id, woA.id))

    const id = await lotId(LOT_A)
    const detail = ok(await planner.get(`/api/lots/${id}`), 200, LotDetailSchema)
    expect(detail.recall.map((u) => u.serial).sort()).toEqual([woA.serial, woB.serial].sort())
    expect(new Set(detail.recall.map((u) => u.order.id))).toEqual(new Set([woA.orderId, woB.orderId]))
    const a = detail.recall.find((u) => u.serial === woA.serial)!
    expect(a).toMatchObject({ status: 'shipped', shippedAt: shippedAt.toISOString(), trackingNumber: `TRK${tag}P1`, quantity: 1, shipTo: { city: 'Millbrook Falls', country: 'US' }, notifiedAt: null })
    expect(detail.recall.find((u) => u.serial === woB.serial)!.shippedAt).toBeNull()
    expect(detail).toMatchObject({ received: 2, customers: 2, customersNotified: 0 })
    // Lot B went into unit C only.
    const other = ok(await planner.get(`/api/lots/${await lotId(LOT_B.toLowerCase())}`), 200, LotDetailSchema)
    expect(other.recall.map((u) => u.serial)).toEqual([woC.serial])

    const res = await planner.get(`/api/lots/${id}/recall.csv`)
    expect(res.status).toBe(200)
    expect(res.headers['content-type']).toMatch(/text\/csv/)
    expect(res.headers['content-disposition']).toContain(`recall-${LOT_A}.csv`)
    const rows = Papa.parse<Record<string, string>>(res.text.replace(/^\ufeff/, ''), { header: true, skipEmptyLines: true }).data
    expect(rows.map((r) => r.Serial).sort()).toEqual([woA.serial, woB.serial].sort())
    const bRow = rows.find((r) => r.Serial === woB.serial)!
    // OWASP, CSV Injection: a cell starting with = + - @ is prefixed with ' so it shows as text.
    expect(bRow.Customer).toBe(`'=HYPERLINK("x") Bea`)
    expect(bRow.City).toBe(`'+Harbour Reach`)
    expect(rows.find((r) => r.Serial === woA.serial)!['Shipped at']).toBe(shippedAt.toISOString())
  })

  it('refuses a notice without its message, writing nothing', async () => {
    const id = await lotId(LOT_A)
    const e = refused(await planner.post(`/api/lots/${id}/notify`).send({ message: 'stop' }), 400)
    expect(e.fields?.message).toMatch(/Say what the customer should do/)
    expect((await t.db.select({ n: count() }).from(mailMessages).where(like(mailMessages.purpose, 'lot_recall:%')))[0]!.n).toBe(0)
    refused(await planner.post(`/api/lots/${randomUUID()}/notify`).send({ message: 'Please stop using the pump.' }), 404)
  })

  it('"Tell the customers" mails each customer once, however often it is pressed, and records it on each order', async () => {
    const id = await lotId(LOT_A)
    const message = 'Please stop using the pump and reply: we send a new one from another lot.'
    // Two planners press at once, then one presses again.
    const [one, two] = await Promise.all([planner.post(`/api/lots/${id}/notify`).send({ message }), admin.post(`/api/lots/${id}/notify`).send({ message })])
    const results = [one, two].map((r) => {
      expect([200, 201], JSON.stringify(r.body)).toContain(r.status)
      return NotifyRecallResultSchema.parse(r.body)
    })
    expect(results.map((r) => r.queued).sort()).toEqual([0, 2])
    const again = ok(await planner.post(`/api/lots/${id}/notify`).send({ message }), 200, NotifyRecallResultSchema)
    expect(again).toMatchObject({ queued: 0, alreadyTold: 2, detail: { customers: 2, customersNotified: 2 } })
    expect(again.detail.recall.every((u) => u.notifiedAt !== null)).toBe(true)

    await waitForQueueIdle(t.db) // every job done: a stray second send would have landed by now
    const mails = await t.db.select().from(mailMessages).where(eq(mailMessages.purpose, `lot_recall:${id}`))
    expect(mails).toHaveLength(2)
    expect(mails.every((m) => m.status === 'sent')).toBe(true)
    const [orderA] = await t.db.select().from(orders).where(eq(orders.id, woA.orderId))
    const [orderB] = await t.db.select().from(orders).where(eq(orders.id, woB.orderId))
    const caughtA = await caughtFor(orderA!.customerEmail)
    expect(caughtA).toHaveLength(1)
    expect(await caughtFor(orderB!.customerEmail)).toHaveLength(1)
    // The shipped customer is told of the pump in their unit, what to do, and the electrical cautions.
    expect(caughtA[0]!.subject).toBe(`Lantern Row Totes: a notice about the Submersible pump 400 L/h in your order (lot ${LOT_A})`)
    expect(caughtA[0]!.text).toContain(`serial ${woA.serial}`)
    expect(caughtA[0]!.text).toContain(message)
    expect(caughtA[0]!.text).toMatch(/unplug the pump.*local electrical codes/s)
    // Unit C (lot B) is no part of it.
    const [orderC] = await t.db.select().from(orders).where(eq(orders.id, woC.orderId))
    expect(await caughtFor(orderC!.customerEmail)).toHaveLength(0)
    for (const [orderId, n] of [[woA.orderId, 1], [woB.orderId, 1], [woC.orderId, 0]] as const) {
      const events = await t.db.select().from(orderEvents).where(and(eq(orderEvents.orderId, orderId), eq(orderEvents.kind, 'recall')))
      expect(events, orderId).toHaveLength(n)
      if (n) expect(events[0]!.message).toContain(`Recall of lot ${LOT_A}`)
    }
  })

  it('tells a customer again only of a unit built with the lot later, in an order no notice spoke of', async () => {
    const id = await lotId(LOT_A)
    const [orderA] = await t.db.select().from(orders).where(eq(orders.id, woA.orderId))
    // Unit A shipped, so one pump of lot A is free again on paper (2 received, unit B holds the other).
    const woD = await insertBuildWorkOrder(t.db, revision.revision.id, revision.kit.id)
    await t.db.update(orders).set({ customerEmail: orderA!.customerEmail.toUpperCase(), customerName: orderA!.customerName }).where(eq(orders.id, woD.orderId))
    ok(await fit(assembler, woD, { partId: pump.id, lotCode: LOT_A }), 201, BuildPageSchema)
    const before = ok(await planner.get(`/api/lots/${id}`), 200, LotDetailSchema)
    expect(before).toMatchObject({ customers: 2, customersNotified: 1 })
    expect(before.recall.find((u) => u.serial === woD.serial)!.notifiedAt).toBeNull()
    const message = 'Please stop using the pump and reply: we send a new one from another lot.'
    const again = ok(await planner.post(`/api/lots/${id}/notify`).send({ message }), 201, NotifyRecallResultSchema)
    expect(again).toMatchObject({ queued: 1, alreadyTold: 1, detail: { customers: 2, customersNotified: 2 } })
    expect(ok(await planner.post(`/api/lots/${id}/notify`).send({ message }), 200, NotifyRecallResultSchema)).toMatchObject({ queued: 0, alreadyTold: 2 })
    await waitForQueueIdle(t.db)
    const caught = await caughtFor(orderA!.customerEmail)
    expect(caught).toHaveLength(2)
    expect(caught.map((m) => m.text ?? '').filter((text) => text.includes(`serial ${woD.serial}`) && !text.includes(`serial ${woA.serial}`))).toHaveLength(1)
    const events = await t.db.select().from(orderEvents).where(and(eq(orderEvents.orderId, woD.orderId), eq(orderEvents.kind, 'recall')))
    expect(events).toHaveLength(1)
  })
})
