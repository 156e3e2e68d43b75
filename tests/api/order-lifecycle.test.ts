import { and, eq, inArray, sql } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { CutRunDetailSchema, type CutRunDetail } from '@kitwright/shared/cut-runs'
import { addWorkingDays } from '@kitwright/shared/domain/working-days'
import { ApiErrorBodySchema } from '@kitwright/shared/errors'
import { orderStage } from '@kitwright/shared/order-stage'
import { OrderDetailSchema, OrdersPageSchema, type NewOrderDraft, type OrderDetail } from '@kitwright/shared/orders'
import { ShopSettingsSchema } from '@kitwright/shared/settings'
import { ReleaseResultSchema } from '@kitwright/shared/work-orders'
import { auditEvents, bins, cutRunCuts, offcuts, parts, shopSettings, stockMoves, workOrders } from '../../server/src/db/schema/index'
import { seedDemo } from '../../server/src/seeds/demo'
import { buildApp, signedInAs } from '../support/app'
import { insertBin } from '../support/build-factories'
import { buildNewOrder } from '../support/order-factories'
import { createTestDb, type TestDb } from '../support/test-db'

type Agent = Awaited<ReturnType<typeof signedInAs>>['agent']
let t: TestDb
let app: ReturnType<typeof buildApp>['app']
let planner: Agent
let plannerName: string
let admin: Agent
let cutter: Agent
let packer: Agent

beforeAll(async () => {
  t = await createTestDb()
  app = buildApp(t).app
  await seedDemo(t.db)
  const p = await signedInAs(app, t, 'planner')
  planner = p.agent
  plannerName = p.user.name
  admin = (await signedInAs(app, t, 'admin')).agent
  cutter = (await signedInAs(app, t, 'cutter')).agent
  packer = (await signedInAs(app, t, 'packer')).agent
  // Plenty of every demo part, so releases and cut runs are never short here.
  const all = await t.db.select({ id: parts.id, kind: parts.kind, stickLengths: parts.stickLengths }).from(parts)
  await t.db.insert(stockMoves).values(all.map((p) => ({ partId: p.id, kind: 'receive' as const, quantity: 1000, stickLength: p.kind === 'stock_length' ? p.stickLengths[0]! : null })))
})
afterAll(() => t.drop())

async function postOrder(draft: NewOrderDraft): Promise<OrderDetail> {
  const res = await planner.post('/api/orders').send(draft)
  expect(res.status, JSON.stringify(res.body)).toBe(201)
  return OrderDetailSchema.parse(res.body)
}
async function detail(id: string) {
  const res = await planner.get(`/api/orders/${id}`)
  expect(res.status).toBe(200)
  return OrderDetailSchema.parse(res.body)
}
async function release(id: string) {
  const res = await planner.post('/api/orders/release').send({ orderIds: [id] })
  expect(res.status, JSON.stringify(res.body)).toBe(200)
  return ReleaseResultSchema.parse(res.body).released[0]!
}
async function listed(query: Record<string, string>) {
  const res = await planner.get('/api/orders').query({ pageSize: 100, ...query })
  expect(res.status, JSON.stringify(res.body)).toBe(200)
  return OrdersPageSchema.parse(res.body)
}
/** The order as the list shows it, found by its number. */
async function row(number: string) {
  const page = await listed({ q: number })
  return page.items.find((o) => o.number === number)
}
/** Reserved minus released for these work orders, per part. */
async function heldFor(workOrderIds: string[]) {
  const rows = await t.db
    .select({ partId: stockMoves.partId, qty: sql<number>`sum(${stockMoves.quantity})::int` })
    .from(stockMoves)
    .where(and(inArray(stockMoves.workOrderId, workOrderIds), inArray(stockMoves.kind, ['reserve', 'release'])))
    .groupBy(stockMoves.partId)
  return rows
}
function errorOf(body: unknown) {
  return ApiErrorBodySchema.parse(body).error
}

