import type { FieldErrors } from 'react-hook-form'

/** The message of a nested field error, by dotted path (`cutParts.2.length`). */
export function errorAt(errors: FieldErrors, path: string): string | undefined {
  let e: unknown = errors
  for (const p of path.split('.')) e = e && typeof e === 'object' ? (e as Record<string, unknown>)[p] : undefined
  const message = (e as { message?: unknown } | undefined)?.message
  return typeof message === 'string' ? message : undefined
}
