import { z } from 'zod'
import { IdParamsSchema } from '@kitwright/shared/users'
import {
  AssignBinSchema,
  CandidateQuerySchema,
  CutSheetQuerySchema,
  DamageStickSchema,
  PlanCutRunSchema,
  RunCutParamsSchema,
  RunStickParamsSchema,
  CutRunStatusSchema,
} from '@kitwright/shared/cut-runs'
import type { Deps } from '../../deps'
import { currentUser } from '../../lib/auth'
import type { RouteTable } from '../../lib/routes'
import { getShopSettings } from '../settings/settings.service'
import { assignRunBin, damageStick, tickCut, undoCut } from './cut-bench.service'
import { cancelCutRun, getCutRun, listCandidates, listCutRuns, planCutRun, publishCutRun } from './cut-runs.service'
import { cutSheetPdf } from '../labels/cut-sheet.pdf'
import { offcutLabel } from './offcut-label'
import { loadPipeStock } from './pipe-stock'

const ListQuerySchema = z.object({
  status: z
    .string()
    .optional()
    .transform((v) => (v ? v.split(',') : undefined))
    .pipe(z.array(CutRunStatusSchema).optional()),
})

export function cutRunsRouter(deps: Deps, routes: RouteTable) {
  const r = routes.router('/api/cut-runs')
  // The office plans and publishes; the cutter works the published run at the bench.
  const office = ['admin', 'planner'] as const
  const bench = ['admin', 'planner', 'cutter'] as const
  r.get('/', bench, async (req, res) => {
    res.json(await listCutRuns(deps.db, ListQuerySchema.parse(req.query).status))
  })
  r.get('/candidates', office, async (req, res) => {
    res.json(await listCandidates(deps.db, CandidateQuerySchema.parse(req.query)))
  })
  r.get('/stock', office, async (_req, res) => {
    res.json(await loadPipeStock(deps.db))
  })
  r.post('/', office, async (req, res) => {
    res.status(201).json(await planCutRun(deps.db, PlanCutRunSchema.parse(req.body), currentUser(req)))
  })
  r.get('/:id', bench, async (req, res) => {
    res.json(await getCutRun(deps.db, IdParamsSchema.parse(req.params).id))
  })
  r.post('/:id/publish', office, async (req, res) => {
    res.json(await publishCutRun(deps.db, IdParamsSchema.parse(req.params).id, currentUser(req)))
  })
  r.post('/:id/cancel', office, async (req, res) => {
    res.json(await cancelCutRun(deps.db, IdParamsSchema.parse(req.params).id, currentUser(req)))
  })
  r.get('/:id/cut-sheet.pdf', bench, async (req, res) => {
    const { id } = IdParamsSchema.parse(req.params)
    const { paper } = CutSheetQuerySchema.parse(req.query)
    const run = await getCutRun(deps.db, id)
    const settings = await getShopSettings(deps.db)
    const pdf = await cutSheetPdf(run, { paper, unit: settings.displayUnit, shopName: settings.shopName })
    res.type('application/pdf').attachment(`cut-sheet-${run.number}-${paper}.pdf`).send(pdf)
  })
  r.post('/:id/cuts/:cutId/tick', bench, async (req, res) => {
    const { id, cutId } = RunCutParamsSchema.parse(req.params)
    res.json(await tickCut(deps.db, id, cutId, currentUser(req)))
  })
  r.post('/:id/cuts/:cutId/undo', bench, async (req, res) => {
    const { id, cutId } = RunCutParamsSchema.parse(req.params)
    res.json(await undoCut(deps.db, id, cutId, currentUser(req)))
  })
  r.post('/:id/sticks/:stickId/damage', bench, async (req, res) => {
    const { id, stickId } = RunStickParamsSchema.parse(req.params)
    res.json(await damageStick(deps.db, id, stickId, DamageStickSchema.parse(req.body), currentUser(req)))
  })
  r.get('/:id/sticks/:stickId/offcut-label.pdf', bench, async (req, res) => {
    const { id, stickId } = RunStickParamsSchema.parse(req.params)
    const { pdf, code } = await offcutLabel(deps.db, id, stickId)
    res.type('application/pdf').attachment(`offcut-${code}.pdf`).send(pdf)
  })
  r.post('/:id/bins', bench, async (req, res) => {
    const { id } = IdParamsSchema.parse(req.params)
    res.json(await assignRunBin(deps.db, id, AssignBinSchema.parse(req.body)))
  })
  return r
}