describe('the promised ship date', () => {
  it('is never sooner than the shop lead time after the placed day when the order brings none; a given date is kept', async () => {
    const [settings] = await t.db.select().from(shopSettings)
    expect(settings!.leadTimeDays).toBe(7)
    // Placed now, with a short queue (the demo shop's few units): the 7 working days of lead time bind.
    const now = new Date()
    const bare = await postOrder(buildNewOrder({ placedAt: now.toISOString(), promisedShipDate: undefined }))
    expect(bare.promisedShipDate).toBe(addWorkingDays(now.toISOString().slice(0, 10), 7))
    expect(bare.events[0]!.message).toContain("the shop's minimum lead time of 7 working days")
    const given = await postOrder(buildNewOrder({ placedAt: '2026-03-02T09:15:00Z', promisedShipDate: '2026-04-01' }))
    expect(given.promisedShipDate).toBe('2026-04-01')

    // The admin shortens the lead time: the next order is promised sooner.
    expect((await admin.patch('/api/settings').send({ leadTimeDays: 2 })).status).toBe(200)
    try {
      const sooner = await postOrder(buildNewOrder({ placedAt: now.toISOString(), promisedShipDate: undefined }))
      expect(sooner.promisedShipDate! < bare.promisedShipDate!).toBe(true)
    } finally {
      await admin.patch('/api/settings').send({ leadTimeDays: 7 })
    }
  })
})

describe('priority and late orders', () => {
  it('lets a planner mark an order rush, sorts rush first and filters by it, on the timeline with who', async () => {
    const a = await postOrder(buildNewOrder())
    const b = await postOrder(buildNewOrder())
    const res = await planner.patch(`/api/orders/${b.id}`).send({ priority: 'rush' })
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    const after = OrderDetailSchema.parse(res.body)
    expect(after.priority).toBe('rush')
    expect(after.events.at(-1)).toMatchObject({ kind: 'priority', message: 'Priority set to rush (was normal).', actorName: plannerName })

    const sorted = await listed({ sort: 'priority', dir: 'asc' })
    const firstNormal = sorted.items.findIndex((o) => o.priority === 'normal')
    const lastRush = sorted.items.map((o) => o.priority).lastIndexOf('rush')
    expect(lastRush).toBeGreaterThanOrEqual(0)
    expect(lastRush).toBeLessThan(firstNormal)
    const rushOnly = await listed({ priority: 'rush' })
    expect(rushOnly.items.map((o) => o.number)).toContain(b.number)
    expect(rushOnly.items.map((o) => o.number)).not.toContain(a.number)
    expect(rushOnly.items.every((o) => o.priority === 'rush')).toBe(true)

    const bad = await planner.patch(`/api/orders/${a.id}`).send({ priority: 'urgent' })
    expect(bad.status).toBe(400)
    expect(errorOf(bad.body).fields?.priority).toMatch(/normal, rush/)
    expect((await planner.patch(`/api/orders/${a.id}`).send({})).status).toBe(400)
    expect((await cutter.patch(`/api/orders/${a.id}`).send({ priority: 'rush' })).status).toBe(403)
  })

  it('flags an order late once its promised date has passed, on the list and the detail, until it is cancelled', async () => {
    const o = await postOrder(buildNewOrder())
    expect((await row(o.number))!.late).toBe(false)
    const res = await planner.patch(`/api/orders/${o.id}`).send({ promisedShipDate: '2020-01-06' })
    expect(res.status).toBe(200)
    expect(OrderDetailSchema.parse(res.body)).toMatchObject({ promisedShipDate: '2020-01-06', late: true })
    expect((await row(o.number))!.late).toBe(true)
    const lateOnly = await listed({ late: 'true' })
    expect(lateOnly.items.map((x) => x.number)).toContain(o.number)
    expect(lateOnly.items.every((x) => x.late)).toBe(true)
    // The work orders are due on the promised date.
    const released = await release(o.id)
    const due = await t.db.select({ due: workOrders.dueDate }).from(workOrders).where(eq(workOrders.orderId, o.id))
    expect(due.map((d) => d.due)).toEqual(released.workOrders.map(() => '2020-01-06'))
    expect((await planner.post(`/api/orders/${o.id}/cancel`).send({ reason: 'Customer moved away' })).status).toBe(200)
    expect((await detail(o.id)).late).toBe(false)
  })
})

