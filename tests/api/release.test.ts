import { and, asc, desc, eq, inArray, sql } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ApiErrorBodySchema } from '@kitwright/shared/errors'
import { NewOrderSchema, OrderDetailSchema, type NewOrderDraft } from '@kitwright/shared/orders'
import { ReleasePreviewSchema, ReleaseResultSchema, ShortagesSchema } from '@kitwright/shared/work-orders'
import {
  bomLines,
  cutParts,
  kitRevisions,
  kits,
  orderLines,
  orders,
  parts,
  purchaseOrderLines,
  purchaseOrders,
  shopSettings,
  stockMoves,
  suppliers,
  users,
  workOrders,
} from '../../server/src/db/schema/index'
import { seedDemo } from '../../server/src/seeds/demo'
import { createKit, releaseRevision, saveRevision } from '../../server/src/features/kits/kits.service'
import { createOrder } from '../../server/src/features/orders/orders.service'
import { buildApp, signedInAs } from '../support/app'
import { insertPart } from '../support/factories'
import { buildNewOrder } from '../support/order-factories'
import { createTestDb, type TestDb } from '../support/test-db'

let t: TestDb
let app: ReturnType<typeof buildApp>['app']
let planner: Awaited<ReturnType<typeof signedInAs>>['agent']
let planner2: Awaited<ReturnType<typeof signedInAs>>['agent']

beforeAll(async () => {
  t = await createTestDb()
  app = buildApp(t).app
  await seedDemo(t.db)
  planner = (await signedInAs(app, t, 'planner')).agent
  planner2 = (await signedInAs(app, t, 'planner')).agent
  // Plenty of every demo part, so only the parts a test starves are short.
  const all = await t.db.select({ id: parts.id, kind: parts.kind, stickLengths: parts.stickLengths }).from(parts)
  await t.db.insert(stockMoves).values(all.map((p) => ({ partId: p.id, kind: 'receive' as const, quantity: 1000, stickLength: p.kind === 'stock_length' ? p.stickLengths[0]! : null })))
})
afterAll(() => t.drop())

async function postOrder(draft: NewOrderDraft) {
  const res = await planner.post('/api/orders').send(draft)
  expect(res.status, JSON.stringify(res.body)).toBe(201)
  return OrderDetailSchema.parse(res.body)
}
async function detail(id: string) {
  return OrderDetailSchema.parse((await planner.get(`/api/orders/${id}`)).body)
}
/** What the ledger holds reserved for these work orders, per part id. */
async function reservedFor(workOrderIds: string[]) {
  const rows = await t.db
    .select({ partId: stockMoves.partId, qty: sql<number>`sum(${stockMoves.quantity})::int` })
    .from(stockMoves)
    .where(and(inArray(stockMoves.workOrderId, workOrderIds), inArray(stockMoves.kind, ['reserve', 'release'])))
    .groupBy(stockMoves.partId)
  return new Map(rows.map((r) => [r.partId, r.qty]))
}
async function newestReleased(kitSku: string) {
  const [rev] = await t.db
    .select({ id: kitRevisions.id, code: kitRevisions.code })
    .from(kitRevisions)
    .innerJoin(kits, eq(kits.id, kitRevisions.kitId))
    .where(and(eq(kits.sku, kitSku), eq(kitRevisions.status, 'released')))
    .orderBy(desc(kitRevisions.releasedAt))
  return rev!
}
async function bomOf(revisionId: string) {
  return t.db.select().from(bomLines).where(eq(bomLines.revisionId, revisionId))
}

