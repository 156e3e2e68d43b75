import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query'
import {
  DraftFromShortagesResultSchema,
  PurchaseOrderSchema,
  SupplierSchema,
  type PurchaseOrderListQuery,
  type SaveSupplierInput,
  type SaveSupplierPartInput,
  type UpdatePurchaseOrderInput,
} from '@kitwright/shared/purchasing'
import { apiFetch } from '../../../lib/api-client'

export const purchasingKeys = {
  all: ['purchasing'] as const,
  suppliers: () => [...purchasingKeys.all, 'suppliers'] as const,
  orders: () => [...purchasingKeys.all, 'orders'] as const,
  orderList: (q: PurchaseOrderListQuery) => [...purchasingKeys.orders(), 'list', q] as const,
  order: (id: string) => [...purchasingKeys.orders(), 'detail', id] as const,
}

export function suppliersOptions() {
  return queryOptions({ queryKey: purchasingKeys.suppliers(), queryFn: ({ signal }) => apiFetch('/suppliers', SupplierSchema.array(), { signal }) })
}

export function purchaseOrdersOptions(q: PurchaseOrderListQuery) {
  return queryOptions({
    queryKey: purchasingKeys.orderList(q),
    queryFn: ({ signal }) => apiFetch(q.status ? `/purchase-orders?status=${q.status}` : '/purchase-orders', PurchaseOrderSchema.array(), { signal }),
  })
}

export function purchaseOrderOptions(id: string) {
  return queryOptions({ queryKey: purchasingKeys.order(id), queryFn: ({ signal }) => apiFetch(`/purchase-orders/${id}`, PurchaseOrderSchema, { signal }) })
}

/** Drafts, sends and receipts change shortages (on order) and the stock pages too. */
function useInvalidatePurchasing() {
  const qc = useQueryClient()
  return () => Promise.all([qc.invalidateQueries({ queryKey: purchasingKeys.all }), qc.invalidateQueries({ queryKey: ['shortages'] })])
}

export function useSaveSupplier() {
  const invalidate = useInvalidatePurchasing()
  return useMutation({
    mutationFn: ({ id, input }: { id: string | null; input: SaveSupplierInput }) =>
      apiFetch(id ? `/suppliers/${id}` : '/suppliers', SupplierSchema, { method: id ? 'PUT' : 'POST', body: input }),
    onSuccess: () => invalidate(),
  })
}

export function useSaveSupplierPart() {
  const invalidate = useInvalidatePurchasing()
  return useMutation({
    mutationFn: ({ supplierId, partId, input }: { supplierId: string; partId: string; input: SaveSupplierPartInput }) =>
      apiFetch(`/suppliers/${supplierId}/parts/${partId}`, SupplierSchema, { method: 'PUT', body: input }),
    onSuccess: () => invalidate(),
  })
}

export function useDraftFromShortages() {
  const invalidate = useInvalidatePurchasing()
  return useMutation({
    mutationFn: () => apiFetch('/purchase-orders/from-shortages', DraftFromShortagesResultSchema, { method: 'POST' }),
    onSuccess: () => invalidate(),
  })
}

export function useUpdatePurchaseOrder() {
  const invalidate = useInvalidatePurchasing()
  return useMutation({
    mutationFn: ({ id, input }: { id: string; input: UpdatePurchaseOrderInput }) => apiFetch(`/purchase-orders/${id}`, PurchaseOrderSchema, { method: 'PUT', body: input }),
    onSuccess: () => invalidate(),
  })
}

export function useSendPurchaseOrder() {
  const invalidate = useInvalidatePurchasing()
  return useMutation({
    mutationFn: (id: string) => apiFetch(`/purchase-orders/${id}/send`, PurchaseOrderSchema, { method: 'POST' }),
    onSuccess: () => invalidate(),
  })
}

export function useCancelPurchaseOrder() {
  const invalidate = useInvalidatePurchasing()
  return useMutation({
    mutationFn: (id: string) => apiFetch(`/purchase-orders/${id}/cancel`, PurchaseOrderSchema, { method: 'POST' }),
    onSuccess: () => invalidate(),
  })
}
