import { z } from 'zod'
import { PHOTO_CONTENT_TYPES, MAX_PHOTO_BYTES } from './build'
import { RETURN_DECISIONS, RETURN_DISPOSITIONS, RETURN_LABEL_STATUSES, RETURN_STATUSES } from './returns-status'

const uuid = z.string().uuid('Not a valid id')
/** No control characters: nothing a label or keyboard makes. */
const PRINTABLE = /^[^\u0000-\u001f\u007f]*$/

/** Where a return is. */
export const ReturnStatusSchema = z.enum(RETURN_STATUSES)
/** Where a return is. */
export type ReturnStatus = z.infer<typeof ReturnStatusSchema>
/** What the shop decided for a received return. */
export const ReturnDecisionSchema = z.enum(RETURN_DECISIONS)
/** What the shop decided. */
export type ReturnDecision = z.infer<typeof ReturnDecisionSchema>
/** What became of a replaced or refunded unit. */
export const ReturnDispositionSchema = z.enum(RETURN_DISPOSITIONS)
/** What became of a replaced or refunded unit. */
export type ReturnDisposition = z.infer<typeof ReturnDispositionSchema>
/** Where the return label is. */
export const ReturnLabelStatusSchema = z.enum(RETURN_LABEL_STATUSES)

/** A scanned or typed code: a serial (`U-1001`), an order number, or a return label's tracking number. */
export const ReturnCodeSchema = z
  .string({ error: 'Scan or type a serial or an order number' })
  .trim()
  .min(1, 'Scan or type a serial or an order number')
  .max(60, 'That code is too long to be a serial, an order number or a tracking number')
  .regex(PRINTABLE, 'Scan or type the code again: it has characters no label carries')

/** What a scanned serial or order number can be returned: its shipped units. */
export const ReturnLookupQuerySchema = z.object({ code: ReturnCodeSchema })

/** A shipped unit that can be returned (or already has a return under way). */
export const ReturnableUnitSchema = z.object({
  workOrderId: uuid,
  serial: z.string(),
  kitSku: z.string(),
  kitName: z.string(),
  revisionCode: z.string(),
  orderNumber: z.string(),
  shippedAt: z.string().nullable(),
  /** An undecided return of this unit, if one is open: open it rather than a second. */
  openReturnId: uuid.nullable(),
  openReturnNumber: z.string().nullable(),
})
/** A unit that can be returned. */
export type ReturnableUnit = z.infer<typeof ReturnableUnitSchema>
/** The units a scanned code names. */
export const ReturnLookupSchema = z.object({ code: z.string(), units: z.array(ReturnableUnitSchema) })
/** The units a scanned code names. */
export type ReturnLookup = z.infer<typeof ReturnLookupSchema>

/** Open a return of one shipped unit, named by its serial. */
export const OpenReturnSchema = z
  .object({
    serial: ReturnCodeSchema,
    reason: z.string({ error: 'Choose a reason' }).trim().min(1, 'Choose a reason').max(80, 'Use at most 80 characters'),
    notes: z
      .string()
      .trim()
      .max(2000, 'Use at most 2000 characters')
      .regex(PRINTABLE, 'Use letters, digits and punctuation only')
      .nullish()
      .transform((v) => (v ? v : null)),
  })
  .strict()
/** Open a return (as typed). */
export type OpenReturnInput = z.input<typeof OpenReturnSchema>

/** Buy the return label: the service of the carrier (ground, express…). */
export const BuyReturnLabelSchema = z
  .object({ service: z.string({ error: 'Choose a service' }).trim().min(1, 'Choose a service').max(40).regex(PRINTABLE, 'Not a service name') })
  .strict()
/** Buy the return label. */
export type BuyReturnLabel = z.infer<typeof BuyReturnLabelSchema>

/** Receive a return at the pack bench by the scan of its return label or of the unit's serial. */
export const ReceiveReturnSchema = z.object({ code: ReturnCodeSchema }).strict()
/** Receive a return. */
export type ReceiveReturn = z.infer<typeof ReceiveReturnSchema>

const decisionNote = z
  .string()
  .trim()
  .max(1000, 'Use at most 1000 characters')
  .regex(PRINTABLE, 'Use letters, digits and punctuation only')
  .nullish()
  .transform((v) => (v ? v : null))

