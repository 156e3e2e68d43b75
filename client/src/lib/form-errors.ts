import type { FieldValues, Path, UseFormSetError } from 'react-hook-form'
import { toast } from 'sonner'
import { ApiError } from './api-client'

/** Puts a 400's per-field hints on the form's fields, and the server's message in a toast. */
export function applyServerErrors<T extends FieldValues>(err: unknown, setError: UseFormSetError<T>) {
  if (err instanceof ApiError) {
    for (const [field, message] of Object.entries(err.body.fields ?? {})) setError(field as Path<T>, { message })
    toast.error(err.message)
  } else {
    toast.error('Could not reach Kitwright; check the connection and try again')
  }
}
