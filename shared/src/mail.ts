import { z } from 'zod'
import { MAIL_STATUSES } from './orders-status'
import { PageNumberSchema, PageOf, PageSizeSchema } from './pagination'

/** The life of an e-mail in the outbox: queued (and retried while the relay is down), sent, or failed for good. */
export const MailStatusSchema = z.enum(MAIL_STATUSES)
/** The life of an e-mail in the outbox. */
export type MailStatus = z.infer<typeof MailStatusSchema>

/** What each mail status is called on screen (one map of words for every state: status-words.ts). */
export { MAIL_STATUS_LABELS } from './status-words'

/** The statuses the outbox filters by, in the order a message passes through them. */
export const MAIL_STATUSES_FOR_FILTER: readonly MailStatus[] = MAIL_STATUSES

/** One message as the outbox lists it. */
export const MailSummarySchema = z.object({
  id: z.string().uuid(),
  to: z.string(),
  subject: z.string(),
  status: MailStatusSchema,
  /** Why it was sent, e.g. `order_received`. */
  purpose: z.string(),
  attempts: z.number().int(),
  lastError: z.string().nullable(),
  order: z.object({ id: z.string().uuid(), number: z.string() }).nullable(),
  createdAt: z.string(),
  sentAt: z.string().nullable(),
})
/** One message as the outbox lists it. */
export type MailSummary = z.infer<typeof MailSummarySchema>

/** One message with its bodies, to read it. */
export const MailMessageSchema = MailSummarySchema.extend({
  text: z.string(),
  html: z.string().nullable(),
  /** Files sent with it (a purchase order's PDF): name, type and size in bytes. */
  attachments: z.array(z.object({ filename: z.string(), contentType: z.string(), bytes: z.number().int() })).default([]),
})
/** One message with its bodies. */
export type MailMessage = z.infer<typeof MailMessageSchema>

/** One page of the outbox, newest first. */
export const MailPageSchema = PageOf(MailSummarySchema)
/** One page of the outbox. */
export type MailPage = z.infer<typeof MailPageSchema>

/** The outbox query: page and an optional status filter. */
export const MailListQuerySchema = z
  .object({
    page: PageNumberSchema,
    pageSize: PageSizeSchema,
    status: MailStatusSchema.optional(),
  })
  .strict()
/** The outbox query. */
export type MailListQuery = z.infer<typeof MailListQuerySchema>
