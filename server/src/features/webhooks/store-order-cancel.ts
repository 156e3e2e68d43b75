import { and, eq, notInArray } from 'drizzle-orm'
import type { Tx } from '../../db/client'
import { orders, workOrders, type OrderRow } from '../../db/schema/index'
import { addOrderEvent } from '../orders/orders.service'
import { releaseReservation } from '../stock/stock.service'

/**
 * Cancels an order the store cancelled, inside the caller's transaction: every work order not yet
 * shipped is cancelled and gives back the stock it had reserved. A shipped order stays as it is and
 * the timeline tells the planner to settle it with the customer.
 */
export async function cancelOrderFromStore(tx: Tx, order: OrderRow, detail: { eventId: string; reason?: string }) {
  const because = detail.reason ? ` (${detail.reason})` : ''
  if (order.status === 'cancelled') return
  if (order.status === 'shipped') {
    await addOrderEvent(tx, {
      orderId: order.id,
      kind: 'note',
      message: `The web store cancelled this order after it shipped${because}; nothing was changed here. Settle a return with the customer.`,
      data: { eventId: detail.eventId },
    })
    return
  }
  const open = await tx
    .select({ id: workOrders.id, serial: workOrders.serial })
    .from(workOrders)
    .where(and(eq(workOrders.orderId, order.id), notInArray(workOrders.status, ['shipped', 'cancelled'])))
    .orderBy(workOrders.serial)
    .for('update')
  for (const wo of open) {
    await releaseReservation(tx, { workOrderId: wo.id, lines: [], reason: `Order ${order.number} cancelled by the web store` }, null)
  }
  if (open.length > 0) {
    await tx
      .update(workOrders)
      .set({ status: 'cancelled', updatedAt: new Date() })
      .where(and(eq(workOrders.orderId, order.id), notInArray(workOrders.status, ['shipped', 'cancelled'])))
  }
  await tx.update(orders).set({ status: 'cancelled', cancelledAt: new Date(), updatedAt: new Date() }).where(eq(orders.id, order.id))
  const units = open.length ? ` ${open.length} work order${open.length === 1 ? '' : 's'} cancelled (${open.map((w) => w.serial).join(', ')}) and their reserved stock released.` : ''
  await addOrderEvent(tx, {
    orderId: order.id,
    kind: 'cancelled',
    message: `Cancelled by the web store${because}.${units}`,
    data: { eventId: detail.eventId, workOrders: open.map((w) => w.serial) },
  })
}
