import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query'
import { BuildPageSchema, UnitRecordSchema, type BuildPage } from '@kitwright/shared/build'
import { MeasurementFlagSchema } from '@kitwright/shared/measurement-flags'
import type { FitLotInput } from '@kitwright/shared/lots'
import { z } from 'zod'
import { BuildWorklistItemSchema } from '@kitwright/shared/worklists'
import { apiFetch } from '../../../lib/api-client'

export const buildKeys = {
  all: ['build'] as const,
  lookup: (code: string) => [...buildKeys.all, 'lookup', code.trim().toUpperCase()] as const,
  units: () => [...buildKeys.all, 'unit'] as const,
  unit: (serial: string) => [...buildKeys.units(), serial.toUpperCase()] as const,
  outOfLimits: () => [...buildKeys.all, 'out-of-limits'] as const,
  worklist: () => [...buildKeys.all, 'worklist'] as const,
}

/** Units ready for the build bench, the most urgent first; refreshed as the cut bench fills bins. */
export function buildWorklistOptions() {
  return queryOptions({ queryKey: buildKeys.worklist(), queryFn: ({ signal }) => apiFetch('/build/worklist', z.array(BuildWorklistItemSchema), { signal }), refetchInterval: 30_000 })
}

/** Out-of-limits measurements on units still in the shop, for the planner. */
export function measurementFlagsOptions() {
  return queryOptions({ queryKey: buildKeys.outOfLimits(), queryFn: ({ signal }) => apiFetch('/build/out-of-limits', z.array(MeasurementFlagSchema), { signal }) })
}

/** The build page of a scanned bin or serial. Not refetched on focus: a built unit would answer 409 and hide the page. */
export function buildLookupOptions(code: string) {
  return queryOptions({
    queryKey: buildKeys.lookup(code),
    queryFn: ({ signal }) => apiFetch(`/build/lookup?${new URLSearchParams({ code })}`, BuildPageSchema, { signal }),
    enabled: code.trim() !== '',
    refetchOnWindowFocus: false,
    retry: false,
  })
}

/** The build record of one serial. */
export function unitRecordOptions(serial: string) {
  return queryOptions({
    queryKey: buildKeys.unit(serial),
    queryFn: ({ signal }) => apiFetch(`/units/${encodeURIComponent(serial)}`, UnitRecordSchema, { signal }),
    retry: false,
  })
}

/** Every build mutation answers with the whole page: put it where the scanned code's page is. */
function useSetPage(code: string) {
  const qc = useQueryClient()
  return (page: BuildPage) => {
    qc.setQueryData(buildKeys.lookup(code), page)
    void qc.invalidateQueries({ queryKey: buildKeys.worklist() })
    return qc.invalidateQueries({ queryKey: buildKeys.unit(page.workOrder.serial) })
  }
}

// Ticks, undos, the leak test and photos go through the tablet's queue: build-bench-actions.ts.

/** Records which lot of a lot-tracked part went into the unit: `{ partId, lotCode, quantity? }`, one plain call. */
export function useFitLot(code: string) {
  const setPage = useSetPage(code)
  return useMutation({
    mutationFn: ({ workOrderId, ...body }: FitLotInput & { workOrderId: string }) => apiFetch(`/build/${workOrderId}/lots`, BuildPageSchema, { method: 'POST', body }),
    onSuccess: setPage,
  })
}

/** Undoes a lot recorded by mistake (it stays on the build record as undone). */
export function useUndoLotFit(code: string) {
  const setPage = useSetPage(code)
  return useMutation({
    mutationFn: ({ workOrderId, fitId }: { workOrderId: string; fitId: string }) => apiFetch(`/build/${workOrderId}/lots/${fitId}/undo`, BuildPageSchema, { method: 'POST', body: {} }),
    onSuccess: setPage,
  })
}
