import { useMutation, useQueryClient } from '@tanstack/react-query'
import { ShopSettingsSchema, UpdateShopSettingsSchema, type UpdateShopSettings } from '@kitwright/shared/settings'
import { apiFetch } from '../../../lib/api-client'
import { settingsKeys } from '../../../lib/shop-settings'

/** Saves the shop's settings (admin); every screen reading them gets the new values. */
export function useUpdateSettings() {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (change: UpdateShopSettings) => apiFetch('/settings', ShopSettingsSchema, { method: 'PATCH', body: UpdateShopSettingsSchema.parse(change) }),
    onSuccess: (settings) => qc.setQueryData(settingsKeys.shop, settings),
  })
}
