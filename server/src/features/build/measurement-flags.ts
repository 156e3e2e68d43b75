import type { MeasurementFlag } from '@kitwright/shared/build'
import { and, desc, eq, isNull, notInArray } from 'drizzle-orm'
import type { Db } from '../../db/client'
import { buildSteps, buildStepTicks, kitRevisions, kits, orders, users, workOrders } from '../../db/schema/index'

/**
 * Out-of-limits measurements standing (not undone) on units that have not shipped or been
 * cancelled, newest first: the planner decides what to do about each.
 */
export async function listMeasurementFlags(db: Db): Promise<MeasurementFlag[]> {
  const rows = await db
    .select({ tick: buildStepTicks, step: buildSteps, wo: workOrders, orderNumber: orders.number, kitSku: kits.sku, revisionCode: kitRevisions.code, by: users.name })
    .from(buildStepTicks)
    .innerJoin(buildSteps, eq(buildSteps.id, buildStepTicks.buildStepId))
    .innerJoin(workOrders, eq(workOrders.id, buildStepTicks.workOrderId))
    .innerJoin(orders, eq(orders.id, workOrders.orderId))
    .innerJoin(kitRevisions, eq(kitRevisions.id, workOrders.kitRevisionId))
    .innerJoin(kits, eq(kits.id, kitRevisions.kitId))
    .innerJoin(users, eq(users.id, buildStepTicks.tickedBy))
    .where(and(eq(buildStepTicks.outOfLimits, true), isNull(buildStepTicks.undoneAt), notInArray(workOrders.status, ['shipped', 'cancelled'])))
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
  }))
}
