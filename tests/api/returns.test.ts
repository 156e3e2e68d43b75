import { and, eq, isNull, sql } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { BuildPageSchema, UnitRecordSchema } from '@kitwright/shared/build'
import { ApiErrorBodySchema } from '@kitwright/shared/errors'
import { PackViewSchema } from '@kitwright/shared/pack'
import { DEFAULT_RETURN_REASONS } from '@kitwright/shared/returns-status'
import { ReturnLookupSchema, ReturnReasonsSchema, ReturnSchema, ReturnSummarySchema, UnitReturnsSchema, type Return } from '@kitwright/shared/returns'
import {
  auditEvents,
  buildSteps,
  buildStepTicks,
  orderEvents,
  orders,
  returnReasons,
  returns,
  reworkEntries,
  stockLots,
  stockMoves,
  unitLots,
  unitPhotos,
  workOrders,
} from '../../server/src/db/schema/index'
import { lotTrackedBom } from '../../server/src/features/lots/lots.queries'
import { seedDemo } from '../../server/src/seeds/demo'
import { buildApp, signedInAs } from '../support/app'
import { insertPackOrder, receivePlenty } from '../support/pack-factories'
import { createTestDb, type TestDb } from '../support/test-db'

let t: TestDb
let built: ReturnType<typeof buildApp>
type Agent = Awaited<ReturnType<typeof signedInAs>>['agent']
let admin: Agent
let planner: Agent
let packer: Agent
let assembler: Agent
let cutter: Agent

beforeAll(async () => {
  t = await createTestDb()
  await seedDemo(t.db)
  await receivePlenty(t.db)
  built = buildApp(t)
  admin = (await signedInAs(built.app, t, 'admin')).agent
  planner = (await signedInAs(built.app, t, 'planner')).agent
  packer = (await signedInAs(built.app, t, 'packer')).agent
  assembler = (await signedInAs(built.app, t, 'assembler')).agent
  cutter = (await signedInAs(built.app, t, 'cutter')).agent
})
afterAll(() => t.drop())

function ok<T>(res: { status: number; body: unknown }, status: number, schema: { parse(v: unknown): T }): T {
  expect(res.status, JSON.stringify(res.body)).toBe(status)
  return schema.parse(res.body)
}
function error(res: { status: number; body: unknown }, status: number) {
  expect(res.status, JSON.stringify(res.body)).toBe(status)
  return ApiErrorBodySchema.parse(res.body).error
}
const returnView = (res: { status: number; body: unknown }, status = 200): Return => ok(res, status, ReturnSchema)

/** Row counts of what a return writes, to show a refusal wrote nothing. */
async function counts() {
  const n = async (table: typeof returns | typeof reworkEntries | typeof orders | typeof orderEvents | typeof workOrders) =>
    Number((await t.db.select({ n: sql<number>`count(*)` }).from(table))[0]!.n)
  return { returns: await n(returns), rework: await n(reworkEntries), orders: await n(orders), events: await n(orderEvents), workOrders: await n(workOrders) }
}

/** Through the pack bench's own routes: every item confirmed, the label bought, shipped. */
async function packAndShip(orderId: string) {
  let v = ok(await packer.get(`/api/pack/orders/${orderId}`), 200, PackViewSchema)
  for (const item of v.items) {
    if (item.check) continue
    v = ok(
      item.kind === 'unit'
        ? await packer.post(`/api/pack/orders/${orderId}/scan`).send({ code: item.binCode ?? item.serial })
        : await packer.post(`/api/pack/orders/${orderId}/tick`).send({ itemKey: item.key }),
      200,
      PackViewSchema,
    )
  }
  expect(v.canLabel, v.blockers.join('; ')).toBe(true)
  const parcels = v.parcels.map((p) => ({ workOrderIds: p.workOrderIds, boxId: p.boxId!, scaleGrams: null }))
  ok(await packer.post(`/api/pack/orders/${orderId}/label`).send({ service: 'ground', parcels }), 201, PackViewSchema)
  const shipped = await packer.post(`/api/pack/orders/${orderId}/ship`).send({})
  expect(shipped.status, JSON.stringify(shipped.body)).toBe(200)
}

