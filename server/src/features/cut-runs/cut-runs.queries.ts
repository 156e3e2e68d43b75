import { and, asc, eq, inArray, ne, sql } from 'drizzle-orm'
import type { Db, Tx } from '../../db/client'
import {
  bins,
  cutParts,
  cutRunCuts,
  cutRuns,
  cutRunSticks,
  kitRevisions,
  kits,
  offcuts,
  orders,
  parts,
  users,
  workOrders,
} from '../../db/schema/index'

type Conn = Db | Tx

/** Work orders with their kit, revision and order number, by id. */
export async function selectWorkOrders(db: Conn, ids: readonly string[]) {
  if (ids.length === 0) return []
  return db
    .select({
      id: workOrders.id,
      serial: workOrders.serial,
      status: workOrders.status,
      dueDate: workOrders.dueDate,
      revisionId: workOrders.kitRevisionId,
      revisionCode: kitRevisions.code,
      kitId: kits.id,
      kitSku: kits.sku,
      kitName: kits.name,
      orderNumber: orders.number,
    })
    .from(workOrders)
    .innerJoin(kitRevisions, eq(kitRevisions.id, workOrders.kitRevisionId))
    .innerJoin(kits, eq(kits.id, kitRevisions.kitId))
    .innerJoin(orders, eq(orders.id, workOrders.orderId))
    .where(inArray(workOrders.id, [...new Set(ids)]))
}
export type WorkOrderRecord = Awaited<ReturnType<typeof selectWorkOrders>>[number]

/** The cut parts of the given revisions, in their order. */
export async function selectCutParts(db: Conn, revisionIds: readonly string[]) {
  if (revisionIds.length === 0) return []
  return db
    .select()
    .from(cutParts)
    .where(inArray(cutParts.revisionId, [...new Set(revisionIds)]))
    .orderBy(asc(cutParts.revisionId), asc(cutParts.position))
}

/**
 * Work orders already in a published run (or a finished one) with cuts not moved away by a re-plan:
 * they are cut, or being cut, and may not go into another run.
 */
export async function selectWorkOrdersInRuns(db: Conn, workOrderIds: readonly string[], exceptRunId?: string) {
  if (workOrderIds.length === 0) return []
  return db
    .selectDistinct({ workOrderId: cutRunCuts.workOrderId, number: cutRuns.number })
    .from(cutRunCuts)
    .innerJoin(cutRuns, eq(cutRuns.id, cutRunCuts.cutRunId))
    .where(
      and(
        inArray(cutRunCuts.workOrderId, [...workOrderIds]),
        inArray(cutRuns.status, ['published', 'done']),
        ne(cutRunCuts.status, 'replanned'),
        exceptRunId ? ne(cutRuns.id, exceptRunId) : undefined,
      ),
    )
}

/** Work orders waiting to be cut whose revision has cut parts and which no published run holds. */
export async function selectCandidateIds(db: Conn, filter: { dueBy?: string; kitId?: string }) {
  const rows = await db.execute<{ id: string }>(sql`
    select w.id from work_orders w
    join kit_revisions r on r.id = w.kit_revision_id
    where w.status = 'waiting_cut'
      and exists (select 1 from cut_parts c where c.revision_id = r.id)
      and not exists (
        select 1 from cut_run_cuts c join cut_runs cr on cr.id = c.cut_run_id
        where c.work_order_id = w.id and cr.status in ('published', 'done') and c.status <> 'replanned')
      ${filter.dueBy ? sql`and w.due_date <= ${filter.dueBy}` : sql``}
      ${filter.kitId ? sql`and r.kit_id = ${filter.kitId}` : sql``}
    order by w.due_date asc nulls last, w.serial asc
    limit 1000
  `)
  return rows.rows.map((r) => r.id)
}

/** Offcuts of these parts on the rack and free to plan. */
export async function selectOffcutsInStock(db: Conn, partIds: readonly string[]) {
  if (partIds.length === 0) return []
  return db
    .select()
    .from(offcuts)
    .where(and(inArray(offcuts.partId, [...partIds]), eq(offcuts.status, 'in_stock')))
    .orderBy(asc(offcuts.length), asc(offcuts.id))
}

/** Active pipe parts. */
export async function selectPipeParts(db: Conn, ids?: readonly string[]) {
  return db
    .select()
    .from(parts)
    .where(and(eq(parts.kind, 'stock_length'), eq(parts.active, true), ids ? inArray(parts.id, ids.length ? [...ids] : ['00000000-0000-0000-0000-000000000000']) : undefined))
    .orderBy(asc(parts.sku))
}

/** The next cut run number: CR-0001, CR-0002, … */
export async function nextRunNumber(tx: Tx) {
  const result = await tx.execute<{ n: string }>(sql`select nextval('cut_run_number_seq')::text as n`)
  return `CR-${result.rows[0]!.n.padStart(4, '0')}`
}

export async function selectRun(db: Conn, id: string, lock = false) {
  const q = db.select().from(cutRuns).where(eq(cutRuns.id, id))
  const [row] = lock ? await q.for('update') : await q
  return row
}

/** Everything the run's page and the bench show, in three queries. */
export async function selectRunContents(db: Conn, runId: string) {
  const sticks = await db
    .select({
      stick: cutRunSticks,
      partSku: parts.sku,
      partName: parts.name,
      // The label codes of the offcut a stick was cut from and of the one it made.
      sourceOffcutCode: sql<string | null>`(select o.code from offcuts o where o.id = ${cutRunSticks.sourceOffcutId})`,
      offcutCode: sql<string | null>`(select o.code from offcuts o where o.id = ${cutRunSticks.offcutId})`,
    })
    .from(cutRunSticks)
    .innerJoin(parts, eq(parts.id, cutRunSticks.partId))
    .where(eq(cutRunSticks.cutRunId, runId))
    .orderBy(asc(cutRunSticks.position))
  const cuts = await db
    .select({ cut: cutRunCuts, serial: workOrders.serial, label: cutParts.label, cutByName: users.name })
    .from(cutRunCuts)
    .innerJoin(workOrders, eq(workOrders.id, cutRunCuts.workOrderId))
    .innerJoin(cutParts, eq(cutParts.id, cutRunCuts.cutPartId))
    .leftJoin(users, eq(users.id, cutRunCuts.cutBy))
    .where(eq(cutRunCuts.cutRunId, runId))
    .orderBy(asc(cutRunCuts.position))
  const woIds = [...new Set(cuts.map((c) => c.cut.workOrderId))]
  const workOrderRows = await selectWorkOrders(db, woIds)
  const binRows = woIds.length ? await db.select().from(bins).where(inArray(bins.workOrderId, woIds)) : []
  return { sticks, cuts, workOrders: workOrderRows, bins: binRows }
}

export async function userNames(db: Conn, ids: (string | null)[]) {
  const wanted = ids.filter((i): i is string => i !== null)
  if (wanted.length === 0) return new Map<string, string>()
  const rows = await db.select({ id: users.id, name: users.name }).from(users).where(inArray(users.id, wanted))
  return new Map(rows.map((r) => [r.id, r.name]))
}
