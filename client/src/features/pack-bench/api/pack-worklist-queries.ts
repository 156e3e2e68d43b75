import { queryOptions } from '@tanstack/react-query'
import { z } from 'zod'
import { PackWorklistItemSchema } from '@kitwright/shared/worklists'
import { apiFetch } from '../../../lib/api-client'

export const packWorklistKeys = { all: ['pack-bench', 'worklist'] as const }

/** Orders with units ready to pack, the most urgent first; refreshed as the build bench finishes units. */
export function packWorklistOptions() {
  return queryOptions({ queryKey: packWorklistKeys.all, queryFn: ({ signal }) => apiFetch('/pack/worklist', z.array(PackWorklistItemSchema), { signal }), refetchInterval: 30_000 })
}
