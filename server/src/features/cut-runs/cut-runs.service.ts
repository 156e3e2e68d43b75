import { and, desc, eq, inArray, sql } from 'drizzle-orm'
import { NestingInputError, type NestInput, type NestPiece } from '@kitwright/shared/domain/nesting/index'
import { formatLength } from '@kitwright/shared/domain/units'
import type { CandidateQuery, CandidateWorkOrder, CutRunDetail, CutRunSummary, PlanCutRun, ReplanCutRun } from '@kitwright/shared/cut-runs'
import type { Db, Tx } from '../../db/client'
import { cutRunCuts, cutRuns, cutRunSticks, offcuts } from '../../db/schema/index'
import type { SessionUser } from '../../lib/auth'
import { BadRequest, Conflict, NotFound } from '../../lib/http-errors'
import { getShopSettings } from '../settings/settings.service'
import { releaseReservation, reserveStock } from '../stock/stock.service'
import { toCutRunDetail } from './cut-runs.mapper'
import {
  nextRunNumber,
  selectCandidateIds,
  selectCutParts,
  selectRun,
  selectRunContents,
  selectWorkOrders,
  selectWorkOrdersInRuns,
  userNames,
} from './cut-runs.queries'
import { loadPipeStock } from './pipe-stock'
import { insertPlanRows, sumPlans, type PartPlan } from './plan-rows'
import { runNesting } from './run-nesting'
import { CUT_RUN_STATUS_LABELS, OFFCUT_STATUS_LABELS, WORK_ORDER_STATUS_LABELS, statusInSentence } from '@kitwright/shared/status-words'

type Actor = Pick<SessionUser, 'id' | 'name'>

export async function getCutRun(db: Db | Tx, id: string): Promise<CutRunDetail> {
  const run = await selectRun(db, id)
  if (!run) throw new NotFound('No such cut run')
  const contents = await selectRunContents(db, id)
  return toCutRunDetail(run, contents, await userNames(db, [run.createdBy, run.publishedBy]))
}

export async function listCutRuns(db: Db, statuses?: readonly CutRunDetail['status'][]): Promise<CutRunSummary[]> {
  const rows = await db
    .select({
      run: cutRuns,
      workOrderCount: sql<number>`(select count(distinct c.work_order_id)::int from cut_run_cuts c where c.cut_run_id = ${cutRuns.id} and c.status <> 'replanned')`,
      cutsDone: sql<number>`(select count(*)::int from cut_run_cuts c where c.cut_run_id = ${cutRuns.id} and c.status = 'cut')`,
      cutsTotal: sql<number>`(select count(*)::int from cut_run_cuts c where c.cut_run_id = ${cutRuns.id} and c.status <> 'replanned')`,
    })
    .from(cutRuns)
    .where(statuses ? inArray(cutRuns.status, [...statuses]) : undefined)
    .orderBy(desc(cutRuns.createdAt))
    .limit(100)
  return rows.map(({ run, workOrderCount, cutsDone, cutsTotal }) => ({
    id: run.id,
    number: run.number,
    status: run.status,
    planStatus: run.planStatus,
    workOrderCount,
    sticksUsed: run.sticksUsed,
    cutsDone,
    cutsTotal,
    createdAt: run.createdAt.toISOString(),
    publishedAt: run.publishedAt?.toISOString() ?? null,
  }))
}

/** Work orders waiting to be cut (by due date, by kit, or all), with the pipe each needs. */
export async function listCandidates(db: Db, query: CandidateQuery): Promise<CandidateWorkOrder[]> {
  const ids = await selectCandidateIds(db, query)
  const wos = await selectWorkOrders(db, ids)
  const cps = await selectCutParts(db, wos.map((w) => w.revisionId))
  const order = new Map(ids.map((id, i) => [id, i]))
  return wos
    .sort((a, b) => order.get(a.id)! - order.get(b.id)!)
    .map((w) => {
      const own = cps.filter((c) => c.revisionId === w.revisionId)
      return {
        id: w.id,
        serial: w.serial,
        orderNumber: w.orderNumber,
        kitId: w.kitId,
        kitSku: w.kitSku,
        kitName: w.kitName,
        revisionCode: w.revisionCode,
        dueDate: w.dueDate,
        pieceCount: own.reduce((s, c) => s + c.quantity, 0),
        pieceLength: own.reduce((s, c) => s + c.quantity * c.length, 0),
      }
    })
}

