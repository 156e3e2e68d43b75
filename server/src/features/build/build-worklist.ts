import { compareWorklist, isLate } from '@kitwright/shared/domain/worklist'
import type { BuildWorklistItem } from '@kitwright/shared/worklists'
import { eq, inArray } from 'drizzle-orm'
import type { Db } from '../../db/client'
import { bins, kitRevisions, kits, orders, workOrders } from '../../db/schema/index'
import { BUILDABLE_STATUSES } from '@kitwright/shared/build'

/** The most a bench list shows; a shop with more waiting has a planning problem, not a list problem. */
const LIMIT = 200

/**
 * Units ready for the build bench (cut, in build, back in rework), rush first, then by promised
 * ship date, then the longest wait. A unit waits since its last change of status.
 */
export async function buildWorklist(db: Db, today: string): Promise<BuildWorklistItem[]> {
  const rows = await db
    .select({
      wo: workOrders,
      kitSku: kits.sku,
      kitName: kits.name,
      revisionCode: kitRevisions.code,
      binCode: bins.code,
      orderNumber: orders.number,
      priority: orders.priority,
      promisedShipDate: orders.promisedShipDate,
    })
    .from(workOrders)
    .innerJoin(orders, eq(orders.id, workOrders.orderId))
    .innerJoin(kitRevisions, eq(kitRevisions.id, workOrders.kitRevisionId))
    .innerJoin(kits, eq(kits.id, kitRevisions.kitId))
    .leftJoin(bins, eq(bins.workOrderId, workOrders.id))
    .where(inArray(workOrders.status, [...BUILDABLE_STATUSES]))
  return rows
    .map((r) => ({
      workOrderId: r.wo.id,
      serial: r.wo.serial,
      status: r.wo.status,
      kitSku: r.kitSku,
      kitName: r.kitName,
      revisionCode: r.revisionCode,
      binCode: r.binCode,
      orderId: r.wo.orderId,
      orderNumber: r.orderNumber,
      rush: r.priority === 'rush',
      promisedShipDate: r.promisedShipDate,
      late: isLate(r.promisedShipDate, today),
      waitingSince: r.wo.updatedAt.toISOString(),
    }))
    .sort(compareWorklist)
    .slice(0, LIMIT)
}
