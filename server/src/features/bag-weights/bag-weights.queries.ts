import { and, asc, desc, eq, inArray, sql } from 'drizzle-orm'
import type { Db, Tx } from '../../db/client'
import { bagWeighings, parts, unitWeightSamples, users, type NewPartRow } from '../../db/schema/index'

type Conn = Db | Tx
const NONE = ['00000000-0000-0000-0000-000000000000']

const sampleColumns = {
  id: unitWeightSamples.id,
  partId: unitWeightSamples.partId,
  sampleCount: unitWeightSamples.sampleCount,
  sampleMg: unitWeightSamples.sampleMg,
  unitMg: unitWeightSamples.unitMg,
  spreadMg: unitWeightSamples.spreadMg,
  spreadSource: unitWeightSamples.spreadSource,
  singlesMg: unitWeightSamples.singlesMg,
  packedLoose: unitWeightSamples.packedLoose,
  recordedBy: unitWeightSamples.recordedBy,
  recordedAt: unitWeightSamples.recordedAt,
  recordedByName: users.name,
  partName: parts.name,
}
export type SampleWithNames = Awaited<ReturnType<typeof latestSamples>>[number]

/** The latest sample of each part (its unit weight now), for the given parts or all. */
export function latestSamples(db: Conn, partIds?: readonly string[]) {
  return db
    .selectDistinctOn([unitWeightSamples.partId], sampleColumns)
    .from(unitWeightSamples)
    .innerJoin(users, eq(users.id, unitWeightSamples.recordedBy))
    .innerJoin(parts, eq(parts.id, unitWeightSamples.partId))
    .where(partIds ? inArray(unitWeightSamples.partId, partIds.length ? [...partIds] : NONE) : undefined)
    .orderBy(unitWeightSamples.partId, desc(unitWeightSamples.recordedAt), desc(unitWeightSamples.id))
}

/** Every sample of one part, newest first. */
export function samplesOfPart(db: Conn, partId: string) {
  return db
    .select(sampleColumns)
    .from(unitWeightSamples)
    .innerJoin(users, eq(users.id, unitWeightSamples.recordedBy))
    .innerJoin(parts, eq(parts.id, unitWeightSamples.partId))
    .where(eq(unitWeightSamples.partId, partId))
    .orderBy(desc(unitWeightSamples.recordedAt), desc(unitWeightSamples.id))
}

/** Parts that can be counted by weight: hardware and packaging stocked "each", active. */
export function countableParts(db: Conn) {
  return db
    .select({ id: parts.id, sku: parts.sku, name: parts.name, kind: parts.kind })
    .from(parts)
    .where(and(inArray(parts.kind, ['hardware', 'packaging'] satisfies NewPartRow['kind'][]), eq(parts.unitOfMeasure, 'each'), eq(parts.active, true)))
    .orderBy(asc(parts.kind), asc(parts.name))
}

export async function findPart(db: Conn, id: string) {
  const [row] = await db.select().from(parts).where(eq(parts.id, id))
  return row
}

const weighingColumns = { weighing: bagWeighings, weighedByName: users.name }
export type WeighingWithName = { weighing: typeof bagWeighings.$inferSelect; weighedByName: string }

/** The latest weighing of each bag of an order. */
export function latestWeighingsOfOrder(db: Conn, orderId: string): Promise<WeighingWithName[]> {
  return db
    .selectDistinctOn([bagWeighings.workOrderId, bagWeighings.itemKey], weighingColumns)
    .from(bagWeighings)
    .innerJoin(users, eq(users.id, bagWeighings.weighedBy))
    .where(eq(bagWeighings.orderId, orderId))
    .orderBy(bagWeighings.workOrderId, bagWeighings.itemKey, desc(bagWeighings.weighedAt), sql`${bagWeighings.id} desc`)
}

/** A weighing by its request key (a retried weighing). */
export async function weighingByRequestKey(db: Conn, requestKey: string): Promise<WeighingWithName | undefined> {
  const [row] = await db.select(weighingColumns).from(bagWeighings).innerJoin(users, eq(users.id, bagWeighings.weighedBy)).where(eq(bagWeighings.requestKey, requestKey))
  return row
}

/** The latest weighing of one bag, or undefined when it was never weighed. */
export async function latestWeighingOf(db: Conn, workOrderId: string, itemKey: string) {
  const [row] = await db
    .select()
    .from(bagWeighings)
    .where(and(eq(bagWeighings.workOrderId, workOrderId), eq(bagWeighings.itemKey, itemKey)))
    .orderBy(desc(bagWeighings.weighedAt), sql`${bagWeighings.id} desc`)
    .limit(1)
  return row
}
