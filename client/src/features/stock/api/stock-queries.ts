import { keepPreviousData, queryOptions, useMutation, useQueryClient } from '@tanstack/react-query'
import { z } from 'zod'
import { queryToSearch } from '@kitwright/shared/pagination'
import {
  PackingListPreviewSchema,
  StockLedgerSchema,
  StockListQuerySchema,
  StockMovesResultSchema,
  StockPageSchema,
  StockPartOptionSchema,
  type AdjustStock,
  type PackingList,
  type ReceiveStock,
  type StockListQuery,
} from '@kitwright/shared/stock'
import { apiFetch } from '../../../lib/api-client'

export const stockKeys = {
  all: ['stock'] as const,
  lists: () => [...stockKeys.all, 'list'] as const,
  list: (q: StockListQuery) => [...stockKeys.lists(), q] as const,
  ledgers: () => [...stockKeys.all, 'ledger'] as const,
  ledger: (partId: string) => [...stockKeys.ledgers(), partId] as const,
  partOptions: () => [...stockKeys.all, 'part-options'] as const,
}

function search(q: StockListQuery, omitPage = false) {
  const params = queryToSearch(StockListQuerySchema, q)
  if (omitPage) {
    delete params.page
    delete params.pageSize
  }
  const text = new URLSearchParams(params).toString()
  return text ? `?${text}` : ''
}

export function stockListOptions(q: StockListQuery) {
  return queryOptions({
    queryKey: stockKeys.list(q),
    queryFn: ({ signal }) => apiFetch(`/stock${search(q)}`, StockPageSchema, { signal }),
    placeholderData: keepPreviousData,
  })
}

export function stockLedgerOptions(partId: string) {
  return queryOptions({
    queryKey: stockKeys.ledger(partId),
    queryFn: ({ signal }) => apiFetch(`/stock/moves?partId=${encodeURIComponent(partId)}`, StockLedgerSchema, { signal }),
  })
}

export function stockPartOptions() {
  return queryOptions({
    queryKey: stockKeys.partOptions(),
    queryFn: ({ signal }) => apiFetch('/stock/parts', z.array(StockPartOptionSchema), { signal }),
    staleTime: 60_000,
  })
}

/** Where the browser downloads the stock page as CSV, with the page's search and filters (all pages). */
export function stockExportHref(q: StockListQuery) {
  return `/api/stock/export.csv${search(q, true)}`
}

/** Every write to the ledger changes balances: refresh the stock lists and the ledgers. */
function useInvalidateStock() {
  const qc = useQueryClient()
  return () => Promise.all([qc.invalidateQueries({ queryKey: stockKeys.lists() }), qc.invalidateQueries({ queryKey: stockKeys.ledgers() })])
}

export function useReceiveStock() {
  const invalidate = useInvalidateStock()
  return useMutation({
    mutationFn: (input: ReceiveStock) => apiFetch('/stock/receive', StockMovesResultSchema, { method: 'POST', body: input }),
    onSuccess: () => invalidate(),
  })
}

export function usePreviewPackingList() {
  return useMutation({
    mutationFn: (input: PackingList) => apiFetch('/stock/receive/preview', PackingListPreviewSchema, { method: 'POST', body: input }),
  })
}

export function useReceivePackingList() {
  const invalidate = useInvalidateStock()
  return useMutation({
    mutationFn: (input: PackingList) => apiFetch('/stock/receive/csv', StockMovesResultSchema, { method: 'POST', body: input }),
    onSuccess: () => invalidate(),
  })
}

export function useAdjustStock() {
  const invalidate = useInvalidateStock()
  return useMutation({
    mutationFn: (input: AdjustStock) => apiFetch('/stock/adjust', StockMovesResultSchema, { method: 'POST', body: input }),
    onSuccess: () => invalidate(),
  })
}
