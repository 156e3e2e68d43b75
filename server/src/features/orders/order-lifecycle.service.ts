import { and, asc, count, eq, inArray, notInArray } from 'drizzle-orm'
import { formatDay } from '@kitwright/shared/dates'
import { ORDER_PRIORITY_LABELS, type OrderDetail, type UpdateOrderPlan } from '@kitwright/shared/orders'
import type { Db, Tx } from '../../db/client'
import { bins, cutRunCuts, cutRuns, cutRunSticks, offcuts, orders, workOrders, type OrderRow } from '../../db/schema/index'
import type { Deps } from '../../deps'
import { recordAudit, type AuditContext } from '../../lib/audit'
import type { Jobs } from '../../lib/jobs'
import { Conflict, NotFound } from '../../lib/http-errors'
import { freeBin } from '../bins/bins.service'
import { queueOrderCancelledMail } from '../mail/order-cancelled-mail'
import { refreshOrderReceivedMail } from '../mail/order-received-mail'
import { insertMoves } from '../stock/stock.queries'
import { releaseReservation } from '../stock/stock.service'
import { addOrderEvent, getOrder, type OrderActor } from './orders.service'
import { ORDER_STATUS_LABELS, statusInSentence } from '@kitwright/shared/status-words'

/** The order row locked for a change; 404 when there is none. */
async function lockOrder(tx: Tx, id: string): Promise<OrderRow> {
  const [order] = await tx.select().from(orders).where(eq(orders.id, id)).for('update')
  if (!order) throw new NotFound('No such order')
  return order
}

/** Who cancelled an order and why, for {@link cancelOrder}. */
export interface CancelBy {
  /** `store`: the web store's cancel event; `planner`: a planner in Kitwright. */
  by: 'store' | 'planner'
  actor: OrderActor
  reason?: string
  /** The store's event id, kept on the timeline. */
  eventId?: string
  /** The job queue the customer's cancellation e-mail is queued on. */
  jobs: Jobs
}

/** What a cancellation did. */
export interface CancelOutcome {
  cancelled: boolean
  workOrders: string[]
  offcuts: number
  binsFreed: string[]
}

/**
 * Cancels an order inside the caller's transaction, the one way for the store's cancel event and a
 * planner's cancel alike. Every work order not yet shipped is cancelled and gives back the stock it
 * had reserved; its bin goes back on the rack; pieces already cut for it return to stock as offcuts
 * (an `offcuts` row of the piece's length and an `offcut_in` move), when at or above the minimum
 * offcut of its cut run, as the cut bench does for remnants; shorter ones are scrap. Pieces still to
 * cut on a published sheet are racked by the cut bench when cut. The customer gets one cancellation
 * e-mail, and an "order received" e-mail still waiting in the outbox drops its ship date. A cancelled
 * order changes nothing. A shipped order stays as it is: the store's cancel only notes it on the timeline,
 * a planner is refused (409).
 */