/** On hand per part (the ledger's sum of on-hand moves), for the parts given. */
async function onHand(partIds: string[]) {
  const { rows } = await t.db.execute<{ part_id: string; n: number }>(
    sql`select part_id, coalesce(sum(quantity) filter (where kind not in ('reserve', 'release')), 0)::int as n from stock_moves where part_id in (${sql.join(
      partIds.map((id) => sql`${id}::uuid`),
      sql`, `,
    )}) group by part_id order by part_id`,
  )
  return Object.fromEntries(rows.map((r) => [r.part_id, Number(r.n)]))
}

/**
 * A unit of MW-TOTE-6C as the benches leave it: every step ticked, its photos taken, leak test
 * passed (the factory), then packed, labelled and shipped through the pack bench's own routes.
 */
async function shippedUnit() {
  const made = await insertPackOrder(t.db, [{ kitSku: 'MW-TOTE-6C' }])
  const unit = made.units[0]!
  const [tester] = await t.db.select().from(workOrders).where(eq(workOrders.id, unit.wo.id))
  const steps = await t.db.select().from(buildSteps).where(eq(buildSteps.revisionId, tester!.kitRevisionId))
  const [someone] = await t.db.execute<{ id: string }>(sql`select id from users limit 1`).then((r) => r.rows)
  for (const s of steps) {
    await t.db
      .insert(buildStepTicks)
      .values({
        workOrderId: unit.wo.id,
        buildStepId: s.id,
        tickedBy: someone!.id,
        measurement: s.measurementRequired ? String(Number(s.measurementMin ?? s.measurementMax ?? 1)) : null,
      })
    if (s.photoRequired)
      await t.db
        .insert(unitPhotos)
        .values({
          workOrderId: unit.wo.id,
          buildStepId: s.id,
          key: `photos/${unit.wo.serial}/${s.id}.jpg`,
          contentType: 'image/jpeg',
          size: 1000,
          uploadedBy: someone!.id,
          uploadedAt: new Date(),
        })
  }
  // The supplier's lot of each lot-tracked part, recorded as the bench's lot prompt records it.
  for (const b of await lotTrackedBom(t.db, tester!.kitRevisionId)) {
    const [lot] = await t.db
      .insert(stockLots)
      .values({ partId: b.partId, code: `RET-${unit.wo.serial}-${b.sku}` })
      .returning()
    await t.db.insert(unitLots).values({ workOrderId: unit.wo.id, partId: b.partId, lotId: lot!.id, quantity: b.quantity, fittedBy: someone!.id })
  }
  await packAndShip(made.order.id)
  const [wo] = await t.db.select().from(workOrders).where(eq(workOrders.id, unit.wo.id))
  expect(wo!.status).toBe('shipped')
  return { order: made.order, wo: wo!, steps: steps.sort((a, b) => a.position - b.position) }
}

const open = (agent: Agent, serial: string, reason = 'Leaks', notes: string | null = 'Drips at the drain grommet after a day') =>
  agent.post('/api/returns').send({ serial, reason, notes })

