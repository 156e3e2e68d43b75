import { sql } from 'drizzle-orm'
import { check, index, integer, jsonb, pgEnum, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core'
import { PAYMENT_LINK_STATUSES, PAYMENT_METHODS } from '@kitwright/shared/payments'
import { createdAt, id } from './columns'
import { orders } from './orders'
import { users } from './users'

export const paymentMethodEnum = pgEnum('payment_method', PAYMENT_METHODS)
export const paymentLinkStatusEnum = pgEnum('payment_link_status', PAYMENT_LINK_STATUSES)

/**
 * Money received for an order outside the web store: a card taken over the phone, cash, a bank
 * transfer, or a payment link the customer paid. `externalId` (the payment service's id) makes a
 * redelivered payment event a no-op. Money in cents.
 */
export const orderPayments = pgTable(
  'order_payments',
  {
    id: id(),
    orderId: uuid().notNull().references(() => orders.id),
    method: paymentMethodEnum().notNull(),
    amountCents: integer().notNull(),
    reference: text(),
    externalId: text().unique(),
    recordedBy: uuid().references(() => users.id),
    recordedAt: createdAt(),
  },
  (t) => [index().on(t.orderId), check('order_payments_amount_positive', sql`${t.amountCents} > 0`)],
)
export type OrderPaymentRow = typeof orderPayments.$inferSelect

/**
 * A payment link sent to a customer through the hosted payment service. Recorded as `creating` with
 * its idempotency key before the service is called, so a retry or a double click gets the same link.
 */
export const paymentLinks = pgTable(
  'payment_links',
  {
    id: id(),
    orderId: uuid().notNull().references(() => orders.id),
    idempotencyKey: text().notNull().unique(),
    status: paymentLinkStatusEnum().notNull().default('creating'),
    amountCents: integer().notNull(),
    /** The service's id for the checkout, and the address the customer pays at. */
    externalId: text().unique(),
    url: text(),
    error: text(),
    createdBy: uuid().references(() => users.id),
    createdAt: createdAt(),
    paidAt: timestamp({ withTimezone: true }),
  },
  (t) => [index().on(t.orderId), check('payment_links_amount_positive', sql`${t.amountCents} > 0`)],
)
export type PaymentLinkRow = typeof paymentLinks.$inferSelect

/** Every payment event the signature check accepted, stored as it came; `eventId` makes a redelivery a no-op. */
export const paymentEvents = pgTable('payment_events', {
  id: id(),
  eventId: text().notNull().unique(),
  type: text().notNull(),
  payload: jsonb().notNull(),
  receivedAt: createdAt(),
})
