import { useMutation, useQueryClient } from '@tanstack/react-query'
import { ReleasePreviewSchema, ReleaseResultSchema, type ReleaseOrdersInput } from '@kitwright/shared/work-orders'
import { apiFetch } from '../../../lib/api-client'
import { orderKeys } from './order-queries'

/** Releases orders into work orders; refreshes the released orders and the lists. */
export function useReleaseOrders() {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (input: ReleaseOrdersInput) => apiFetch('/orders/release', ReleaseResultSchema, { method: 'POST', body: input }),
    onSettled: (_result, _err, input) =>
      Promise.all([
        ...input.orderIds.map((id) => qc.invalidateQueries({ queryKey: orderKeys.detail(id) })),
        qc.invalidateQueries({ queryKey: orderKeys.lists() }),
        // The shortages page reads the same work orders.
        qc.invalidateQueries({ queryKey: ['shortages'] }),
      ]),
  })
}

/** What releasing these orders would do (who gets stock, who is refused), without doing it. */
export function useReleasePreview() {
  return useMutation({
    mutationFn: (input: ReleaseOrdersInput) => apiFetch('/orders/release/preview', ReleasePreviewSchema, { method: 'POST', body: input }),
  })
}