export async function cancelOrder(tx: Tx, order: OrderRow, by: CancelBy): Promise<CancelOutcome> {
  const none: CancelOutcome = { cancelled: false, workOrders: [], offcuts: 0, binsFreed: [] }
  const because = by.reason ? ` (${by.reason})` : ''
  const who = by.by === 'store' ? 'the web store' : (by.actor?.name ?? 'a planner')
  if (order.status === 'cancelled') {
    if (by.by === 'planner') throw new Conflict(`Order ${order.number} is already cancelled`)
    return none
  }
  if (order.status === 'shipped') {
    if (by.by === 'planner') throw new Conflict(`Order ${order.number} has shipped; it cannot be cancelled. Settle a return with the customer.`)
    await addOrderEvent(tx, {
      orderId: order.id,
      kind: 'note',
      message: `The web store cancelled this order after it shipped${because}; nothing was changed here. Settle a return with the customer.`,
      data: { eventId: by.eventId ?? null },
    })
    return none
  }

  const open = await tx
    .select({ id: workOrders.id, serial: workOrders.serial })
    .from(workOrders)
    .where(and(eq(workOrders.orderId, order.id), notInArray(workOrders.status, ['shipped', 'cancelled'])))
    .orderBy(asc(workOrders.serial))
    .for('update')
  const ids = open.map((w) => w.id)
  const serialOf = new Map(open.map((w) => [w.id, w.serial]))
  const why = `Order ${order.number} cancelled by ${who}`

  for (const wo of open) await releaseReservation(tx, { workOrderId: wo.id, lines: [], reason: why }, by.actor)

  const held = ids.length ? await tx.select({ id: bins.id, code: bins.code }).from(bins).where(inArray(bins.workOrderId, ids)).orderBy(asc(bins.code)) : []
  for (const bin of held) await freeBin(tx, bin.id)

  // Pieces already cut for these units: the material is off the rack, so it comes back as offcuts.
  const pieces = ids.length
    ? await tx
        .select({ id: cutRunCuts.id, length: cutRunCuts.length, workOrderId: cutRunCuts.workOrderId, partId: cutRunSticks.partId, run: cutRuns.number, minOffcut: cutRuns.minOffcut })
        .from(cutRunCuts)
        .innerJoin(cutRunSticks, eq(cutRunSticks.id, cutRunCuts.stickId))
        .innerJoin(cutRuns, eq(cutRuns.id, cutRunCuts.cutRunId))
        .where(and(inArray(cutRunCuts.workOrderId, ids), eq(cutRunCuts.status, 'cut')))
        .orderBy(asc(cutRuns.number), asc(cutRunSticks.position), asc(cutRunCuts.position))
    : []
  let stocked = 0
  let scrapped = 0
  for (const piece of pieces) {
    const note = `Piece cut for unit ${serialOf.get(piece.workOrderId)} of cancelled order ${order.number} (cut run ${piece.run})`
    if (await stockCutPiece(tx, { ...piece, note, reason: why, actorId: by.actor?.id ?? null })) stocked += 1
    else scrapped += 1
  }
  // Pieces still on a published cut sheet: the stick's plan is fixed, so the cut bench racks them when cut.
  const [pending] = ids.length
    ? await tx
        .select({ n: count() })
        .from(cutRunCuts)
        .innerJoin(cutRuns, eq(cutRuns.id, cutRunCuts.cutRunId))
        .where(and(inArray(cutRunCuts.workOrderId, ids), eq(cutRunCuts.status, 'pending'), inArray(cutRuns.status, ['published', 'done'])))
    : []
  const stillToCut = pending?.n ?? 0

  const now = new Date()
  if (ids.length > 0) await tx.update(workOrders).set({ status: 'cancelled', updatedAt: now }).where(inArray(workOrders.id, ids))
  await tx.update(orders).set({ status: 'cancelled', cancelledAt: now, heldAt: null, holdReason: null, heldBy: null, updatedAt: now }).where(eq(orders.id, order.id))

  const serials = open.map((w) => w.serial)
  const parts = [
    serials.length ? `${serials.length} work order${serials.length === 1 ? '' : 's'} cancelled (${serials.join(', ')}) and their reserved stock released.` : '',
    held.length ? `Bin${held.length === 1 ? '' : 's'} ${held.map((b) => b.code).join(', ')} freed.` : '',
    stocked ? `${stocked} piece${stocked === 1 ? '' : 's'} already cut returned to stock as offcuts.` : '',
    scrapped ? `${scrapped} piece${scrapped === 1 ? '' : 's'} shorter than the minimum offcut scrapped.` : '',
    stillToCut ? `${stillToCut} piece${stillToCut === 1 ? ' is' : 's are'} still on a published cut sheet; cut as planned, ${stillToCut === 1 ? 'it goes' : 'they go'} to the offcut rack.` : '',
  ].filter(Boolean)
  await addOrderEvent(tx, {
    orderId: order.id,
    kind: 'cancelled',
    message: `Cancelled by ${who}${because}.${parts.length ? ` ${parts.join(' ')}` : ''}`,
    data: { by: by.by, eventId: by.eventId ?? null, reason: by.reason ?? null, workOrders: serials, bins: held.map((b) => b.code), offcuts: stocked, scrapped, stillToCut },
    actor: by.actor,
  })
  await refreshOrderReceivedMail(tx, order.id)
  await queueOrderCancelledMail(tx, by.jobs, order.id)
  return { cancelled: true, workOrders: serials, offcuts: stocked, binsFreed: held.map((b) => b.code) }
}

/**
 * Puts one piece cut for a cancelled work order on the offcut rack: an `offcuts` row of its length and
 * an `offcut_in` move, when at or above the shop's minimum offcut; shorter, it is scrap (false).
 * Used when an order is cancelled, and by the cut bench when a piece of a cancelled unit is cut later
 * (the stick's plan is fixed once published).
 */
export async function stockCutPiece(
  tx: Tx,
  piece: { partId: string; length: number; workOrderId: string; minOffcut: number; note: string; reason: string; actorId: string | null },
): Promise<boolean> {
  if (piece.length < piece.minOffcut) return false
  const [offcut] = await tx.insert(offcuts).values({ partId: piece.partId, length: piece.length, note: piece.note }).returning({ id: offcuts.id })
  await insertMoves(tx, [{ partId: piece.partId, kind: 'offcut_in', quantity: 1, offcutId: offcut!.id, workOrderId: piece.workOrderId, reason: piece.reason, createdBy: piece.actorId }])
  return true
}

/** A planner cancels an order (409 when it is cancelled or shipped already), with the audit entry, in one transaction. */
export async function cancelOrderByPlanner(deps: Pick<Deps, 'db' | 'jobs'>, id: string, reason: string, actor: NonNullable<OrderActor>, audit: AuditContext): Promise<OrderDetail> {
  return deps.db.transaction(async (tx) => {
    const order = await lockOrder(tx, id)
    const outcome = await cancelOrder(tx, order, { by: 'planner', actor, reason, jobs: deps.jobs })
    await recordAudit(tx, audit, {
      action: 'order.cancel',
      entityType: 'order',
      entityId: order.id,
      summary: `Cancelled order ${order.number}: ${reason}`,
      data: { reason, ...outcome },
    })
    return getOrder(tx, order.id)
  })
}

