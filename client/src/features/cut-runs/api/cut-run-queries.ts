import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query'
import { z } from 'zod'
import {
  CandidateWorkOrderSchema,
  CutRunDetailSchema,
  CutRunSummarySchema,
  PipeStockSchema,
  type CandidateQuery,
  type PlanCutRunInput,
} from '@kitwright/shared/cut-runs'
import { apiFetch } from '../../../lib/api-client'

export const cutRunKeys = {
  all: ['cut-runs'] as const,
  lists: () => [...cutRunKeys.all, 'list'] as const,
  detail: (id: string) => [...cutRunKeys.all, 'detail', id] as const,
  candidates: (q: CandidateQuery) => [...cutRunKeys.all, 'candidates', q] as const,
  stock: () => [...cutRunKeys.all, 'stock'] as const,
}

export function cutRunsListOptions() {
  return queryOptions({ queryKey: cutRunKeys.lists(), queryFn: ({ signal }) => apiFetch('/cut-runs', z.array(CutRunSummarySchema), { signal }) })
}

export function cutRunDetailOptions(id: string) {
  return queryOptions({ queryKey: cutRunKeys.detail(id), queryFn: ({ signal }) => apiFetch(`/cut-runs/${id}`, CutRunDetailSchema, { signal }) })
}

export function candidatesOptions(q: CandidateQuery) {
  const search = new URLSearchParams(Object.entries(q).filter((e): e is [string, string] => typeof e[1] === 'string' && e[1] !== '')).toString()
  return queryOptions({
    queryKey: cutRunKeys.candidates(q),
    queryFn: ({ signal }) => apiFetch(`/cut-runs/candidates${search ? `?${search}` : ''}`, z.array(CandidateWorkOrderSchema), { signal }),
  })
}

export function pipeStockOptions() {
  return queryOptions({ queryKey: cutRunKeys.stock(), queryFn: ({ signal }) => apiFetch('/cut-runs/stock', z.array(PipeStockSchema), { signal }) })
}

/** Where the browser downloads a run's cut sheet. */
export function cutSheetHref(id: string, paper: 'letter' | 'a4') {
  return `/api/cut-runs/${id}/cut-sheet.pdf?paper=${paper}`
}

export function usePlanCutRun() {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (input: PlanCutRunInput) => apiFetch('/cut-runs', CutRunDetailSchema, { method: 'POST', body: input }),
    onSuccess: (run) => {
      qc.setQueryData(cutRunKeys.detail(run.id), run)
      return qc.invalidateQueries({ queryKey: cutRunKeys.lists() })
    },
  })
}

function useRunAction(action: 'publish' | 'cancel') {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (id: string) => apiFetch(`/cut-runs/${id}/${action}`, CutRunDetailSchema, { method: 'POST' }),
    onSuccess: (run) => {
      qc.setQueryData(cutRunKeys.detail(run.id), run)
      // Publishing or cancelling changes what is reserved and which work orders wait.
      return qc.invalidateQueries({ predicate: (q) => q.queryKey[0] === 'cut-runs' && q.queryKey[1] !== 'detail' })
    },
  })
}

/** "Take longer": the draft planned again with more time; its sticks and cuts are replaced. */
export function useReplanCutRun() {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: ({ id, timeLimitSeconds }: { id: string; timeLimitSeconds: number }) =>
      apiFetch(`/cut-runs/${id}/replan`, CutRunDetailSchema, { method: 'POST', body: { timeLimitSeconds } }),
    onSuccess: (run) => {
      qc.setQueryData(cutRunKeys.detail(run.id), run)
      return qc.invalidateQueries({ queryKey: cutRunKeys.lists() })
    },
  })
}

export const usePublishCutRun = () => useRunAction('publish')
export const useCancelCutRun = () => useRunAction('cancel')
