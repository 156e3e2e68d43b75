import { z } from 'zod'
import { PostalAddressSchema } from './address'
import { OrderStatusSchema, WorkOrderStatusSchema } from './orders'
import { PACK_CHECK_METHODS, SHIPMENT_STATUSES } from './pack-status'

const uuid = z.string().uuid('Not a valid id')
/** No control characters (a NUL byte cannot be stored, and no scanner or person types one). */
const PRINTABLE = /^[^\u0000-\u001f\u007f]*$/

/** Where a shipment is. */
export const ShipmentStatusSchema = z.enum(SHIPMENT_STATUSES)
/** Where a shipment is. */
export type ShipmentStatus = z.infer<typeof ShipmentStatusSchema>

/** A scanned bin code or serial at the pack bench, e.g. `BIN-0004` or `U-1001`. */
export const PackCodeSchema = z.object({
  code: z
    .string({ error: 'Scan a bin or type a serial' })
    .trim()
    .min(1, 'Scan a bin or type a serial')
    .max(60, 'That code is too long to be a bin or serial')
    .regex(PRINTABLE, 'That code has characters no label carries; scan again'),
})
/** A scanned code. */
export type PackCode = z.infer<typeof PackCodeSchema>

/** Tick (or undo) one item of the packing list, by its key. */
export const PackItemKeySchema = z.object({ itemKey: z.string().trim().min(1, 'Say which item').max(120).regex(PRINTABLE, 'Not a packing list item') }).strict()

/** A planner's approval to ship what is confirmed and back-order the rest, with why. */
export const ApprovePartialSchema = z
  .object({
    note: z
      .string({ error: 'Say why the rest may follow later' })
      .trim()
      .min(3, 'Say why the rest may follow later')
      .max(500, 'Use at most 500 characters')
      .regex(PRINTABLE, 'Use letters, digits and punctuation only'),
  })
  .strict()
/** A planner's approval of a partial shipment. */
export type ApprovePartial = z.infer<typeof ApprovePartialSchema>

/** One parcel as the packer sets it: which units go in it, the box, and a scale reading if taken. */
export const ParcelInputSchema = z.object({
  workOrderIds: z.array(uuid).min(1, 'Put at least one unit in the parcel').max(50),
  boxId: uuid,
  scaleGrams: z
    .number({ error: 'Enter the scale reading in grams' })
    .int('Whole grams')
    .positive('The scale reading must be above zero')
    .max(70_000, 'Over 70 kg: split the parcel')
    .nullish()
    .transform((v) => v ?? null),
})
/** One parcel as the packer sets it. */
export type ParcelInput = z.infer<typeof ParcelInputSchema>

/** The parcels of a shipment, for a quote. */
export const QuoteRequestSchema = z.object({ parcels: z.array(ParcelInputSchema).min(1, 'Add at least one parcel').max(20) }).strict()
/** The parcels of a shipment, for a quote. */
export type QuoteRequest = z.infer<typeof QuoteRequestSchema>

/** Buy the label for the parcels with one of the quoted services. */
export const BuyLabelSchema = z
  .object({ service: z.string({ error: 'Choose a service' }).trim().min(1, 'Choose a service').max(40).regex(PRINTABLE, 'Not a service name'), parcels: QuoteRequestSchema.shape.parcels })
  .strict()
/** Buy the label. */
export type BuyLabel = z.infer<typeof BuyLabelSchema>

/** Void the label, with why (kept in the audit and on the order's timeline). */
export const VoidLabelSchema = z
  .object({
    reason: z
      .string({ error: 'Say why the label is voided' })
      .trim()
      .min(3, 'Say why the label is voided')
      .max(500, 'Use at most 500 characters')
      .regex(PRINTABLE, 'Use letters, digits and punctuation only'),
  })
  .strict()
/** Void the label, with why. */
export type VoidLabel = z.infer<typeof VoidLabelSchema>

/** One of the carrier's services with its price for these parcels. */
export const QuoteSchema = z.object({ service: z.string(), name: z.string(), days: z.number().int(), chargeCents: z.number().int() })
/** A carrier's price for a service. */
export type Quote = z.infer<typeof QuoteSchema>

/** Paper size of the packing slip. */
export const PaperQuerySchema = z.object({ paper: z.enum(['letter', 'a4'], { error: 'Paper is letter or a4' }).default('letter') })

const PersonSchema = z.object({ id: uuid, name: z.string() })

/** A shipping box the bench can choose; outside size in base length units, weight in grams. */
export const BoxSchema = z.object({ id: uuid, code: z.string(), name: z.string(), length: z.number().int(), width: z.number().int(), height: z.number().int(), weightGrams: z.number().int() })
/** A shipping box. */
export type Box = z.infer<typeof BoxSchema>

/** What kind of item of the packing list: a built unit, a kit's hardware bag, a spare-parts pack. */
export const PACK_ITEM_KINDS = ['unit', 'bag', 'pack'] as const

