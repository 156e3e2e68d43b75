import { relations, sql } from 'drizzle-orm'
import { check, date, index, integer, jsonb, pgEnum, pgSequence, pgTable, text, timestamp, unique, uuid } from 'drizzle-orm/pg-core'
import { MAIL_STATUSES, ORDER_PRIORITIES, ORDER_SOURCES, ORDER_STATUSES, PAYMENT_STATUSES, WORK_ORDER_STATUSES } from '@kitwright/shared/orders-status'
import { createdAt, id, updatedAt } from './columns'
import { kitRevisions, kits } from './kits'
import { users } from './users'

export const orderStatusEnum = pgEnum('order_status', ORDER_STATUSES)
export const paymentStatusEnum = pgEnum('payment_status', PAYMENT_STATUSES)
export const orderSourceEnum = pgEnum('order_source', ORDER_SOURCES)
export const orderPriorityEnum = pgEnum('order_priority', ORDER_PRIORITIES)
export const workOrderStatusEnum = pgEnum('work_order_status', WORK_ORDER_STATUSES)
export const mailStatusEnum = pgEnum('mail_status', MAIL_STATUSES)

/**
 * Every webhook delivery the store's signature check accepted, stored raw before any processing, so
 * a crash never loses one. `eventId` makes a retried delivery a no-op.
 */
export const storeEvents = pgTable(
  'store_events',
  {
    id: id(),
    eventId: text().notNull().unique(),
    type: text().notNull(),
    orderNumber: text().notNull(),
    payload: jsonb().notNull(),
    receivedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    processedAt: timestamp({ withTimezone: true }),
    /** The last processing error, kept for the planner; the job queue retries. */
    error: text(),
  },
  (t) => [index().on(t.orderNumber)],
)
export type StoreEventRow = typeof storeEvents.$inferSelect

