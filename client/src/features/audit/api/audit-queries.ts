import { keepPreviousData, queryOptions } from '@tanstack/react-query'
import { AuditPageSchema, AuditQuerySchema, type AuditQuery } from '@kitwright/shared/audit'
import { queryToSearch } from '@kitwright/shared/pagination'
import { apiFetch } from '../../../lib/api-client'

export const auditKeys = {
  all: ['audit'] as const,
  list: (q: AuditQuery) => [...auditKeys.all, 'list', q] as const,
}

export function auditListOptions(q: AuditQuery) {
  return queryOptions({
    queryKey: auditKeys.list(q),
    queryFn: ({ signal }) => apiFetch(`/audit?${new URLSearchParams(queryToSearch(AuditQuerySchema, q))}`, AuditPageSchema, { signal }),
    placeholderData: keepPreviousData,
  })
}
