import { and, eq, inArray, max, sql } from 'drizzle-orm'
import type { NestInput } from '@kitwright/shared/domain/nesting/index'
import type { AssignBin, CutRunDetail, DamageStick } from '@kitwright/shared/cut-runs'
import type { Db, Tx } from '../../db/client'
import { bins, cutRunCuts, cutRuns, cutRunSticks, offcuts, workOrders, type CutRunRow } from '../../db/schema/index'
import type { SessionUser } from '../../lib/auth'
import { BadRequest, Conflict, NotFound } from '../../lib/http-errors'
import { assignBin } from '../bins/bins.service'
import { stockCutPiece } from '../orders/order-lifecycle.service'
import { getShopSettings } from '../settings/settings.service'
import { reserveStock } from '../stock/stock.service'
import { selectRun } from './cut-runs.queries'
import { getCutRun, nestParts, reserveOffcuts } from './cut-runs.service'
import { loadPipeStock } from './pipe-stock'
import { insertPlanRows } from './plan-rows'
import { startStick, stockRemnant, unstockRemnant } from './stick-ledger'
import { CUT_RUN_STATUS_LABELS, WORK_ORDER_STATUS_LABELS, statusInSentence } from '@kitwright/shared/status-words'

type Actor = Pick<SessionUser, 'id' | 'name'>

async function publishedRun(tx: Tx | Db, id: string): Promise<CutRunRow> {
  const run = await selectRun(tx, id)
  if (!run) throw new NotFound('No such cut run')
  if (run.status === 'draft') throw new Conflict(`Cut run ${run.number} is not published yet; the planner publishes it first`)
  if (run.status === 'cancelled') throw new Conflict(`Cut run ${run.number} was cancelled`)
  return run
}

/** The cut and its stick, the stick locked so ticks on one stick queue one behind the other. */
async function lockCut(tx: Tx, runId: string, cutId: string) {
  const [found] = await tx
    .select()
    .from(cutRunCuts)
    .where(and(eq(cutRunCuts.id, cutId), eq(cutRunCuts.cutRunId, runId)))
  if (!found) throw new NotFound('No such cut in this run')
  const [stick] = await tx.select().from(cutRunSticks).where(eq(cutRunSticks.id, found.stickId)).for('update')
  const [cut] = await tx.select().from(cutRunCuts).where(eq(cutRunCuts.id, cutId))
  return { cut: cut!, stick: stick! }
}

/**
 * A work order is cut when none of its pieces in published runs waits and it has a bin; an undone
 * or spoiled piece sends a `cut` work order back to waiting.
 */
async function settleWorkOrder(tx: Tx, workOrderId: string) {
  const [counts] = await tx
    .execute<{ pending: number; total: number }>(
      sql`
    select count(*) filter (where c.status = 'pending')::int as pending, count(*)::int as total
    from cut_run_cuts c join cut_runs r on r.id = c.cut_run_id
    where c.work_order_id = ${workOrderId} and r.status in ('published', 'done') and c.status <> 'replanned'
  `,
    )
    .then((r) => r.rows)
  const [bin] = await tx.select({ id: bins.id }).from(bins).where(eq(bins.workOrderId, workOrderId))
  const [wo] = await tx.select().from(workOrders).where(eq(workOrders.id, workOrderId)).for('update')
  if (!wo) return
  const complete = counts !== undefined && counts.total > 0 && counts.pending === 0 && bin !== undefined
  if (complete && wo.status === 'waiting_cut') await tx.update(workOrders).set({ status: 'cut', updatedAt: new Date() }).where(eq(workOrders.id, wo.id))
  if (!complete && wo.status === 'cut') await tx.update(workOrders).set({ status: 'waiting_cut', updatedAt: new Date() }).where(eq(workOrders.id, wo.id))
}

