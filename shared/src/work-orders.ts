import { z } from 'zod'
import { PartKindSchema } from './parts'
import { WorkOrderStatusSchema } from './orders'

const uuid = z.string().uuid('Not a valid id')

/**
 * Release orders into work orders. Each order is released in its own transaction; with
 * `allowShort`, an order whose hardware or packaging is short is released anyway, reserving what is
 * available and leaving the rest as a shortage.
 */
export const ReleaseOrdersSchema = z
  .object({
    orderIds: z.array(uuid).min(1, 'Choose at least one order').max(100, 'Release at most 100 orders at once'),
    allowShort: z.boolean().default(false),
  })
  .strict()
/** Release orders into work orders. */
export type ReleaseOrders = z.infer<typeof ReleaseOrdersSchema>
/** Release orders into work orders, before defaults. */
export type ReleaseOrdersInput = z.input<typeof ReleaseOrdersSchema>

/** A part an order (or the open work orders) needs more of than there is free. */
export const ReleaseShortageSchema = z.object({
  partId: uuid,
  sku: z.string(),
  name: z.string(),
  needed: z.number().int(),
  reserved: z.number().int(),
  /** How many were missing when the order was released. */
  short: z.number().int(),
})
/** A part short at release. */
export type ReleaseShortage = z.infer<typeof ReleaseShortageSchema>

/** One order released: its new work orders and what it is short. */
export const ReleasedOrderSchema = z.object({
  orderId: uuid,
  number: z.string(),
  workOrders: z.array(
    z.object({ id: uuid, serial: z.string(), status: WorkOrderStatusSchema, kitSku: z.string(), revisionCode: z.string() }),
  ),
  shortages: z.array(ReleaseShortageSchema),
})
/** One order released. */
export type ReleasedOrder = z.infer<typeof ReleasedOrderSchema>

/**
 * What a release did, order by order. When no order could be released the API answers with the
 * error instead (409 naming what is short, or why the order cannot be released).
 */
export const ReleaseResultSchema = z.object({
  released: z.array(ReleasedOrderSchema),
  refused: z.array(z.object({ orderId: uuid, number: z.string().nullable(), status: z.number().int(), message: z.string() })),
})
/** What a release did. */
export type ReleaseResult = z.infer<typeof ReleaseResultSchema>

/** What a bulk release would do, order by order, in the turn each gets stock (see domain/release-plan). */
export const ReleasePreviewSchema = z.object({
  plan: z.array(
    z.object({
      orderId: uuid,
      number: z.string(),
      priority: z.enum(['normal', 'rush']),
      promisedShipDate: z.string().nullable(),
      turn: z.number().int(),
      outcome: z.enum(['release', 'release_short', 'refuse']),
      reason: z.string().nullable(),
      parts: z.array(
        z.object({ partId: uuid, sku: z.string(), name: z.string(), needed: z.number().int(), freeBefore: z.number().int(), takes: z.number().int(), short: z.number().int() }),
      ),
    }),
  ),
  /** Ids that match no order. */
  missing: z.array(z.string()),
})
/** What a bulk release would do. */
export type ReleasePreview = z.infer<typeof ReleasePreviewSchema>

/** The field key under which a release refused for shortage names a short part: `short.<SKU>`. */
export function shortageFieldKey(sku: string): string {
  return `short.${sku}`
}

/**
 * One part on the shortages page, over all open demand: the open work orders of released orders and
 * the orders not yet released (each line at its kit's newest released revision). For hardware and
 * packaging, in units: what that demand still needs (BOM × units, less what was consumed), what is
 * reserved for it, what is free in stock, and `short` = needed − reserved − available − on order when above zero. For pipe (kept by the stick and
 * reserved only when a cut run is published), the same in sticks, estimated from the cut parts: the
 * total cut length with kerf over the longest stick length, rounded up.
 */
export const ShortageRowSchema = z.object({
  partId: uuid,
  sku: z.string(),
  name: z.string(),
  kind: PartKindSchema,
  unitOfMeasure: z.string(),
  needed: z.number().int(),
  reserved: z.number().int(),
  available: z.number().int(),
  short: z.number().int(),
  /** Ordered and not yet received on open purchase orders (sent or partly received); counted before `short`. */
  onOrder: z.number().int().default(0),
  /** Those purchase orders, the soonest expected first: number, expected date (YYYY-MM-DD), still to come. */
  onOrderPurchaseOrders: z.array(z.object({ number: z.string(), expectedDate: z.string().nullable(), outstanding: z.number().int() })).default([]),
  /** Open work orders that need this part. */
  workOrderCount: z.number().int(),
  /** The open orders (released or not) that need it, the earliest ship date first. */
  orderNumbers: z.array(z.string()),
  /** The earliest date it is needed: the soonest due or promised ship date among them (YYYY-MM-DD). */
  neededBy: z.string().nullable(),
  /** Pipe only: total length to cut (pieces + one kerf each), in base units. */
  cutLength: z.number().int().nullable(),
  /** Pipe only: the longest stick length the part is bought in, in base units. */
  stickLength: z.number().int().nullable(),
  supplier: z.string().nullable(),
  supplierId: z.string().nullable().default(null),
  leadTimeDays: z.number().int().nullable(),
  reorderPoint: z.number().int(),
  reorderQuantity: z.number().int(),
  /** Free stock is at or below the part's reorder point (needed by an order or not). */
  belowReorderPoint: z.boolean(),
  /** What to buy: the shortfall, or the reorder quantity when that is more or when below the reorder point; 0 otherwise. */
  suggestedOrder: z.number().int(),
})
/** One part on the shortages page. */
export type ShortageRow = z.infer<typeof ShortageRowSchema>

/** The shortages page: every part the open demand needs, short ones first. */
export const ShortagesSchema = z.object({
  rows: z.array(ShortageRowSchema),
  /** Open work orders counted (not shipped, packed or cancelled). */
  openWorkOrders: z.number().int(),
  /** Orders received and not yet released, counted at their kits' newest released revisions. */
  unreleasedOrders: z.number().int(),
})
/** The shortages page. */
export type Shortages = z.infer<typeof ShortagesSchema>

/** Which parts the shortages page lists. */
export const ShortagesQuerySchema = z.object({ only: z.enum(['short', 'all'], { error: 'Use short or all' }).default('short') }).strict()
/** Which parts the shortages page lists. */
export type ShortagesQuery = z.infer<typeof ShortagesQuerySchema>
