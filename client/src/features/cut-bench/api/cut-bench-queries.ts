import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query'
import { z } from 'zod'
import { CutRunDetailSchema, CutRunSummarySchema, type CutRunDetail } from '@kitwright/shared/cut-runs'
import { apiFetch } from '../../../lib/api-client'

export const benchKeys = {
  all: ['cut-bench'] as const,
  runs: () => [...benchKeys.all, 'runs'] as const,
  run: (id: string) => [...benchKeys.all, 'run', id] as const,
}

/** Runs the bench can work: published ones. */
export function benchRunsOptions() {
  return queryOptions({ queryKey: benchKeys.runs(), queryFn: ({ signal }) => apiFetch('/cut-runs?status=published', z.array(CutRunSummarySchema), { signal }) })
}

export function benchRunOptions(id: string) {
  // Another cutter may work the same run: refresh now and then.
  return queryOptions({ queryKey: benchKeys.run(id), queryFn: ({ signal }) => apiFetch(`/cut-runs/${id}`, CutRunDetailSchema, { signal }), refetchInterval: 15_000 })
}

/** A bench action answers with the whole run; the screen shows it at once. */
function useBenchAction<V>(path: (v: V) => string, body?: (v: V) => unknown) {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (v: V) => apiFetch(path(v), CutRunDetailSchema, { method: 'POST', body: body?.(v) }),
    onSuccess: async (run: CutRunDetail) => {
      // A background refresh started before this action must not paint the older state over it.
      await qc.cancelQueries({ queryKey: benchKeys.run(run.id) })
      qc.setQueryData(benchKeys.run(run.id), run)
      return qc.invalidateQueries({ queryKey: benchKeys.runs() })
    },
  })
}

export const useTickCut = () => useBenchAction((v: { runId: string; cutId: string }) => `/cut-runs/${v.runId}/cuts/${v.cutId}/tick`)
export const useUndoCut = () => useBenchAction((v: { runId: string; cutId: string }) => `/cut-runs/${v.runId}/cuts/${v.cutId}/undo`)
export const useDamageStick = () =>
  useBenchAction(
    (v: { runId: string; stickId: string; reason: string; spoiledCutIds: string[] }) => `/cut-runs/${v.runId}/sticks/${v.stickId}/damage`,
    (v) => ({ reason: v.reason, spoiledCutIds: v.spoiledCutIds }),
  )
export const useAssignBin = () =>
  useBenchAction(
    (v: { runId: string; workOrderId: string; code: string }) => `/cut-runs/${v.runId}/bins`,
    (v) => ({ workOrderId: v.workOrderId, code: v.code }),
  )

export function binLabelHref(binId: string) {
  return `/api/bins/labels.pdf?size=2x1&ids=${binId}`
}
export function offcutLabelHref(runId: string, stickId: string) {
  return `/api/cut-runs/${runId}/sticks/${stickId}/offcut-label.pdf`
}
export function benchCutSheetHref(runId: string) {
  return `/api/cut-runs/${runId}/cut-sheet.pdf?paper=letter`
}