describe('a return through repair and retest', () => {
  it('opens by serial, buys its label, is received by the label scan, goes to the build bench, and is ready only after a new leak test', async () => {
    const { order, wo, steps } = await shippedUnit()
    const bomParts = (
      await t.db
        .select({ partId: stockMoves.partId })
        .from(stockMoves)
        .where(and(eq(stockMoves.workOrderId, wo.id), eq(stockMoves.kind, 'ship')))
    ).map((m) => m.partId)
    const shelfAfterFirstShip = await onHand([...new Set(bomParts)])
    // The scan names the unit (by serial and by order number).
    const bySerial = ok(await planner.get('/api/returns/lookup').query({ code: wo.serial.toLowerCase() }), 200, ReturnLookupSchema)
    expect(bySerial.units.map((u) => u.serial)).toEqual([wo.serial])
    const byOrder = ok(await planner.get('/api/returns/lookup').query({ code: order.number }), 200, ReturnLookupSchema)
    expect(byOrder.units.map((u) => u.serial)).toEqual([wo.serial])

    const opened = returnView(await open(planner, wo.serial), 201)
    expect(opened).toMatchObject({
      status: 'awaiting_parcel',
      reason: 'Leaks',
      unit: { serial: wo.serial, kitSku: 'MW-TOTE-6C' },
      label: { status: 'none' },
      received: null,
      decision: null,
    })
    expect(opened.number).toMatch(/^R-\d+$/)

    // A decision before the parcel is back is refused, and writes nothing.
    const before = await counts()
    expect(error(await planner.post(`/api/returns/${opened.id}/decision`).send({ decision: 'repair', reopenStepIds: [] }), 409).message).toBe(
      `Return ${opened.number} has not been received yet: decide once the packer has scanned the parcel in`,
    )
    expect(await counts()).toEqual(before)

    const labelled = returnView(await planner.post(`/api/returns/${opened.id}/label`).send({ service: 'ground' }), 201)
    expect(labelled.label).toMatchObject({ status: 'bought', carrier: 'Brindlepost', service: 'ground' })
    expect(labelled.label.trackingNumber).toMatch(/^BP\d+$/)
    const pdf = await planner.get(`/api/returns/${opened.id}/label.pdf`)
    expect(pdf.status).toBe(200)
    expect(pdf.headers['content-type']).toBe('application/pdf')

    // The packer scans the return label's barcode.
    const received = returnView(await packer.post('/api/returns/receive').send({ code: labelled.label.trackingNumber }))
    expect(received.status).toBe('received')
    expect(received.received?.code).toBe(labelled.label.trackingNumber)
    expect(error(await packer.post('/api/returns/receive').send({ code: wo.serial }), 409).message).toMatch(
      new RegExp(`^Return ${opened.number} was already received on `),
    )

    // Repair, reopening one step that takes no measurement and no photo.
    const redo = steps.find((s) => !s.measurementRequired && !s.photoRequired)!
    const decided = returnView(
      await planner.post(`/api/returns/${opened.id}/decision`).send({ decision: 'repair', reopenStepIds: [redo.id], note: 'Reseat the grommet' }),
    )
    expect(decided.status).toBe('repair')
    expect(decided.decision).toMatchObject({
      kind: 'repair',
      note: 'Reseat the grommet',
      repaired: false,
      reopenedSteps: [{ id: redo.id, position: redo.position }],
    })
    expect(decided.unit.status).toBe('rework')
    const standing = await t.db
      .select()
      .from(buildStepTicks)
      .where(and(eq(buildStepTicks.workOrderId, wo.id), eq(buildStepTicks.buildStepId, redo.id), isNull(buildStepTicks.undoneAt)))
    expect(standing).toHaveLength(0)

    // The assembler finds it at the build bench by its serial; the old passed test does not make it ready.
    let page = ok(await assembler.get('/api/build/lookup').query({ code: wo.serial }), 200, BuildPageSchema)
    expect(page.readiness).toMatchObject({ stepsLeft: 1, openRework: 1, leakTest: 'passed', ready: false })
    const retestTooSoon = await assembler
      .post(`/api/build/${wo.id}/leak-tests`)
      .send({ unit: 'psi', startPressure: 15, endPressure: 14.6, holdMinutes: 10, waterVolumeMl: 30_000, leaks: [] })
    expect(error(retestTooSoon, 409).message).toBe(`The leak test comes after every build step: tick step ${redo.position} of unit ${wo.serial} first`)
    page = ok(await assembler.post(`/api/build/${wo.id}/steps/${redo.id}/tick`).send({}), 200, BuildPageSchema)
    expect(page.readiness).toMatchObject({ stepsLeft: 0, openRework: 1, ready: false })
    expect(page.workOrder.status).toBe('rework')
    // The retest: attempt 2, passed (15 psi held at 14.6 psi for 10 min: a 0.4 psi drop, within the demo protocol's 0.5 psi).
    page = ok(
      await assembler
        .post(`/api/build/${wo.id}/leak-tests`)
        .send({ unit: 'psi', startPressure: 15, endPressure: 14.6, holdMinutes: 10, waterVolumeMl: 30_000, leaks: [] }),
      201,
      BuildPageSchema,
    )
    expect(page.leakTests.map((l) => [l.attempt, l.passed])).toEqual([
      [1, true],
      [2, true],
    ])
    expect(page.readiness).toMatchObject({ stepsLeft: 0, photosMissing: 0, openRework: 0, leakTest: 'passed', ready: true })
    expect(page.workOrder.status).toBe('built')

    const after = returnView(await planner.get(`/api/returns/${opened.id}`))
    expect(after.decision?.repaired).toBe(true)
    // A repaired unit goes back to the customer: there is nothing to dispose of.
    expect(error(await planner.post(`/api/returns/${opened.id}/disposition`).send({ disposition: 'spare' }), 409).message).toBe(
      `Unit ${wo.serial} of return ${opened.number} was sent for repair and goes back to the customer; there is nothing to dispose of`,
    )

    // Back to the customer through the pack bench: the order was open again for this unit, and is shipped again.
    await packAndShip(order.id)
    const [reshipped] = await t.db.select().from(orders).where(eq(orders.id, order.id))
    expect(reshipped!.status).toBe('shipped')
    // The ledger nets to nothing over the return and the second shipment: the parts came back inside the unit and left in it again.
    expect(await onHand([...new Set(bomParts)])).toEqual(shelfAfterFirstShip)

    // The build record: original build, the return, the repair (undone tick, rework entry resolved), the retest.
    const record = ok(await assembler.get(`/api/units/${wo.serial}`), 200, UnitRecordSchema)
    const redoStep = record.steps.find((s) => s.id === redo.id)!
    expect(redoStep.history).toHaveLength(2)
    expect(redoStep.history[0]!.undoneAt).not.toBeNull()
    expect(record.rework.find((r) => r.reason.startsWith(`Returned on ${opened.number} (Leaks)`))?.resolvedAt).not.toBeNull()
    const unitReturns = ok(await assembler.get(`/api/returns/units/${wo.serial}`), 200, UnitReturnsSchema)
    expect(unitReturns.returns).toMatchObject([{ number: opened.number, status: 'repair', reason: 'Leaks' }])
    const timeline = await t.db.select({ kind: orderEvents.kind }).from(orderEvents).where(eq(orderEvents.orderId, order.id))
    expect(timeline.map((e) => e.kind)).toEqual(expect.arrayContaining(['return_opened', 'return_label_bought', 'return_received', 'return_decided']))
  })
})

