import { keepPreviousData, queryOptions, useMutation, useQueryClient } from '@tanstack/react-query'
import { MailListQuerySchema, MailMessageSchema, MailPageSchema, type MailListQuery } from '@kitwright/shared/mail'
import { queryToSearch } from '@kitwright/shared/pagination'
import { apiFetch } from '../../../lib/api-client'

export const mailKeys = {
  all: ['mail'] as const,
  lists: () => [...mailKeys.all, 'list'] as const,
  list: (q: MailListQuery) => [...mailKeys.lists(), q] as const,
  detail: (id: string) => [...mailKeys.all, 'detail', id] as const,
}

export function mailListOptions(q: MailListQuery) {
  return queryOptions({
    queryKey: mailKeys.list(q),
    queryFn: ({ signal }) => apiFetch(`/mail?${new URLSearchParams(queryToSearch(MailListQuerySchema, q))}`, MailPageSchema, { signal }),
    placeholderData: keepPreviousData,
    // Messages move from queued to sent in the background; keep the list current while it is open.
    refetchInterval: 10_000,
  })
}

export function mailMessageOptions(id: string) {
  return queryOptions({
    queryKey: mailKeys.detail(id),
    queryFn: ({ signal }) => apiFetch(`/mail/${id}`, MailMessageSchema, { signal }),
  })
}

/** "Send again" for a message that failed for good; the outbox and the home page list refresh. */
export function useResendMail() {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (id: string) => apiFetch(`/mail/${id}/resend`, MailMessageSchema, { method: 'POST', body: {} }),
    onSuccess: (mail) => {
      qc.setQueryData(mailKeys.detail(mail.id), mail)
      return qc.invalidateQueries({ queryKey: mailKeys.lists() })
    },
  })
}
