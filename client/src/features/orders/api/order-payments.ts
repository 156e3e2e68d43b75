import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query'
import { OrderPaymentsSchema, type RecordPayment } from '@kitwright/shared/payments'
import { apiFetch } from '../../../lib/api-client'
import { orderKeys } from './order-queries'

export const orderPaymentKeys = { detail: (orderId: string) => [...orderKeys.detail(orderId), 'payments'] as const }

export function orderPaymentsOptions(orderId: string) {
  return queryOptions({
    queryKey: orderPaymentKeys.detail(orderId),
    queryFn: ({ signal }) => apiFetch(`/orders/${orderId}/payments`, OrderPaymentsSchema, { signal }),
  })
}

/** After a payment the order itself changes too (its payment state, its timeline, maybe its work orders). */
function useRefreshOrder(orderId: string) {
  const qc = useQueryClient()
  return () => Promise.all([qc.invalidateQueries({ queryKey: orderKeys.detail(orderId) }), qc.invalidateQueries({ queryKey: orderKeys.lists() })])
}

export function useRecordPayment(orderId: string) {
  const refresh = useRefreshOrder(orderId)
  return useMutation({
    mutationFn: (input: RecordPayment) => apiFetch(`/orders/${orderId}/payments`, OrderPaymentsSchema, { method: 'POST', body: input }),
    onSettled: refresh,
  })
}

export function useSendPaymentLink(orderId: string) {
  const refresh = useRefreshOrder(orderId)
  return useMutation({
    mutationFn: () => apiFetch(`/orders/${orderId}/payment-links`, OrderPaymentsSchema, { method: 'POST', body: {} }),
    onSettled: refresh,
  })
}
