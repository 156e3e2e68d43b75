import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query'
import { z } from 'zod'
import { BagCheckSchema, WeighBagResultSchema, type WeighBagInput } from '@kitwright/shared/bag-weights'
import { apiFetch } from '../../../lib/api-client'
import { packKeys } from '../api/pack-queries'

export const bagKeys = {
  all: ['pack-bench', 'bags'] as const,
  order: (orderId: string) => [...bagKeys.all, orderId] as const,
}

/** The bags of an order: contents, what each should weigh and why, the last weighing. */
export function bagChecksOptions(orderId: string) {
  return queryOptions({ queryKey: bagKeys.order(orderId), queryFn: ({ signal }) => apiFetch(`/bags/orders/${orderId}`, z.array(BagCheckSchema), { signal }) })
}

/**
 * Weighs one bag: a plain API call (`POST /api/bags/orders/:orderId/weigh` with `{ itemKey, weight,
 * source, requestKey }`). The request key is made once per weighing, so a retry lands once.
 */
export function useWeighBag(orderId: string) {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (input: WeighBagInput) => apiFetch(`/bags/orders/${orderId}/weigh`, WeighBagResultSchema, { method: 'POST', body: { ...input, requestKey: input.requestKey ?? crypto.randomUUID() } }),
    onSuccess: () => Promise.all([qc.invalidateQueries({ queryKey: bagKeys.order(orderId) }), qc.invalidateQueries({ queryKey: packKeys.order(orderId) })]),
  })
}

/** The bag's 2 × 1 in label (its contents, accepted weight and Code 128). */
export const bagLabelHref = (orderId: string, itemKey: string) => `/api/bags/orders/${orderId}/label.pdf?itemKey=${encodeURIComponent(itemKey)}`
