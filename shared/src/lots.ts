import { z } from 'zod'
import { PostalAddressSchema } from './address'
import { WorkOrderStatusSchema } from './orders'

const uuid = z.string().uuid('Not a valid id')
const PersonSchema = z.object({ id: uuid, name: z.string() })

/**
 * A supplier's lot code as printed on the bag or box (typed, scanned, or a packing-list cell):
 * letters, digits and the usual separators, no control characters. Blank means "no lot".
 */
export const LotCodeSchema = z
  .string({ error: "Type or scan the supplier's lot" })
  .trim()
  .max(40, 'A lot code is at most 40 characters: scan it again')
  .regex(/^[^\u0000-\u001f\u007f]*$/, 'A lot code has no control characters: scan it again')

/** A lot code on a receipt line: blank or missing becomes null (the part must then not be lot-tracked). */
export const OptionalLotCodeSchema = LotCodeSchema.nullish().transform((v) => (v ? v : null))

/** A lot in stock as the build bench offers it: oldest first, with how many are free to fit. */
export const LotChoiceSchema = z.object({
  lotId: uuid,
  code: z.string(),
  firstReceivedAt: z.string(),
  /** On hand in this lot, less what is already fitted into units not yet shipped. */
  free: z.number().int(),
})
/** A lot in stock as the build bench offers it. */
export type LotChoice = z.infer<typeof LotChoiceSchema>

/** One lot fitted into the unit (standing or undone). */
export const UnitLotSchema = z.object({
  id: uuid,
  lotId: uuid,
  lotCode: z.string(),
  quantity: z.number().int(),
  by: PersonSchema,
  at: z.string(),
  undoneAt: z.string().nullable(),
})
/** One lot fitted into the unit. */
export type UnitLot = z.infer<typeof UnitLotSchema>

/** A lot-tracked part of the unit's bill of materials: how many it takes, the lots fitted, the lots to choose from. */
export const UnitLotNeedSchema = z.object({
  partId: uuid,
  sku: z.string(),
  name: z.string(),
  /** How many the bill of materials fits into one unit. */
  quantity: z.number().int(),
  /** Standing fits (not undone). */
  fitted: z.array(UnitLotSchema),
  /** Still to record: quantity less the standing fits. */
  left: z.number().int(),
  /** Lots with stock free to fit, oldest first (empty once nothing is left to record). */
  choices: z.array(LotChoiceSchema),
})
/** A lot-tracked part of the unit and its lots. */
export type UnitLotNeed = z.infer<typeof UnitLotNeedSchema>

/**
 * The build bench records which lot of a lot-tracked part went into a unit: the part, the lot code
 * as scanned off the bag or picked from the list, and how many (default: all still to record).
 */
export const FitLotSchema = z
  .object({
    partId: uuid,
    lotCode: LotCodeSchema.min(1, "Type or scan the supplier's lot"),
    quantity: z.number().int('Use a whole number').min(1, 'Must be at least 1').max(1000).nullish().transform((v) => v ?? null),
  })
  .strict()
/** A lot fitted at the build bench. */
export type FitLot = z.infer<typeof FitLotSchema>
/** A lot fitted at the build bench, as the bench sends it. */
export type FitLotInput = z.input<typeof FitLotSchema>

/** A work order and one of its lot fits in a URL. */
export const LotFitParamsSchema = z.object({ workOrderId: uuid, fitId: uuid })
/** A lot in a URL. */
export const LotParamsSchema = z.object({ lotId: uuid })

/** Search of the lots page: a lot code or a part's SKU or name. */
export const LotListQuerySchema = z.object({
  q: z
    .string()
    .trim()
    .max(60, 'Use at most 60 characters')
    .regex(/^[^\u0000-\u001f\u007f]*$/, 'Type letters and digits to search: no control characters')
    .optional()
    .transform((v) => v || undefined),
})
/** Search of the lots page. */
export type LotListQuery = z.infer<typeof LotListQuerySchema>

/** One lot on the lots page. */
export const LotSummarySchema = z.object({
  id: uuid,
  code: z.string(),
  part: z.object({ id: uuid, sku: z.string(), name: z.string() }),
  firstReceivedAt: z.string(),
  received: z.number().int(),
  onHand: z.number().int(),
  /** Units it is fitted into (standing fits), shipped or not. */
  units: z.number().int(),
})
/** One lot on the lots page. */
export type LotSummary = z.infer<typeof LotSummarySchema>
/** The lots page. */
export const LotListSchema = z.object({ items: z.array(LotSummarySchema) })
/** The lots page. */
export type LotList = z.infer<typeof LotListSchema>

/** One unit built with the lot, and where it went. */
export const RecallUnitSchema = z.object({
  workOrderId: uuid,
  serial: z.string(),
  status: WorkOrderStatusSchema,
  quantity: z.number().int(),
  fittedAt: z.string(),
  order: z.object({ id: uuid, number: z.string() }),
  customer: z.object({ name: z.string(), email: z.string() }),
  /** When the unit left the shop, null while it is still here. */
  shippedAt: z.string().nullable(),
  trackingNumber: z.string().nullable(),
  /** Where it went (the order's ship-to address). */
  shipTo: PostalAddressSchema,
  /** When this customer was told of the recall of this lot, null until then. */
  notifiedAt: z.string().nullable(),
})
/** One unit built with the lot. */
export type RecallUnit = z.infer<typeof RecallUnitSchema>

/** A lot, its receipts and every unit built with it: the recall page. */
export const LotDetailSchema = LotSummarySchema.extend({
  receipts: z.array(z.object({ quantity: z.number().int(), reference: z.string().nullable(), at: z.string(), by: PersonSchema.nullable() })),
  recall: z.array(RecallUnitSchema),
  /** Customers (by e-mail) with a unit of the lot, and how many of them have been told. */
  customers: z.number().int(),
  customersNotified: z.number().int(),
})
/** A lot and every unit built with it. */
export type LotDetail = z.infer<typeof LotDetailSchema>

/** "Tell the customers": one e-mail per customer with a unit of the lot, each sent once. */
export const NotifyRecallSchema = z
  .object({
    /** What the shop asks the customer to do, in the shop's words (goes into every e-mail). */
    message: z
      .string({ error: 'Say what the customer should do' })
      .trim()
      .min(10, 'Say what the customer should do, e.g. stop using the pump and reply for a replacement')
      .max(2000, 'Use at most 2000 characters')
      // Line breaks are fine; other control characters (a NUL byte) cannot go into an e-mail.
      .regex(/^[^\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f]*$/, 'Remove the control characters from the message'),
  })
  .strict()
/** "Tell the customers". */
export type NotifyRecall = z.infer<typeof NotifyRecallSchema>

/** What "Tell the customers" did: e-mails queued now, and customers already told before. */
export const NotifyRecallResultSchema = z.object({
  queued: z.number().int(),
  alreadyTold: z.number().int(),
  detail: LotDetailSchema,
})
/** What "Tell the customers" did. */
export type NotifyRecallResult = z.infer<typeof NotifyRecallResultSchema>
