import { and, eq, isNull } from 'drizzle-orm'
import { BUILDABLE_STATUSES, type BuildPage, type RecordLeakTestSchema, type TickStep } from '@kitwright/shared/build'
import { judgeLeakTest, toPascals } from '@kitwright/shared/domain/leak-test'
import { outsideLimits, parseMeasurement } from '@kitwright/shared/domain/measurement'
import type { z } from 'zod'
import type { Db, Tx } from '../../db/client'
import { buildStepTicks, leakTests, reworkEntries, workOrders, type BuildStepRow, type WorkOrderRow } from '../../db/schema/index'
import type { SessionUser } from '../../lib/auth'
import { BadRequest, Conflict, Forbidden, NotFound } from '../../lib/http-errors'
import type { Storage } from '../../lib/storage'
import { hasLotFits, lotsMissingOf } from '../lots/lots.queries'
import { loadBuildPage, protocolOf, readinessOf } from './build-page'
import {
  confirmedPhotos,
  findBinByCode,
  findRevisionWithKit,
  findStep,
  findWorkOrderById,
  findWorkOrderBySerial,
  leakTestsOfWorkOrder,
  lastAttempt,
  lockWorkOrder,
  namesOf,
  reworkOfWorkOrder,
  standingTick,
  stepsOfRevision,
  ticksOfWorkOrder,
} from './build.queries'
import { WORK_ORDER_STATUS_LABELS, statusInSentence } from '@kitwright/shared/status-words'

type BuildableStatus = (typeof BUILDABLE_STATUSES)[number]

/** Why a unit in this status cannot be worked on at the build bench, in the bench's words. */
function notBuildableMessage(wo: WorkOrderRow): string {
  switch (wo.status) {
    case 'waiting_cut':
      return `Unit ${wo.serial} has not been cut yet: its pieces are still to come from the cut bench`
    case 'built':
      return `Unit ${wo.serial} is already built and leak-tested; it goes to the pack bench`
    case 'packed':
      return `Unit ${wo.serial} is already packed`
    case 'shipped':
      return `Unit ${wo.serial} has already shipped`
    case 'cancelled':
      return `Unit ${wo.serial} was cancelled; do not build it`
    default:
      return `Unit ${wo.serial} is ${statusInSentence(WORK_ORDER_STATUS_LABELS, wo.status)}`
  }
}

function isBuildable(status: WorkOrderRow['status']): status is BuildableStatus {
  return (BUILDABLE_STATUSES as readonly string[]).includes(status)
}

/** Refuses a unit that is not cut, in build or in rework. `fields.serial` lets the bench link its build record. */
export function assertBuildable(wo: WorkOrderRow): void {
  if (!isBuildable(wo.status)) throw new Conflict(notBuildableMessage(wo), { serial: wo.serial })
}

/** Locks the unit and refuses it unless it may be worked on at the build bench. */
export async function lockBuildable(tx: Tx, workOrderId: string): Promise<WorkOrderRow> {
  const wo = await lockWorkOrder(tx, workOrderId)
  if (!wo) throw new NotFound('No such work order')
  assertBuildable(wo)
  return wo
}

/** A scanned bin code or a typed serial → the unit's build page, if it may be built now. */
export async function lookupForBuild(db: Db, storage: Storage, code: string): Promise<BuildPage> {
  const wanted = code.trim().toUpperCase()
  const bin = await findBinByCode(db, wanted)
  let wo: WorkOrderRow | undefined
  if (bin) {
    if (!bin.workOrderId) throw new Conflict(`Bin ${bin.code} holds no unit (it is on the rack); scan the bin that came from the cut bench, or type the serial`)
    wo = await findWorkOrderById(db, bin.workOrderId)
  } else {
    wo = await findWorkOrderBySerial(db, wanted)
  }
  if (!wo) throw new NotFound(`No bin or serial "${wanted}": check the label and scan again`)
  assertBuildable(wo)
  return loadBuildPage(db, storage, wo)
}

