import { eq, inArray } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { OrdersPageSchema } from '@kitwright/shared/orders'
import { orderEvents, orders, stockMoves, workOrders } from '../../server/src/db/schema/index'
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
    expect(page.total).toBe(9)
    expect(page.items.filter((o) => o.status === 'released').map((o) => o.number).sort()).toEqual(['W-2401', 'W-2402'])
    expect(page.items.filter((o) => o.status === 'cancelled').map((o) => o.number)).toEqual(['W-2403'])
    expect(page.items.filter((o) => o.late).map((o) => o.number)).toEqual(['W-2395'])
    expect(by.get('W-2406')!.unmappedLines).toBe(1)
    for (const o of page.items) expect(o.customerEmail).toMatch(/\.example$/)

    const released = await t.db.select({ id: orders.id }).from(orders).where(inArray(orders.number, ['W-2401', 'W-2402']))
    const wos = await t.db.select().from(workOrders).where(inArray(workOrders.orderId, released.map((o) => o.id)))
    // Spare packs only: 2 units, then 2 units, straight to packing, nothing to cut.
    expect(wos.map((w) => w.status)).toEqual(['built', 'built', 'built', 'built'])
    expect(await t.db.$count(stockMoves, inArray(stockMoves.workOrderId, wos.map((w) => w.id)))).toBeGreaterThan(0)
  })

  it('changes nothing when seeded again', async () => {
    const counts = async () => [await t.db.$count(orders), await t.db.$count(workOrders), await t.db.$count(stockMoves), await t.db.$count(orderEvents)]
    const before = await counts()
    await seedDemo(t.db)
    expect(await counts()).toEqual(before)
    expect(await t.db.$count(orderEvents, eq(orderEvents.kind, 'cancelled'))).toBe(1)
  })
})
