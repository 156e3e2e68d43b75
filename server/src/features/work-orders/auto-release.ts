import { eq } from 'drizzle-orm'
import type { ReleasedOrder } from '@kitwright/shared/work-orders'
import type { Tx } from '../../db/client'
import { orders, shopSettings } from '../../db/schema/index'
import { recordAudit } from '../../lib/audit'
import { HttpError } from '../../lib/http-errors'
import { addOrderEvent } from '../orders/orders.service'
import { releaseOrder } from './release.service'

/**
 * Releases a paid store or phone order as soon as it is paid (in the job that takes a store order in,
 * or where a phone order's payment is recorded), when the shop's "release paid orders
 * automatically" setting is on: with `allowShort`, so short stock leaves the work orders waiting
 * with their shortage listed. The release runs in a savepoint of the caller's transaction; when it
 * is refused (a line that maps to no kit, a kit with no released revision) nothing of it is kept,
 * the order stays received, and the timeline says why, so a planner releases it by hand.
 */
export async function autoReleasePaidOrder(tx: Tx, orderId: string): Promise<ReleasedOrder | null> {
  const [settings] = await tx.select({ on: shopSettings.autoReleasePaid }).from(shopSettings).where(eq(shopSettings.id, 1))
  if (!settings?.on) return null
  const [order] = await tx.select().from(orders).where(eq(orders.id, orderId))
  if (!order || order.source === 'csv' || order.paymentStatus !== 'paid' || order.status !== 'open' || order.heldAt) return null
  try {
    const released = await tx.transaction((sp) => releaseOrder(sp, orderId, { allowShort: true, automatic: true }, null))
    const serials = released.workOrders.map((w) => w.serial).join(', ')
    await recordAudit(tx, { actorId: null, actorEmail: null, bench: null, address: null }, {
      action: 'order.release',
      entityType: 'order',
      entityId: orderId,
      summary: `Released order ${order.number} automatically when paid into ${released.workOrders.length} work order(s): ${serials}`,
    })
    return released
  } catch (err) {
    if (!(err instanceof HttpError)) throw err
    await addOrderEvent(tx, { orderId, kind: 'note', message: `Not released automatically: ${err.message}`, data: { status: err.status }, actor: null })
    return null
  }
}