describe('a return through replace', () => {
  it('releases a new unit on a replacement order through the normal release, its stock reserved', async () => {
    const { order, wo } = await shippedUnit()
    const opened = returnView(await open(admin, wo.serial, 'arrived damaged', null), 201)
    expect(opened.reason).toBe('Arrived damaged')
    // Received by the serial (no label bought: the customer brought it to the counter).
    returnView(await packer.post('/api/returns/receive').send({ code: wo.serial }))
    const decided = returnView(await planner.post(`/api/returns/${opened.id}/decision`).send({ decision: 'replace', note: 'Tote cracked in transit' }))
    expect(decided.status).toBe('replace')
    const replacement = decided.decision!.replacement!
    expect(replacement.orderNumber).toBe(`${order.number}-${opened.number}`)
    expect(replacement.serial).toMatch(/^U-\d+$/)
    expect(replacement.serial).not.toBe(wo.serial)
    const [newOrder] = await t.db.select().from(orders).where(eq(orders.id, replacement.orderId))
    expect(newOrder).toMatchObject({ source: 'replacement', status: 'released', paymentStatus: 'paid', totalCents: 0, shipPostalCode: order.shipPostalCode })
    const [newWo] = await t.db.select().from(workOrders).where(eq(workOrders.id, replacement.workOrderId))
    expect(newWo!.status).toBe('waiting_cut')
    // The normal release reserves the hardware and packaging of the unit's BOM.
    const reserved = await t.db
      .select()
      .from(stockMoves)
      .where(and(eq(stockMoves.workOrderId, replacement.workOrderId), eq(stockMoves.kind, 'reserve')))
    expect(reserved.length).toBeGreaterThan(0)
    // The returned unit stays as it was; a second return of it is refused (the customer no longer has it).
    expect(error(await open(planner, wo.serial), 409).message).toBe(
      `Unit ${wo.serial} came back on return ${opened.number} (Replacement made); the customer no longer has it`,
    )
    // A decided return cannot be decided again.
    expect(
      error(await planner.post(`/api/returns/${opened.id}/decision`).send({ decision: 'refund', amountCents: 100, note: 'changed our minds' }), 409).message,
    ).toBe(`Return ${opened.number} is already decided (Replacement made)`)

    // What becomes of the returned unit: the office's call, as the decision is.
    const shipped = (
      await t.db
        .select({ partId: stockMoves.partId })
        .from(stockMoves)
        .where(and(eq(stockMoves.workOrderId, wo.id), eq(stockMoves.kind, 'ship')))
    ).map((m) => m.partId)
    const shelf = await onHand([...new Set(shipped)])
    const spare = { disposition: 'spare', note: 'Spares shelf S1; tote scuffed' }
    for (const agent of [cutter, assembler, packer]) expect((await agent.post(`/api/returns/${opened.id}/disposition`).send(spare)).status).toBe(403)
    // A double tap: two requests at once record one disposition, one timeline entry and one audit entry.
    const [first, second] = await Promise.all([1, 2].map(() => planner.post(`/api/returns/${opened.id}/disposition`).send(spare)))
    for (const res of [first!, second!])
      expect(returnView(res).disposition).toMatchObject({ kind: 'spare', note: 'Spares shelf S1; tote scuffed', by: { name: expect.any(String) } })
    const disposedEvents = await t.db
      .select()
      .from(orderEvents)
      .where(and(eq(orderEvents.orderId, order.id), eq(orderEvents.kind, 'return_unit_disposed')))
    expect(disposedEvents.map((e) => e.message)).toEqual([
      `Return ${opened.number}: unit ${wo.serial} back to stock as a spare (kept whole on the spares shelf under its serial): Spares shelf S1; tote scuffed`,
    ])
    const audits = await t.db
      .select()
      .from(auditEvents)
      .where(and(eq(auditEvents.action, 'return.dispose'), eq(auditEvents.entityId, opened.id)))
    expect(audits).toHaveLength(1)
    // Once recorded, a different disposition is refused and changes nothing.
    const changed = error(await admin.post(`/api/returns/${opened.id}/disposition`).send({ disposition: 'scrapped', note: 'Changed our minds' }), 409)
    expect(changed.message).toMatch(new RegExp(`^Unit ${wo.serial} of return ${opened.number} is already recorded as back to stock as a spare \\([A-Z][a-z]{2} \\d{1,2}, \\d{4}, \\d{1,2}:\\d{2} [AP]M UTC\\); it is recorded once$`))
    const [row] = await t.db.select().from(returns).where(eq(returns.id, opened.id))
    expect(row).toMatchObject({ disposition: 'spare', dispositionNote: 'Spares shelf S1; tote scuffed' })
    // The stock ledger counts parts, not finished units: keeping the unit as a spare moves no stock.
    expect(await onHand([...new Set(shipped)])).toEqual(shelf)
    // The build record's history says what became of the unit.
    const history = ok(await assembler.get(`/api/returns/units/${wo.serial}`), 200, UnitReturnsSchema)
    expect(history.returns).toMatchObject([{ number: opened.number, status: 'replace', disposition: 'spare', dispositionNote: 'Spares shelf S1; tote scuffed' }])
    expect(history.returns[0]!.disposedAt).not.toBeNull()
  })

  it('notes a refund with its amount and note; the money moves in the store', async () => {
    const { wo } = await shippedUnit()
    const opened = returnView(await open(planner, wo.serial, 'Changed mind', null), 201)
    returnView(await packer.post('/api/returns/receive').send({ code: wo.serial }))
    const decided = returnView(
      await planner.post(`/api/returns/${opened.id}/decision`).send({ decision: 'refund', amountCents: 0, note: 'Refunded in the store, ref 5521' }),
    )
    expect(decided).toMatchObject({ status: 'refund', decision: { kind: 'refund', refundCents: 0, note: 'Refunded in the store, ref 5521' } })

    // Scrapped needs a reason; a bad choice is refused with what to fix, and nothing is written.
    expect(error(await planner.post(`/api/returns/${opened.id}/disposition`).send({ disposition: 'scrapped' }), 400).fields).toEqual({
      note: 'Say why the unit is scrapped',
    })
    expect(error(await planner.post(`/api/returns/${opened.id}/disposition`).send({ disposition: 'scrapped', note: ' ' }), 400).fields).toEqual({
      note: 'Say why the unit is scrapped (e.g. "tote cracked through, not worth a repair")',
    })
    expect(error(await planner.post(`/api/returns/${opened.id}/disposition`).send({ disposition: 'melt' }), 400).message).toBeTruthy()
    expect((await t.db.select().from(returns).where(eq(returns.id, opened.id)))[0]).toMatchObject({ disposition: null, disposedAt: null })
    const scrapped = returnView(
      await planner.post(`/api/returns/${opened.id}/disposition`).send({ disposition: 'scrapped', note: 'Pump housing cracked, not worth a repair' }),
    )
    expect(scrapped.disposition).toMatchObject({ kind: 'scrapped', note: 'Pump housing cracked, not worth a repair' })
    // A retry of the same request answers the same and records nothing more.
    const retried = returnView(
      await planner.post(`/api/returns/${opened.id}/disposition`).send({ disposition: 'scrapped', note: 'Pump housing cracked, not worth a repair' }),
    )
    expect(retried.disposition).toEqual(scrapped.disposition)
    expect(
      await t.db.$count(auditEvents, and(eq(auditEvents.action, 'return.dispose'), eq(auditEvents.entityId, opened.id))),
    ).toBe(1)
  })
})

