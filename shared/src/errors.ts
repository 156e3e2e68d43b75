import { z } from 'zod'

/** Machine-readable error codes the API answers with. */
export const ERROR_CODES = [
  'invalid',
  'unauthenticated',
  'forbidden',
  'not_found',
  'conflict',
  'too_many_requests',
  'unavailable',
  'internal',
] as const

/** The one error body every non-2xx API answer carries. */
export const ApiErrorBodySchema = z.object({
  error: z.object({
    code: z.enum(ERROR_CODES),
    message: z.string(),
    /** Field path (`lines.0.qty`) → what to fix, for invalid input. */
    fields: z.record(z.string(), z.string()).optional(),
  }),
})
/** The one error body every non-2xx API answer carries. */
export type ApiErrorBody = z.infer<typeof ApiErrorBodySchema>
