import type { MeasurementFlag } from '@kitwright/shared/measurement-flags'
import { and, desc, eq, isNull, notInArray, type SQL } from 'drizzle-orm'
import { alias } from 'drizzle-orm/pg-core'
import type { Db, Tx } from '../../db/client'
import { buildSteps, buildStepTicks, kitRevisions, kits, orders, users, workOrders } from '../../db/schema/index'

/**
 * Which out-of-limits measurements: the planner's attention list (standing, not undone, on units
 * that have not shipped or been cancelled), or every one recorded on an order's units, those undone
 * to measure again (reworked) and those on shipped units included, for the order page.
 */
export type MeasurementFlagScope = { attention: true } | { orderId: string }

const undoer = alias(users, 'undoer')

/** Out-of-limits measurements in the scope, newest first (the home page and the order page read the same rows). */
export async function listMeasurementFlags(db: Db | Tx, scope: MeasurementFlagScope = { attention: true }): Promise<MeasurementFlag[]> {
  const where: SQL | undefined =
    'orderId' in scope
      ? and(eq(buildStepTicks.outOfLimits, true), eq(workOrders.orderId, scope.orderId))
      : and(eq(buildStepTicks.outOfLimits, true), isNull(buildStepTicks.undoneAt), notInArray(workOrders.status, ['shipped', 'cancelled']))
  const rows = await db
    .select({
      tick: buildStepTicks,
      step: buildSteps,
      wo: workOrders,
      orderNumber: orders.number,
      kitSku: kits.sku,
      revisionCode: kitRevisions.code,
      by: users.name,
      undoneBy: undoer.name,
    })
    .from(buildStepTicks)
    .innerJoin(buildSteps, eq(buildSteps.id, buildStepTicks.buildStepId))
    .innerJoin(workOrders, eq(workOrders.id, buildStepTicks.workOrderId))
    .innerJoin(orders, eq(orders.id, workOrders.orderId))
    .innerJoin(kitRevisions, eq(kitRevisions.id, workOrders.kitRevisionId))
    .innerJoin(kits, eq(kits.id, kitRevisions.kitId))
    .innerJoin(users, eq(users.id, buildStepTicks.tickedBy))
    .leftJoin(undoer, eq(undoer.id, buildStepTicks.undoneBy))
    .where(where)
    .orderBy(desc(buildStepTicks.tickedAt))
    .limit(200)
  return rows.map((r) => ({
    tickId: r.tick.id,
    workOrderId: r.wo.id,
    serial: r.wo.serial,
    workOrderStatus: r.wo.status,
    orderId: r.wo.orderId,
    orderNumber: r.orderNumber,
    kitSku: r.kitSku,
    revisionCode: r.revisionCode,
    stepPosition: r.step.position,
    stepText: r.step.text,
    measurement: Number(r.tick.measurement),
    unit: r.step.measurementUnit,
    min: r.step.measurementMin === null ? null : Number(r.step.measurementMin),
    max: r.step.measurementMax === null ? null : Number(r.step.measurementMax),
    reason: r.tick.outOfLimitsReason,
    rework: r.step.outOfLimitsRework,
    by: r.by,
    at: r.tick.tickedAt.toISOString(),
    undoneAt: r.tick.undoneAt?.toISOString() ?? null,
    undoneBy: r.tick.undoneAt ? r.undoneBy : null,
  }))
}