/** A run is done when no stick waits or is on the saw. */
async function settleRun(tx: Tx, run: CutRunRow) {
  const [open] = await tx
    .select({ id: cutRunSticks.id })
    .from(cutRunSticks)
    .where(and(eq(cutRunSticks.cutRunId, run.id), inArray(cutRunSticks.status, ['pending', 'in_progress'])))
    .limit(1)
  if (!open && run.status === 'published') await tx.update(cutRuns).set({ status: 'done', completedAt: new Date() }).where(eq(cutRuns.id, run.id))
  if (open && run.status === 'done') await tx.update(cutRuns).set({ status: 'published', completedAt: null }).where(eq(cutRuns.id, run.id))
}

/**
 * Ticks one piece as cut, with who and when. The first tick on a stick takes it off the rack in the
 * ledger; the last one finishes it and stocks its remnant as an offcut. Ticking a piece already cut
 * changes nothing, so two cutters tapping the same piece record it once.
 */
export async function tickCut(db: Db, runId: string, cutId: string, actor: Actor): Promise<CutRunDetail> {
  return (await tickCutOnce(db, runId, cutId, actor)).run
}

/** As `tickCut`, saying whether the piece was cut already (another cutter, or the same tap sent twice). */
export async function tickCutOnce(db: Db, runId: string, cutId: string, actor: Actor): Promise<{ run: CutRunDetail; alreadyCut: boolean }> {
  const alreadyCut = await db.transaction(async (tx) => {
    const run = await publishedRun(tx, runId)
    const { cut, stick } = await lockCut(tx, runId, cutId)
    if (cut.status === 'cut') return true
    if (cut.status === 'replanned') throw new Conflict('This piece was moved to another stick by a re-plan; cut it there')
    if (stick.status === 'damaged') throw new Conflict(`Stick ${stick.position} was marked damaged; its pieces are on other sticks now`)
    await startStick(tx, run, stick, actor)
    await tx
      .update(cutRunCuts)
      .set({ status: 'cut', cutBy: actor.id, cutAt: new Date() })
      .where(and(eq(cutRunCuts.id, cut.id), eq(cutRunCuts.status, 'pending')))
    // A piece of a unit cancelled after the run was published goes straight to the offcut rack.
    const [owner] = await tx.select({ status: workOrders.status, serial: workOrders.serial }).from(workOrders).where(eq(workOrders.id, cut.workOrderId))
    if (owner?.status === 'cancelled') {
      const note = `Piece cut for cancelled unit ${owner.serial} (cut run ${run.number})`
      await stockCutPiece(tx, {
        partId: stick.partId,
        length: cut.length,
        workOrderId: cut.workOrderId,
        minOffcut: run.minOffcut,
        note,
        reason: `Cut run ${run.number}: unit ${owner.serial} was cancelled`,
        actorId: actor.id,
      })
    }
    const [left] = await tx
      .select({ id: cutRunCuts.id })
      .from(cutRunCuts)
      .where(and(eq(cutRunCuts.stickId, stick.id), eq(cutRunCuts.status, 'pending')))
      .limit(1)
    if (!left) {
      const [done] = await tx.update(cutRunSticks).set({ status: 'done', finishedAt: new Date() }).where(eq(cutRunSticks.id, stick.id)).returning()
      await stockRemnant(tx, run, done!, actor)
    }
    await settleWorkOrder(tx, cut.workOrderId)
    await settleRun(tx, run)
    return false
  })
  return { run: await getCutRun(db, runId), alreadyCut }
}

