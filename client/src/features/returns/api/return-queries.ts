import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query'
import { PresignedPhotoSchema, type PhotoContentType } from '@kitwright/shared/build'
import {
  ReturnListSchema,
  ReturnLookupSchema,
  ReturnReasonsSchema,
  ReturnSchema,
  ReturnSummarySchema,
  UnitReturnsSchema,
  type DecideReturnInput,
  type DisposeReturnInput,
  type OpenReturnInput,
  type Return,
} from '@kitwright/shared/returns'
import { apiFetch } from '../../../lib/api-client'

/** One key factory for everything about returns. */
export const returnKeys = {
  all: ['returns'] as const,
  lists: () => [...returnKeys.all, 'list'] as const,
  list: (status: string) => [...returnKeys.lists(), status] as const,
  detail: (id: string) => [...returnKeys.all, 'detail', id] as const,
  reasons: () => [...returnKeys.all, 'reasons'] as const,
  summary: () => [...returnKeys.all, 'summary'] as const,
  ofUnit: (serial: string) => [...returnKeys.all, 'unit', serial] as const,
}

export function returnsListOptions(status: string) {
  return queryOptions({ queryKey: returnKeys.list(status), queryFn: ({ signal }) => apiFetch(`/returns?status=${encodeURIComponent(status)}`, ReturnListSchema, { signal }) })
}
export function returnDetailOptions(id: string) {
  return queryOptions({ queryKey: returnKeys.detail(id), queryFn: ({ signal }) => apiFetch(`/returns/${id}`, ReturnSchema, { signal }) })
}
export function returnReasonsOptions() {
  return queryOptions({ queryKey: returnKeys.reasons(), queryFn: ({ signal }) => apiFetch('/returns/reasons', ReturnReasonsSchema, { signal }) })
}
export function returnSummaryOptions() {
  return queryOptions({ queryKey: returnKeys.summary(), queryFn: ({ signal }) => apiFetch('/returns/summary', ReturnSummarySchema, { signal }) })
}
export function unitReturnsOptions(serial: string) {
  return queryOptions({ queryKey: returnKeys.ofUnit(serial), queryFn: ({ signal }) => apiFetch(`/returns/units/${encodeURIComponent(serial)}`, UnitReturnsSchema, { signal }) })
}

/** The shipped units a scanned serial or order number names. */
export function useLookupReturnable() {
  return useMutation({ mutationFn: (code: string) => apiFetch(`/returns/lookup?code=${encodeURIComponent(code)}`, ReturnLookupSchema) })
}

/** Puts a return's new state in the cache and refreshes the lists and the summary. */
function useSetReturn() {
  const qc = useQueryClient()
  return (r: Return) => {
    qc.setQueryData(returnKeys.detail(r.id), r)
    void qc.invalidateQueries({ queryKey: returnKeys.summary() })
    return qc.invalidateQueries({ queryKey: returnKeys.lists() })
  }
}

export function useOpenReturn() {
  const setReturn = useSetReturn()
  return useMutation({ mutationFn: (input: OpenReturnInput) => apiFetch('/returns', ReturnSchema, { method: 'POST', body: input }), onSuccess: setReturn })
}
export function useBuyReturnLabel() {
  const setReturn = useSetReturn()
  return useMutation({ mutationFn: ({ id, service }: { id: string; service: string }) => apiFetch(`/returns/${id}/label`, ReturnSchema, { method: 'POST', body: { service } }), onSuccess: setReturn })
}
export function useReceiveReturn() {
  const setReturn = useSetReturn()
  return useMutation({ mutationFn: (code: string) => apiFetch('/returns/receive', ReturnSchema, { method: 'POST', body: { code } }), onSuccess: setReturn })
}
export function useDecideReturn() {
  const setReturn = useSetReturn()
  return useMutation({ mutationFn: ({ id, ...body }: DecideReturnInput & { id: string }) => apiFetch(`/returns/${id}/decision`, ReturnSchema, { method: 'POST', body }), onSuccess: setReturn })
}
/** Back to stock as a spare, or scrapped; the server records it once, so a second tap changes nothing. */
export function useDisposeReturnedUnit() {
  const setReturn = useSetReturn()
  const qc = useQueryClient()
  return useMutation({
    mutationFn: ({ id, ...body }: DisposeReturnInput & { id: string }) => apiFetch(`/returns/${id}/disposition`, ReturnSchema, { method: 'POST', body }),
    onSuccess: (r) => {
      void qc.invalidateQueries({ queryKey: returnKeys.ofUnit(r.unit.serial) })
      return setReturn(r)
    },
  })
}
export function useSetReturnReasons() {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (reasons: string[]) => apiFetch('/returns/reasons', ReturnReasonsSchema, { method: 'PUT', body: { reasons } }),
    onSuccess: (saved) => qc.setQueryData(returnKeys.reasons(), saved),
  })
}

/** The upload failed before the server saw it. */
export class ReturnPhotoUploadError extends Error {}

/** Presign, PUT straight to the photo store with exactly the signed headers, then confirm: as the build bench does. */
export function useUploadReturnPhoto() {
  const setReturn = useSetReturn()
  return useMutation({
    mutationFn: async ({ id, file }: { id: string; file: File }) => {
      const presigned = await apiFetch(`/returns/${id}/photos/presign`, PresignedPhotoSchema, { method: 'POST', body: { contentType: file.type as PhotoContentType, size: file.size } })
      let res: Response
      try {
        res = await fetch(presigned.url, { method: presigned.method, headers: presigned.headers, body: file })
      } catch (err) {
        throw new ReturnPhotoUploadError('The photo store could not be reached, so the photo was not saved; the return is kept. Try the photo again in a moment.', { cause: err })
      }
      if (!res.ok) throw new ReturnPhotoUploadError(`The photo store refused the upload (${res.status}); take the photo again.`)
      return apiFetch(`/returns/${id}/photos/confirm`, ReturnSchema, { method: 'POST', body: { key: presigned.key } })
    },
    onSuccess: setReturn,
  })
}
