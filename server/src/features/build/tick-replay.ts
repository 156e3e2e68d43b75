import { BUILDABLE_STATUSES, type BuildPage, type TickStep } from '@kitwright/shared/build'
import { parseMeasurement } from '@kitwright/shared/domain/measurement'
import type { Db } from '../../db/client'
import type { Storage } from '../../lib/storage'
import { loadBuildPage } from './build-page'
import { findStep, findWorkOrderById, standingTick } from './build.queries'

/**
 * A tick sent from a bench's offline queue for a step that someone else has meanwhile ticked with
 * the same content (no measurement, or the same value): the step is recorded once and the bench
 * gets the page as it stands, instead of a refusal for a tick that says what is already recorded.
 * Null when the tick is not the same (a different measurement is for the person to sort out; the
 * ordinary tick refuses it with who ticked the step) or the unit may not be built any more.
 */
export async function pageIfTickedAlike(db: Db, storage: Storage, workOrderId: string, stepId: string, input: TickStep): Promise<BuildPage | null> {
  const wo = await findWorkOrderById(db, workOrderId)
  if (!wo || !(BUILDABLE_STATUSES as readonly string[]).includes(wo.status)) return null
  const standing = await standingTick(db, workOrderId, stepId)
  if (!standing) return null
  const step = await findStep(db, wo.kitRevisionId, stepId)
  if (!step) return null
  if (!step.measurementRequired) {
    if (input.measurement !== null) return null
  } else {
    if (input.measurement === null || standing.measurement === null) return null
    let value: number
    if (typeof input.measurement === 'number') value = input.measurement
    else {
      const parsed = parseMeasurement(input.measurement, step.measurementUnit)
      if (!parsed.ok) return null
      value = parsed.value
    }
    if (value !== Number(standing.measurement)) return null
  }
  return loadBuildPage(db, storage, wo)
}