/** Takes back a tick made by mistake (the stick stays taken from the rack: it is on the saw). */
export async function undoCut(db: Db, runId: string, cutId: string, actor: Actor): Promise<CutRunDetail> {
  await db.transaction(async (tx) => {
    const run = await publishedRun(tx, runId)
    const { cut, stick } = await lockCut(tx, runId, cutId)
    if (cut.status !== 'cut') throw new Conflict('This piece is not ticked; there is nothing to undo')
    if (stick.status === 'damaged') throw new Conflict(`Stick ${stick.position} was marked damaged; its ticks stay as they are`)
    const [wo] = await tx.select().from(workOrders).where(eq(workOrders.id, cut.workOrderId))
    if (wo && !['waiting_cut', 'cut'].includes(wo.status))
      throw new Conflict(`Work order ${wo.serial} is ${statusInSentence(WORK_ORDER_STATUS_LABELS, wo.status)} already; its pieces left the cut bench`)
    if (stick.status === 'done') {
      if (!(await unstockRemnant(tx, run, stick, actor)))
        throw new Conflict(`The offcut from stick ${stick.position} is already planned or used elsewhere; the tick stays`)
      await tx.update(cutRunSticks).set({ status: 'in_progress', finishedAt: null }).where(eq(cutRunSticks.id, stick.id))
    }
    await tx.update(cutRunCuts).set({ status: 'pending', cutBy: null, cutAt: null }).where(eq(cutRunCuts.id, cut.id))
    await settleWorkOrder(tx, cut.workOrderId)
    await settleRun(tx, (await selectRun(tx, runId))!)
  })
  return getCutRun(db, runId)
}

/**
 * A damaged or miscut stick: its material is consumed (scrapped), and only its pieces not yet cut,
 * plus any ticked pieces spoiled with it, are planned again by the engine from the stock that is
 * left; the new sticks are reserved and added to the end of the run. Nothing changes when the new
 * plan cannot be reserved (409 saying what is short).
 */