/** A planner puts an order on hold, saying why: it is then neither released nor shipped until taken off hold. */
export async function holdOrder(db: Db, id: string, reason: string, actor: NonNullable<OrderActor>, audit: AuditContext): Promise<OrderDetail> {
  return db.transaction(async (tx) => {
    const order = await lockOrder(tx, id)
    if (order.status === 'cancelled' || order.status === 'shipped') throw new Conflict(`Order ${order.number} is ${statusInSentence(ORDER_STATUS_LABELS, order.status)}; there is nothing to hold`)
    if (order.heldAt) throw new Conflict(`Order ${order.number} is already on hold (${order.holdReason ?? 'no reason given'}); take it off hold first to change the reason`)
    await tx.update(orders).set({ heldAt: new Date(), holdReason: reason, heldBy: actor.id, updatedAt: new Date() }).where(eq(orders.id, order.id))
    await addOrderEvent(tx, { orderId: order.id, kind: 'held', message: `Put on hold: ${reason}. It is not released or shipped until taken off hold.`, data: { reason }, actor })
    await refreshOrderReceivedMail(tx, order.id)
    await recordAudit(tx, audit, { action: 'order.hold', entityType: 'order', entityId: order.id, summary: `Put order ${order.number} on hold: ${reason}`, data: { reason } })
    return getOrder(tx, order.id)
  })
}

/** A planner takes an order off hold (409 when it is not on hold). */
export async function liftOrderHold(db: Db, id: string, actor: NonNullable<OrderActor>, audit: AuditContext): Promise<OrderDetail> {
  return db.transaction(async (tx) => {
    const order = await lockOrder(tx, id)
    if (!order.heldAt) throw new Conflict(`Order ${order.number} is not on hold`)
    await tx.update(orders).set({ heldAt: null, holdReason: null, heldBy: null, updatedAt: new Date() }).where(eq(orders.id, order.id))
    await addOrderEvent(tx, { orderId: order.id, kind: 'hold_lifted', message: `Taken off hold (it was held: ${order.holdReason ?? 'no reason given'}).`, data: { reason: order.holdReason }, actor })
    await refreshOrderReceivedMail(tx, order.id)
    await recordAudit(tx, audit, { action: 'order.hold_lift', entityType: 'order', entityId: order.id, summary: `Took order ${order.number} off hold` })
    return getOrder(tx, order.id)
  })
}

/**
 * A planner sets an order's priority or promised ship date. The due date of its work orders still to
 * ship follows the promised date. Cancelled and shipped orders are left as they are (409).
 */
export async function updateOrderPlan(db: Db, id: string, change: UpdateOrderPlan, actor: NonNullable<OrderActor>, audit: AuditContext): Promise<OrderDetail> {
  return db.transaction(async (tx) => {
    const order = await lockOrder(tx, id)
    if (order.status === 'cancelled' || order.status === 'shipped') throw new Conflict(`Order ${order.number} is ${statusInSentence(ORDER_STATUS_LABELS, order.status)}; its plan no longer changes`)
    const said: string[] = []
    if (change.priority !== undefined && change.priority !== order.priority) {
      await tx.update(orders).set({ priority: change.priority, updatedAt: new Date() }).where(eq(orders.id, order.id))
      const message = `Priority set to ${ORDER_PRIORITY_LABELS[change.priority].toLowerCase()} (was ${ORDER_PRIORITY_LABELS[order.priority].toLowerCase()}).`
      await addOrderEvent(tx, { orderId: order.id, kind: 'priority', message, data: { from: order.priority, to: change.priority }, actor })
      said.push(message)
    }
    if (change.promisedShipDate !== undefined && change.promisedShipDate !== order.promisedShipDate) {
      await tx.update(orders).set({ promisedShipDate: change.promisedShipDate, updatedAt: new Date() }).where(eq(orders.id, order.id))
      await tx
        .update(workOrders)
        .set({ dueDate: change.promisedShipDate, updatedAt: new Date() })
        .where(and(eq(workOrders.orderId, order.id), notInArray(workOrders.status, ['shipped', 'cancelled'])))
      const message = change.promisedShipDate
        ? `Promised ship date set to ${formatDay(change.promisedShipDate)}${order.promisedShipDate ? ` (was ${formatDay(order.promisedShipDate)})` : ''}.`
        : `Promised ship date cleared (was ${formatDay(order.promisedShipDate)}).`
      await addOrderEvent(tx, { orderId: order.id, kind: 'promised_date', message, data: { from: order.promisedShipDate, to: change.promisedShipDate }, actor })
      said.push(message)
    }
    if (said.length > 0) await recordAudit(tx, audit, { action: 'order.plan', entityType: 'order', entityId: order.id, summary: `Order ${order.number}: ${said.join(' ')}`, data: change })
    return getOrder(tx, order.id)
  })
}

/** The refusal for an action on a held order. */
export function onHoldConflict(order: Pick<OrderRow, 'number' | 'holdReason'>, action: 'released' | 'shipped'): Conflict {
  return new Conflict(`Order ${order.number} is on hold (${order.holdReason ?? 'no reason given'}); it cannot be ${action} until a planner takes it off hold`)
}
