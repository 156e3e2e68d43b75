import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query'
import { z } from 'zod'
import { KitSchema, RevisionDetailSchema, type CreateKit, type RevisionContent } from '@kitwright/shared/kits'
import { PartsPageSchema, type Part } from '@kitwright/shared/parts'
import { apiFetch } from '../../../lib/api-client'

export const kitKeys = {
  all: ['kits'] as const,
  lists: () => [...kitKeys.all, 'list'] as const,
  revision: (id: string) => [...kitKeys.all, 'revision', id] as const,
  partChoices: () => [...kitKeys.all, 'part-choices'] as const,
}

export function kitsListOptions() {
  return queryOptions({
    queryKey: kitKeys.lists(),
    queryFn: ({ signal }) => apiFetch('/kits', z.array(KitSchema), { signal }),
  })
}

export function revisionOptions(id: string) {
  return queryOptions({
    queryKey: kitKeys.revision(id),
    queryFn: ({ signal }) => apiFetch(`/revisions/${id}`, RevisionDetailSchema, { signal }),
  })
}

/** Every active part, for the BOM and cut-part pickers (read page by page). */
export function partChoicesOptions() {
  return queryOptions({
    queryKey: kitKeys.partChoices(),
    queryFn: async ({ signal }) => {
      const all: Part[] = []
      for (let page = 1; ; page++) {
        const res = await apiFetch(`/parts?page=${page}&pageSize=100&sort=sku`, PartsPageSchema, { signal })
        all.push(...res.items)
        if (all.length >= res.total || res.items.length === 0) return all
      }
    },
    staleTime: 60_000,
  })
}

export function useCreateKit() {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (input: CreateKit) => apiFetch('/kits', KitSchema, { method: 'POST', body: input }),
    onSuccess: () => qc.invalidateQueries({ queryKey: kitKeys.lists() }),
  })
}

function useRevisionMutation<V>(request: (vars: V) => Promise<z.infer<typeof RevisionDetailSchema>>) {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: request,
    onSuccess: (rev) => {
      qc.setQueryData(kitKeys.revision(rev.id), rev)
      return qc.invalidateQueries({ queryKey: kitKeys.lists() })
    },
  })
}

export function useSaveRevision() {
  return useRevisionMutation(({ id, content }: { id: string; content: RevisionContent }) =>
    apiFetch(`/revisions/${id}`, RevisionDetailSchema, { method: 'PUT', body: content }),
  )
}

export function useReleaseRevision() {
  return useRevisionMutation((id: string) => apiFetch(`/revisions/${id}/release`, RevisionDetailSchema, { method: 'POST', body: {} }))
}

export function useRetireRevision() {
  return useRevisionMutation((id: string) => apiFetch(`/revisions/${id}/retire`, RevisionDetailSchema, { method: 'POST', body: {} }))
}

export function useNewRevision() {
  return useRevisionMutation(({ kitId, copyFrom }: { kitId: string; copyFrom: string | null }) =>
    apiFetch(`/kits/${kitId}/revisions`, RevisionDetailSchema, { method: 'POST', body: { copyFrom } }),
  )
}

/** Sets (or clears, with null) a kit's list price; phone orders start their unit price from it. */
export function useSetKitPrice() {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: ({ kitId, priceCents }: { kitId: string; priceCents: number | null }) => apiFetch(`/kits/${kitId}/price`, KitSchema, { method: 'PUT', body: { priceCents } }),
    onSuccess: () => qc.invalidateQueries({ queryKey: kitKeys.all }),
  })
}
