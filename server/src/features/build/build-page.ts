import type { BuildPage, BuildReadiness } from '@kitwright/shared/build'
import type { LeakTestProtocol } from '@kitwright/shared/kits'
import type { Db, Tx } from '../../db/client'
import type { BuildStepRow, BuildStepTickRow, KitRevisionRow, LeakTestRow, ReworkEntryRow, UnitPhotoRow, WorkOrderRow } from '../../db/schema/index'
import type { Storage } from '../../lib/storage'
import { NotFound } from '../../lib/http-errors'
import { lotNeedsOf } from '../lots/lots.queries'
import {
  confirmedPhotos,
  findBinOfWorkOrder,
  findRevisionWithKit,
  leakTestsOfWorkOrder,
  namesOf,
  reworkOfWorkOrder,
  stepsOfRevision,
  ticksOfWorkOrder,
} from './build.queries'

/** Thumbnails' presigned GETs last an hour: long enough for a shift's glance, short enough not to leak. */
const PHOTO_URL_SECONDS = 3600

/** A revision's leak test protocol, or null when the revision has none (e.g. spare-parts packs). */
export function protocolOf(r: KitRevisionRow): LeakTestProtocol | null {
  const { leakTestMinPressurePa: min, leakTestMaxPressurePa: max, leakTestHoldMinutes: hold, leakTestMaxDropPa: drop, leakTestWaterVolumeMl: water } = r
  if (min === null || max === null || hold === null || drop === null || water === null) return null
  return { minPressurePa: min, maxPressurePa: max, holdMinutes: hold, maxDropPa: drop, waterVolumeMl: water }
}

/**
 * What stands between the unit and the pack bench: every step ticked, a photo for every step that
 * needs one, no rework left open, the lot of every lot-tracked part recorded, and the latest leak test passed (when the revision has a protocol).
 */
export function readinessOf(
  steps: readonly Pick<BuildStepRow, 'id' | 'photoRequired'>[],
  ticks: readonly Pick<BuildStepTickRow, 'buildStepId' | 'undoneAt'>[],
  photos: readonly Pick<UnitPhotoRow, 'buildStepId'>[],
  tests: readonly Pick<LeakTestRow, 'attempt' | 'passed'>[],
  hasProtocol: boolean,
  rework: readonly Pick<ReworkEntryRow, 'resolvedAt'>[],
  lotsMissing = 0,
): BuildReadiness {
  const ticked = new Set(ticks.filter((t) => t.undoneAt === null).map((t) => t.buildStepId))
  const photographed = new Set(photos.map((p) => p.buildStepId))
  const stepsLeft = steps.filter((s) => !ticked.has(s.id)).length
  const photosMissing = steps.filter((s) => s.photoRequired && !photographed.has(s.id)).length
  const latest = [...tests].sort((a, b) => a.attempt - b.attempt).at(-1)
  const leakTest = !hasProtocol ? 'not_required' : !latest ? 'none' : latest.passed ? 'passed' : 'failed'
  const openRework = rework.filter((r) => r.resolvedAt === null).length
  const ready = stepsLeft === 0 && photosMissing === 0 && openRework === 0 && lotsMissing === 0 && (leakTest === 'passed' || leakTest === 'not_required')
  return { stepsLeft, photosMissing, leakTest, openRework, lotsMissing, ready }
}

