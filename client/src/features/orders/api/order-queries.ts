import { keepPreviousData, queryOptions, useMutation, useQueryClient } from '@tanstack/react-query'
import { z } from 'zod'
import { KitSchema } from '@kitwright/shared/kits'
import { NewOrderSchema, OrderDetailSchema, OrderListQuerySchema, OrdersPageSchema, type NewOrder, type OrderListQuery } from '@kitwright/shared/orders'
import { OrderImportPreviewSchema, OrderImportResultSchema } from '@kitwright/shared/orders-csv'
import { queryToSearch } from '@kitwright/shared/pagination'
import { apiFetch } from '../../../lib/api-client'

export const orderKeys = {
  all: ['orders'] as const,
  lists: () => [...orderKeys.all, 'list'] as const,
  list: (q: OrderListQuery) => [...orderKeys.lists(), q] as const,
  detail: (id: string) => [...orderKeys.all, 'detail', id] as const,
  kits: () => [...orderKeys.all, 'kits'] as const,
}

function search(q: Partial<OrderListQuery>) {
  return new URLSearchParams(queryToSearch(OrderListQuerySchema, OrderListQuerySchema.parse(q))).toString()
}

export function ordersListOptions(q: OrderListQuery) {
  const s = search(q)
  return queryOptions({
    queryKey: orderKeys.list(q),
    queryFn: ({ signal }) => apiFetch(s ? `/orders?${s}` : '/orders', OrdersPageSchema, { signal }),
    // Keep the current page on screen while the next one loads, so the table does not jump.
    placeholderData: keepPreviousData,
  })
}

export function orderDetailOptions(id: string) {
  return queryOptions({
    queryKey: orderKeys.detail(id),
    queryFn: ({ signal }) => apiFetch(`/orders/${id}`, OrderDetailSchema, { signal }),
  })
}

/** The kits, for the kit filter and the order form's line picker. */
export function orderKitsOptions() {
  return queryOptions({
    queryKey: orderKeys.kits(),
    queryFn: ({ signal }) => apiFetch('/kits', z.array(KitSchema), { signal }),
    staleTime: 60_000,
  })
}

/** Where the browser downloads the orders matching the list's filters as CSV (every page). */
export function ordersExportHref(q: OrderListQuery) {
  const { page: _p, pageSize: _s, ...rest } = q
  const s = search(rest)
  return s ? `/api/orders/export.csv?${s}` : '/api/orders/export.csv'
}

export function useCreateOrder() {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (input: NewOrder) => apiFetch('/orders', OrderDetailSchema, { method: 'POST', body: NewOrderSchema.parse(input) }),
    onSuccess: (order) => {
      qc.setQueryData(orderKeys.detail(order.id), order)
      return qc.invalidateQueries({ queryKey: orderKeys.lists() })
    },
  })
}

export function usePreviewOrdersImport() {
  return useMutation({
    mutationFn: (csv: string) => apiFetch('/orders/import/preview', OrderImportPreviewSchema, { method: 'POST', body: { csv } }),
  })
}

export function useImportOrders() {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (csv: string) => apiFetch('/orders/import', OrderImportResultSchema, { method: 'POST', body: { csv } }),
    onSuccess: () => qc.invalidateQueries({ queryKey: orderKeys.lists() }),
  })
}