/** Checks the chosen work orders can go into a run and returns their pieces grouped by pipe part. */
async function piecesOf(db: Db | Tx, workOrderIds: readonly string[], exceptRunId?: string) {
  const wos = await selectWorkOrders(db, workOrderIds)
  const byId = new Map(wos.map((w) => [w.id, w]))
  const fields: Record<string, string> = {}
  const busy = new Map((await selectWorkOrdersInRuns(db, workOrderIds, exceptRunId)).map((r) => [r.workOrderId, r.number]))
  const cps = await selectCutParts(db, wos.map((w) => w.revisionId))
  workOrderIds.forEach((id, i) => {
    const w = byId.get(id)
    if (!w) fields[`workOrderIds.${i}`] = 'No such work order'
    else if (w.status !== 'waiting_cut') fields[`workOrderIds.${i}`] = `Work order ${w.serial} is ${statusInSentence(WORK_ORDER_STATUS_LABELS, w.status)}, not waiting to be cut`
    else if (busy.has(id)) fields[`workOrderIds.${i}`] = `Work order ${w.serial} is already in cut run ${busy.get(id)}`
    else if (!cps.some((c) => c.revisionId === w.revisionId)) fields[`workOrderIds.${i}`] = `Work order ${w.serial} (${w.kitSku}) has no pipe to cut`
  })
  const first = Object.values(fields)[0]
  if (first) throw new BadRequest(first, fields)
  const byPart = new Map<string, NestPiece[]>()
  for (const id of new Set(workOrderIds)) {
    const w = byId.get(id)!
    for (const c of cps.filter((x) => x.revisionId === w.revisionId)) {
      const list = byPart.get(c.partId) ?? []
      list.push({ length: c.length, quantity: c.quantity, workOrderRef: w.id, cutPartRef: c.id })
      byPart.set(c.partId, list)
    }
  }
  return byPart
}

/** Runs the engine (in worker threads) once per pipe part; bad input becomes a 400 that says what to fix. */
export async function nestParts(inputs: { partId: string; sku: string; input: NestInput }[], timeLimitMs: number): Promise<PartPlan[]> {
  try {
    return await Promise.all(inputs.map(async ({ partId, input }) => ({ partId, plan: await runNesting(input, { timeLimitMs }) })))
  } catch (err) {
    if (err instanceof NestingInputError) {
      const which = inputs.length > 1 ? ` (${inputs.find((i) => err.message.includes(i.sku))?.sku ?? 'one of the pipe parts'})` : ` (${inputs[0]?.sku})`
      throw new BadRequest(`The plan cannot be made${which}: ${err.message}`, { [err.field || '_']: err.message })
    }
    throw err
  }
}

/** The engine's input per pipe part for the chosen work orders, stock and saw settings. */
async function nestingInputs(
  db: Db,
  workOrderIds: readonly string[],
  choice: { stock?: PlanCutRun['stock']; useOffcuts: boolean; kerf: number; endTrim: number; minOffcut: number },
  exceptRunId?: string,
) {
  const byPart = await piecesOf(db, workOrderIds, exceptRunId)
  const stock = await loadPipeStock(db, [...byPart.keys()])
  return [...byPart.entries()].map(([partId, pieces]) => {
    const part = stock.find((s) => s.partId === partId)
    if (!part) throw new BadRequest('A cut part uses a pipe part that is retired or not pipe; fix the kit revision first')
    const chosen = choice.stock
      ? choice.stock.filter((l) => l.partId === partId).map((l) => ({ length: l.stickLength, available: l.maxSticks }))
      : part.sticks.map((s) => ({ length: s.stickLength, available: s.available }))
    const lines = chosen.filter((l) => l.available > 0).map((l) => ({ id: String(l.length), length: l.length, available: l.available }))
    const rack = choice.useOffcuts ? part.offcuts.map((o) => ({ id: o.id, length: o.length })) : []
    if (lines.length === 0 && rack.length === 0) {
      throw new BadRequest(`No ${part.sku} ${part.name} to cut from: receive sticks, or choose a stick length with sticks available`, { stock: 'No stock for this pipe' })
    }
    const nestInput: NestInput = { pieces, stock: lines, offcuts: rack, kerf: choice.kerf, endTrim: choice.endTrim, minOffcutLength: choice.minOffcut }
    return { partId, sku: part.sku, input: nestInput }
  })
}

