import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query'
import { z } from 'zod'
import { BenchPersonSchema, MeSchema, SessionSchema, type BenchDevice, type SignIn } from '@kitwright/shared/auth'
import { apiFetch } from '../../../lib/api-client'
import { forgetBenchReads } from '../../../lib/offline/bench-reads'

export const authKeys = {
  me: ['auth', 'me'] as const,
}

/** The signed-in user, or null when nobody is signed in. */
export function meOptions() {
  return queryOptions({
    queryKey: authKeys.me,
    queryFn: async ({ signal }) => (await apiFetch('/auth/me', SessionSchema, { signal })).user,
    staleTime: 60_000,
  })
}

/** The names on a bench's sign-in screen (every bench's people when the device is no bench). */
export function benchPeopleOptions(bench: BenchDevice | null) {
  return queryOptions({
    queryKey: [...authKeys.me, 'bench-people', bench ?? 'all'] as const,
    queryFn: ({ signal }) => apiFetch(`/auth/bench-people${bench ? `?bench=${bench}` : ''}`, z.array(BenchPersonSchema), { signal }),
  })
}

export function useSignIn() {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (input: SignIn) => apiFetch('/auth/sign-in', MeSchema, { method: 'POST', body: input }),
    onSuccess: (me) => qc.setQueryData(authKeys.me, me),
  })
}

export function useSignOut() {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: () => apiFetch('/auth/sign-out', z.undefined(), { method: 'POST' }),
    onSuccess: async () => {
      qc.clear()
      qc.setQueryData(authKeys.me, null)
      await forgetBenchReads()
    },
  })
}
