import { queryOptions, useQuery } from '@tanstack/react-query'
import { useCallback } from 'react'
import { formatLength, formatLengthForInput, parseLength, type Length } from '@kitwright/shared/domain/units'
import { ShopSettingsSchema } from '@kitwright/shared/settings'
import { apiFetch } from './api-client'

export const settingsKeys = { shop: ['settings', 'shop'] as const }

export function shopSettingsOptions() {
  return queryOptions({
    queryKey: settingsKeys.shop,
    queryFn: ({ signal }) => apiFetch('/settings', ShopSettingsSchema, { signal }),
    staleTime: 5 * 60_000,
  })
}

/** Lengths shown and typed in the shop's unit (inches and sixteenths, or millimetres). */
export function useLengthUnit() {
  const { data } = useQuery(shopSettingsOptions())
  const unit = data?.displayUnit ?? 'in'
  const format = useCallback((v: Length) => formatLength(v, unit), [unit])
  const parse = useCallback((text: string) => parseLength(text, unit), [unit])
  /** For input fields: parsing it back gives exactly the stored length. */
  const formatInput = useCallback((v: Length) => formatLengthForInput(v, unit), [unit])
  return { unit, format, formatInput, parse }
}