/**
 * Plans a draft cut run: the engine nests the chosen work orders' pieces into the stock on hand,
 * for as long as the planner asked or, by default, the shop's planning time.
 */
export async function planCutRun(db: Db, input: PlanCutRun, actor: Actor): Promise<CutRunDetail> {
  const settings = await getShopSettings(db)
  const kerf = input.kerf ?? settings.kerf
  const endTrim = input.endTrim ?? settings.endTrim
  const minOffcut = input.minOffcut ?? settings.minOffcut
  const inputs = await nestingInputs(db, input.workOrderIds, { stock: input.stock, useOffcuts: input.useOffcuts, kerf, endTrim, minOffcut })
  const plans = await nestParts(inputs, Math.round((input.timeLimitSeconds ?? settings.nestingTimeLimitSeconds) * 1000))
  const runId = await db.transaction(async (tx) => {
    const [run] = await tx
      .insert(cutRuns)
      .values({ number: await nextRunNumber(tx), kerf, endTrim, minOffcut, ...sumPlans(plans), createdBy: actor.id })
      .returning()
    await insertPlanRows(tx, run!.id, plans, { position: 1, patternIndex: 0 }, { kerf })
    return run!.id
  })
  return getCutRun(db, runId)
}

/**
 * "Take longer": plans a draft again with more time — the same work orders, kerf, trim and
 * minimum offcut, every stick length on hand and the offcuts on the rack — and replaces its sticks
 * and cuts. Only a draft (nothing reserved, nothing cut) can be planned again.
 */
export async function replanCutRun(db: Db, id: string, input: ReplanCutRun): Promise<CutRunDetail> {
  const run = await selectRun(db, id)
  if (!run) throw new NotFound('No such cut run')
  if (run.status !== 'draft') throw new Conflict(`Cut run ${run.number} is ${statusInSentence(CUT_RUN_STATUS_LABELS, run.status)}; only a draft can be planned again`)
  const woIds = (await db.selectDistinct({ id: cutRunCuts.workOrderId }).from(cutRunCuts).where(eq(cutRunCuts.cutRunId, id))).map((r) => r.id)
  const inputs = await nestingInputs(db, woIds, { useOffcuts: true, kerf: run.kerf, endTrim: run.endTrim, minOffcut: run.minOffcut }, id)
  const plans = await nestParts(inputs, Math.round(input.timeLimitSeconds * 1000))
  await db.transaction(async (tx) => {
    const locked = await selectRun(tx, id, true)
    if (!locked || locked.status !== 'draft') throw new Conflict(`Cut run ${run.number} changed while it was being planned; open it again`)
    await tx.delete(cutRunCuts).where(eq(cutRunCuts.cutRunId, id))
    await tx.delete(cutRunSticks).where(eq(cutRunSticks.cutRunId, id))
    await tx.update(cutRuns).set(sumPlans(plans)).where(eq(cutRuns.id, id))
    await insertPlanRows(tx, id, plans, { position: 1, patternIndex: 0 }, { kerf: run.kerf })
  })
  return getCutRun(db, id)
}

/** Sticks to reserve, summed per pipe part and stick length, and the offcuts the run uses. */
async function stockOfSticks(tx: Tx, runId: string, onlyStatus?: 'pending') {
  const sticks = await tx
    .select()
    .from(cutRunSticks)
    .where(and(eq(cutRunSticks.cutRunId, runId), onlyStatus ? eq(cutRunSticks.status, onlyStatus) : undefined))
  const lines = new Map<string, { partId: string; stickLength: number; quantity: number }>()
  for (const s of sticks) {
    if (s.stickLength === null) continue
    const key = `${s.partId}|${s.stickLength}`
    const line = lines.get(key) ?? { partId: s.partId, stickLength: s.stickLength, quantity: 0 }
    line.quantity += 1
    lines.set(key, line)
  }
  return { lines: [...lines.values()], offcutIds: sticks.flatMap((s) => (s.sourceOffcutId ? [s.sourceOffcutId] : [])) }
}

