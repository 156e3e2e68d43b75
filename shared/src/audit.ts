import { z } from 'zod'
import { PageNumberSchema, PageOf, PageSizeSchema } from './pagination'

/** The screens a change can come from; the client says which in the `X-Kitwright-Bench` header. */
export const BENCHES = ['office', 'cut', 'build', 'pack'] as const
/** A screen a change can come from. */
export type Bench = (typeof BENCHES)[number]

/** One entry of the audit trail. */
export const AuditEventSchema = z.object({
  id: z.string().uuid(),
  at: z.string(),
  actorId: z.string().uuid().nullable(),
  actorEmail: z.string().nullable(),
  actorName: z.string().nullable(),
  action: z.string(),
  entityType: z.string(),
  entityId: z.string().nullable(),
  summary: z.string(),
  bench: z.string().nullable(),
  address: z.string().nullable(),
  /** For a change a bench sent from its queue: when it was taken on the bench (the tablet's clock); `at` is when it reached the server. */
  takenAt: z.string().nullable(),
})
/** One entry of the audit trail. */
export type AuditEvent = z.infer<typeof AuditEventSchema>

/** One page of the audit trail. */
export const AuditPageSchema = PageOf(AuditEventSchema)

/** Filters of the audit page: what kind of change, by whom, on what, when, from which bench. */
export const AuditQuerySchema = z
  .object({
    page: PageNumberSchema,
    pageSize: PageSizeSchema,
    action: z.string().trim().max(60).optional().transform((v) => v || undefined),
    actorId: z.string().uuid('Not a valid user id').optional(),
    entityType: z.string().trim().max(40).optional().transform((v) => v || undefined),
    bench: z.enum(BENCHES).optional(),
    from: z.iso.date('Use a date like 2026-12-01').optional(),
    to: z.iso.date('Use a date like 2026-12-31').optional(),
    q: z.string().trim().max(100).optional().transform((v) => v || undefined),
  })
  .strict()
/** Filters of the audit page. */
export type AuditQuery = z.infer<typeof AuditQuerySchema>
