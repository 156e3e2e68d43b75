import { and, eq, isNotNull, ne, sql } from 'drizzle-orm'
import { NewOrderSchema, type ShipTo } from '@kitwright/shared/orders'
import { StoreEventSchema, type StoreEvent } from '@kitwright/shared/store-events'
import type { Tx } from '../../db/client'
import { orders, storeEvents, type OrderRow, type StoreEventRow } from '../../db/schema/index'
import type { Deps } from '../../deps'
import { queueOrderReceivedMail } from '../mail/order-received-mail'
import { addOrderEvent, createOrder } from '../orders/orders.service'
import { cancelOrder } from '../orders/order-lifecycle.service'
import { autoReleasePaidOrder } from '../work-orders/auto-release'
import { ORDER_STATUS_LABELS, statusInSentence } from '@kitwright/shared/status-words'

export type StoreEventDeps = Pick<Deps, 'db' | 'jobs'>
type Paid = Extract<StoreEvent, { type: 'order.paid' }>
type Cancelled = Extract<StoreEvent, { type: 'order.cancelled' }>
type AddressChanged = Extract<StoreEvent, { type: 'order.address_changed' }>

/**
 * The `store-event` job: applies one stored event to its order, once. Events of one order are
 * applied one at a time (an advisory lock on the order number), and an event that arrives before its
 * order was paid is kept and applied when the paid event creates the order. A failure is written on
 * the event and rethrown, so the queue retries it.
 */
export async function processStoreEvent(deps: StoreEventDeps, storeEventId: string): Promise<void> {
  try {
    await deps.db.transaction(async (tx) => {
      const [row] = await tx.select().from(storeEvents).where(eq(storeEvents.id, storeEventId)).for('update')
      if (!row || row.processedAt) return
      await tx.execute(sql`select pg_advisory_xact_lock(hashtext(${`store-order:${row.orderNumber}`}))`)
      const event = StoreEventSchema.parse(row.payload)
      const order = await orderByNumber(tx, event.orderNumber)
      if (event.type === 'order.paid') await applyPaid(tx, deps, event, row)
      else if (order && event.type === 'order.cancelled') await cancelOrder(tx, order, { by: 'store', actor: null, eventId: event.eventId, reason: event.reason, jobs: deps.jobs })
      else if (order && event.type === 'order.address_changed') await applyAddressChange(tx, order, event, { early: false })
      // With no order yet, the event waits, stored and marked processed, for its paid event (applyPaid reads it back).
      await tx.update(storeEvents).set({ processedAt: new Date(), error: null }).where(eq(storeEvents.id, row.id))
    })
  } catch (err) {
    const message = err instanceof Error ? err.message : String(err)
    await deps.db.update(storeEvents).set({ error: message.slice(0, 2000) }).where(eq(storeEvents.id, storeEventId))
    throw err
  }
}

async function orderByNumber(tx: Tx, number: string): Promise<OrderRow | undefined> {
  const [order] = await tx.select().from(orders).where(eq(orders.number, number)).for('update')
  return order
}