describe('the stage of an order', () => {
  it('goes received → released → in production → ready to pack, read from the work orders the same way in the list and the detail', async () => {
    const o = await postOrder(buildNewOrder({ lines: [{ kitSku: 'MW-TOTE-6C', quantity: 2, unitPriceCents: 100 }] }))
    const check = async (stage: string) => {
      const d = await detail(o.id)
      expect(d.stage).toBe(stage)
      // The list's SQL and the shared function agree.
      expect((await row(o.number))!.stage).toBe(stage)
      expect(orderStage({ status: d.status, onHold: d.onHold, workOrderStatuses: d.workOrders.map((w) => w.status) })).toBe(stage)
      expect((await listed({ stage })).items.map((x) => x.number)).toContain(o.number)
    }
    await check('received')
    const released = await release(o.id)
    const [first, second] = released.workOrders
    await check('released')
    await t.db.update(workOrders).set({ status: 'cut' }).where(eq(workOrders.id, first!.id))
    await check('in_production')
    await t.db.update(workOrders).set({ status: 'built' }).where(eq(workOrders.id, first!.id))
    await check('in_production')
    await t.db.update(workOrders).set({ status: 'built' }).where(eq(workOrders.id, second!.id))
    await check('ready_to_pack')
    expect((await planner.post(`/api/orders/${o.id}/hold`).send({ reason: 'Customer asked to wait for a second tote' })).status).toBe(200)
    await check('on_hold')
    expect((await planner.delete(`/api/orders/${o.id}/hold`)).status).toBe(200)
    await check('ready_to_pack')
    expect((await planner.post(`/api/orders/${o.id}/cancel`).send({ reason: 'Customer changed their mind' })).status).toBe(200)
    await check('cancelled')
  })

  it('puts a spare-parts order straight to ready to pack when released', async () => {
    const o = await postOrder(buildNewOrder({ lines: [{ kitSku: 'MW-SPARE-CUP12', quantity: 1, unitPriceCents: 100 }] }))
    await release(o.id)
    expect((await detail(o.id)).stage).toBe('ready_to_pack')
  })

  it('refuses a stage that does not exist, naming the ones that do', async () => {
    const res = await planner.get('/api/orders').query({ stage: 'waiting' })
    expect(res.status).toBe(400)
    expect(errorOf(res.body).fields?.stage).toMatch(/received, released, in_production, ready_to_pack/)
  })
})

