import { useMutation, useQueryClient, type QueryClient } from '@tanstack/react-query'
import { OrderDetailSchema, type OrderDetail, type UpdateOrderPlan } from '@kitwright/shared/orders'
import { apiFetch } from '../../../lib/api-client'
import { orderKeys } from './order-queries'

/** After a change to one order: its detail from the answer, the lists and the shortages read again. */
function settle(qc: QueryClient, order: OrderDetail) {
  qc.setQueryData(orderKeys.detail(order.id), order)
  return Promise.all([qc.invalidateQueries({ queryKey: orderKeys.lists() }), qc.invalidateQueries({ queryKey: ['shortages'] })])
}

/** Puts an order on hold with a reason. */
export function useHoldOrder(orderId: string) {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (reason: string) => apiFetch(`/orders/${orderId}/hold`, OrderDetailSchema, { method: 'POST', body: { reason } }),
    onSuccess: (order) => settle(qc, order),
  })
}

/** Takes an order off hold. */
export function useLiftOrderHold(orderId: string) {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: () => apiFetch(`/orders/${orderId}/hold`, OrderDetailSchema, { method: 'DELETE' }),
    onSuccess: (order) => settle(qc, order),
  })
}

/** Cancels an order with a reason: its unshipped work orders, reservations, bins and cut pieces follow. */
export function useCancelOrder(orderId: string) {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (reason: string) => apiFetch(`/orders/${orderId}/cancel`, OrderDetailSchema, { method: 'POST', body: { reason } }),
    onSuccess: (order) => settle(qc, order),
  })
}

/** Sets an order's priority or promised ship date. */
export function useUpdateOrderPlan(orderId: string) {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (change: UpdateOrderPlan) => apiFetch(`/orders/${orderId}`, OrderDetailSchema, { method: 'PATCH', body: change }),
    onSuccess: (order) => settle(qc, order),
  })
}