describe('the return label is bought exactly once', () => {
  it('ten buys at once give one label, and every answer shows it', async () => {
    const { wo } = await shippedUnit()
    const opened = returnView(await open(planner, wo.serial), 201)
    const answers = await Promise.all(Array.from({ length: 10 }, () => planner.post(`/api/returns/${opened.id}/label`).send({ service: 'ground' })))
    const views = answers.map((a) => returnView(a, 201))
    const numbers = new Set(views.map((v) => v.label.trackingNumber))
    expect(numbers.size).toBe(1)
    expect([...numbers][0]).toMatch(/^BP\d+$/)
    const [row] = await t.db.select().from(returns).where(eq(returns.id, opened.id))
    expect(row).toMatchObject({ labelStatus: 'bought', trackingNumber: [...numbers][0] })
    const events = await t.db
      .select()
      .from(orderEvents)
      .where(and(eq(orderEvents.orderId, row!.orderId), eq(orderEvents.kind, 'return_label_bought')))
    expect(events).toHaveLength(1)
    // The carrier's purchase under that key holds the one parcel with that number: nothing else was paid for.
    const label = await built.deps.carrier!.findLabel(row!.carrierRef!)
    expect(label?.parcels.map((p) => p.trackingNumber)).toEqual([...numbers])
  })
})