describe('on hold', () => {
  it('holds with a reason, refuses release and shipping with 409 saying so, and lets it go again', async () => {
    const o = await postOrder(buildNewOrder())
    const held = await planner.post(`/api/orders/${o.id}/hold`).send({ reason: 'Address to confirm by phone' })
    expect(held.status, JSON.stringify(held.body)).toBe(200)
    expect(OrderDetailSchema.parse(held.body)).toMatchObject({ onHold: true, holdReason: 'Address to confirm by phone', heldByName: plannerName, stage: 'on_hold' })
    expect((await row(o.number))!).toMatchObject({ onHold: true, holdReason: 'Address to confirm by phone' })

    const again = await planner.post(`/api/orders/${o.id}/hold`).send({ reason: 'Twice' })
    expect(again.status).toBe(409)
    expect(errorOf(again.body).message).toMatch(/already on hold/)

    const refused = await planner.post('/api/orders/release').send({ orderIds: [o.id] })
    expect(refused.status).toBe(409)
    expect(errorOf(refused.body).message).toBe(`Order ${o.number} is on hold (Address to confirm by phone); it cannot be released until a planner takes it off hold`)
    expect(await t.db.$count(workOrders, eq(workOrders.orderId, o.id))).toBe(0)

    const lifted = await planner.delete(`/api/orders/${o.id}/hold`)
    expect(lifted.status).toBe(200)
    const after = OrderDetailSchema.parse(lifted.body)
    expect(after).toMatchObject({ onHold: false, holdReason: null, heldAt: null, stage: 'received' })
    expect(after.events.map((e) => e.kind).slice(-2)).toEqual(['held', 'hold_lifted'])
    expect(after.events.at(-2)!.actorName).toBe(plannerName)
    expect((await planner.delete(`/api/orders/${o.id}/hold`)).status).toBe(409)
    await release(o.id)

    // Released and held again: the pack bench cannot ship it.
    expect((await planner.post(`/api/orders/${o.id}/hold`).send({ reason: 'Payment disputed' })).status).toBe(200)
    const ship = await packer.post(`/api/pack/orders/${o.id}/ship`)
    expect(ship.status).toBe(409)
    expect(errorOf(ship.body).message).toMatch(/is on hold \(Payment disputed\); it cannot be shipped until a planner takes it off hold/)
    const view = await packer.get(`/api/pack/orders/${o.id}`)
    expect(JSON.stringify(view.body)).toContain('is on hold (Payment disputed)')

    const actions = await t.db.select({ action: auditEvents.action }).from(auditEvents).where(eq(auditEvents.entityId, o.id))
    expect(actions.map((a) => a.action)).toEqual(expect.arrayContaining(['order.hold', 'order.hold_lift']))
  })

  it('wants a reason, and will not hold a cancelled order; benches may not hold', async () => {
    const o = await postOrder(buildNewOrder())
    const none = await planner.post(`/api/orders/${o.id}/hold`).send({})
    expect(none.status).toBe(400)
    expect(errorOf(none.body).fields?.reason).toBe('Say why the order is on hold')
    expect((await planner.post(`/api/orders/${o.id}/hold`).send({ reason: ' ' })).status).toBe(400)
    expect((await cutter.post(`/api/orders/${o.id}/hold`).send({ reason: 'Not mine to hold' })).status).toBe(403)
    expect((await planner.post(`/api/orders/${o.id}/cancel`).send({ reason: 'Duplicate of a phone order' })).status).toBe(200)
    expect((await planner.post(`/api/orders/${o.id}/hold`).send({ reason: 'Too late' })).status).toBe(409)
  })
})

