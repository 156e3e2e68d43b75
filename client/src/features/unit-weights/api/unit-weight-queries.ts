import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query'
import { z } from 'zod'
import { PartUnitWeightSchema, UnitWeightSchema, type RecordUnitWeightInput } from '@kitwright/shared/bag-weights'
import { apiFetch } from '../../../lib/api-client'

export const unitWeightKeys = {
  all: ['unit-weights'] as const,
  list: () => [...unitWeightKeys.all, 'list'] as const,
}

/** Every part counted by weight, with its unit weight (null until a sample is weighed). */
export function unitWeightsOptions() {
  return queryOptions({ queryKey: unitWeightKeys.list(), queryFn: ({ signal }) => apiFetch('/unit-weights', z.array(PartUnitWeightSchema), { signal }) })
}

/** Records a counted sample of one part. */
export function useRecordUnitWeight() {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (v: RecordUnitWeightInput & { partId: string }) => {
      const { partId, ...body } = v
      return apiFetch(`/unit-weights/${partId}`, UnitWeightSchema, { method: 'POST', body })
    },
    onSuccess: () => qc.invalidateQueries({ queryKey: unitWeightKeys.all }),
  })
}
