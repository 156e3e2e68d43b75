import type { NestPlan } from '@kitwright/shared/domain/nesting/index'
import { sawOrder } from '@kitwright/shared/domain/saw-order'
import type { Tx } from '../../db/client'
import { cutRunCuts, cutRunSticks, type NewCutRunCutRow, type NewCutRunStickRow } from '../../db/schema/index'

/** The engine's plan for one pipe part, and (for a re-plan) which old cut each piece replaces. */
export interface PartPlan {
  partId: string
  plan: NestPlan
  replacesCutOfPiece?: (pieceIndex: number) => string | undefined
}

/**
 * Writes the sticks and cuts of the plans after `start` (saw position and pattern index), in plan
 * order. Stock sticks carry their stock length; offcut sticks their offcut id. Every cut must carry
 * the work order and cut part it was planned for. `saw.kerf` is the run's kerf (the cuts' offsets
 * are recomputed for the saw order); `saw.replanOfStickId` the damaged stick a re-plan replaces.
 */
export async function insertPlanRows(
  tx: Tx,
  runId: string,
  plans: readonly PartPlan[],
  start: { position: number; patternIndex: number },
  saw: { kerf: number; replanOfStickId?: string | null },
) {
  const replanOfStickId = saw.replanOfStickId ?? null
  let position = start.position
  let patternBase = start.patternIndex
  const stickRows: NewCutRunStickRow[] = []
  const cutsOfStick: Omit<NewCutRunCutRow, 'stickId'>[][] = []
  for (const { partId, plan, replacesCutOfPiece } of plans) {
    for (const stick of plan.sticks) {
      const fromOffcut = stick.source.kind === 'offcut'
      stickRows.push({
        cutRunId: runId,
        partId,
        stickLength: fromOffcut ? null : stick.length,
        sourceOffcutId: stick.source.kind === 'offcut' ? stick.source.offcutId : null,
        length: stick.length,
        trim: stick.trim,
        patternIndex: patternBase + stick.patternIndex,
        position: position++,
        remnant: stick.remnant,
        remnantIsOffcut: stick.remnantIsOffcut,
        replanOfStickId,
      })
      // Stored in saw order (shared/domain/saw-order.ts): the sheet, the bench and the drawings number
      // the pieces by this position.
      const ordered = sawOrder(stick.cuts, (c) => `${c.cutPartRef ?? ''}|${c.workOrderRef ?? ''}`, { trim: stick.trim, kerf: saw.kerf })
      cutsOfStick.push(
        ordered.map((c, i) => {
          if (!c.workOrderRef || !c.cutPartRef) throw new Error('A planned cut lost its work order or cut part')
          return {
            cutRunId: runId,
            position: i,
            offset: c.offset,
            length: c.length,
            workOrderId: c.workOrderRef,
            cutPartId: c.cutPartRef,
            replacesCutId: replacesCutOfPiece?.(c.pieceIndex) ?? null,
          }
        }),
      )
    }
    patternBase += plan.patterns.length
  }
  if (stickRows.length === 0) return []
  const inserted = await tx.insert(cutRunSticks).values(stickRows).returning()
  const cutRows = inserted.flatMap((s, i) => cutsOfStick[i]!.map((c) => ({ ...c, stickId: s.id })))
  if (cutRows.length > 0) await tx.insert(cutRunCuts).values(cutRows)
  return inserted
}

/** The plans' totals and bounds summed over the pipe parts, as the run row keeps them. */
export function sumPlans(plans: readonly PartPlan[]) {
  const sum = (f: (p: NestPlan) => number) => plans.reduce((s, p) => s + f(p.plan), 0)
  const statuses = plans.map((p) => p.plan.status)
  return {
    planStatus: statuses.includes('time-limit') ? ('time-limit' as const) : statuses.every((s) => s === 'optimal') ? ('optimal' as const) : ('feasible' as const),
    stockCost: sum((p) => p.totals.stockCost),
    lowerBoundCost: sum((p) => p.bounds.cost),
    sticksUsed: sum((p) => p.totals.sticksUsed),
    lowerBoundSticks: sum((p) => p.bounds.sticks),
    offcutsUsed: sum((p) => p.totals.offcutsUsed),
    offcutsMade: sum((p) => p.totals.offcutsMade),
    lengthUsed: sum((p) => p.totals.lengthUsed),
    pieceLength: sum((p) => p.totals.pieceLength),
    kerfLoss: sum((p) => p.totals.kerfLoss),
    trimLoss: sum((p) => p.totals.trimLoss),
    offcutLength: sum((p) => p.totals.offcutLength),
    scrapLength: sum((p) => p.totals.scrapLength),
    solveMs: Math.round(sum((p) => p.seconds) * 1000),
    solverNote: plans.map((p) => p.plan.stats.solverUnavailable).find((why) => why) ?? null,
  }
}