describe('a planner cancels an order', () => {
  async function planAndPublish(workOrderIds: string[]): Promise<CutRunDetail> {
    const planned = await planner.post('/api/cut-runs').send({ workOrderIds, timeLimitSeconds: 3 })
    expect(planned.status, JSON.stringify(planned.body)).toBe(201)
    const published = await planner.post(`/api/cut-runs/${planned.body.id}/publish`)
    expect(published.status, JSON.stringify(published.body)).toBe(200)
    return CutRunDetailSchema.parse(published.body)
  }

  it('cancels the unshipped work orders, returns their reservations, frees their bins and stocks the pieces already cut as offcuts', async () => {
    const o = await postOrder(buildNewOrder({ lines: [{ kitSku: 'MW-TOTE-6C', quantity: 2, unitPriceCents: 100 }] }))
    const released = await release(o.id)
    const ids = released.workOrders.map((w) => w.id)
    expect((await heldFor(ids)).every((r) => r.qty > 0)).toBe(true)

    // The cutter cuts every piece of the first unit and puts it in a bin, and one piece of the second.
    const run = await planAndPublish(ids)
    const cuts = run.sticks.flatMap((s) => s.cuts)
    const firstCuts = cuts.filter((c) => c.workOrderId === ids[0])
    const secondCut = cuts.find((c) => c.workOrderId === ids[1])!
    for (const c of [...firstCuts, secondCut]) expect((await cutter.post(`/api/cut-runs/${run.id}/cuts/${c.id}/tick`)).status).toBe(200)
    const bin = await insertBin(t.db, null)
    expect((await cutter.post(`/api/cut-runs/${run.id}/bins`).send({ workOrderId: ids[0], code: bin.code })).status).toBe(200)
    expect((await detail(o.id)).workOrders.find((w) => w.id === ids[0])!.status).toBe('cut')

    const res = await planner.post(`/api/orders/${o.id}/cancel`).send({ reason: 'Customer found a local supplier' })
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    const after = OrderDetailSchema.parse(res.body)
    expect(after.status).toBe('cancelled')
    expect(after.workOrders.map((w) => w.status)).toEqual(['cancelled', 'cancelled'])

    // Every reservation of the two units is given back.
    expect((await heldFor(ids)).every((r) => r.qty === 0)).toBe(true)
    // The bin is back on the rack.
    const [binAfter] = await t.db.select().from(bins).where(eq(bins.id, bin.id))
    expect(binAfter).toMatchObject({ status: 'free', workOrderId: null })

    // Each piece cut for them is an offcut of its own length (at or above the shop's minimum), with an offcut_in move.
    const [settings] = await t.db.select().from(shopSettings)
    const cutPieces = await t.db.select().from(cutRunCuts).where(and(inArray(cutRunCuts.workOrderId, ids), eq(cutRunCuts.status, 'cut')))
    expect(cutPieces.length).toBe(firstCuts.length + 1)
    const keep = cutPieces.filter((c) => c.length >= settings!.minOffcut)
    expect(keep.length).toBeGreaterThan(0)
    const moves = await t.db.select().from(stockMoves).where(and(inArray(stockMoves.workOrderId, ids), eq(stockMoves.kind, 'offcut_in')))
    expect(moves).toHaveLength(keep.length)
    expect(moves.every((m) => m.quantity === 1 && m.offcutId !== null)).toBe(true)
    const made = await t.db.select().from(offcuts).where(inArray(offcuts.id, moves.map((m) => m.offcutId!)))
    expect(made.map((m) => m.length).sort((a, b) => a - b)).toEqual(keep.map((c) => c.length).sort((a, b) => a - b))
    expect(made.every((m) => m.status === 'in_stock' && m.note!.includes(`of cancelled order ${o.number}`))).toBe(true)

    const event = after.events.filter((e) => e.kind === 'cancelled').at(-1)!
    expect(event).toMatchObject({ kind: 'cancelled', actorName: plannerName })
    // The customer's cancellation e-mail is queued right after, on the same timeline.
    expect(after.events.at(-1)).toMatchObject({ kind: 'mail_queued', message: expect.stringContaining(`your order ${o.number} is cancelled`) })
    expect(event.message).toContain(`Cancelled by ${plannerName} (Customer found a local supplier).`)
    expect(event.message).toContain(`2 work orders cancelled (${released.workOrders.map((w) => w.serial).join(', ')}) and their reserved stock released.`)
    expect(event.message).toContain(`Bin ${bin.code} freed.`)
    const [audit] = await t.db.select().from(auditEvents).where(and(eq(auditEvents.entityId, o.id), eq(auditEvents.action, 'order.cancel')))
    expect(audit!.summary).toBe(`Cancelled order ${o.number}: Customer found a local supplier`)

    // The second unit's pieces still on the published sheet: named on the timeline, and racked as offcuts when cut.
    const pending = await t.db.select().from(cutRunCuts).where(and(eq(cutRunCuts.workOrderId, ids[1]!), eq(cutRunCuts.status, 'pending')))
    expect(pending.length).toBeGreaterThan(0)
    expect(event.message).toContain(`${pending.length} piece${pending.length === 1 ? ' is' : 's are'} still on a published cut sheet`)
    const longest = pending.reduce((m, c) => (c.length > m.length ? c : m))
    expect(longest.length).toBeGreaterThanOrEqual(settings!.minOffcut)
    expect((await cutter.post(`/api/cut-runs/${run.id}/cuts/${longest.id}/tick`)).status).toBe(200)
    const [late] = await t.db
      .select({ length: offcuts.length, note: offcuts.note })
      .from(stockMoves)
      .innerJoin(offcuts, eq(offcuts.id, stockMoves.offcutId))
      .where(and(eq(stockMoves.workOrderId, ids[1]!), eq(stockMoves.kind, 'offcut_in'), sql`${offcuts.note} like 'Piece cut for cancelled unit%'`))
    expect(late).toEqual({ length: longest.length, note: `Piece cut for cancelled unit ${released.workOrders[1]!.serial} (cut run ${run.number})` })
    expect((await detail(o.id)).workOrders[1]!.status).toBe('cancelled')

    const twice = await planner.post(`/api/orders/${o.id}/cancel`).send({ reason: 'Again' })
    expect(twice.status).toBe(409)
    expect(errorOf(twice.body).message).toBe(`Order ${o.number} is already cancelled`)
  })

  it('wants a reason, refuses a shipped order and keeps the benches out', async () => {
    const o = await postOrder(buildNewOrder())
    const none = await planner.post(`/api/orders/${o.id}/cancel`).send({ reason: '' })
    expect(none.status).toBe(400)
    expect(errorOf(none.body).fields?.reason).toMatch(/Say why the order is cancelled/)
    expect((await packer.post(`/api/orders/${o.id}/cancel`).send({ reason: 'Not mine to cancel' })).status).toBe(403)
    await t.db.execute(sql`update orders set status = 'shipped' where id = ${o.id}`)
    const shipped = await planner.post(`/api/orders/${o.id}/cancel`).send({ reason: 'Too late' })
    expect(shipped.status).toBe(409)
    expect(errorOf(shipped.body).message).toMatch(/has shipped; it cannot be cancelled/)
    expect((await planner.post(`/api/orders/00000000-0000-4000-8000-000000000000/cancel`).send({ reason: 'Nobody' })).status).toBe(404)
  })
})

