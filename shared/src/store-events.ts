import { z } from 'zod'
import { CustomerSchema, OrderNumberSchema, ShipToSchema } from './orders'

/** Kinds of event the web store sends to `POST /api/webhooks/store`. */
export const STORE_EVENT_TYPES = ['order.paid', 'order.cancelled', 'order.address_changed'] as const
/** A kind of store event. */
export type StoreEventType = (typeof STORE_EVENT_TYPES)[number]

/** How many seconds a delivery's `X-Store-Timestamp` may be off Kitwright's clock, either way. */
export const STORE_WEBHOOK_TOLERANCE_SECONDS = 5 * 60

/** One product line of a paid store order: the store's product id, how many, and the unit price in cents. */
export const StoreOrderLineSchema = z.object({
  productId: z.string().trim().min(1, 'Give the store product id').max(80),
  /** What the store calls the product (kept when it maps to no kit). */
  title: z.string().trim().max(200).optional(),
  quantity: z.number().int('Use a whole number').min(1, 'At least 1').max(500, 'At most 500 per line'),
  unitPriceCents: z.number().int('Whole cents').min(0, 'Cannot be negative').max(10_000_000),
})
/** One product line of a paid store order. */
export type StoreOrderLine = z.infer<typeof StoreOrderLineSchema>

/** The order as the store reports it when it is paid. */
export const StoreOrderSchema = z.object({
  placedAt: z.iso.datetime({ offset: true, error: 'Use a date and time such as 2026-03-01T14:30:00Z' }),
  customer: CustomerSchema,
  shipTo: ShipToSchema,
  currency: z
    .string()
    .trim()
    .toUpperCase()
    .regex(/^[A-Z]{3}$/, 'Use a three-letter currency code such as USD')
    .default('USD'),
  note: z.string().trim().max(1000).optional(),
  lines: z.array(StoreOrderLineSchema).min(1, 'A paid order needs at least one line').max(100),
})
/** The order as the store reports it when it is paid. */
export type StoreOrder = z.infer<typeof StoreOrderSchema>

const envelope = {
  /** The store's own id for this event; a redelivery carries the same id. */
  eventId: z.string().trim().min(1, 'Give the event id').max(100),
  /** When the thing happened at the store (not when it was delivered). */
  occurredAt: z.iso.datetime({ offset: true, error: 'Use a date and time such as 2026-03-01T14:30:00Z' }),
  orderNumber: OrderNumberSchema,
}

/**
 * One webhook delivery's body. Every event names the order by its number; `order.paid` carries the
 * whole order, `order.address_changed` the new ship-to, `order.cancelled` an optional reason.
 */
export const StoreEventSchema = z.discriminatedUnion(
  'type',
  [
    z.object({ ...envelope, type: z.literal('order.paid'), order: StoreOrderSchema }),
    z.object({ ...envelope, type: z.literal('order.cancelled'), reason: z.string().trim().max(500).optional() }),
    z.object({ ...envelope, type: z.literal('order.address_changed'), shipTo: ShipToSchema }),
  ],
  { error: `type must be one of ${STORE_EVENT_TYPES.join(', ')}` },
)
/** One webhook delivery's body (parsed). */
export type StoreEvent = z.infer<typeof StoreEventSchema>
/** One webhook delivery's body as the store writes it. */
export type StoreEventInput = z.input<typeof StoreEventSchema>

/** What the webhook answers to an accepted delivery; `duplicate` when the event id was already stored. */
export const StoreWebhookReplySchema = z.object({ received: z.literal(true), duplicate: z.boolean() })
/** What the webhook answers to an accepted delivery. */
export type StoreWebhookReply = z.infer<typeof StoreWebhookReplySchema>
