import { queryOptions } from '@tanstack/react-query'
import { ShortagesSchema, type ShortagesQuery } from '@kitwright/shared/work-orders'
import { apiFetch } from '../../../lib/api-client'

export const shortageKeys = {
  all: ['shortages'] as const,
  list: (q: ShortagesQuery) => [...shortageKeys.all, q] as const,
}

export function shortagesOptions(q: ShortagesQuery) {
  return queryOptions({
    queryKey: shortageKeys.list(q),
    queryFn: ({ signal }) => apiFetch(q.only === 'all' ? '/shortages?only=all' : '/shortages', ShortagesSchema, { signal }),
  })
}
