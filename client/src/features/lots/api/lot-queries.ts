import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query'
import { LotDetailSchema, LotListSchema, NotifyRecallResultSchema, type LotListQuery, type NotifyRecall } from '@kitwright/shared/lots'
import { apiFetch } from '../../../lib/api-client'

export const lotKeys = {
  all: ['lots'] as const,
  lists: () => [...lotKeys.all, 'list'] as const,
  list: (q: LotListQuery) => [...lotKeys.lists(), q] as const,
  detail: (id: string) => [...lotKeys.all, 'detail', id] as const,
}

/** The lots received, newest first, or those matching a lot code, SKU or part name. */
export function lotListOptions(q: LotListQuery) {
  const search = q.q ? `?${new URLSearchParams({ q: q.q })}` : ''
  return queryOptions({ queryKey: lotKeys.list(q), queryFn: ({ signal }) => apiFetch(`/lots${search}`, LotListSchema, { signal }) })
}

/** A lot and every unit built with it. */
export function lotDetailOptions(lotId: string) {
  return queryOptions({ queryKey: lotKeys.detail(lotId), queryFn: ({ signal }) => apiFetch(`/lots/${lotId}`, LotDetailSchema, { signal }) })
}

/** The recall list of a lot as CSV (a plain link: the browser downloads it with the session cookie). */
export function recallCsvHref(lotId: string) {
  return `/api/lots/${lotId}/recall.csv`
}

/** "Tell the customers": one e-mail per customer, each sent once. */
export function useNotifyRecall(lotId: string) {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (body: NotifyRecall) => apiFetch(`/lots/${lotId}/notify`, NotifyRecallResultSchema, { method: 'POST', body }),
    onSuccess: (result) => {
      qc.setQueryData(lotKeys.detail(lotId), result.detail)
      return qc.invalidateQueries({ queryKey: ['mail'] })
    },
  })
}