/**
 * The decision on a received return. Repair names the build steps to do again (their ticks are
 * undone; a new leak test is required whatever is reopened). Replace releases a new unit the normal
 * way (`allowShort` as the release's "release anyway"). Refund notes what the store paid back.
 */
export const DecideReturnSchema = z.discriminatedUnion(
  'decision',
  [
    z.object({ decision: z.literal('repair'), reopenStepIds: z.array(uuid).max(100).default([]), note: decisionNote }).strict(),
    z.object({ decision: z.literal('replace'), allowShort: z.boolean().default(false), note: decisionNote }).strict(),
    z
      .object({
        decision: z.literal('refund'),
        amountCents: z
          .number({ error: 'Give the amount refunded' })
          .int('The amount is whole cents')
          .min(0, 'The amount cannot be negative')
          .max(100_000_000, 'That amount is too large'),
        note: z
          .string({ error: 'Say how the store refunded it' })
          .trim()
          .min(3, 'Say how the store refunded it (e.g. "refunded in the store, ref 5521")')
          .max(1000, 'Use at most 1000 characters')
          .regex(PRINTABLE, 'Use letters, digits and punctuation only'),
      })
      .strict(),
  ],
  { error: 'Choose repair, replace or refund' },
)
/** The decision on a received return (as typed). */
export type DecideReturnInput = z.input<typeof DecideReturnSchema>

/**
 * What becomes of a unit that came back and was replaced or refunded: back to stock as a spare (an
 * optional note: which shelf, what it lacks) or scrapped (the reason is required). Recorded once; the
 * same request again changes nothing.
 */
export const DisposeReturnSchema = z.discriminatedUnion(
  'disposition',
  [
    z.object({ disposition: z.literal('spare'), note: decisionNote }).strict(),
    z
      .object({
        disposition: z.literal('scrapped'),
        note: z
          .string({ error: 'Say why the unit is scrapped' })
          .trim()
          .min(3, 'Say why the unit is scrapped (e.g. "tote cracked through, not worth a repair")')
          .max(1000, 'Use at most 1000 characters')
          .regex(PRINTABLE, 'Use letters, digits and punctuation only'),
      })
      .strict(),
  ],
  { error: 'Choose back to stock as a spare, or scrapped' },
)
/** What becomes of the returned unit (as typed). */
export type DisposeReturnInput = z.input<typeof DisposeReturnSchema>

/** Ask for a presigned upload of one photo of a returned unit. */
export const PresignReturnPhotoSchema = z
  .object({
    contentType: z.enum(PHOTO_CONTENT_TYPES, { error: 'Photos must be JPEG, PNG or WebP images' }),
    size: z
      .number({ error: 'Give the size of the photo in bytes' })
      .int('The size is a whole number of bytes')
      .min(1, 'The photo is empty')
      .max(MAX_PHOTO_BYTES, `The photo is larger than ${MAX_PHOTO_BYTES / 1024 / 1024} MB; take it at a lower resolution`),
  })
  .strict()

/** The shop's return reasons, in order (edited by the owner in settings). */
export const ReturnReasonsSchema = z.object({
  reasons: z.array(z.string()),
  /** True while the shop has not set its own list and the defaults stand. */
  defaults: z.boolean(),
})
/** The shop's return reasons. */
export type ReturnReasons = z.infer<typeof ReturnReasonsSchema>
/** Set the shop's return reasons. */
export const UpdateReturnReasonsSchema = z
  .object({
    reasons: z
      .array(
        z
          .string({ error: 'A reason is text' })
          .trim()
          .min(1, 'A reason cannot be blank')
          .max(80, 'Use at most 80 characters')
          .regex(PRINTABLE, 'Use letters, digits and punctuation only'),
      )
      .min(1, 'Keep at least one reason')
      .max(30, 'At most 30 reasons')
      .refine((list) => new Set(list.map((r) => r.toLowerCase())).size === list.length, 'Each reason once'),
  })
  .strict()
/** Set the shop's return reasons (as typed). */
export type UpdateReturnReasonsInput = z.input<typeof UpdateReturnReasonsSchema>

const person = z.object({ id: uuid, name: z.string() })

