import { eq, inArray } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { OrdersPageSchema } from '@kitwright/shared/orders'
import { ReturnListSchema } from '@kitwright/shared/returns'
import { orderEvents, orders, returns, stockMoves, workOrders } from '../../server/src/db/schema/index'
import { seedDemo } from '../../server/src/seeds/demo'
import { buildApp, signedInAs } from '../support/app'
import { createTestDb, type TestDb } from '../support/test-db'

let t: TestDb
beforeAll(async () => {
  t = await createTestDb()
  await seedDemo(t.db)
})
afterAll(() => t.drop())

describe('demo orders', () => {
  it('holds open, released, late and cancelled orders, released through the release service', async () => {
    const app = buildApp(t).app
    const { agent } = await signedInAs(app, t, 'planner')
    const page = OrdersPageSchema.parse((await agent.get('/api/orders?pageSize=25')).body)
    const by = new Map(page.items.map((o) => [o.number, o]))
    expect(page.total).toBe(10)
    expect(page.items.filter((o) => o.status === 'released').map((o) => o.number).sort()).toEqual(['W-2401', 'W-2402'])
    expect(page.items.filter((o) => o.status === 'cancelled').map((o) => o.number)).toEqual(['W-2403'])
    expect(page.items.filter((o) => o.status === 'shipped').map((o) => o.number)).toEqual(['W-2388'])
    expect(page.items.filter((o) => o.late).map((o) => o.number)).toEqual(['W-2395'])
    expect(by.get('W-2406')!.unmappedLines).toBe(1)
    for (const o of page.items) expect(o.customerEmail).toMatch(/\.example$/)

    const released = await t.db.select({ id: orders.id }).from(orders).where(inArray(orders.number, ['W-2401', 'W-2402']))
    const wos = await t.db.select().from(workOrders).where(inArray(workOrders.orderId, released.map((o) => o.id)))
    // Spare packs only: 2 units, then 2 units, straight to packing, nothing to cut.
    expect(wos.map((w) => w.status)).toEqual(['built', 'built', 'built', 'built'])
    expect(await t.db.$count(stockMoves, inArray(stockMoves.workOrderId, wos.map((w) => w.id)))).toBeGreaterThan(0)
  })

  it('holds one return, opened for a leak and waiting for the parcel of a unit shipped five weeks ago', async () => {
    const { agent } = await signedInAs(buildApp(t).app, t, 'packer')
    const list = ReturnListSchema.parse((await agent.get('/api/returns?status=all')).body)
    expect(list.returns).toMatchObject([{ status: 'awaiting_parcel', reason: 'Leaks', orderNumber: 'W-2388', kitSku: 'MW-TOTE-6C', trackingNumber: null }])
    expect(list.returns[0]!.number).toMatch(/^R-\d+$/)
    const [order] = await t.db.select().from(orders).where(eq(orders.number, 'W-2388'))
    expect(order).toMatchObject({ status: 'shipped', customerEmail: 'rosalind@wrenfold.example' })
    // Shipped before the shop's stock in Kitwright: the unit moved no stock.
    const [unit] = await t.db.select().from(workOrders).where(eq(workOrders.orderId, order!.id))
    expect(unit!.status).toBe('shipped')
    expect(await t.db.$count(stockMoves, eq(stockMoves.workOrderId, unit!.id))).toBe(0)
  })

  it('changes nothing when seeded again', async () => {
    const counts = async () => [
      await t.db.$count(orders),
      await t.db.$count(workOrders),
      await t.db.$count(stockMoves),
      await t.db.$count(orderEvents),
      await t.db.$count(returns),
    ]
    const before = await counts()
    await seedDemo(t.db)
    expect(await counts()).toEqual(before)
    expect(await t.db.$count(orderEvents, eq(orderEvents.kind, 'cancelled'))).toBe(1)
  })
})