/**
 * Moves the unit on once everything is done: every step ticked, the photos taken, no rework open,
 * the latest leak test passed (or none required) → built; a failed test or open rework → rework.
 * Called after every change, inside its transaction.
 */
export async function settle(tx: Tx, wo: WorkOrderRow): Promise<void> {
  const found = await findRevisionWithKit(tx, wo.kitRevisionId)
  // One after another: a transaction is one connection, which runs one query at a time.
  const steps = await stepsOfRevision(tx, wo.kitRevisionId)
  const ticks = await ticksOfWorkOrder(tx, wo.id)
  const photos = await confirmedPhotos(tx, wo.id)
  const tests = await leakTestsOfWorkOrder(tx, wo.id)
  const rework = await reworkOfWorkOrder(tx, wo.id)
  const lotsMissing = await lotsMissingOf(tx, wo)
  const readiness = readinessOf(steps, ticks, photos, tests, found ? protocolOf(found.revision) !== null : false, rework, lotsMissing)
  let status: WorkOrderRow['status'] = wo.status
  if (readiness.ready) status = 'built'
  else if (readiness.leakTest === 'failed' || readiness.openRework > 0) status = 'rework'
  else if (ticks.length > 0 || tests.length > 0 || (await hasLotFits(tx, wo.id))) status = 'building'
  if (status !== wo.status) await tx.update(workOrders).set({ status, updatedAt: new Date() }).where(eq(workOrders.id, wo.id))
}

async function reload(db: Db, storage: Storage, workOrderId: string): Promise<BuildPage> {
  const wo = await findWorkOrderById(db, workOrderId)
  if (!wo) throw new NotFound('No such work order')
  return loadBuildPage(db, storage, wo)
}

/** Limits as the bench reads them: `17.75–18.25 in`, `at least 10 psi`. */
function limitsText(min: number | null, max: number | null, unit: string | null): string {
  const u = unit ? ` ${unit}` : ''
  if (min !== null && max !== null) return `${min}–${max}${u}`
  if (min !== null) return `at least ${min}${u}`
  return `at most ${max}${u}`
}

/** The earlier steps still to do before this one: none for a free-order step, else every earlier step that is not free-order. */
function stepsBefore(step: BuildStepRow, steps: readonly BuildStepRow[], ticked: ReadonlySet<string>): BuildStepRow[] {
  if (step.freeOrder) return []
  return steps.filter((s) => s.position < step.position && !s.freeOrder && !ticked.has(s.id))
}

/**
 * Ticks one step for one unit. Steps go in order, except those the revision marks free-order. A
 * step that takes a measurement needs it, typed as the shop writes lengths (domain/measurement.ts);
 * a value outside the limits needs a reason, is recorded and flagged, and sends the unit to rework
 * when the revision says so. A step that needs a photo needs the photo first. The first tick starts the build.
 */