describe('who may do what', () => {
  it('lets the office open and decide, the packer receive, and refuses the cutter and the assembler', async () => {
    const { wo } = await shippedUnit()
    const before = await counts()
    for (const agent of [cutter, assembler, packer]) expect((await open(agent, wo.serial)).status).toBe(403)
    expect((await cutter.get('/api/returns/lookup').query({ code: wo.serial })).status).toBe(403)
    expect(await counts()).toEqual(before)
    const opened = returnView(await open(planner, wo.serial), 201)
    for (const agent of [cutter, assembler]) expect((await agent.post('/api/returns/receive').send({ code: wo.serial })).status).toBe(403)
    returnView(await packer.post('/api/returns/receive').send({ code: wo.serial }))
    for (const agent of [cutter, assembler, packer])
      expect((await agent.post(`/api/returns/${opened.id}/decision`).send({ decision: 'repair', reopenStepIds: [] })).status).toBe(403)
    returnView(await admin.post(`/api/returns/${opened.id}/decision`).send({ decision: 'repair', reopenStepIds: [] }))
    // The rework itself is the assembler's, at the build bench.
    expect(ok(await assembler.get('/api/build/lookup').query({ code: wo.serial }), 200, BuildPageSchema).workOrder.status).toBe('rework')
    expect((await planner.put('/api/returns/reasons').send({ reasons: ['Leaks'] })).status).toBe(403)
  })
})

