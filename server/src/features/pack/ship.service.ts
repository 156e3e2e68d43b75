import { and, eq, inArray, ne } from 'drizzle-orm'
import type { ShipResult } from '@kitwright/shared/pack'
import { orders, shipments, workOrders } from '../../db/schema/index'
import type { Deps } from '../../deps'
import type { SessionUser } from '../../lib/auth'
import { recordAudit, type AuditContext } from '../../lib/audit'
import { Conflict, NotFound } from '../../lib/http-errors'
import { freeBin } from '../bins/bins.service'
import { queueMail } from '../mail/mail.service'
import { onHoldConflict } from '../orders/order-lifecycle.service'
import { addOrderEvent } from '../orders/orders.service'
import { splitShipMovesByLot } from '../lots/lots.queries'
import { insertMoves, lockParts } from '../stock/stock.queries'
import { releaseReservation } from '../stock/stock.service'
import { loadPackData } from './pack-view'
import { bomOfRevisions, lockOrderRow, lockShipment, parcelsOf } from './pack.queries'
import { packView } from './pack.service'
import { unitRecordLink } from '../build/public-record'
import { shippedMailContent } from './shipped-mail'
import { WORK_ORDER_STATUS_LABELS, statusInSentence } from '@kitwright/shared/status-words'

/**
 * Ships a labelled shipment in one transaction: its units and the order marked shipped (or partly
 * shipped, the rest back-ordered), their bins freed, each unit's BOM taken off the shelf in the
 * ledger (`ship` moves) with its reservations released, and the customer's e-mail queued with the
 * tracking number and a link to each unit's build record. Parcels were recorded with the label.
 */
export async function shipShipment(
  deps: Pick<Deps, 'db' | 'carrier' | 'jobs' | 'publicUrl' | 'tokens'>,
  orderId: string,
  actor: SessionUser,
  audit: AuditContext,
): Promise<ShipResult> {
  let shipmentId = ''
  let mailQueued = false
  await deps.db.transaction(async (tx) => {
    const order = await lockOrderRow(tx, orderId)
    if (!order) throw new NotFound('No such order')
    if (order.heldAt) throw onHoldConflict(order, 'shipped')
    const data = await loadPackData(tx, orderId)
    if (!data.shipment) throw new Conflict(`Nothing of order ${order.number} is packed yet`)
    const shipment = await lockShipment(tx, data.shipment.id)
    if (!shipment || shipment.status !== 'labelled') throw new Conflict(`Buy the label for order ${order.number} before shipping it`)
    shipmentId = shipment.id
    const packed = await parcelsOf(tx, shipment.id)
    const ids = [...new Set(packed.flatMap((p) => p.workOrderIds))]
    const units = data.units.filter((u) => ids.includes(u.workOrder.id))
    const locked = await tx.select().from(workOrders).where(inArray(workOrders.id, ids)).for('update')
    const notReady = locked.filter((w) => w.status !== 'built')
    if (notReady.length > 0)
      throw new Conflict(
        `Cannot ship: ${notReady.map((w) => `${w.serial} is ${statusInSentence(WORK_ORDER_STATUS_LABELS, w.status)}`).join('; ')}. Take it out of the box and void the label (with the reason) to open the box again`,
      )

    const now = new Date()
    await tx.update(workOrders).set({ status: 'shipped', updatedAt: now }).where(inArray(workOrders.id, ids))
    for (const u of units) if (u.binId) await freeBin(tx, u.binId)

    // The ledger: parts locked in id order, each unit's reservations released, its BOM shipped off the shelf.
    const bom = await bomOfRevisions(tx, [...new Set(units.map((u) => u.revision.id))])
    await lockParts(
      tx,
      bom.map((b) => b.partId),
    )
    for (const u of units) {
      const why = `Order ${order.number}, unit ${u.workOrder.serial} shipped`
      await releaseReservation(tx, { workOrderId: u.workOrder.id, lines: [], reason: why }, actor)
      // Lot-tracked parts leave the shelf from the lots the build bench fitted into the unit.
      const moves = bom
        .filter((b) => b.revisionId === u.revision.id)
        .map((b) => ({
          partId: b.partId,
          kind: 'ship' as const,
          quantity: -b.quantity,
          workOrderId: u.workOrder.id,
          reason: why,
          reference: shipment.trackingNumber,
          createdBy: actor.id,
        }))
      await insertMoves(tx, await splitShipMovesByLot(tx, u.workOrder.id, moves))
    }

    const remaining = await tx
      .select({ serial: workOrders.serial })
      .from(workOrders)
      .where(and(eq(workOrders.orderId, order.id), ne(workOrders.status, 'shipped'), ne(workOrders.status, 'cancelled')))
    const status = remaining.length === 0 ? 'shipped' : 'partially_shipped'
    await tx
      .update(orders)
      .set({ status, shippedAt: remaining.length === 0 ? now : null, updatedAt: now })
      .where(eq(orders.id, order.id))
    await tx.update(shipments).set({ status: 'shipped', shippedAt: now, shippedBy: actor.id }).where(eq(shipments.id, shipment.id))
    const serials = units.map((u) => u.workOrder.serial)
    const backOrdered = remaining.map((r) => r.serial)
    // Each parcel has its own tracking number; shipments labelled before that carry one for all.
    const tracking =
      packed
        .map((p) => p.trackingNumber)
        .filter((t): t is string => Boolean(t))
        .join(', ') ||
      (shipment.trackingNumber ?? '')
    const summary = `Shipped ${serials.join(', ')} of order ${order.number}: ${shipment.carrier} ${shipment.service}, tracking ${tracking}, ${packed.length} parcel${packed.length === 1 ? '' : 's'}${backOrdered.length ? `; back-ordered ${backOrdered.join(', ')}` : ''}`
    await addOrderEvent(tx, {
      orderId: order.id,
      kind: status === 'shipped' ? 'shipped' : 'partially_shipped',
      message: summary,
      data: { shipmentId: shipment.id, trackingNumber: shipment.trackingNumber, serials },
      actor,
    })
    await recordAudit(tx, audit, { action: 'shipment.create', entityType: 'order', entityId: order.id, summary, data: { shipmentId: shipment.id } })

    const content = shippedMailContent({
      shopName: data.settings.shopName,
      customerName: order.customerName,
      orderNumber: order.number,
      carrier: shipment.carrier ?? 'the carrier',
      service: shipment.service ?? '',
      trackingNumber: tracking,
      units: await Promise.all(
        units.map(async (u) => {
          const built = data.items.some((i) => i.workOrderId === u.workOrder.id && i.kind === 'unit')
          const recordUrl = built ? await unitRecordLink(deps.tokens, deps.publicUrl, u.workOrder.serial) : null
          return { serial: u.workOrder.serial, description: `${u.kitName} (${u.kitSku}), serial ${u.workOrder.serial}`, recordUrl }
        }),
      ),
      backOrdered,
      electrical: bom.some((b) => b.electrical),
    })
    // One e-mail per shipment: a second attempt for the same shipment is dropped by the outbox.
    mailQueued = (await queueMail(tx, deps.jobs, { to: order.customerEmail, ...content, orderId: order.id, purpose: `shipped:${shipment.id}` })) !== null
  })
  return { view: await packView(deps, orderId, shipmentId), mailQueued }
}
