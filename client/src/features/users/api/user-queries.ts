import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query'
import { z } from 'zod'
import { UserSchema, type CreateUser, type ResetCredentials, type UpdateUser } from '@kitwright/shared/users'
import { apiFetch } from '../../../lib/api-client'

export const userKeys = {
  all: ['users'] as const,
  lists: () => [...userKeys.all, 'list'] as const,
}

export function usersListOptions() {
  return queryOptions({
    queryKey: userKeys.lists(),
    queryFn: ({ signal }) => apiFetch('/users', z.array(UserSchema), { signal }),
  })
}

export function useCreateUser() {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (input: CreateUser) => apiFetch('/users', UserSchema, { method: 'POST', body: input }),
    onSuccess: () => qc.invalidateQueries({ queryKey: userKeys.lists() }),
  })
}

export function useUpdateUser() {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: ({ id, ...input }: UpdateUser & { id: string }) => apiFetch(`/users/${id}`, UserSchema, { method: 'PATCH', body: input }),
    onSuccess: () => qc.invalidateQueries({ queryKey: userKeys.lists() }),
  })
}

export function useResetCredentials() {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: ({ id, ...input }: ResetCredentials & { id: string }) =>
      apiFetch(`/users/${id}/credentials`, UserSchema, { method: 'POST', body: input }),
    onSuccess: () => qc.invalidateQueries({ queryKey: userKeys.lists() }),
  })
}
