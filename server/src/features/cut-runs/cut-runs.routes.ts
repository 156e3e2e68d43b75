import { z } from 'zod'
import { IdParamsSchema } from '@kitwright/shared/users'
import {
  AssignBinSchema,
  CandidateQuerySchema,
  CutSheetQuerySchema,
  DamageStickSchema,
  PlanCutRunSchema,
  ReplanCutRunSchema,
  RunCutParamsSchema,
  RunStickParamsSchema,
  CutRunStatusSchema,
} from '@kitwright/shared/cut-runs'
import type { Request } from 'express'
import type { Deps } from '../../deps'
import { auditContext, recordAudit } from '../../lib/audit'
import { currentUser } from '../../lib/auth'
import type { RouteTable } from '../../lib/routes'
import { getShopSettings } from '../settings/settings.service'
import { assignRunBin, damageStick, tickCutOnce, undoCut } from './cut-bench.service'
import { cancelCutRun, getCutRun, listCandidates, listCutRuns, planCutRun, publishCutRun, replanCutRun } from './cut-runs.service'
import { cutSheetPdf } from '../labels/cut-sheet.pdf'
import { sendPdfInline } from '../labels/pdf-document'
import { offcutLabel } from './offcut-label'
import { loadPipeStock } from './pipe-stock'
import { cutWorklist } from './cut-worklist'
import { todayUtc } from '../reports/report-sql'

const ListQuerySchema = z.object({
  status: z
    .string()
    .optional()
    .transform((v) => (v ? v.split(',') : undefined))
    .pipe(z.array(CutRunStatusSchema).optional()),
})

export function cutRunsRouter(deps: Deps, routes: RouteTable) {
  const r = routes.router('/api/cut-runs')
  const audit = (req: Request, action: string, runId: string, summary: string) =>
    recordAudit(deps.db, auditContext(req), { action, entityType: 'cut_run', entityId: runId, summary })
  // The office plans and publishes; the cutter works the published run at the bench.
  const office = ['admin', 'planner'] as const
  const bench = ['admin', 'planner', 'cutter'] as const
  r.get('/', bench, async (req, res) => {
    res.json(await listCutRuns(deps.db, ListQuerySchema.parse(req.query).status))
  })
  // The cut bench's list of published runs, the most urgent first.
  r.get('/worklist', bench, async (_req, res) => {
    res.json(await cutWorklist(deps.db, todayUtc()))
  })
  r.get('/candidates', office, async (req, res) => {
    res.json(await listCandidates(deps.db, CandidateQuerySchema.parse(req.query)))
  })
  r.get('/stock', office, async (_req, res) => {
    res.json(await loadPipeStock(deps.db))
  })
  r.post('/', office, async (req, res) => {
    const run = await planCutRun(deps.db, PlanCutRunSchema.parse(req.body), currentUser(req))
    await audit(req, 'cut_run.plan', run.id, 'Planned a cut run')
    res.status(201).json(run)
  })
  r.get('/:id', bench, async (req, res) => {
    res.json(await getCutRun(deps.db, IdParamsSchema.parse(req.params).id))
  })
  r.post('/:id/publish', office, async (req, res) => {
    const { id } = IdParamsSchema.parse(req.params)
    const run = await publishCutRun(deps.db, id, currentUser(req))
    await audit(req, 'cut_run.publish', id, 'Published a cut run; its sticks and offcuts are reserved')
    res.json(run)
  })
  r.post('/:id/cancel', office, async (req, res) => {
    const { id } = IdParamsSchema.parse(req.params)
    const run = await cancelCutRun(deps.db, id, currentUser(req))
    await audit(req, 'cut_run.cancel', id, 'Cancelled a cut run')
    res.json(run)
  })
  // "Take longer": a draft planned again with more time (same work orders and saw settings).
  r.post('/:id/replan', office, async (req, res) => {
    const { id } = IdParamsSchema.parse(req.params)
    const input = ReplanCutRunSchema.parse(req.body ?? {})
    const run = await replanCutRun(deps.db, id, input)
    await audit(req, 'cut_run.replan', id, `Planned the draft again with ${input.timeLimitSeconds} s: ${run.totals.sticksUsed} sticks`)
    res.json(run)
  })
  r.get('/:id/cut-sheet.pdf', bench, async (req, res) => {
    const { id } = IdParamsSchema.parse(req.params)
    const { paper } = CutSheetQuerySchema.parse(req.query)
    const run = await getCutRun(deps.db, id)
    const settings = await getShopSettings(deps.db)
    const pdf = await cutSheetPdf(run, { paper, unit: settings.displayUnit, shopName: settings.shopName })
    // The browser shows the sheet (and prints it from there); the name is used when it is saved.
    sendPdfInline(res, `cut-sheet-${run.number}-${paper}.pdf`, pdf)
  })
  r.post('/:id/cuts/:cutId/tick', bench, async (req, res) => {
    const { id, cutId } = RunCutParamsSchema.parse(req.params)
    const { run, alreadyCut } = await tickCutOnce(deps.db, id, cutId, currentUser(req))
    // Two tablets tapping the same piece (one of them offline) record it once.
    if (alreadyCut) await audit(req, 'cut.tick_again', id, `Cut ${cutId} was ticked already; this tick changed nothing`)
    else await audit(req, 'cut.tick', id, `Ticked cut ${cutId}`)
    res.json(run)
  })
  r.post('/:id/cuts/:cutId/undo', bench, async (req, res) => {
    const { id, cutId } = RunCutParamsSchema.parse(req.params)
    const run = await undoCut(deps.db, id, cutId, currentUser(req))
    await audit(req, 'cut.undo', id, `Undid cut ${cutId}`)
    res.json(run)
  })
  r.post('/:id/sticks/:stickId/damage', bench, async (req, res) => {
    const { id, stickId } = RunStickParamsSchema.parse(req.params)
    const input = DamageStickSchema.parse(req.body)
    const run = await damageStick(deps.db, id, stickId, input, currentUser(req))
    await audit(req, 'cut.damage', id, `Marked stick ${stickId} damaged: ${input.reason}`)
    res.json(run)
  })
  r.get('/:id/sticks/:stickId/offcut-label.pdf', bench, async (req, res) => {
    const { id, stickId } = RunStickParamsSchema.parse(req.params)
    const { pdf, code } = await offcutLabel(deps.db, id, stickId)
    res.type('application/pdf').attachment(`offcut-${code}.pdf`).send(pdf)
  })
  r.post('/:id/bins', bench, async (req, res) => {
    const { id } = IdParamsSchema.parse(req.params)
    const input = AssignBinSchema.parse(req.body)
    const result = await assignRunBin(deps.db, id, input)
    await audit(req, 'cut.bin', id, `Put work order ${input.workOrderId} in bin ${input.code}`)
    res.json(result)
  })
  return r
}
