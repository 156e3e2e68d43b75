import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query'
import { z } from 'zod'
import { BinSchema, type CreateBins } from '@kitwright/shared/bins'
import { apiFetch } from '../../../lib/api-client'

export const binKeys = { all: ['bins'] as const, list: () => [...binKeys.all, 'list'] as const }

export function binsListOptions() {
  return queryOptions({ queryKey: binKeys.list(), queryFn: ({ signal }) => apiFetch('/bins', z.array(BinSchema), { signal }) })
}

export function useCreateBins() {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (input: CreateBins) => apiFetch('/bins', z.array(BinSchema), { method: 'POST', body: input }),
    onSuccess: () => qc.invalidateQueries({ queryKey: binKeys.list() }),
  })
}

/** Where the browser downloads bin labels: all bins, or the ids given. */
/** The labels of one batch of bins, by its first and last code: one PDF, one print. */
export function binBatchLabelsHref(size: '2x1' | '4x6' | 'letter', from: string, to: string) {
  return `/api/bins/labels.pdf?${new URLSearchParams({ size, from, to })}`
}

export function binLabelsHref(size: '2x1' | '4x6' | 'letter', ids?: string[]) {
  return `/api/bins/labels.pdf?size=${size}${ids?.length ? `&ids=${ids.join(',')}` : ''}`
}