/** A spare pack kit of our own whose one part has `stock` in the ledger and `perUnit` per pack. */
async function starvedKit(stock: number, perUnit: number) {
  const part = await insertPart(t.db, { name: 'Test float valve' })
  if (stock > 0) await t.db.insert(stockMoves).values({ partId: part.id, kind: 'receive', quantity: stock })
  const kit = await createKit(t.db, { sku: `TST-PACK-${part.sku.slice(4)}`, name: 'Test pack', storeProductId: null, description: null })
  const rev = kit.revisions[0]!.id
  await saveRevision(t.db, rev, {
    notes: null,
    frame: null,
    leakTest: null,
    bomLines: [{ partId: part.id, quantity: perUnit, note: null }],
    cutParts: [],
    buildSteps: [{
      text: 'Bag the valves.',
      caution: null,
      photoRequired: false,
      measurementRequired: false,
      measurementUnit: null,
      measurementMin: null,
      measurementMax: null,
      freeOrder: false,
      outOfLimitsRework: false,
    }],
  })
  const [owner] = await t.db.select().from(users).where(eq(users.role, 'admin')).limit(1)
  await releaseRevision(t.db, rev, owner!)
  return { part, kitSku: kit.sku }
}

describe('releasing an order into work orders', () => {
  it('makes one work order per unit at the newest released revision, with distinct serials, and reserves BOM × units', async () => {
    const order = await postOrder(
      buildNewOrder({
        lines: [
          { kitSku: 'MW-TOTE-12', quantity: 2, unitPriceCents: 18900 },
          { kitSku: 'MW-SPARE-CUP12', quantity: 1, unitPriceCents: 2400 },
        ],
      }),
    )
    const res = await planner.post('/api/orders/release').send({ orderIds: [order.id] })
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    const result = ReleaseResultSchema.parse(res.body)
    expect(result.refused).toEqual([])
    const [released] = result.released
    expect(released!.shortages).toEqual([])
    expect(released!.workOrders.map((w) => [w.kitSku, w.revisionCode, w.status])).toEqual([
      ['MW-TOTE-12', 'B', 'waiting_cut'],
      ['MW-TOTE-12', 'B', 'waiting_cut'],
      // A spare-parts pack has nothing to cut or build: it goes straight to packing.
      ['MW-SPARE-CUP12', 'A', 'built'],
    ])
    const serials = released!.workOrders.map((w) => w.serial)
    expect(new Set(serials).size).toBe(3)
    for (const s of serials) expect(s).toMatch(/^U-\d{4,}$/)

    // The work orders in the database: frozen revision, due on the promised date.
    const rows = await t.db.select().from(workOrders).where(eq(workOrders.orderId, order.id)).orderBy(asc(workOrders.serial))
    const revB = await newestReleased('MW-TOTE-12')
    expect(rows.filter((w) => w.kitRevisionId === revB.id)).toHaveLength(2)
    expect(rows.every((w) => w.dueDate === order.promisedShipDate)).toBe(true)

    // The ledger, read back per work order: exactly the BOM of its revision, once per unit.
    const bomB = await bomOf(revB.id)
    const pack = await newestReleased('MW-SPARE-CUP12')
    const bomPack = await bomOf(pack.id)
    for (const wo of rows) {
      const expected = new Map<string, number>()
      for (const b of wo.kitRevisionId === revB.id ? bomB : bomPack) expected.set(b.partId, (expected.get(b.partId) ?? 0) + b.quantity)
      expect(await reservedFor([wo.id])).toEqual(expected)
    }
    // No pipe is reserved at release: it is reserved when a cut run is published.
    const pipeIds = (await t.db.select({ id: parts.id }).from(parts).where(eq(parts.kind, 'stock_length'))).map((p) => p.id)
    const all = await reservedFor(rows.map((w) => w.id))
    for (const id of pipeIds) expect(all.has(id)).toBe(false)

    const after = await detail(order.id)
    expect(after.status).toBe('released')
    expect(after.workOrders.map((w) => w.serial)).toEqual(serials)
    expect(after.events.map((e) => e.kind)).toEqual(['received', 'released'])
    expect(after.events[1]!.message).toContain('pipe is reserved when a cut run is published')
  })

  it('refuses with 409 naming the short part and reserves nothing; allowShort releases with the shortage listed', async () => {
    const { part, kitSku } = await starvedKit(3, 2)
    const order = await postOrder(buildNewOrder({ lines: [{ kitSku, quantity: 2, unitPriceCents: 500 }] }))
    const refused = await planner.post('/api/orders/release').send({ orderIds: [order.id] })
    expect(refused.status).toBe(409)
    const body = ApiErrorBodySchema.parse(refused.body)
    expect(body.error.message).toContain(`${part.sku} Test float valve: needs 4, 3 free`)
    expect(body.error.fields).toEqual({ [`short.${part.sku}`]: 'Needs 4, 3 free' })
    expect(await t.db.$count(workOrders, eq(workOrders.orderId, order.id))).toBe(0)
    expect(await t.db.$count(stockMoves, and(eq(stockMoves.partId, part.id), eq(stockMoves.kind, 'reserve')))).toBe(0)
    expect((await detail(order.id)).status).toBe('open')

    const res = await planner.post('/api/orders/release').send({ orderIds: [order.id], allowShort: true })
    expect(res.status).toBe(200)
    const [released] = ReleaseResultSchema.parse(res.body).released
    expect(released!.shortages).toEqual([{ partId: part.id, sku: part.sku, name: 'Test float valve', needed: 4, reserved: 3, short: 1 }])
    // What is free goes to the lowest serial first: 2 to the first unit, 1 to the second.
    const held = await Promise.all(released!.workOrders.map((w) => reservedFor([w.id])))
    expect(held.map((h) => h.get(part.id))).toEqual([2, 1])
    const after = await detail(order.id)
    expect(after.status).toBe('released')
    expect(after.events.map((e) => e.kind)).toEqual(['received', 'released', 'shortage'])

    const shortages = ShortagesSchema.parse((await planner.get('/api/shortages')).body)
    expect(shortages.rows.find((r) => r.partId === part.id)).toMatchObject({ needed: 4, reserved: 3, available: 0, short: 1, workOrderCount: 2, suggestedOrder: 1 })
  })

  it('will not release a cancelled order, an unpaid store order, an order released already, or an unmapped line', async () => {
    const cancelled = await postOrder(buildNewOrder())
    await t.db.update(orders).set({ status: 'cancelled' }).where(eq(orders.id, cancelled.id))
    const res = await planner.post('/api/orders/release').send({ orderIds: [cancelled.id] })
    expect(res.status).toBe(409)
    expect(ApiErrorBodySchema.parse(res.body).error.message).toContain('is cancelled')

    const store = await t.db.transaction((tx) =>
      createOrder(tx, NewOrderSchema.parse(buildNewOrder({ lines: [{ storeProductId: 'mw-store-1006', quantity: 1, unitPriceCents: 1 }] })), 'store', null),
    )
    const unpaid = await planner.post('/api/orders/release').send({ orderIds: [store.order.id] })
    expect(unpaid.status).toBe(409)
    expect(ApiErrorBodySchema.parse(unpaid.body).error.message).toContain('not paid yet')

    const odd = await t.db.transaction((tx) =>
      createOrder(tx, NewOrderSchema.parse(buildNewOrder({ paymentStatus: 'paid', lines: [{ storeProductId: 'mw-store-5555', quantity: 1, unitPriceCents: 1 }] })), 'store', null),
    )
    const unmapped = await planner.post('/api/orders/release').send({ orderIds: [odd.order.id] })
    expect(unmapped.status).toBe(409)
    expect(ApiErrorBodySchema.parse(unmapped.body).error.message).toContain('maps to no kit')
    // Once a kit carries that store product, the line maps at release.
    await t.db.update(kits).set({ storeProductId: 'mw-store-5555' }).where(eq(kits.sku, 'MW-SPARE-SPR6'))
    const mapped = await planner.post('/api/orders/release').send({ orderIds: [odd.order.id] })
    expect(mapped.status).toBe(200)
    expect(ReleaseResultSchema.parse(mapped.body).released[0]!.workOrders.map((w) => w.kitSku)).toEqual(['MW-SPARE-SPR6'])
    const twice = await planner.post('/api/orders/release').send({ orderIds: [odd.order.id] })
    expect(twice.status).toBe(409)
    expect(ApiErrorBodySchema.parse(twice.body).error.message).toContain('already released')
  })

  it('releases what it can from a batch and says why it refused the rest', async () => {
    const good = await postOrder(buildNewOrder())
    const bad = await postOrder(buildNewOrder())
    await t.db.update(orders).set({ status: 'cancelled' }).where(eq(orders.id, bad.id))
    const res = await planner.post('/api/orders/release').send({ orderIds: [good.id, bad.id] })
    expect(res.status).toBe(200)
    const result = ReleaseResultSchema.parse(res.body)
    expect(result.released.map((r) => r.number)).toEqual([good.number])
    expect(result.refused).toEqual([{ orderId: bad.id, number: bad.number, status: 409, message: expect.stringContaining('cancelled') }])
  })
})