describe('shop settings for lead time and auto-release', () => {
  it('shows them to everyone signed in, lets only the admin change them, and says what is wrong', async () => {
    const seen = ShopSettingsSchema.parse((await cutter.get('/api/settings')).body)
    expect(seen).toMatchObject({ leadTimeDays: 7, autoReleasePaid: false })
    expect((await planner.patch('/api/settings').send({ autoReleasePaid: true })).status).toBe(403)
    expect((await cutter.patch('/api/settings').send({ leadTimeDays: 3 })).status).toBe(403)
    const negative = await admin.patch('/api/settings').send({ leadTimeDays: -1 })
    expect(negative.status).toBe(400)
    expect(errorOf(negative.body).fields?.leadTimeDays).toBe('Cannot be negative')
    expect(errorOf((await admin.patch('/api/settings').send({ leadTimeDays: 2.5 })).body).fields?.leadTimeDays).toBe('Use a whole number of working days')
    expect((await admin.patch('/api/settings').send({ autoReleasePaid: 'yes' })).status).toBe(400)
    const ok = await admin.patch('/api/settings').send({ leadTimeDays: 10, autoReleasePaid: true })
    expect(ok.status).toBe(200)
    expect(ShopSettingsSchema.parse(ok.body)).toMatchObject({ leadTimeDays: 10, autoReleasePaid: true })
    await admin.patch('/api/settings').send({ leadTimeDays: 7, autoReleasePaid: false })
    const [audit] = await t.db.select().from(auditEvents).where(and(eq(auditEvents.action, 'settings.update'), sql`${auditEvents.summary} like '%autoReleasePaid%'`))
    expect(audit).toBeDefined()
  })
})