/** A customer's order, from the store, a CSV import or the phone. Money in cents. */
export const orders = pgTable(
  'orders',
  {
    id: id(),
    number: text().notNull().unique(),
    source: orderSourceEnum().notNull(),
    status: orderStatusEnum().notNull().default('open'),
    paymentStatus: paymentStatusEnum().notNull().default('pending'),
    customerName: text().notNull(),
    customerEmail: text().notNull(),
    customerPhone: text(),
    shipName: text().notNull(),
    shipLine1: text().notNull(),
    shipLine2: text(),
    shipCity: text().notNull(),
    shipRegion: text(),
    shipPostalCode: text().notNull(),
    shipCountry: text().notNull(),
    placedAt: timestamp({ withTimezone: true }).notNull(),
    /** The ship date promised to the customer; past it and not shipped, the order is late. */
    promisedShipDate: date({ mode: 'string' }),
    /** Set by a planner; rush orders sort first. */
    priority: orderPriorityEnum().notNull().default('normal'),
    /** On hold (a planner's decision, on top of the status): not released or shipped until taken off hold. */
    heldAt: timestamp({ withTimezone: true }),
    holdReason: text(),
    heldBy: uuid().references(() => users.id),
    totalCents: integer().notNull().default(0),
    currency: text().notNull().default('USD'),
    note: text(),
    releasedAt: timestamp({ withTimezone: true }),
    shippedAt: timestamp({ withTimezone: true }),
    cancelledAt: timestamp({ withTimezone: true }),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [index().on(t.status, t.placedAt), index().on(t.placedAt), index().on(t.promisedShipDate), index('orders_number_upper_index').on(sql`upper(${t.number})`)],
)
export type OrderRow = typeof orders.$inferSelect
export type NewOrderRow = typeof orders.$inferInsert

/** One line of an order: a kit (or spare pack) and how many. `kitId` is null when the store's product maps to no kit. */
export const orderLines = pgTable(
  'order_lines',
  {
    id: id(),
    orderId: uuid().notNull().references(() => orders.id, { onDelete: 'cascade' }),
    lineNo: integer().notNull(),
    kitId: uuid().references(() => kits.id),
    storeProductId: text(),
    sku: text().notNull(),
    description: text().notNull(),
    quantity: integer().notNull(),
    unitPriceCents: integer().notNull().default(0),
  },
  (t) => [unique().on(t.orderId, t.lineNo), index().on(t.kitId), check('order_lines_quantity_positive', sql`${t.quantity} > 0`)],
)
export type OrderLineRow = typeof orderLines.$inferSelect

/** The order's timeline: every event of consequence, with who did it. */
export const orderEvents = pgTable(
  'order_events',
  {
    id: id(),
    orderId: uuid().notNull().references(() => orders.id, { onDelete: 'cascade' }),
    kind: text().notNull(),
    message: text().notNull(),
    data: jsonb(),
    actorId: uuid().references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [
    index().on(t.orderId, t.createdAt),
    // When an order that came in unpaid was paid (lead-time report): the few payment events only.
    index('order_events_payment').on(t.orderId, t.createdAt).where(sql`${t.kind} = 'payment'`),
  ],
)
export type OrderEventRow = typeof orderEvents.$inferSelect

/** Serial numbers of units, shop-wide and never reused. */
export const workOrderSerialSeq = pgSequence('work_order_serial_seq', { startWith: 1001 })

/**
 * One unit of one kit revision, with its serial number. The revision is frozen once released, so
 * the work order's bill of materials is the revision's.
 */
export const workOrders = pgTable(
  'work_orders',
  {
    id: id(),
    serial: text().notNull().unique(),
    orderId: uuid().notNull().references(() => orders.id),
    orderLineId: uuid().notNull().references(() => orderLines.id),
    kitRevisionId: uuid().notNull().references(() => kitRevisions.id),
    status: workOrderStatusEnum().notNull().default('waiting_cut'),
    dueDate: date({ mode: 'string' }),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [index().on(t.status), index().on(t.orderId), index().on(t.kitRevisionId), index('work_orders_serial_upper_index').on(sql`upper(${t.serial})`)],
)
export type WorkOrderRow = typeof workOrders.$inferSelect

/** Every e-mail the shop sends, queued first and sent by a job; the outbox page reads this table. */
export const mailMessages = pgTable(
  'mail_messages',
  {
    id: id(),
    to: text().notNull(),
    subject: text().notNull(),
    text: text().notNull(),
    html: text(),
    /** Files sent with it (a purchase order's PDF), base64, kept so a retry sends the same bytes. */
    attachments: jsonb().$type<{ filename: string; contentType: string; contentBase64: string }[]>().notNull().default([]),
    status: mailStatusEnum().notNull().default('queued'),
    attempts: integer().notNull().default(0),
    lastError: text(),
    orderId: uuid().references(() => orders.id),
    /** Why it was sent (e.g. `order_received`, `shipped`), with the order: sent at most once per purpose. */
    purpose: text().notNull(),
    sentAt: timestamp({ withTimezone: true }),
    createdAt: createdAt(),
  },
  (t) => [index().on(t.status, t.createdAt), unique().on(t.orderId, t.purpose)],
)
export type MailMessageRow = typeof mailMessages.$inferSelect

export const ordersRelations = relations(orders, ({ many }) => ({
  lines: many(orderLines),
  events: many(orderEvents),
  workOrders: many(workOrders),
}))
export const orderLinesRelations = relations(orderLines, ({ one, many }) => ({
  order: one(orders, { fields: [orderLines.orderId], references: [orders.id] }),
  kit: one(kits, { fields: [orderLines.kitId], references: [kits.id] }),
  workOrders: many(workOrders),
}))
export const orderEventsRelations = relations(orderEvents, ({ one }) => ({
  order: one(orders, { fields: [orderEvents.orderId], references: [orders.id] }),
  actor: one(users, { fields: [orderEvents.actorId], references: [users.id] }),
}))
export const workOrdersRelations = relations(workOrders, ({ one }) => ({
  order: one(orders, { fields: [workOrders.orderId], references: [orders.id] }),
  orderLine: one(orderLines, { fields: [workOrders.orderLineId], references: [orderLines.id] }),
  revision: one(kitRevisions, { fields: [workOrders.kitRevisionId], references: [kitRevisions.id] }),
}))