/** Everything recorded for one unit, as the build bench and the build record show it. */
export async function loadBuildPage(db: Db | Tx, storage: Storage, wo: WorkOrderRow): Promise<BuildPage> {
  const found = await findRevisionWithKit(db, wo.kitRevisionId)
  if (!found) throw new NotFound(`Unit ${wo.serial} has no kit revision`)
  const [steps, ticks, photos, tests, rework, bin, lots] = await Promise.all([
    stepsOfRevision(db, wo.kitRevisionId),
    ticksOfWorkOrder(db, wo.id),
    confirmedPhotos(db, wo.id),
    leakTestsOfWorkOrder(db, wo.id),
    reworkOfWorkOrder(db, wo.id),
    findBinOfWorkOrder(db, wo.id),
    lotNeedsOf(db, wo),
  ])
  const names = await namesOf(db, [
    ...ticks.flatMap((t) => [t.tickedBy, t.undoneBy]),
    ...photos.map((p) => p.uploadedBy),
    ...tests.map((t) => t.testedBy),
    ...rework.flatMap((r) => [r.createdBy, r.resolvedBy]),
  ])
  const person = (id: string) => ({ id, name: names.get(id) ?? 'Unknown user' })
  const maybePerson = (id: string | null) => (id === null ? null : person(id))
  const toTick = (t: BuildStepTickRow) => ({
    id: t.id,
    stepId: t.buildStepId,
    by: person(t.tickedBy),
    at: t.tickedAt.toISOString(),
    measurement: t.measurement === null ? null : Number(t.measurement),
    outOfLimits: t.outOfLimits,
    outOfLimitsReason: t.outOfLimitsReason,
    undoneAt: t.undoneAt?.toISOString() ?? null,
    undoneBy: maybePerson(t.undoneBy),
  })
  const protocol = protocolOf(found.revision)
  const urls = await Promise.all(photos.map((p) => storage.presignGet(p.key, PHOTO_URL_SECONDS).catch(() => null)))
  return {
    workOrder: { id: wo.id, serial: wo.serial, status: wo.status, binCode: bin?.code ?? null },
    kit: found.kit,
    revision: { id: found.revision.id, code: found.revision.code },
    leakTestProtocol: protocol,
    steps: steps.map((s) => {
      const history = ticks.filter((t) => t.buildStepId === s.id).map(toTick)
      return {
        id: s.id,
        position: s.position,
        text: s.text,
        caution: s.caution,
        photoRequired: s.photoRequired,
        measurementRequired: s.measurementRequired,
        measurementUnit: s.measurementUnit,
        measurementMin: s.measurementMin === null ? null : Number(s.measurementMin),
        measurementMax: s.measurementMax === null ? null : Number(s.measurementMax),
        freeOrder: s.freeOrder,
        outOfLimitsRework: s.outOfLimitsRework,
        tick: history.find((t) => t.undoneAt === null) ?? null,
        history,
      }
    }),
    photos: photos.map((p, i) => ({
      id: p.id,
      stepId: p.buildStepId,
      key: p.key,
      contentType: p.contentType,
      size: p.size,
      url: urls[i] ?? null,
      by: person(p.uploadedBy),
      at: p.uploadedAt!.toISOString(),
    })),
    leakTests: tests.map((t) => ({
      id: t.id,
      attempt: t.attempt,
      startPressurePa: t.startPressurePa,
      endPressurePa: t.endPressurePa,
      dropPa: t.startPressurePa - t.endPressurePa,
      holdMinutes: t.holdMinutes,
      waterVolumeMl: t.waterVolumeMl,
      leaks: t.leaks,
      leakNote: t.leakNote,
      unit: t.enteredUnit,
      passed: t.passed,
      reason: t.reason,
      by: person(t.testedBy),
      at: t.testedAt.toISOString(),
    })),
    rework: rework.map((r: ReworkEntryRow) => ({
      id: r.id,
      reason: r.reason,
      cause: r.leakTestId !== null ? ('leak_test' as const) : r.stepTickId !== null ? ('measurement' as const) : ('other' as const),
      by: person(r.createdBy),
      at: r.createdAt.toISOString(),
      resolvedAt: r.resolvedAt?.toISOString() ?? null,
      resolvedBy: maybePerson(r.resolvedBy),
    })),
    lots,
    readiness: readinessOf(steps, ticks, photos, tests, protocol !== null, rework, lots.filter((l) => l.left > 0).length),
  }
}