/**
 * Reserves offcuts for a run; refuses (409, naming them) when any is no longer on the rack, so a
 * plan never counts on an offcut another run took or someone scrapped.
 */
export async function reserveOffcuts(tx: Tx, offcutIds: readonly string[], unit: 'in' | 'mm') {
  if (offcutIds.length === 0) return
  const taken = await tx
    .update(offcuts)
    .set({ status: 'reserved' })
    .where(and(inArray(offcuts.id, [...offcutIds]), eq(offcuts.status, 'in_stock')))
    .returning({ id: offcuts.id })
  if (taken.length === offcutIds.length) return
  const got = new Set(taken.map((t) => t.id))
  const missing = await tx.select().from(offcuts).where(inArray(offcuts.id, offcutIds.filter((id) => !got.has(id))))
  const names = missing.map((o) => `${formatLength(o.length, unit)} offcut (${statusInSentence(OFFCUT_STATUS_LABELS, o.status)})`).join(', ')
  throw new Conflict(`Not enough stock to publish: the plan uses offcuts that are no longer on the rack: ${names}. Plan the run again.`)
}

/**
 * Publishes a draft: freezes the plan and, in one transaction, reserves its sticks in the ledger
 * (reserve moves per stick length) and its offcuts (status reserved). Refuses with 409 saying what is
 * short when the stock changed since the plan, and reserves nothing then.
 */
export async function publishCutRun(db: Db, id: string, actor: Actor): Promise<CutRunDetail> {
  const settings = await getShopSettings(db)
  await db.transaction(async (tx) => {
    const run = await selectRun(tx, id, true)
    if (!run) throw new NotFound('No such cut run')
    if (run.status !== 'draft') throw new Conflict(`Cut run ${run.number} is ${statusInSentence(CUT_RUN_STATUS_LABELS, run.status)}; only a draft can be published`)
    const woIds = (await tx.selectDistinct({ id: cutRunCuts.workOrderId }).from(cutRunCuts).where(eq(cutRunCuts.cutRunId, id))).map((r) => r.id)
    try {
      await piecesOf(tx, woIds, id)
    } catch (err) {
      if (err instanceof BadRequest) throw new Conflict(`Cut run ${run.number} cannot be published: ${err.message}. Plan it again.`)
      throw err
    }
    const { lines, offcutIds } = await stockOfSticks(tx, id)
    if (lines.length > 0) await reserveStock(tx, { workOrderId: null, lines, reason: `Cut run ${run.number}` }, actor)
    await reserveOffcuts(tx, offcutIds, settings.displayUnit)
    await tx.update(cutRuns).set({ status: 'published', publishedBy: actor.id, publishedAt: new Date() }).where(eq(cutRuns.id, id))
  })
  return getCutRun(db, id)
}

/**
 * Cancels a draft, or a published run not yet started at the saw (its reservations are released and
 * its offcuts go back on the rack).
 */
export async function cancelCutRun(db: Db, id: string, actor: Actor): Promise<CutRunDetail> {
  await db.transaction(async (tx) => {
    const run = await selectRun(tx, id, true)
    if (!run) throw new NotFound('No such cut run')
    if (run.status === 'published') {
      const started = await tx.select({ id: cutRunSticks.id }).from(cutRunSticks).where(and(eq(cutRunSticks.cutRunId, id), sql`${cutRunSticks.status} <> 'pending'`)).limit(1)
      if (started.length > 0) throw new Conflict(`Cut run ${run.number} is being cut; it cannot be cancelled now`)
      const { lines, offcutIds } = await stockOfSticks(tx, id)
      if (lines.length > 0) await releaseReservation(tx, { workOrderId: null, lines, reason: `Cut run ${run.number} cancelled` }, actor)
      if (offcutIds.length > 0) await tx.update(offcuts).set({ status: 'in_stock' }).where(inArray(offcuts.id, offcutIds))
    } else if (run.status !== 'draft') {
      throw new Conflict(`Cut run ${run.number} is ${statusInSentence(CUT_RUN_STATUS_LABELS, run.status)}; it cannot be cancelled`)
    }
    await tx.update(cutRuns).set({ status: 'cancelled', cancelledAt: new Date() }).where(eq(cutRuns.id, id))
  })
  return getCutRun(db, id)
}