describe('bad input', () => {
  it('refuses an unknown serial, a unit never shipped, a reason not on the list and a bad refund, writing nothing', async () => {
    const before = await counts()
    expect(error(await open(planner, 'U-999999'), 404).message).toBe('No unit with serial "U-999999": check the label on the unit and type it again')
    expect(error(await planner.get('/api/returns/lookup').query({ code: 'NOPE-1' }), 404).message).toBe(
      'No unit with serial "NOPE-1" and no order numbered "NOPE-1": check the label or the packing slip and scan again',
    )
    const made = await insertPackOrder(t.db, [{ kitSku: 'MW-TOTE-6C' }])
    const atBench = made.units[0]!.wo
    const afterInsert = await counts()
    const refused = error(await open(planner, atBench.serial), 409)
    expect(refused.message).toBe(`Unit ${atBench.serial} has not shipped (it is built in the shop); only a unit the customer has can be returned`)
    expect(error(await planner.get('/api/returns/lookup').query({ code: made.order.number }), 409).message).toBe(
      `Order ${made.order.number} has no shipped unit; only a unit the customer has can be returned`,
    )
    expect(await counts()).toEqual(afterInsert)
    expect(afterInsert.returns).toBe(before.returns)

    const { wo } = await shippedUnit()
    const start = await counts()
    const badReason = error(await open(planner, wo.serial, 'Wrong colour'), 400)
    expect(badReason.fields).toEqual({ reason: "Choose one of the shop's reasons" })
    expect(error(await planner.post('/api/returns').send({ serial: '', reason: '' }), 400).fields).toMatchObject({
      serial: 'Scan or type a serial or an order number',
      reason: 'Choose a reason',
    })
    expect(error(await packer.post('/api/returns/receive').send({ code: 'BP000000000' }), 404).message).toBe(
      'No return label or serial "BP000000000": scan the return label\'s barcode or the serial on the unit',
    )
    expect(error(await packer.post('/api/returns/receive').send({ code: wo.serial }), 404).message).toBe(
      `Unit ${wo.serial} has no return opened; ask the office to open one before it is received`,
    )
    expect(await counts()).toEqual(start)

    const opened = returnView(await open(planner, wo.serial), 201)
    expect(error(await open(planner, wo.serial), 409).message).toBe(
      `Unit ${wo.serial} already has return ${opened.number} (Waiting for the parcel); open that one`,
    )
    // No disposition of a unit not yet back, nor of one not yet decided.
    const beforeDisposal = await counts()
    expect(error(await planner.post(`/api/returns/${opened.id}/disposition`).send({ disposition: 'spare' }), 409).message).toBe(
      `Unit ${wo.serial} of return ${opened.number} has not been received yet: the pack bench scans the parcel in first, then the office decides`,
    )
    returnView(await packer.post('/api/returns/receive').send({ code: wo.serial }))
    expect(error(await planner.post(`/api/returns/${opened.id}/disposition`).send({ disposition: 'spare' }), 409).message).toBe(
      `Return ${opened.number} is not decided yet: decide replace or refund first, then what becomes of unit ${wo.serial}`,
    )
    expect(error(await planner.post('/api/returns/00000000-0000-4000-8000-000000000000/disposition').send({ disposition: 'spare' }), 404).message).toBe(
      'No such return',
    )
    expect((await counts()).events).toBe(beforeDisposal.events + 1) // the receiving only
    const mid = await counts()
    expect(error(await planner.post(`/api/returns/${opened.id}/decision`).send({ decision: 'refund', amountCents: -5, note: 'x' }), 400).fields).toMatchObject({
      amountCents: 'The amount cannot be negative',
    })
    expect(
      error(await planner.post(`/api/returns/${opened.id}/decision`).send({ decision: 'repair', reopenStepIds: ['00000000-0000-4000-8000-000000000000'] }), 400)
        .fields,
    ).toEqual({ reopenStepIds: 'Choose steps of this unit' })
    expect(error(await planner.post(`/api/returns/${opened.id}/decision`).send({ decision: 'scrap' }), 400).message).toBeTruthy()
    expect(await counts()).toEqual(mid)
    const [row] = await t.db.select().from(returns).where(eq(returns.id, opened.id))
    expect(row).toMatchObject({ status: 'received', decision: null })
  })
})