/** One thing that must be in the box, and whether it has been confirmed. */
export const PackItemSchema = z.object({
  key: z.string(),
  kind: z.enum(PACK_ITEM_KINDS),
  workOrderId: uuid,
  serial: z.string(),
  workOrderStatus: WorkOrderStatusSchema,
  kit: z.object({ sku: z.string(), name: z.string() }),
  revisionCode: z.string(),
  description: z.string(),
  binCode: z.string().nullable(),
  /** Why the item may not go yet (e.g. not leak-tested), or null. */
  problem: z.string().nullable(),
  /** A unit must be scanned; bags and packs may be ticked. */
  tickable: z.boolean(),
  check: z.object({ method: z.enum(PACK_CHECK_METHODS), code: z.string().nullable(), by: PersonSchema, at: z.string() }).nullable(),
})
/** One item of the packing list. */
export type PackItem = z.infer<typeof PackItemSchema>

/** A parcel: proposed before the label is bought, recorded after. Weights in grams; size in base units. */
export const ParcelSchema = z.object({
  position: z.number().int(),
  boxId: uuid.nullable(),
  boxName: z.string(),
  length: z.number().int(),
  width: z.number().int(),
  height: z.number().int(),
  workOrderIds: z.array(uuid),
  serials: z.array(z.string()),
  estimatedGrams: z.number().int(),
  scaleGrams: z.number().int().nullable(),
  actualGrams: z.number().int(),
  dimensionalGrams: z.number().int(),
  billableGrams: z.number().int(),
  /** The parcel's SSCC-18, once the label is bought. */
  sscc: z.string().nullable(),
  /** The parcel's own tracking number, once the label is bought. */
  trackingNumber: z.string().nullable().default(null),
})
/** A parcel. */
export type Parcel = z.infer<typeof ParcelSchema>

/** The pack bench's view of one order: what must go, what is confirmed, what stops it, the parcels. */
export const PackViewSchema = z.object({
  order: z.object({
    id: uuid,
    number: z.string(),
    status: OrderStatusSchema,
    customerName: z.string(),
    shipTo: PostalAddressSchema,
  }),
  shipment: z
    .object({
      id: uuid,
      status: ShipmentStatusSchema,
      carrier: z.string().nullable(),
      service: z.string().nullable(),
      trackingNumber: z.string().nullable(),
      chargeCents: z.number().int().nullable(),
      partialApproval: z.object({ by: PersonSchema, at: z.string(), note: z.string() }).nullable(),
      shippedAt: z.string().nullable(),
      /** The carrier's latest tracking status (`in_transit`, `delivered`…) and when it was reported. */
      trackingStatus: z.string().nullable().default(null),
      trackingUpdatedAt: z.string().nullable().default(null),
      /** Labels of this shipment voided so far, with why and what the carrier said of the refund. */
      voidedLabels: z
        .array(z.object({ trackingNumbers: z.array(z.string()), service: z.string(), reason: z.string(), at: z.string(), refundStatus: z.string().nullable() }))
        .default([]),
      /** Whether the current label may be voided by this shipment's state (a shipped one needs a planner). */
      canVoid: z.boolean().default(false),
    })
    .nullable(),
  items: z.array(PackItemSchema),
  /** Serials going in this shipment: all, or with an approved partial shipment the fully confirmed ones. */
  shippingSerials: z.array(z.string()),
  /** Serials left for a later shipment when a partial shipment is approved. */
  backOrderedSerials: z.array(z.string()),
  /** Serials of the order that left in earlier shipments. */
  alreadyShipped: z.array(z.string()),
  /** Shipments that have left, oldest first; `canVoid` while a bought label is left to void (office only). */
  shipped: z
    .array(
      z.object({
        id: uuid,
        carrier: z.string().nullable(),
        service: z.string().nullable(),
        trackingNumber: z.string().nullable(),
        shippedAt: z.string().nullable(),
        trackingStatus: z.string().nullable(),
        voidedLabels: z.array(z.object({ trackingNumbers: z.array(z.string()), service: z.string(), reason: z.string(), at: z.string(), refundStatus: z.string().nullable() })),
        canVoid: z.boolean(),
      }),
    )
    .default([]),
  /** What stops the label (and so the shipment) now, in words; empty when it may go. */
  blockers: z.array(z.string()),
  canLabel: z.boolean(),
  canShip: z.boolean(),
  /** A label purchase is under way (or was cut short): Buy again finishes it with the same key. */
  canFinishBuying: z.boolean().default(false),
  parcels: z.array(ParcelSchema),
  boxes: z.array(BoxSchema),
})
/** The pack bench's view of one order. */
export type PackView = z.infer<typeof PackViewSchema>

/** The answer to a shipment: the view, and whether the customer's e-mail was queued. */
export const ShipResultSchema = z.object({ view: PackViewSchema, mailQueued: z.boolean() })
/** The answer to a shipment. */
export type ShipResult = z.infer<typeof ShipResultSchema>
