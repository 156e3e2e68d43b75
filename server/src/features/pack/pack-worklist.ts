import { compareWorklist, isLate } from '@kitwright/shared/domain/worklist'
import type { PackWorklistItem } from '@kitwright/shared/worklists'
import { and, eq, inArray, isNull, notInArray, sql } from 'drizzle-orm'
import type { Db } from '../../db/client'
import { bins, orders, workOrders } from '../../db/schema/index'

const LIMIT = 200

/**
 * Orders with units ready for the pack bench (built and leak-tested), not on hold: rush first, then
 * by promised ship date, then the longest wait. An order waits since its first unit was built.
 */
export async function packWorklist(db: Db, today: string): Promise<PackWorklistItem[]> {
  const rows = await db
    .select({ wo: workOrders, binCode: bins.code, order: orders })
    .from(workOrders)
    .innerJoin(orders, eq(orders.id, workOrders.orderId))
    .leftJoin(bins, eq(bins.workOrderId, workOrders.id))
    .where(and(eq(workOrders.status, 'built'), isNull(orders.heldAt), notInArray(orders.status, ['shipped', 'cancelled'])))
  const orderIds = [...new Set(rows.map((r) => r.order.id))]
  const toShip = orderIds.length
    ? await db
        .select({ orderId: workOrders.orderId, n: sql<number>`count(*)::int` })
        .from(workOrders)
        .where(and(inArray(workOrders.orderId, orderIds), notInArray(workOrders.status, ['shipped', 'cancelled'])))
        .groupBy(workOrders.orderId)
    : []
  const byOrder = new Map<string, PackWorklistItem>()
  for (const r of rows.sort((a, b) => a.wo.serial.localeCompare(b.wo.serial))) {
    const since = r.wo.updatedAt.toISOString()
    const item = byOrder.get(r.order.id)
    if (item) {
      item.ready.push({ serial: r.wo.serial, binCode: r.binCode })
      if (since < item.waitingSince) item.waitingSince = since
      continue
    }
    byOrder.set(r.order.id, {
      orderId: r.order.id,
      orderNumber: r.order.number,
      customerName: r.order.shipName,
      shipCountry: r.order.shipCountry,
      ready: [{ serial: r.wo.serial, binCode: r.binCode }],
      unitsToShip: toShip.find((c) => c.orderId === r.order.id)?.n ?? 0,
      rush: r.order.priority === 'rush',
      promisedShipDate: r.order.promisedShipDate,
      late: isLate(r.order.promisedShipDate, today),
      waitingSince: since,
    })
  }
  return [...byOrder.values()].sort(compareWorklist).slice(0, LIMIT)
}