export async function tickStep(
  db: Db,
  storage: Storage,
  workOrderId: string,
  stepId: string,
  input: TickStep,
  actor: SessionUser,
): Promise<{ page: BuildPage; outOfLimits: boolean }> {
  let outOfLimits = false
  await db.transaction(async (tx) => {
    const wo = await lockBuildable(tx, workOrderId)
    const step = await findStep(tx, wo.kitRevisionId, stepId)
    if (!step) throw new NotFound(`No such step in the revision unit ${wo.serial} is built to`)
    const standing = await standingTick(tx, wo.id, step.id)
    if (standing) {
      const names = await namesOf(tx, [standing.tickedBy])
      throw new Conflict(`Step ${step.position} is already ticked by ${names.get(standing.tickedBy) ?? 'someone'}; undo it first to tick it again`)
    }
    const steps = await stepsOfRevision(tx, wo.kitRevisionId)
    const ticked = new Set((await ticksOfWorkOrder(tx, wo.id)).filter((t) => t.undoneAt === null).map((t) => t.buildStepId))
    const before = stepsBefore(step, steps, ticked)
    if (before.length > 0) {
      const list = before.map((s) => s.position).join(', ')
      throw new Conflict(`Steps go in order: do step${before.length > 1 ? 's' : ''} ${list} before step ${step.position}`)
    }
    let measurement: number | null = null
    const unit = step.measurementUnit ?? ''
    if (step.measurementRequired) {
      if (input.measurement === null) {
        throw new BadRequest(`Step ${step.position} needs a measurement in ${unit} before it can be ticked`, {
          measurement: `Enter the measurement in ${unit}`,
        })
      }
      if (typeof input.measurement === 'number') measurement = input.measurement
      else {
        const parsed = parseMeasurement(input.measurement, step.measurementUnit)
        if (!parsed.ok) throw new BadRequest(`Step ${step.position}: ${parsed.message}`, { measurement: parsed.message })
        measurement = parsed.value
      }
      const min = step.measurementMin === null ? null : Number(step.measurementMin)
      const max = step.measurementMax === null ? null : Number(step.measurementMax)
      outOfLimits = outsideLimits(measurement, min, max)
      if (outOfLimits && !input.reason) {
        const then = step.outOfLimitsRework ? 'the unit then goes to rework' : 'it is flagged to the planner'
        throw new BadRequest(
          `${measurement} ${unit} is outside the limits of step ${step.position} (${limitsText(min, max, step.measurementUnit)}): measure again, or give a reason to record it (${then})`,
          {
            reason: 'Say why this out-of-limits value is recorded',
          },
        )
      }
      if (outOfLimits && step.outOfLimitsRework) {
        const [tick] = await tx
          .insert(buildStepTicks)
          .values({
            workOrderId: wo.id,
            buildStepId: step.id,
            tickedBy: actor.id,
            measurement: String(measurement),
            outOfLimits,
            outOfLimitsReason: input.reason,
          })
          .returning()
        await tx.insert(reworkEntries).values({
          workOrderId: wo.id,
          stepTickId: tick!.id,
          reason: `Step ${step.position} measured ${measurement} ${unit}, outside ${limitsText(min, max, step.measurementUnit)}: ${input.reason}`,
          createdBy: actor.id,
        })
        await settle(tx, wo)
        return
      }
    } else if (input.measurement !== null) {
      throw new BadRequest(`Step ${step.position} takes no measurement`, { measurement: 'Leave the measurement out for this step' })
    }
    if (step.photoRequired) {
      const photos = await confirmedPhotos(tx, wo.id)
      if (!photos.some((p) => p.buildStepId === step.id)) throw new Conflict(`Take the photo for step ${step.position} before ticking it`)
    }
    await tx.insert(buildStepTicks).values({
      workOrderId: wo.id,
      buildStepId: step.id,
      tickedBy: actor.id,
      measurement: measurement === null ? null : String(measurement),
      outOfLimits,
      outOfLimitsReason: outOfLimits ? input.reason : null,
    })
    await settle(tx, wo)
  })
  return { page: await reload(db, storage, workOrderId), outOfLimits }
}

/** Undoes a step's standing tick: only the one who ticked it, or a planner or admin. The tick stays on record as undone. */
export async function undoTick(db: Db, storage: Storage, workOrderId: string, stepId: string, actor: SessionUser): Promise<BuildPage> {
  await db.transaction(async (tx) => {
    const wo = await lockBuildable(tx, workOrderId)
    const step = await findStep(tx, wo.kitRevisionId, stepId)
    if (!step) throw new NotFound(`No such step in the revision unit ${wo.serial} is built to`)
    const tick = await standingTick(tx, wo.id, step.id)
    if (!tick) throw new Conflict(`Step ${step.position} is not ticked; there is nothing to undo`)
    if (tick.tickedBy !== actor.id && actor.role !== 'planner' && actor.role !== 'admin') {
      const names = await namesOf(tx, [tick.tickedBy])
      throw new Forbidden(`Only ${names.get(tick.tickedBy) ?? 'the person who ticked it'} or a planner can undo step ${step.position}`)
    }
    await tx
      .update(buildStepTicks)
      .set({ undoneAt: new Date(), undoneBy: actor.id })
      .where(and(eq(buildStepTicks.id, tick.id), isNull(buildStepTicks.undoneAt)))
    // The out-of-limits value that sent the unit to rework is withdrawn: measuring again decides anew.
    await tx
      .update(reworkEntries)
      .set({ resolvedAt: new Date(), resolvedBy: actor.id })
      .where(and(eq(reworkEntries.stepTickId, tick.id), isNull(reworkEntries.resolvedAt)))
    await settle(tx, wo)
  })
  return reload(db, storage, workOrderId)
}