export async function damageStick(db: Db, runId: string, stickId: string, input: DamageStick, actor: Actor): Promise<CutRunDetail> {
  const run = await publishedRun(db, runId)
  if (run.status !== 'published') throw new Conflict(`Cut run ${run.number} is ${statusInSentence(CUT_RUN_STATUS_LABELS, run.status)}`)
  const [stick] = await db
    .select()
    .from(cutRunSticks)
    .where(and(eq(cutRunSticks.id, stickId), eq(cutRunSticks.cutRunId, runId)))
  if (!stick) throw new NotFound('No such stick in this run')
  if (stick.status === 'damaged') throw new Conflict(`Stick ${stick.position} is already marked damaged`)
  const cuts = await db.select().from(cutRunCuts).where(eq(cutRunCuts.stickId, stickId))
  const fields: Record<string, string> = {}
  input.spoiledCutIds.forEach((id, i) => {
    const c = cuts.find((x) => x.id === id)
    if (!c) fields[`spoiledCutIds.${i}`] = 'Not a piece of this stick'
    else if (c.status !== 'cut') fields[`spoiledCutIds.${i}`] = 'Only a piece already cut can be spoiled; pieces not cut are planned again anyway'
  })
  const firstProblem = Object.values(fields)[0]
  if (firstProblem) throw new BadRequest(firstProblem, fields)
  const affected = cuts.filter((c) => c.status === 'pending' || input.spoiledCutIds.includes(c.id))
  if (affected.length === 0 && stick.status === 'done') throw new Conflict(`Stick ${stick.position} is cut already; mark the spoiled pieces to cut them again`)

  let plans: Awaited<ReturnType<typeof nestParts>> = []
  if (affected.length > 0) {
    const [pipe] = await loadPipeStock(db, [stick.partId])
    if (!pipe) throw new Conflict('The pipe of this stick is retired; nothing to re-plan from')
    const nestInput: NestInput = {
      pieces: affected.map((c) => ({ length: c.length, quantity: 1, workOrderRef: c.workOrderId, cutPartRef: c.cutPartId })),
      stock: pipe.sticks.filter((s) => s.available > 0).map((s) => ({ id: String(s.stickLength), length: s.stickLength, available: s.available })),
      offcuts: pipe.offcuts.map((o) => ({ id: o.id, length: o.length })),
      kerf: run.kerf,
      endTrim: run.endTrim,
      minOffcutLength: run.minOffcut,
    }
    if (nestInput.stock.length === 0 && nestInput.offcuts!.length === 0) {
      throw new Conflict(`No ${pipe.sku} left in stock to cut ${affected.length} piece${affected.length === 1 ? '' : 's'} again: receive sticks first`)
    }
    plans = await nestParts([{ partId: stick.partId, sku: pipe.sku, input: nestInput }], input.timeLimitSeconds * 1000)
  }
  const unit = (await getShopSettings(db)).displayUnit

  await db.transaction(async (tx) => {
    const [locked] = await tx.select().from(cutRunSticks).where(eq(cutRunSticks.id, stickId)).for('update')
    const now = await tx.select().from(cutRunCuts).where(eq(cutRunCuts.stickId, stickId))
    const same = locked!.status === stick.status && now.every((c) => c.status === cuts.find((x) => x.id === c.id)?.status)
    if (!same) throw new Conflict('The stick changed while it was being re-planned; mark it again')
    await startStick(tx, run, locked!, actor)
    await tx
      .update(cutRunSticks)
      .set({ status: 'damaged', damagedReason: input.reason, damagedBy: actor.id, damagedAt: new Date() })
      .where(eq(cutRunSticks.id, stickId))
    if (locked!.sourceOffcutId) await tx.update(offcuts).set({ status: 'scrapped' }).where(eq(offcuts.id, locked!.sourceOffcutId))
    if (affected.length > 0) {
      await tx
        .update(cutRunCuts)
        .set({ status: 'replanned' })
        .where(
          inArray(
            cutRunCuts.id,
            affected.map((c) => c.id),
          ),
        )
      const plan = plans[0]!.plan
      const lines = plan.totals.stock.filter((s) => s.count > 0).map((s) => ({ partId: stick.partId, stickLength: s.length, quantity: s.count }))
      if (lines.length > 0) await reserveStock(tx, { workOrderId: null, lines, reason: `Cut run ${run.number}: re-plan of stick ${stick.position}` }, actor)
      await reserveOffcuts(
        tx,
        plan.sticks.flatMap((s) => (s.source.kind === 'offcut' ? [s.source.offcutId] : [])),
        unit,
      )
      const [last] = await tx
        .select({ position: max(cutRunSticks.position), pattern: max(cutRunSticks.patternIndex) })
        .from(cutRunSticks)
        .where(eq(cutRunSticks.cutRunId, runId))
      await insertPlanRows(
        tx,
        runId,
        [{ partId: stick.partId, plan, replacesCutOfPiece: (i) => affected[i]?.id }],
        { position: (last?.position ?? 0) + 1, patternIndex: (last?.pattern ?? -1) + 1 },
        { kerf: run.kerf, replanOfStickId: stickId },
      )
    }
    for (const woId of new Set(affected.map((c) => c.workOrderId))) await settleWorkOrder(tx, woId)
    await settleRun(tx, run)
  })
  return getCutRun(db, runId)
}

/** The cutter scans a bin for a work order of this run; once all its pieces are cut, the work order is cut. */
export async function assignRunBin(db: Db, runId: string, input: AssignBin): Promise<CutRunDetail> {
  await db.transaction(async (tx) => {
    await publishedRun(tx, runId)
    const [inRun] = await tx
      .select({ id: workOrders.id, serial: workOrders.serial })
      .from(cutRunCuts)
      .innerJoin(workOrders, eq(workOrders.id, cutRunCuts.workOrderId))
      .where(and(eq(cutRunCuts.cutRunId, runId), eq(cutRunCuts.workOrderId, input.workOrderId), sql`${cutRunCuts.status} <> 'replanned'`))
      .limit(1)
    if (!inRun) throw new NotFound('That work order has no pieces in this cut run')
    await assignBin(tx, input.code, inRun)
    await settleWorkOrder(tx, inRun.id)
  })
  return getCutRun(db, runId)
}
