import { z } from 'zod'
import { PURCHASE_ORDER_STATUSES } from './purchasing-status'

const uuid = z.string().uuid('Not a valid id')

const optionalText = (max: number) =>
  z
    .string()
    .trim()
    .max(max, `Use at most ${max} characters`)
    .nullish()
    .transform((v) => (v ? v : null))

/** Money in whole cents, never below zero. */
export const CentsSchema = z
  .number({ error: 'Enter an amount in cents' })
  .int('Use whole cents')
  .min(0, 'A price cannot be negative: enter 0 or more')
  .max(100_000_000, 'At most $1,000,000.00')

/** One price break: from `minQuantity` units on one order, each costs `unitPriceCents`. */
export const PriceBreakSchema = z
  .object({
    minQuantity: z.number({ error: 'Enter the quantity the price starts at' }).int('Use a whole number').min(1, 'Starts at 1 or more').max(1_000_000),
    unitPriceCents: CentsSchema,
  })
  .strict()
/** One price break. */
export type PriceBreak = z.infer<typeof PriceBreakSchema>

/** Price breaks: the first from 1 unit, each next one from a larger quantity. */
export const PriceBreaksSchema = z
  .array(PriceBreakSchema)
  .min(1, 'Give at least the price from 1 unit')
  .max(20, 'At most 20 price breaks')
  .superRefine((breaks, ctx) => {
    if (breaks[0] && breaks[0].minQuantity !== 1) ctx.addIssue({ code: 'custom', path: [0, 'minQuantity'], message: 'The first price break starts at 1 unit' })
    breaks.forEach((b, i) => {
      const prev = breaks[i - 1]
      if (prev && b.minQuantity <= prev.minQuantity) ctx.addIssue({ code: 'custom', path: [i, 'minQuantity'], message: `Each break starts above the one before (${prev.minQuantity})` })
    })
  })

/** A supplier as the office types it. */
export const SaveSupplierSchema = z
  .object({
    name: z.string({ error: 'Enter the supplier name' }).trim().min(1, 'Enter the supplier name').max(120, 'Use at most 120 characters'),
    contactName: optionalText(120),
    email: z
      .string()
      .trim()
      .toLowerCase()
      .max(254)
      .nullish()
      .transform((v) => (v ? v : null))
      .pipe(z.email('Enter an address such as orders@supplier.example, or leave it blank').nullable()),
    phone: optionalText(40),
    leadTimeDays: z.number().int('Use whole days').min(0, 'Zero days or more').max(365, 'At most 365 days').nullish().transform((v) => v ?? null),
    minimumOrderCents: CentsSchema.default(0),
    active: z.boolean().default(true),
  })
  .strict()
/** A supplier as saved. */
export type SaveSupplier = z.infer<typeof SaveSupplierSchema>
/** A supplier as typed. */
export type SaveSupplierInput = z.input<typeof SaveSupplierSchema>

/** What a supplier sells of one part. `preferred` makes them the part's supplier (drafts go to them). */
export const SaveSupplierPartSchema = z
  .object({
    supplierSku: optionalText(60),
    packSize: z.number({ error: 'Enter the pack size' }).int('Use a whole number').min(1, 'At least 1').max(100_000),
    priceBreaks: PriceBreaksSchema,
    preferred: z.boolean().default(true),
  })
  .strict()
/** What a supplier sells of one part. */
export type SaveSupplierPart = z.infer<typeof SaveSupplierPartSchema>
/** What a supplier sells of one part, as typed. */
export type SaveSupplierPartInput = z.input<typeof SaveSupplierPartSchema>

export const SupplierPartSchema = z.object({
  partId: uuid,
  sku: z.string(),
  name: z.string(),
  supplierSku: z.string().nullable(),
  packSize: z.number().int(),
  priceBreaks: z.array(PriceBreakSchema),
  /** This supplier is the part's supplier: drafts from shortages go to them. */
  preferred: z.boolean(),
})
export type SupplierPart = z.infer<typeof SupplierPartSchema>

export const SupplierSchema = z.object({
  id: uuid,
  name: z.string(),
  contactName: z.string().nullable(),
  email: z.string().nullable(),
  phone: z.string().nullable(),
  leadTimeDays: z.number().int().nullable(),
  minimumOrderCents: z.number().int(),
  active: z.boolean(),
  parts: z.array(SupplierPartSchema),
})
/** A supplier with what it sells. */
export type Supplier = z.infer<typeof SupplierSchema>

export const PurchaseOrderStatusSchema = z.enum(PURCHASE_ORDER_STATUSES)

export const PurchaseOrderLineSchema = z.object({
  id: uuid,
  partId: uuid,
  sku: z.string(),
  name: z.string(),
  supplierSku: z.string().nullable(),
  stickLength: z.number().int().nullable(),
  quantity: z.number().int(),
  unitPriceCents: z.number().int(),
  received: z.number().int(),
  /** Still to come: ordered − received, 0 once received or closed short. */
  outstanding: z.number().int(),
  closedShortReason: z.string().nullable(),
})
export type PurchaseOrderLine = z.infer<typeof PurchaseOrderLineSchema>

export const PurchaseOrderSchema = z.object({
  id: uuid,
  number: z.string(),
  status: PurchaseOrderStatusSchema,
  supplier: z.object({ id: uuid, name: z.string(), email: z.string().nullable(), minimumOrderCents: z.number().int() }),
  expectedDate: z.string().nullable(),
  note: z.string().nullable(),
  sentAt: z.string().nullable(),
  /** The outbox message that carried it to the supplier. */
  sentMailId: z.string().nullable(),
  totalCents: z.number().int(),
  lines: z.array(PurchaseOrderLineSchema),
})
/** A purchase order with its lines. */
export type PurchaseOrder = z.infer<typeof PurchaseOrderSchema>

export const PurchaseOrderListQuerySchema = z.object({ status: PurchaseOrderStatusSchema.optional() }).strict()
export type PurchaseOrderListQuery = z.infer<typeof PurchaseOrderListQuerySchema>

/** A draft's edit: every line, each time (a line left out is taken off). */
export const UpdatePurchaseOrderSchema = z
  .object({
    expectedDate: z
      .string()
      .regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date such as 2026-12-18')
      .nullish()
      .transform((v) => v ?? null),
    note: optionalText(500),
    lines: z
      .array(
        z
          .object({
            partId: uuid,
            stickLength: z.number().int().positive().nullish().transform((v) => v ?? null),
            quantity: z.number({ error: 'Enter how many' }).int('Use a whole number').min(1, 'At least 1').max(1_000_000),
            unitPriceCents: CentsSchema,
          })
          .strict(),
      )
      .min(1, 'A purchase order needs at least one line')
      .max(200),
  })
  .strict()
/** A draft's edit. */
export type UpdatePurchaseOrder = z.infer<typeof UpdatePurchaseOrderSchema>
export type UpdatePurchaseOrderInput = z.input<typeof UpdatePurchaseOrderSchema>

/** What "Draft purchase orders from shortages" made. */
export const DraftFromShortagesResultSchema = z.object({
  created: z.array(PurchaseOrderSchema),
  /** Parts to buy that no draft could take, with why (no supplier, or already on a draft). */
  skipped: z.array(z.object({ sku: z.string(), reason: z.string() })),
})
export type DraftFromShortagesResult = z.infer<typeof DraftFromShortagesResultSchema>

/** One line of a receipt against a purchase order: why, when more or less than still due comes in. */
export const ReceiptReasonSchema = optionalText(200)