describe('bulk release by priority', () => {
  it('gives scarce stock to rush first, then the oldest promise, whatever order the orders were ticked in; the preview said so first', async () => {
    // 2 packs' worth free (4 valves, 2 per pack); three one-pack orders.
    const { kitSku } = await starvedKit(4, 2)
    const line = [{ kitSku, quantity: 1, unitPriceCents: 100 }]
    const newest = await postOrder(buildNewOrder({ promisedShipDate: '2099-06-20', lines: line }))
    const oldest = await postOrder(buildNewOrder({ promisedShipDate: '2099-06-01', lines: line }))
    const rush = await postOrder(buildNewOrder({ promisedShipDate: '2099-06-15', lines: line }))
    await t.db.update(orders).set({ priority: 'rush' }).where(eq(orders.id, rush.id))
    const ticked = [newest.id, oldest.id, rush.id]

    const preview = ReleasePreviewSchema.parse((await planner.post('/api/orders/release/preview').send({ orderIds: ticked })).body)
    // By hand: turn 1 rush takes 2 (4 → 2), turn 2 the oldest promise takes 2 (2 → 0), turn 3 finds 0 free.
    expect(preview.plan.map((p) => [p.number, p.turn, p.outcome])).toEqual([
      [rush.number, 1, 'release'],
      [oldest.number, 2, 'release'],
      [newest.number, 3, 'refuse'],
    ])
    expect(await t.db.$count(workOrders, inArray(workOrders.orderId, ticked))).toBe(0) // the preview wrote nothing

    const result = ReleaseResultSchema.parse((await planner.post('/api/orders/release').send({ orderIds: ticked })).body)
    expect(result.released.map((r) => r.number)).toEqual([rush.number, oldest.number])
    expect(result.refused).toEqual([{ orderId: newest.id, number: newest.number, status: 409, message: expect.stringContaining('needs 2, 0 free') }])
  })

  it('when nothing can be released, one summary names every order and why', async () => {
    const { kitSku } = await starvedKit(0, 1)
    const a = await postOrder(buildNewOrder({ lines: [{ kitSku, quantity: 1, unitPriceCents: 100 }] }))
    const b = await postOrder(buildNewOrder({ lines: [{ kitSku, quantity: 1, unitPriceCents: 100 }] }))
    const res = await planner.post('/api/orders/release').send({ orderIds: [a.id, b.id] })
    expect(res.status).toBe(409)
    const body = ApiErrorBodySchema.parse(res.body)
    expect(body.error.message).toMatch(/^None of the 2 orders was released:\n• .+\n• .+$/)
    expect(Object.keys(body.error.fields ?? {}).sort()).toEqual([`orders.${a.id}`, `orders.${b.id}`].sort())
  })

  it('the preview is for admins and planners only', async () => {
    const { agent } = await signedInAs(app, t, 'packer')
    expect((await agent.post('/api/orders/release/preview').send({ orderIds: [] })).status).toBe(403)
  })
})