/** One return, as its page and the list show it. */
export const ReturnSchema = z.object({
  id: uuid,
  number: z.string(),
  status: ReturnStatusSchema,
  reason: z.string(),
  notes: z.string().nullable(),
  unit: z.object({ workOrderId: uuid, serial: z.string(), status: z.string(), kitSku: z.string(), kitName: z.string(), revisionCode: z.string() }),
  order: z.object({ id: uuid, number: z.string(), customerName: z.string(), currency: z.string() }),
  openedBy: person,
  openedAt: z.string(),
  label: z.object({
    status: ReturnLabelStatusSchema,
    carrier: z.string().nullable(),
    service: z.string().nullable(),
    trackingNumber: z.string().nullable(),
    chargeCents: z.number().int().nullable(),
    boughtAt: z.string().nullable(),
  }),
  received: z.object({ at: z.string(), by: person, code: z.string().nullable() }).nullable(),
  decision: z
    .object({
      kind: ReturnDecisionSchema,
      note: z.string().nullable(),
      at: z.string(),
      by: person,
      reopenedSteps: z.array(z.object({ id: uuid, position: z.number().int(), text: z.string() })),
      /** Repair: whether the unit is ready again (every step, a new passing leak test). */
      repaired: z.boolean().nullable(),
      replacement: z.object({ orderId: uuid, orderNumber: z.string(), workOrderId: uuid, serial: z.string(), status: z.string() }).nullable(),
      refundCents: z.number().int().nullable(),
    })
    .nullable(),
  /** Replace or refund: what became of the returned unit, once recorded. */
  disposition: z.object({ kind: ReturnDispositionSchema, note: z.string().nullable(), at: z.string(), by: person }).nullable(),
  photos: z.array(z.object({ id: uuid, key: z.string(), url: z.string().nullable(), by: person, at: z.string() })),
  /** The unit's build steps, for choosing which to reopen on a repair. */
  steps: z.array(z.object({ id: uuid, position: z.number().int(), text: z.string() })),
})
/** One return. */
export type Return = z.infer<typeof ReturnSchema>

/** A row of the returns list. */
export const ReturnRowSchema = z.object({
  id: uuid,
  number: z.string(),
  status: ReturnStatusSchema,
  reason: z.string(),
  serial: z.string(),
  kitSku: z.string(),
  revisionCode: z.string(),
  orderNumber: z.string(),
  trackingNumber: z.string().nullable(),
  openedAt: z.string(),
})
/** A row of the returns list. */
export type ReturnListRow = z.infer<typeof ReturnRowSchema>
/** The returns list: newest first. */
export const ReturnListSchema = z.object({ returns: z.array(ReturnRowSchema) })
/** Which returns to list. */
export const ReturnListQuerySchema = z.object({
  status: z
    .enum([...RETURN_STATUSES, 'undecided', 'all'])
    .catch('all')
    .default('all'),
})

/** Returns per kit revision and reason, for the owner. */
export const ReturnSummarySchema = z.object({
  rows: z.array(
    z.object({ kitSku: z.string(), kitName: z.string(), revisionCode: z.string(), reason: z.string(), returns: z.number().int(), shipped: z.number().int() }),
  ),
  open: z.number().int(),
})
/** Returns per kit revision and reason. */
export type ReturnSummary = z.infer<typeof ReturnSummarySchema>

/** A return of the unit, as its build record lists it. */
export const UnitReturnSchema = z.object({
  id: uuid,
  number: z.string(),
  status: ReturnStatusSchema,
  reason: z.string(),
  notes: z.string().nullable(),
  openedAt: z.string(),
  receivedAt: z.string().nullable(),
  decidedAt: z.string().nullable(),
  decisionNote: z.string().nullable(),
  replacementSerial: z.string().nullable(),
  refundCents: z.number().int().nullable(),
  /** What became of the unit after a replace or refund: back to stock as a spare, or scrapped. */
  disposition: ReturnDispositionSchema.nullable(),
  dispositionNote: z.string().nullable(),
  disposedAt: z.string().nullable(),
})
/** A return of the unit, in its build record. */
export type UnitReturn = z.infer<typeof UnitReturnSchema>
/** The returns of one unit. */
export const UnitReturnsSchema = z.object({ returns: z.array(UnitReturnSchema) })

/** A return id in a URL. */
export const ReturnParamsSchema = z.object({ returnId: uuid })
