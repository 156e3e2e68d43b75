import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query'
import { ShopIdentitySchema, UpdateShopIdentitySchema, type UpdateShopIdentity } from '@kitwright/shared/settings'
import { apiFetch } from '../../../lib/api-client'
import { settingsKeys } from '../../../lib/shop-settings'

export const identityKeys = { identity: ['settings', 'identity'] as const }

/** The shop's identity (admin): name, e-mail sender and reply-to, ship-from address, and the public address. */
export function shopIdentityOptions() {
  return queryOptions({
    queryKey: identityKeys.identity,
    queryFn: ({ signal }) => apiFetch('/settings/identity', ShopIdentitySchema, { signal }),
  })
}

/** Saves the shop's identity; the shop name shown everywhere follows. */
export function useUpdateIdentity() {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (change: UpdateShopIdentity) => apiFetch('/settings/identity', ShopIdentitySchema, { method: 'PUT', body: UpdateShopIdentitySchema.parse(change) }),
    onSuccess: (identity) => {
      qc.setQueryData(identityKeys.identity, identity)
      return qc.invalidateQueries({ queryKey: settingsKeys.shop })
    },
  })
}
