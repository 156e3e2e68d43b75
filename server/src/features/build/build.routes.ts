import {
  BuildLookupQuerySchema,
  ConfirmPhotoSchema,
  PresignPhotoSchema,
  RecordLeakTestSchema,
  SerialParamsSchema,
  StepParamsSchema,
  TickStepSchema,
  WorkOrderParamsSchema,
} from '@kitwright/shared/build'
import type { Request } from 'express'
import type { Deps } from '../../deps'
import { auditContext, recordAudit } from '../../lib/audit'
import { currentUser } from '../../lib/auth'
import type { RouteTable } from '../../lib/routes'
import { lookupForBuild, recordLeakTest, tickStep, undoTick } from './build.service'
import { todayUtc } from '../reports/report-sql'
import { buildWorklist } from './build-worklist'
import { listMeasurementFlags } from './measurement-flags'
import { confirmPhoto, presignPhoto } from './photos.service'
import { getUnitRecord } from './unit-record.service'
import { benchActionOf } from '../../lib/client-actions'
import { pageIfTickedAlike } from './tick-replay'

const BENCH = ['admin', 'planner', 'assembler'] as const

/** The build bench: scan a unit, tick its steps, photograph it, leak-test it. */
export function buildRouter(deps: Deps, routes: RouteTable) {
  const r = routes.router('/api/build')
  const audit = (req: Request, action: string, workOrderId: string, summary: string) =>
    recordAudit(deps.db, auditContext(req), { action, entityType: 'work_order', entityId: workOrderId, summary })
  // The planner's list of out-of-limits measurements on units still in the shop.
  r.get('/out-of-limits', ['admin', 'planner'], async (_req, res) => {
    res.json(await listMeasurementFlags(deps.db))
  })
  // What is ready for the build bench: rush first, then by promised date, then the longest wait.
  r.get('/worklist', BENCH, async (_req, res) => {
    res.json(await buildWorklist(deps.db, todayUtc()))
  })
  r.get('/lookup', BENCH, async (req, res) => {
    const { code } = BuildLookupQuerySchema.parse(req.query)
    res.json(await lookupForBuild(deps.db, deps.storage, code))
  })
  r.post('/:workOrderId/steps/:stepId/tick', BENCH, async (req, res) => {
    const { workOrderId, stepId } = StepParamsSchema.parse(req.params)
    const input = TickStepSchema.parse(req.body ?? {})
    // From a bench's queue, a step someone else ticked alike meanwhile is recorded once, not refused.
    const alike = benchActionOf(req) ? await pageIfTickedAlike(deps.db, deps.storage, workOrderId, stepId, input) : null
    if (alike) {
      const step = alike.steps.find((s) => s.id === stepId)
      await audit(
        req,
        'build.tick_again',
        workOrderId,
        `Step ${step?.position ?? ''} of ${alike.workOrder.serial} was ticked already by ${step?.tick?.by.name ?? 'someone'}; this tick changed nothing`,
      )
      res.json(alike)
      return
    }
    const { page, outOfLimits } = await tickStep(deps.db, deps.storage, workOrderId, stepId, input, currentUser(req))
    const step = page.steps.find((s) => s.id === stepId)
    const flagged =
      outOfLimits && step?.tick ? ` (out of limits: ${step.tick.measurement} ${step.measurementUnit ?? ''}, ${step.tick.outOfLimitsReason ?? ''})` : ''
    await audit(req, 'build.tick', workOrderId, `Ticked step ${step?.position ?? ''} of ${page.workOrder.serial}${flagged}`)
    res.json(page)
  })
  r.post('/:workOrderId/steps/:stepId/undo', BENCH, async (req, res) => {
    const { workOrderId, stepId } = StepParamsSchema.parse(req.params)
    const page = await undoTick(deps.db, deps.storage, workOrderId, stepId, currentUser(req))
    await audit(req, 'build.undo', workOrderId, `Undid a build step of ${page.workOrder.serial}`)
    res.json(page)
  })
  r.post('/:workOrderId/photos/presign', BENCH, async (req, res) => {
    const { workOrderId } = WorkOrderParamsSchema.parse(req.params)
    res.status(201).json(await presignPhoto(deps.db, deps.storage, workOrderId, PresignPhotoSchema.parse(req.body), currentUser(req)))
  })
  r.post('/:workOrderId/photos/confirm', BENCH, async (req, res) => {
    const { workOrderId } = WorkOrderParamsSchema.parse(req.params)
    const { key } = ConfirmPhotoSchema.parse(req.body)
    res.json(await confirmPhoto(deps.db, deps.storage, workOrderId, key, currentUser(req)))
  })
  r.post('/:workOrderId/leak-tests', BENCH, async (req, res) => {
    const { workOrderId } = WorkOrderParamsSchema.parse(req.params)
    const page = await recordLeakTest(deps.db, deps.storage, workOrderId, RecordLeakTestSchema.parse(req.body), currentUser(req))
    const latest = page.leakTests.at(-1)
    await audit(
      req,
      'build.leak_test',
      workOrderId,
      `Leak test ${latest ? `attempt ${latest.attempt} ${latest.passed ? 'passed' : 'failed'}` : 'recorded'} on ${page.workOrder.serial}`,
    )
    res.status(201).json(page)
  })
  return r
}

/** The build record of a serial, read-only, for everyone who handles the unit. */
export function unitsRouter(deps: Deps, routes: RouteTable) {
  const r = routes.router('/api/units')
  r.get('/:serial', ['admin', 'planner', 'assembler', 'packer'], async (req, res) => {
    const { serial } = SerialParamsSchema.parse(req.params)
    res.json(await getUnitRecord(deps.db, deps.storage, serial))
  })
  return r
}