describe("the shop's reasons and the owner's summary", () => {
  it('starts from the defaults, lets the owner set its own list, and counts returns per kit revision and reason', async () => {
    await t.db.delete(returnReasons)
    expect(ok(await packer.get('/api/returns/reasons'), 200, ReturnReasonsSchema)).toEqual({ reasons: [...DEFAULT_RETURN_REASONS], defaults: true })
    expect(error(await admin.put('/api/returns/reasons').send({ reasons: ['Leaks', 'leaks'] }), 400).fields).toEqual({ reasons: 'Each reason once' })
    expect(error(await admin.put('/api/returns/reasons').send({ reasons: [] }), 400).fields).toEqual({ reasons: 'Keep at least one reason' })
    const saved = ok(
      await admin.put('/api/returns/reasons').send({ reasons: ['Leaks', 'Pump dead on arrival', 'Missing part', 'Changed mind', 'Arrived damaged'] }),
      200,
      ReturnReasonsSchema,
    )
    expect(saved).toEqual({ reasons: ['Leaks', 'Pump dead on arrival', 'Missing part', 'Changed mind', 'Arrived damaged'], defaults: false })
    const { wo } = await shippedUnit()
    returnView(await open(planner, wo.serial, 'Pump dead on arrival', null), 201)
    const summary = ok(await planner.get('/api/returns/summary'), 200, ReturnSummarySchema)
    const pump = summary.rows.find((r) => r.reason === 'Pump dead on arrival')
    expect(pump).toMatchObject({ kitSku: 'MW-TOTE-6C', returns: 1 })
    // Hand count: every MW-TOTE-6C return of this file so far is on this one revision, one row per reason.
    const byHand = await t.db.execute<{ reason: string; n: number }>(
      sql`select r.reason, count(*)::int as n from returns r join work_orders w on w.id = r.work_order_id join kit_revisions kr on kr.id = w.kit_revision_id join kits k on k.id = kr.kit_id where k.sku = 'MW-TOTE-6C' group by r.reason`,
    )
    for (const h of byHand.rows) expect(summary.rows.find((r) => r.kitSku === 'MW-TOTE-6C' && r.reason === h.reason)?.returns).toBe(Number(h.n))
    expect(summary.open).toBeGreaterThanOrEqual(1)
    await t.db.delete(returnReasons)
  })
})
