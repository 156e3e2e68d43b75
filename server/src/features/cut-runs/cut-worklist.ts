import { compareWorklist, isLate } from '@kitwright/shared/domain/worklist'
import type { CutWorklistItem } from '@kitwright/shared/worklists'
import { and, eq, inArray, ne } from 'drizzle-orm'
import type { Db } from '../../db/client'
import { cutRunCuts, cutRuns, orders, workOrders } from '../../db/schema/index'

/**
 * Published cut runs for the cut bench, by their most urgent unit: a run with a rush unit first,
 * then by the earliest promised ship date among its units, then the longest published.
 */
export async function cutWorklist(db: Db, today: string): Promise<CutWorklistItem[]> {
  const runs = await db.select().from(cutRuns).where(eq(cutRuns.status, 'published'))
  if (runs.length === 0) return []
  const cuts = await db
    .select({ runId: cutRunCuts.cutRunId, status: cutRunCuts.status, workOrderId: cutRunCuts.workOrderId, priority: orders.priority, promised: orders.promisedShipDate })
    .from(cutRunCuts)
    .innerJoin(workOrders, eq(workOrders.id, cutRunCuts.workOrderId))
    .innerJoin(orders, eq(orders.id, workOrders.orderId))
    .where(and(inArray(cutRunCuts.cutRunId, runs.map((r) => r.id)), ne(cutRunCuts.status, 'replanned')))
  return runs
    .map((run) => {
      const mine = cuts.filter((c) => c.runId === run.id)
      const units = new Map(mine.map((c) => [c.workOrderId, c]))
      const promised = [...units.values()].map((c) => c.promised).filter((d): d is string => d !== null).sort()[0] ?? null
      const rushUnits = [...units.values()].filter((c) => c.priority === 'rush').length
      return {
        runId: run.id,
        number: run.number,
        cutsDone: mine.filter((c) => c.status === 'cut').length,
        cutsTotal: mine.length,
        workOrderCount: units.size,
        rushUnits,
        rush: rushUnits > 0,
        promisedShipDate: promised,
        late: isLate(promised, today),
        waitingSince: (run.publishedAt ?? run.createdAt).toISOString(),
      }
    })
    .sort(compareWorklist)
}
