import { queryOptions } from '@tanstack/react-query'
import { z } from 'zod'
import { CutWorklistItemSchema } from '@kitwright/shared/worklists'
import { apiFetch } from '../../../lib/api-client'

export const cutWorklistKeys = { all: ['cut-bench', 'worklist'] as const }

/** Published runs with their most urgent unit, the most urgent run first. */
export function cutWorklistOptions() {
  return queryOptions({ queryKey: cutWorklistKeys.all, queryFn: ({ signal }) => apiFetch('/cut-runs/worklist', z.array(CutWorklistItemSchema), { signal }), refetchInterval: 30_000 })
}
