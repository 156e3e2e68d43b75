import { and, eq, sql } from 'drizzle-orm'
import { NewOrderSchema } from '@kitwright/shared/orders'
import { addOrderEvent, createOrder, openReturn, tables, type Db, type SessionUser } from './services'

const { kitRevisions, kits, orderLines, orders, returns, workOrders } = tables

const DAY = 24 * 60 * 60 * 1000

/** The demo's one return: the order it came from (invented customer, `.example` address). */
export const DEMO_RETURN_ORDER_NUMBER = 'W-2388'
/** Why the demo customer sends the unit back: one of the shop's default reasons. */
export const DEMO_RETURN_REASON = 'Leaks'

/**
 * One return the demo shop is waiting for, so the returns screen has something to show after
 * `npm start`: a compact kit sold five weeks ago to an invented customer, shipped before the shop
 * recorded its builds and parcels in Kitwright (so its build record is bare and it has no parcel on
 * record: its return label is the customer's own), and a return opened for a leak, awaiting the
 * parcel. The pack bench receives it by scanning the return's number or the unit's serial.
 *
 * The unit is written as shipped without stock moves: the seeded stock is what is on the shelves
 * today, after this kit left. Running it twice changes nothing.
 */
export async function seedDemoReturn(db: Db, office: SessionUser) {
  const placed = new Date(Date.now() - 35 * DAY)
  placed.setUTCHours(10, 5, 0, 0)
  const shippedAt = new Date(placed.getTime() + 6 * DAY)
  const input = NewOrderSchema.parse({
    number: DEMO_RETURN_ORDER_NUMBER,
    paymentStatus: 'paid',
    note: 'Built and shipped before the shop kept its build records in Kitwright.',
    customer: { name: 'Rosalind Quarrie', email: 'rosalind@wrenfold.example' },
    shipTo: { name: 'Rosalind Quarrie', line1: '27 Wrenfold Street', city: 'Harrowby', region: 'NE', postalCode: '68301', country: 'US' },
    placedAt: placed.toISOString(),
    promisedShipDate: new Date(placed.getTime() + 14 * DAY).toISOString().slice(0, 10),
    lines: [{ storeProductId: 'mw-store-1006', quantity: 1, unitPriceCents: 12900 }],
  })
  await db.transaction(async (tx) => {
    const { order, created } = await createOrder(tx, input, 'store', null)
    if (!created) return
    const [line] = await tx.select().from(orderLines).where(eq(orderLines.orderId, order.id))
    const [revision] = await tx
      .select({ id: kitRevisions.id })
      .from(kitRevisions)
      .innerJoin(kits, eq(kits.id, kitRevisions.kitId))
      .where(and(eq(kits.sku, 'MW-TOTE-6C'), eq(kitRevisions.status, 'released')))
      .orderBy(sql`${kitRevisions.releasedAt} desc nulls last`)
      .limit(1)
    if (!line || !revision) throw new Error('The demo return needs the MW-TOTE-6C kit released: seed the kits first')
    const [unit] = await tx
      .insert(workOrders)
      .values({ serial: sql`'U-' || nextval('work_order_serial_seq')`, orderId: order.id, orderLineId: line.id, kitRevisionId: revision.id, status: 'shipped' })
      .returning()
    await tx.update(orders).set({ status: 'shipped', releasedAt: new Date(placed.getTime() + DAY), shippedAt, updatedAt: shippedAt }).where(eq(orders.id, order.id))
    await addOrderEvent(tx, {
      orderId: order.id,
      kind: 'shipped',
      message: `Shipped unit ${unit!.serial} (recorded when the shop started using Kitwright; its parcel is not on record)`,
      actor: null,
    })
  })
  const [unit] = await db
    .select({ serial: workOrders.serial, id: workOrders.id })
    .from(workOrders)
    .innerJoin(orders, eq(orders.id, workOrders.orderId))
    .where(eq(orders.number, DEMO_RETURN_ORDER_NUMBER))
  if (!unit) return
  const [already] = await db.select({ id: returns.id }).from(returns).where(eq(returns.workOrderId, unit.id)).limit(1)
  if (already) return
  await openReturn(
    db,
    { serial: unit.serial, reason: DEMO_RETURN_REASON, notes: 'Customer writes that water drips from the drain grommet after the pump has run a day; she is sending it back.' },
    office,
  )
}
