import { z } from 'zod'

/** A kit revision's life: drafts change, released ones are frozen, retired ones are no longer built. */
export const REVISION_STATUSES = ['draft', 'released', 'retired'] as const
/** A kit revision's status. */
export const RevisionStatusSchema = z.enum(REVISION_STATUSES)
/** A kit revision's status. */
export type RevisionStatus = z.infer<typeof RevisionStatusSchema>
