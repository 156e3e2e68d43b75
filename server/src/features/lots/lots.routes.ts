import type { Request } from 'express'
import { FitLotSchema, LotFitParamsSchema, LotListQuerySchema, LotParamsSchema, NotifyRecallSchema } from '@kitwright/shared/lots'
import { WorkOrderParamsSchema } from '@kitwright/shared/build'
import type { Deps } from '../../deps'
import { auditContext, recordAudit } from '../../lib/audit'
import { currentUser } from '../../lib/auth'
import type { RouteTable } from '../../lib/routes'
import { listLots, lotDetail, notifyRecall, recallCsv } from './recalls.service'
import { fitLot, undoLotFit } from './unit-lots.service'

const BENCH = ['admin', 'planner', 'assembler'] as const
const OFFICE = ['admin', 'planner'] as const

/**
 * The build bench's lot prompt: which lot of a lot-tracked part went into the unit. One plain JSON
 * call per action (`{ partId, lotCode, quantity? }`), so a bench that queues its actions can replay it.
 */
export function buildLotsRouter(deps: Deps, routes: RouteTable) {
  const r = routes.router('/api/build')
  const audit = (req: Request, workOrderId: string, action: string, summary: string) =>
    recordAudit(deps.db, auditContext(req), { action, entityType: 'work_order', entityId: workOrderId, summary })
  r.post('/:workOrderId/lots', BENCH, async (req, res) => {
    const { workOrderId } = WorkOrderParamsSchema.parse(req.params)
    const { page, summary } = await fitLot(deps.db, deps.storage, workOrderId, FitLotSchema.parse(req.body ?? {}), currentUser(req))
    await audit(req, workOrderId, 'build.lot', summary)
    res.status(201).json(page)
  })
  r.post('/:workOrderId/lots/:fitId/undo', BENCH, async (req, res) => {
    const { workOrderId, fitId } = LotFitParamsSchema.parse(req.params)
    const { page, summary } = await undoLotFit(deps.db, deps.storage, workOrderId, fitId, currentUser(req))
    await audit(req, workOrderId, 'build.lot_undo', summary)
    res.json(page)
  })
  return r
}

/** Lots and recalls: from a lot, every unit built with it and where it went; the office only. */
export function lotsRouter(deps: Deps, routes: RouteTable) {
  const r = routes.router('/api/lots')
  r.get('/', OFFICE, async (req, res) => {
    res.json(await listLots(deps.db, LotListQuerySchema.parse(req.query)))
  })
  r.get('/:lotId', OFFICE, async (req, res) => {
    const { lotId } = LotParamsSchema.parse(req.params)
    res.json(await lotDetail(deps.db, lotId))
  })
  r.get('/:lotId/recall.csv', OFFICE, async (req, res) => {
    const { lotId } = LotParamsSchema.parse(req.params)
    const { csv, code } = await recallCsv(deps.db, lotId)
    const safe = code.replace(/[^A-Za-z0-9._-]+/g, '_').slice(0, 40) || 'lot'
    res.type('text/csv; charset=utf-8').attachment(`recall-${safe}.csv`).send(csv)
  })
  r.post('/:lotId/notify', OFFICE, async (req, res) => {
    const { lotId } = LotParamsSchema.parse(req.params)
    const result = await notifyRecall(deps, lotId, NotifyRecallSchema.parse(req.body ?? {}), currentUser(req))
    await recordAudit(deps.db, auditContext(req), {
      action: 'lot.recall_notify',
      entityType: 'stock_lot',
      entityId: lotId,
      summary: `Recall of lot ${result.detail.code} of ${result.detail.part.sku}: ${result.queued} customer e-mail(s) queued, ${result.alreadyTold} already told`,
    })
    res.status(result.queued > 0 ? 201 : 200).json(result)
  })
  return r
}
