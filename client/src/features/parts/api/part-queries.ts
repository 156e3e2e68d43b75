import { keepPreviousData, queryOptions, useMutation, useQueryClient } from '@tanstack/react-query'
import { queryToSearch } from '@kitwright/shared/pagination'
import { PartListQuerySchema, PartSchema, PartsPageSchema, type PartInput, type PartListQuery, type PartPatch } from '@kitwright/shared/parts'
import { PartImportPreviewSchema, PartImportResultSchema } from '@kitwright/shared/parts-csv'
import { apiFetch } from '../../../lib/api-client'

export const partKeys = {
  all: ['parts'] as const,
  lists: () => [...partKeys.all, 'list'] as const,
  list: (q: PartListQuery) => [...partKeys.lists(), q] as const,
  detail: (id: string) => [...partKeys.all, 'detail', id] as const,
}

/** The API path of the parts list for a query (defaults left out, as in the page's URL). */
function listPath(q: PartListQuery) {
  const search = new URLSearchParams(queryToSearch(PartListQuerySchema, q)).toString()
  return search ? `/parts?${search}` : '/parts'
}

export function partsListOptions(q: PartListQuery) {
  return queryOptions({
    queryKey: partKeys.list(q),
    queryFn: ({ signal }) => apiFetch(listPath(q), PartsPageSchema, { signal }),
    // Keep the current page on screen while the next one loads, so the table does not jump.
    placeholderData: keepPreviousData,
  })
}

export function partDetailOptions(id: string) {
  return queryOptions({
    queryKey: partKeys.detail(id),
    queryFn: ({ signal }) => apiFetch(`/parts/${id}`, PartSchema, { signal }),
  })
}

/** Where the browser downloads every part as CSV (the session cookie goes along). */
export const PARTS_EXPORT_HREF = '/api/parts/export.csv'

export function useCreatePart() {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (input: PartInput) => apiFetch('/parts', PartSchema, { method: 'POST', body: input }),
    onSuccess: (part) => {
      qc.setQueryData(partKeys.detail(part.id), part)
      return qc.invalidateQueries({ queryKey: partKeys.lists() })
    },
  })
}

export function useUpdatePart() {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: ({ id, patch }: { id: string; patch: PartPatch }) => apiFetch(`/parts/${id}`, PartSchema, { method: 'PATCH', body: patch }),
    onSuccess: (part) => {
      qc.setQueryData(partKeys.detail(part.id), part)
      return qc.invalidateQueries({ queryKey: partKeys.lists() })
    },
  })
}

export function usePreviewPartsImport() {
  return useMutation({
    mutationFn: (csv: string) => apiFetch('/parts/import/preview', PartImportPreviewSchema, { method: 'POST', body: { csv } }),
  })
}

export function useImportParts() {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (csv: string) => apiFetch('/parts/import', PartImportResultSchema, { method: 'POST', body: { csv } }),
    onSuccess: () => qc.invalidateQueries({ queryKey: partKeys.all }),
  })
}
