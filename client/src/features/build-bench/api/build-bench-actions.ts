import { useMutation, useQueryClient } from '@tanstack/react-query'
import { BuildPageSchema, type BuildPage, type PhotoContentType, type RecordLeakTestInput, type TickStepInput } from '@kitwright/shared/build'
import { parseMeasurement } from '@kitwright/shared/domain/measurement'
import type { QueuedAction } from '../../../lib/offline/action-store'
import { cancelWaiting, submitBenchAction } from '../../../lib/offline/bench-queue'
import type { PhotoActionBody } from '../../../lib/offline/photo-upload'
import { buildKeys } from './build-queries'

/**
 * The build bench's actions, each through the tablet's queue (lib/offline/): kept first, sent in
 * order, waiting while the network is down. Ticks, measurements and undos show on the bench as
 * taken meanwhile (`overlayWaiting`); the leak test's verdict and photos need the server, so they
 * show as "waiting for the network" until it has them.
 */

/** Every build action answers with the whole page: put it where the scanned code's page is. */
function useSetPage(code: string) {
  const qc = useQueryClient()
  return (page: BuildPage | null) => {
    if (!page) return
    qc.setQueryData(buildKeys.lookup(code), page)
    void qc.invalidateQueries({ queryKey: buildKeys.worklist() })
    return qc.invalidateQueries({ queryKey: buildKeys.unit(page.workOrder.serial) })
  }
}

type StepAction = { workOrderId: string; stepId: string; serial: string; position: number }

export function useTickStep(code: string) {
  const setPage = useSetPage(code)
  return useMutation({
    mutationFn: async ({ workOrderId, stepId, serial, position, ...body }: TickStepInput & StepAction) => {
      const measured = body.measurement === null || body.measurement === undefined || body.measurement === '' ? '' : `, measured ${body.measurement}`
      const outcome = await submitBenchAction(
        {
          bench: 'build',
          kind: 'build.tick',
          label: `Step ${position} of unit ${serial}${measured}`,
          path: `/build/${workOrderId}/steps/${stepId}/tick`,
          body,
          target: { workOrderId, stepId },
        },
        BuildPageSchema,
      )
      return outcome.sent ? outcome.data : null
    },
    onSuccess: setPage,
  })
}

export function useUndoTick(code: string) {
  const setPage = useSetPage(code)
  return useMutation({
    mutationFn: async ({ workOrderId, stepId, serial, position }: StepAction) => {
      // A tick not sent yet is simply taken back.
      if (await cancelWaiting((a) => a.kind === 'build.tick' && a.target.workOrderId === workOrderId && a.target.stepId === stepId)) return null
      const outcome = await submitBenchAction(
        {
          bench: 'build',
          kind: 'build.undo',
          label: `Undo step ${position} of unit ${serial}`,
          path: `/build/${workOrderId}/steps/${stepId}/undo`,
          target: { workOrderId, stepId },
        },
        BuildPageSchema,
      )
      return outcome.sent ? outcome.data : null
    },
    onSuccess: setPage,
  })
}

/** The verdict is the server's (judged by the protocol): offline, the readings wait with their badge. */
export function useRecordLeakTest(code: string) {
  const setPage = useSetPage(code)
  return useMutation({
    mutationFn: async ({ workOrderId, serial, ...input }: RecordLeakTestInput & { workOrderId: string; serial: string }) => {
      const outcome = await submitBenchAction(
        {
          bench: 'build',
          kind: 'build.leak_test',
          label: `Leak test of unit ${serial}`,
          path: `/build/${workOrderId}/leak-tests`,
          body: input,
          target: { workOrderId },
          needsServer: true,
        },
        BuildPageSchema,
      )
      return outcome.sent ? outcome.data : null
    },
    onSuccess: setPage,
  })
}

/** The photo is kept on the tablet until its presigned upload and the server's confirm went through. */
export function useUploadPhoto(code: string) {
  const setPage = useSetPage(code)
  return useMutation({
    mutationFn: async ({ workOrderId, stepId, file, what }: { workOrderId: string; stepId: string | null; file: File; what: string }) => {
      const body: PhotoActionBody = {
        presignPath: `/build/${workOrderId}/photos/presign`,
        presignBody: { contentType: file.type as PhotoContentType, size: file.size, stepId },
        confirmPath: `/build/${workOrderId}/photos/confirm`,
      }
      const outcome = await submitBenchAction(
        {
          bench: 'build',
          kind: 'build.photo',
          label: what,
          path: body.confirmPath,
          body,
          target: { workOrderId, ...(stepId ? { stepId } : {}) },
          needsServer: true,
          photo: file,
        },
        BuildPageSchema,
      )
      return outcome.sent ? outcome.data : null
    },
    onSuccess: setPage,
  })
}

export const BUILD_ACTIONS = ['build.tick', 'build.undo', 'build.leak_test', 'build.photo'] as const

/**
 * The unit's page as the bench should show it: the server's last answer (or, offline, the last one
 * kept) with this person's ticks and undos that wait in the queue applied, so steps ticked offline
 * show as ticked (and the next step opens), even after a reload.
 */
export function overlayWaiting(page: BuildPage, waiting: readonly QueuedAction[], me: { id: string }): BuildPage {
  const mine = waiting.filter((a) => a.target.workOrderId === page.workOrder.id && (a.kind === 'build.tick' || a.kind === 'build.undo'))
  if (mine.length === 0) return page
  const last = new Map<string, QueuedAction>()
  for (const a of mine) last.set(a.target.stepId!, a)
  return {
    ...page,
    steps: page.steps.map((step) => {
      const a = last.get(step.id)
      if (!a) return step
      if (a.kind === 'build.undo') return { ...step, tick: null }
      if (step.tick) return step
      const typed = (a.body as TickStepInput).measurement
      const read = typeof typed === 'number' ? typed : typed ? parseMeasurement(typed, step.measurementUnit) : null
      const measurement = typeof read === 'number' ? read : read?.ok ? read.value : null
      const reason = (a.body as TickStepInput).reason ?? null
      return {
        ...step,
        tick: {
          id: a.id,
          stepId: step.id,
          by: { id: me.id, name: 'you (not sent yet)' },
          at: a.takenAt,
          measurement,
          outOfLimits: reason !== null,
          outOfLimitsReason: reason,
          undoneAt: null,
          undoneBy: null,
        },
      }
    }),
  }
}