describe('releases at the same moment', () => {
  it('two planners releasing the same order create its work orders once', async () => {
    const order = await postOrder(buildNewOrder({ lines: [{ kitSku: 'MW-TOTE-6C', quantity: 3, unitPriceCents: 100 }] }))
    const [a, b] = await Promise.all([planner.post('/api/orders/release').send({ orderIds: [order.id] }), planner2.post('/api/orders/release').send({ orderIds: [order.id] })])
    expect([a.status, b.status].sort()).toEqual([200, 409])
    expect(await t.db.$count(workOrders, eq(workOrders.orderId, order.id))).toBe(3)
    const wos = await t.db.select({ id: workOrders.id }).from(workOrders).where(eq(workOrders.orderId, order.id))
    const rev = await newestReleased('MW-TOTE-6C')
    const bom = await bomOf(rev.id)
    const held = await reservedFor(wos.map((w) => w.id))
    for (const b of bom) expect(held.get(b.partId)).toBe(b.quantity * 3)
  })

  it('concurrent releases of different orders never reserve more than is free', async () => {
    const { part, kitSku } = await starvedKit(5, 2)
    const list = await Promise.all(Array.from({ length: 4 }, () => postOrder(buildNewOrder({ lines: [{ kitSku, quantity: 1, unitPriceCents: 100 }] }))))
    const answers = await Promise.all(list.map((o, i) => (i % 2 ? planner : planner2).post('/api/orders/release').send({ orderIds: [o.id] })))
    expect(answers.map((a) => a.status).sort()).toEqual([200, 200, 409, 409])
    const [reserved] = await t.db
      .select({ n: sql<number>`coalesce(sum(${stockMoves.quantity}), 0)::int` })
      .from(stockMoves)
      .where(and(eq(stockMoves.partId, part.id), inArray(stockMoves.kind, ['reserve', 'release'])))
    expect(reserved!.n).toBe(4)
  })
})