async function applyPaid(tx: Tx, deps: StoreEventDeps, event: Paid, row: StoreEventRow) {
  const input = NewOrderSchema.parse({
    number: event.orderNumber,
    customer: event.order.customer,
    shipTo: event.order.shipTo,
    placedAt: event.order.placedAt,
    note: event.order.note,
    paymentStatus: 'paid',
    currency: event.order.currency,
    lines: event.order.lines.map((l) => ({ storeProductId: l.productId, description: l.title, quantity: l.quantity, unitPriceCents: l.unitPriceCents })),
  })
  const { order, created } = await createOrder(tx, input, 'store', null)
  if (!created) {
    if (order.paymentStatus !== 'paid') {
      await tx.update(orders).set({ paymentStatus: 'paid', updatedAt: new Date() }).where(eq(orders.id, order.id))
      await addOrderEvent(tx, { orderId: order.id, kind: 'payment', message: 'The web store reports this order paid.', data: { eventId: event.eventId } })
      await autoReleasePaidOrder(tx, order.id)
    } else {
      await addOrderEvent(tx, {
        orderId: order.id,
        kind: 'duplicate_ignored',
        message: `The web store sent this paid order again (event ${event.eventId}); nothing changed.`,
        data: { eventId: event.eventId },
      })
    }
    return
  }

  // Events the store sent before this one arrived were stored and wait here; apply them in the order they happened.
  const waiting = await tx
    .select()
    .from(storeEvents)
    .where(and(eq(storeEvents.orderNumber, event.orderNumber), isNotNull(storeEvents.processedAt), ne(storeEvents.id, row.id)))
  const early = waiting
    .map((w) => StoreEventSchema.parse(w.payload))
    .filter((e): e is Cancelled | AddressChanged => e.type !== 'order.paid')
    .sort((a, b) => Date.parse(a.occurredAt) - Date.parse(b.occurredAt))
  let current = order
  for (const e of early.filter((x): x is AddressChanged => x.type === 'order.address_changed')) {
    if (Date.parse(e.occurredAt) <= Date.parse(event.occurredAt)) continue // the paid order already carries it
    current = await applyAddressChange(tx, current, e, { early: true })
  }
  const cancel = early.find((e): e is Cancelled => e.type === 'order.cancelled')
  if (cancel) {
    await cancelOrder(
      tx,
      current,
      {
        by: 'store',
        actor: null,
        eventId: cancel.eventId,
        reason: cancel.reason ? `${cancel.reason}; the cancellation arrived before the payment` : 'the cancellation arrived before the payment',
        jobs: deps.jobs,
      },
    )
    return
  }
  await queueOrderReceivedMail(tx, deps.jobs, order.id)
  await autoReleasePaidOrder(tx, order.id)
}

function oneLine(a: ShipTo | { name: string; line1: string; line2?: string | null; city: string; region?: string | null; postalCode: string; country: string }) {
  return [a.name, a.line1, a.line2, a.city, a.region, a.postalCode, a.country].filter(Boolean).join(', ')
}

async function applyAddressChange(tx: Tx, order: OrderRow, event: AddressChanged, opts: { early: boolean }): Promise<OrderRow> {
  const before = { name: order.shipName, line1: order.shipLine1, line2: order.shipLine2, city: order.shipCity, region: order.shipRegion, postalCode: order.shipPostalCode, country: order.shipCountry }
  if (order.status === 'shipped' || order.status === 'cancelled') {
    await addOrderEvent(tx, {
      orderId: order.id,
      kind: 'note',
      message: `The web store changed the ship-to after the order was ${statusInSentence(ORDER_STATUS_LABELS, order.status)}; nothing was changed here. New address: ${oneLine(event.shipTo)}`,
      data: { eventId: event.eventId, to: event.shipTo },
    })
    return order
  }
  const newer = await tx
    .select({ payload: storeEvents.payload })
    .from(storeEvents)
    .where(and(eq(storeEvents.orderNumber, order.number), eq(storeEvents.type, 'order.address_changed'), isNotNull(storeEvents.processedAt), ne(storeEvents.eventId, event.eventId)))
  const superseded = !opts.early && newer.some((n) => Date.parse(StoreEventSchema.parse(n.payload).occurredAt) > Date.parse(event.occurredAt))
  if (superseded) {
    await addOrderEvent(tx, {
      orderId: order.id,
      kind: 'note',
      message: `An older ship-to change from the web store arrived late and was not applied (a newer one already was): ${oneLine(event.shipTo)}`,
      data: { eventId: event.eventId },
    })
    return order
  }
  const s = event.shipTo
  const [updated] = await tx
    .update(orders)
    .set({
      shipName: s.name,
      shipLine1: s.line1,
      shipLine2: s.line2 ?? null,
      shipCity: s.city,
      shipRegion: s.region ?? null,
      shipPostalCode: s.postalCode,
      shipCountry: s.country,
      updatedAt: new Date(),
    })
    .where(eq(orders.id, order.id))
    .returning()
  await addOrderEvent(tx, {
    orderId: order.id,
    kind: 'address_changed',
    message: `Ship-to changed by the web store${opts.early ? ' (the change arrived before the payment)' : ''}: ${oneLine(before)} → ${oneLine(s)}`,
    data: { eventId: event.eventId, from: before, to: s },
  })
  return updated!
}
