import { and, eq, inArray, sql } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { addWorkingDays } from '@kitwright/shared/domain/working-days'
import { NewOrderSchema } from '@kitwright/shared/orders'
import { kitRevisions, kits, orderEvents, orderLines, orders, shopSettings, stockMoves, users, workOrders } from '../../server/src/db/schema/index'
import { seedDemo } from '../../server/src/seeds/demo'
import { createKit, releaseRevision, saveRevision } from '../../server/src/features/kits/kits.service'
import { createOrder } from '../../server/src/features/orders/orders.service'
import { promiseForOrder } from '../../server/src/features/orders/promise.service'
import { insertPart } from '../support/factories'
import { buildNewOrder } from '../support/order-factories'
import { createTestDb, type TestDb } from '../support/test-db'

// The promise from the queue over the demo shop's real rows. "Now" is Monday Dec 7, 2026 at 08:00 UTC,
// the start of the working day, so the count starts at minute 0 (the rule itself is worked by hand in
// shared/src/domain/promise-date.test.ts).

let t: TestDb
const MONDAY = new Date('2026-12-07T08:00:00Z')

beforeAll(async () => {
  t = await createTestDb()
  await seedDemo(t.db)
  await t.db.update(shopSettings).set({ leadTimeDays: 0, workdayStartHourUtc: 8, workdayHours: 8 })
})
afterAll(() => t.drop())

/** A pack kit of our own (no cut parts: it goes straight to the pack bench) whose one part has `stock`. */
async function packKit(stock: number, leadTimeDays: number | null) {
  const part = await insertPart(t.db, { name: 'Test float valve', leadTimeDays })
  if (stock > 0) await t.db.insert(stockMoves).values({ partId: part.id, kind: 'receive', quantity: stock })
  const kit = await createKit(t.db, { sku: `TST-PACK-${part.sku.slice(4)}`, name: 'Test pack', storeProductId: null, description: null })
  const rev = kit.revisions[0]!.id
  const step = {
    text: 'Bag the valve.',
    caution: null,
    photoRequired: false,
    measurementRequired: false,
    measurementUnit: null,
    measurementMin: null,
    measurementMax: null,
    freeOrder: false,
    outOfLimitsRework: false,
  }
  await saveRevision(t.db, rev, { notes: null, frame: null, leakTest: null, bomLines: [{ partId: part.id, quantity: 1, note: null }], cutParts: [], buildSteps: [step] })
  const [owner] = await t.db.select().from(users).where(eq(users.role, 'admin')).limit(1)
  await releaseRevision(t.db, rev, owner!)
  return kit.id
}

/** Units ahead at the pack bench, counted here on their own: open work orders, and every unit of an order not yet released whose kit has a released revision. */
async function unitsAheadAtPack() {
  const open = await t.db.$count(workOrders, inArray(workOrders.status, ['waiting_cut', 'cut', 'building', 'rework', 'built']))
  const [waiting] = await t.db
    .select({ n: sql<number>`coalesce(sum(${orderLines.quantity}), 0)::int` })
    .from(orderLines)
    .innerJoin(orders, eq(orders.id, orderLines.orderId))
    .where(and(eq(orders.status, 'open'), sql`exists (select 1 from ${kitRevisions} where ${kitRevisions.kitId} = ${orderLines.kitId} and ${kitRevisions.status} = 'released')`))
  return open + waiting!.n
}

describe('the promise from the queue', () => {
  it('a pack waits its turn at the pack bench', async () => {
    const kitId = await packKit(100, 5)
    await t.db.update(shopSettings).set({ packMinutesPerUnit: 480 }) // one unit a day, to make the queue count
    try {
      const ahead = await unitsAheadAtPack()
      expect(ahead).toBeGreaterThan(0)
      // By hand: each unit ahead takes a whole working day, ours the next one: done at (ahead + 1) × 480
      // minutes → working day index `ahead` counting Monday as 0.
      const p = await promiseForOrder(t.db, [{ kitId, quantity: 1 }], MONDAY, MONDAY)
      expect(p.date).toBe(addWorkingDays('2026-12-07', ahead))
      expect(p.reasons[0]).toBe(`pack bench has ${ahead} units ahead (about ${ahead} working days)`)
      expect(p.minutesPerUnit.pack).toEqual({ minutes: 480, measured: false })
    } finally {
      await t.db.update(shopSettings).set({ packMinutesPerUnit: 15 })
    }
  })

  it('a part not in stock comes after the supplier lead time, and the promise waits for it', async () => {
    const kitId = await packKit(0, 10)
    const ahead = await unitsAheadAtPack()
    // By hand: the valve arrives 10 calendar days after Monday Dec 7: Thursday Dec 17, working day 8
    // (Dec 8, 9, 10, 11, 14, 15, 16, 17) → minute 3840. The pack queue (ahead × 15 min) is long
    // clear by then, so ours is done at 3855 → working day 8: Dec 17.
    expect(ahead * 15).toBeLessThan(3840)
    const p = await promiseForOrder(t.db, [{ kitId, quantity: 1 }], MONDAY, MONDAY)
    expect(p.date).toBe('2026-12-17')
    expect(p.reasons[0]).toBe("waits for Test float valve due 2026-12-17 (the supplier's lead time of 10 days)")
  })

  it('an order that arrives with no promise is given one, and its timeline says why', async () => {
    const kitId = await packKit(0, 3)
    const [kit] = await t.db.select({ sku: kits.sku }).from(kits).where(eq(kits.id, kitId))
    const input = NewOrderSchema.parse(buildNewOrder({ placedAt: new Date().toISOString(), promisedShipDate: undefined, lines: [{ kitSku: kit!.sku, quantity: 1, unitPriceCents: 100 }] }))
    const { order } = await t.db.transaction((tx) => createOrder(tx, input, 'phone', null))
    expect(order.promisedShipDate).not.toBeNull()
    const [received] = await t.db.select().from(orderEvents).where(and(eq(orderEvents.orderId, order.id), eq(orderEvents.kind, 'received')))
    expect(received!.message).toMatch(/promised to ship by [^:]+: (.+; )?waits for Test float valve due \d{4}-\d{2}-\d{2} \(the supplier's lead time of 3 days\)/)
  })
})
