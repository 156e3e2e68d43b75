import { and, asc, desc, eq, inArray, isNotNull, isNull, ne, sql } from 'drizzle-orm'
import type { Db, Tx } from '../../db/client'
import {
  bins,
  buildSteps,
  buildStepTicks,
  cutParts,
  cutRunCuts,
  cutRuns,
  cutRunSticks,
  kitRevisions,
  kits,
  leakTests,
  orders,
  parts,
  reworkEntries,
  unitPhotos,
  users,
  workOrders,
} from '../../db/schema/index'

type Conn = Db | Tx

export async function findWorkOrderById(db: Conn, id: string) {
  const [row] = await db.select().from(workOrders).where(eq(workOrders.id, id))
  return row
}

/** The work order row, locked for the rest of the transaction: one change to a unit at a time. */
export async function lockWorkOrder(tx: Tx, id: string) {
  const [row] = await tx.select().from(workOrders).where(eq(workOrders.id, id)).for('update')
  return row
}

export async function findWorkOrderBySerial(db: Conn, serial: string) {
  const [row] = await db.select().from(workOrders).where(sql`upper(${workOrders.serial}) = ${serial.toUpperCase()}`)
  return row
}

export async function findBinByCode(db: Conn, code: string) {
  const [row] = await db.select().from(bins).where(eq(bins.code, code.toUpperCase()))
  return row
}

export async function findBinOfWorkOrder(db: Conn, workOrderId: string) {
  const [row] = await db.select({ code: bins.code }).from(bins).where(eq(bins.workOrderId, workOrderId))
  return row
}

export async function findRevisionWithKit(db: Conn, revisionId: string) {
  const [row] = await db
    .select({ revision: kitRevisions, kit: { sku: kits.sku, name: kits.name } })
    .from(kitRevisions)
    .innerJoin(kits, eq(kits.id, kitRevisions.kitId))
    .where(eq(kitRevisions.id, revisionId))
  return row
}

export function stepsOfRevision(db: Conn, revisionId: string) {
  return db.select().from(buildSteps).where(eq(buildSteps.revisionId, revisionId)).orderBy(asc(buildSteps.position))
}

export async function findStep(db: Conn, revisionId: string, stepId: string) {
  const [row] = await db.select().from(buildSteps).where(and(eq(buildSteps.id, stepId), eq(buildSteps.revisionId, revisionId)))
  return row
}

/** Every tick of the unit, undone ones too, oldest first. */
export function ticksOfWorkOrder(db: Conn, workOrderId: string) {
  return db.select().from(buildStepTicks).where(eq(buildStepTicks.workOrderId, workOrderId)).orderBy(asc(buildStepTicks.tickedAt), asc(buildStepTicks.id))
}

export async function standingTick(db: Conn, workOrderId: string, stepId: string) {
  const [row] = await db
    .select()
    .from(buildStepTicks)
    .where(and(eq(buildStepTicks.workOrderId, workOrderId), eq(buildStepTicks.buildStepId, stepId), isNull(buildStepTicks.undoneAt)))
  return row
}

/** Photos whose upload a HEAD confirmed, oldest first. */
export function confirmedPhotos(db: Conn, workOrderId: string) {
  return db
    .select()
    .from(unitPhotos)
    .where(and(eq(unitPhotos.workOrderId, workOrderId), isNotNull(unitPhotos.uploadedAt)))
    .orderBy(asc(unitPhotos.uploadedAt))
}

export async function findPhotoByKey(db: Conn, workOrderId: string, key: string) {
  const [row] = await db.select().from(unitPhotos).where(and(eq(unitPhotos.workOrderId, workOrderId), eq(unitPhotos.key, key)))
  return row
}

export function leakTestsOfWorkOrder(db: Conn, workOrderId: string) {
  return db.select().from(leakTests).where(eq(leakTests.workOrderId, workOrderId)).orderBy(asc(leakTests.attempt))
}

export async function lastAttempt(tx: Tx, workOrderId: string): Promise<number> {
  const [row] = await tx.select({ attempt: leakTests.attempt }).from(leakTests).where(eq(leakTests.workOrderId, workOrderId)).orderBy(desc(leakTests.attempt)).limit(1)
  return row?.attempt ?? 0
}

export function reworkOfWorkOrder(db: Conn, workOrderId: string) {
  return db.select().from(reworkEntries).where(eq(reworkEntries.workOrderId, workOrderId)).orderBy(asc(reworkEntries.createdAt))
}

/** Names of the people behind the ids, for "who did it". */
export async function namesOf(db: Conn, ids: Iterable<string | null>): Promise<Map<string, string>> {
  const wanted = [...new Set([...ids].filter((i): i is string => i !== null))]
  if (wanted.length === 0) return new Map()
  const rows = await db.select({ id: users.id, name: users.name }).from(users).where(inArray(users.id, wanted))
  return new Map(rows.map((r) => [r.id, r.name]))
}

export async function orderNumberOf(db: Conn, orderId: string) {
  const [row] = await db.select({ number: orders.number }).from(orders).where(eq(orders.id, orderId))
  return row?.number ?? ''
}

/** The unit's pipe pieces with the stick and cut run each came from (pieces moved by a re-plan left out). */
export function piecesOfWorkOrder(db: Conn, workOrderId: string) {
  return db
    .select({
      label: cutParts.label,
      length: cutRunCuts.length,
      status: cutRunCuts.status,
      cutBy: cutRunCuts.cutBy,
      cutAt: cutRunCuts.cutAt,
      cutRunNumber: cutRuns.number,
      stickPosition: cutRunSticks.position,
      stickLength: cutRunSticks.stickLength,
      sourceOffcutId: cutRunSticks.sourceOffcutId,
      partSku: parts.sku,
    })
    .from(cutRunCuts)
    .innerJoin(cutRunSticks, eq(cutRunSticks.id, cutRunCuts.stickId))
    .innerJoin(cutRuns, eq(cutRuns.id, cutRunCuts.cutRunId))
    .innerJoin(cutParts, eq(cutParts.id, cutRunCuts.cutPartId))
    .innerJoin(parts, eq(parts.id, cutRunSticks.partId))
    .where(and(eq(cutRunCuts.workOrderId, workOrderId), ne(cutRunCuts.status, 'replanned'), ne(cutRuns.status, 'cancelled')))
    .orderBy(asc(cutRuns.number), asc(cutRunSticks.position), asc(cutRunCuts.position))
}