describe('the shortages page', () => {
  it('estimates pipe in sticks from the cut parts of units still to cut: work orders waiting and orders not yet released', async () => {
    const res = await planner.get('/api/shortages?only=all')
    expect(res.status).toBe(200)
    const page = ShortagesSchema.parse(res.body)
    const [pipe] = await t.db.select().from(parts).where(eq(parts.kind, 'stock_length'))
    const [settings] = await t.db.select().from(shopSettings)
    // By hand: each unit's cut parts, one kerf per piece, over the longest stick, rounded up — for every
    // work order waiting for cutting, and every line of an open order at its kit's newest released revision.
    const pipeOf = async (revisionId: string) => {
      let length = 0
      for (const c of await t.db.select().from(cutParts).where(and(eq(cutParts.revisionId, revisionId), eq(cutParts.partId, pipe!.id)))) length += (c.length + settings!.kerf) * c.quantity
      return length
    }
    let cut = 0
    for (const w of await t.db.select({ rev: workOrders.kitRevisionId }).from(workOrders).where(eq(workOrders.status, 'waiting_cut'))) cut += await pipeOf(w.rev)
    const unreleased = await t.db.select({
      kitId: orderLines.kitId,
      quantity: orderLines.quantity,
    }).from(orderLines).innerJoin(orders, eq(orders.id, orderLines.orderId)).where(eq(orders.status, 'open'))
    for (const line of unreleased) {
      if (!line.kitId) continue
      const [kit] = await t.db.select({ sku: kits.sku }).from(kits).where(eq(kits.id, line.kitId))
      const rev = await newestReleased(kit!.sku).catch(() => null)
      if (rev) cut += (await pipeOf(rev.id)) * line.quantity
    }
    const longest = Math.max(...pipe!.stickLengths)
    const row = page.rows.find((r) => r.partId === pipe!.id)!
    expect(cut).toBeGreaterThan(0)
    expect(row).toMatchObject({ kind: 'stock_length', cutLength: cut, stickLength: longest, needed: Math.ceil(cut / longest), reserved: 0, short: 0, suggestedOrder: 0 })
    expect(page.openWorkOrders).toBe(await t.db.$count(workOrders, inArray(workOrders.status, ['waiting_cut', 'cut', 'building', 'rework', 'built'])))
    expect(page.unreleasedOrders).toBe(await t.db.$count(orders, eq(orders.status, 'open')))
  })

  it('counts orders not yet released, names them with the earliest date, and keeps reorder points', async () => {
    // A part with 5 in stock and 2 per pack: orders for 2 packs (due later) and 1 pack (due sooner), not released.
    const { part, kitSku } = await starvedKit(5, 2)
    const later = await postOrder(buildNewOrder({ promisedShipDate: '2099-03-20', lines: [{ kitSku, quantity: 2, unitPriceCents: 100 }] }))
    const sooner = await postOrder(buildNewOrder({ promisedShipDate: '2099-03-10', lines: [{ kitSku, quantity: 1, unitPriceCents: 100 }] }))
    const page = ShortagesSchema.parse((await planner.get('/api/shortages')).body)
    const row = page.rows.find((r) => r.partId === part.id)!
    // By hand: needed 2 × 2 + 1 × 2 = 6, nothing reserved (not released), 5 free → short 1.
    expect(row).toMatchObject({ needed: 6, reserved: 0, available: 5, short: 1, workOrderCount: 0, neededBy: '2099-03-10' })
    expect(row.orderNumbers).toEqual([sooner.number, later.number])

    // Releasing the sooner one moves its need to a work order with its reservation: still short 1.
    expect((await planner.post('/api/orders/release').send({ orderIds: [sooner.id] })).status).toBe(200)
    const after = ShortagesSchema.parse((await planner.get('/api/shortages')).body).rows.find((r) => r.partId === part.id)!
    // By hand: needed 6, reserved 2 (the released pack), free 5 − 2 = 3 → short 6 − 2 − 3 = 1.
    expect(after).toMatchObject({ needed: 6, reserved: 2, available: 3, short: 1, workOrderCount: 1 })

    // A part nobody needs, at its reorder point, is still suggested for buying (its reorder quantity).
    const idle = await insertPart(t.db, { name: 'Test spare grommet', reorderPoint: 10, reorderQuantity: 50 })
    await t.db.insert(stockMoves).values({ partId: idle.id, kind: 'receive', quantity: 10 })
    const idleRow = ShortagesSchema.parse((await planner.get('/api/shortages')).body).rows.find((r) => r.partId === idle.id)!
    expect(idleRow).toMatchObject({ needed: 0, short: 0, belowReorderPoint: true, suggestedOrder: 50, orderNumbers: [] })
  })

  it('subtracts what is on order on sent and partly received purchase orders, and names them', async () => {
    const { part, kitSku } = await starvedKit(5, 2)
    const order = await postOrder(buildNewOrder({ promisedShipDate: '2099-04-01', lines: [{ kitSku, quantity: 5, unitPriceCents: 100 }] }))
    const [supplier] = await t.db.insert(suppliers).values({ name: `Test valve supplier ${part.sku}` }).returning()
    const po = async (status: 'draft' | 'sent' | 'partly_received' | 'cancelled', expectedDate: string, quantity: number, received: number) => {
      const [row] = await t.db.insert(purchaseOrders).values({ supplierId: supplier!.id, status, expectedDate }).returning()
      await t.db.insert(purchaseOrderLines).values({ purchaseOrderId: row!.id, partId: part.id, quantity, unitPriceCents: 250, received })
      return row!.number
    }
    const sent = await po('sent', '2099-02-01', 2, 0)
    const partly = await po('partly_received', '2099-01-20', 3, 2)
    await po('draft', '2099-01-05', 10, 0) // a draft is not on its way yet
    await po('cancelled', '2099-01-06', 10, 0) // nor is a cancelled order
    const row = ShortagesSchema.parse((await planner.get('/api/shortages')).body).rows.find((r) => r.partId === part.id)!
    // By hand: needed 5 packs × 2 = 10, nothing reserved (not released), 5 free.
    // On order: sent 2 − 0 = 2, plus partly received 3 − 2 = 1 → 3 (draft and cancelled not counted).
    // short = needed − reserved − available − on order = 10 − 0 − 5 − 3 = 2.
    expect(row).toMatchObject({ needed: 10, reserved: 0, available: 5, onOrder: 3, short: 2, suggestedOrder: 2, orderNumbers: [order.number] })
    // The soonest expected first.
    expect(row.onOrderPurchaseOrders).toEqual([
      { number: partly, expectedDate: '2099-01-20', outstanding: 1 },
      { number: sent, expectedDate: '2099-02-01', outstanding: 2 },
    ])
  })

  it('is for admins and planners only', async () => {
    for (const role of ['cutter', 'packer'] as const) {
      const { agent } = await signedInAs(app, t, role)
      expect((await agent.get('/api/shortages')).status).toBe(403)
      expect((await agent.post('/api/orders/release').send({ orderIds: [] })).status).toBe(403)
    }
  })
})