/**
 * Records a leak test, judged on the server by the revision's protocol; refused until every build step
 * is ticked. A failure sends the unit to rework with the reason; a pass resolves open leak-test
 * rework and, with nothing else open, makes it built.
 * Each test is a new attempt, so first-pass yield can be counted.
 */
export async function recordLeakTest(
  db: Db,
  storage: Storage,
  workOrderId: string,
  input: z.infer<typeof RecordLeakTestSchema>,
  actor: SessionUser,
): Promise<BuildPage> {
  await db.transaction(async (tx) => {
    const wo = await lockBuildable(tx, workOrderId)
    const found = await findRevisionWithKit(tx, wo.kitRevisionId)
    const protocol = found ? protocolOf(found.revision) : null
    if (!protocol)
      throw new Conflict(`Revision ${found?.revision.code ?? ''} of ${found?.kit.sku ?? 'this kit'} has no leak test protocol; there is no leak test to record`)
    // The leak test comes after the build: every step must be ticked first.
    const steps = await stepsOfRevision(tx, wo.kitRevisionId)
    const ticked = new Set((await ticksOfWorkOrder(tx, wo.id)).filter((t) => t.undoneAt === null).map((t) => t.buildStepId))
    const left = steps.filter((s) => !ticked.has(s.id))
    if (left.length > 0) {
      const list = left.map((s) => s.position).join(', ')
      throw new Conflict(`The leak test comes after every build step: tick step${left.length > 1 ? 's' : ''} ${list} of unit ${wo.serial} first`)
    }
    const startPressurePa = toPascals(input.startPressure, input.unit)
    const endPressurePa = toPascals(input.endPressure, input.unit)
    const verdict = judgeLeakTest(protocol, { startPressurePa, endPressurePa, holdMinutes: input.holdMinutes, leaks: input.leaks }, input.unit)
    const attempt = (await lastAttempt(tx, wo.id)) + 1
    const reason = verdict.passed ? null : verdict.reasons.join('; ')
    const [test] = await tx
      .insert(leakTests)
      .values({
        workOrderId: wo.id,
        attempt,
        startPressurePa,
        endPressurePa,
        holdMinutes: input.holdMinutes,
        waterVolumeMl: input.waterVolumeMl,
        leaks: [...new Set(input.leaks)],
        leakNote: input.leakNote,
        enteredUnit: input.unit,
        passed: verdict.passed,
        reason,
        testedBy: actor.id,
      })
      .returning()
    if (verdict.passed) {
      // A pass settles leak-test rework; an out-of-limits measurement stays until it is measured again.
      await tx
        .update(reworkEntries)
        .set({ resolvedAt: new Date(), resolvedBy: actor.id })
        .where(and(eq(reworkEntries.workOrderId, wo.id), isNull(reworkEntries.resolvedAt), isNull(reworkEntries.stepTickId)))
    } else {
      const note = input.leakNote ? ` (${input.leakNote})` : ''
      await tx
        .insert(reworkEntries)
        .values({ workOrderId: wo.id, leakTestId: test!.id, reason: `Leak test ${attempt} failed: ${reason}${note}`, createdBy: actor.id })
    }
    await settle(tx, wo)
  })
  return reload(db, storage, workOrderId)
}
