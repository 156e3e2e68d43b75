import { relations, sql } from 'drizzle-orm'
import { check, date, index, integer, jsonb, pgEnum, pgSequence, pgTable, text, timestamp, unique, uuid } from 'drizzle-orm/pg-core'
import { PURCHASE_ORDER_STATUSES } from '@kitwright/shared/purchasing-status'
import { createdAt, id, updatedAt } from './columns'
import { mailMessages } from './orders'
import { parts } from './parts'
import { stockMoves } from './stock'
import { suppliers } from './suppliers'
import { users } from './users'

export const purchaseOrderStatusEnum = pgEnum('purchase_order_status', PURCHASE_ORDER_STATUSES)

/** One price break: from `minQuantity` units on one order, each costs `unitPriceCents`. */
export interface PriceBreak {
  minQuantity: number
  unitPriceCents: number
}

/** What a supplier sells of one part: their SKU, the pack it comes in, and its price breaks. */
export const supplierParts = pgTable(
  'supplier_parts',
  {
    id: id(),
    supplierId: uuid().notNull().references(() => suppliers.id),
    partId: uuid().notNull().references(() => parts.id),
    supplierSku: text(),
    /** Sold in packs of this many: order quantities round up to a whole pack. */
    packSize: integer().notNull().default(1),
    /** Sorted by minQuantity, the first at 1; checked by the shared contract. */
    priceBreaks: jsonb().$type<PriceBreak[]>().notNull().default([]),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [unique().on(t.supplierId, t.partId), index().on(t.partId), check('supplier_parts_pack_size_positive', sql`${t.packSize} >= 1`)],
)
export type SupplierPartRow = typeof supplierParts.$inferSelect

/** Numbers of purchase orders, shop-wide and never reused. */
export const purchaseOrderNumberSeq = pgSequence('purchase_order_number_seq', { startWith: 1 })

/**
 * An order to a supplier. Drafts are edited freely; sending e-mails the PDF once (the message id is
 * kept in `sentMailId`) and moves it to sent; receipts move it to partly received and received.
 */
export const purchaseOrders = pgTable(
  'purchase_orders',
  {
    id: id(),
    number: text()
      .notNull()
      .unique()
      .default(sql`'PO-' || lpad(nextval('purchase_order_number_seq')::text, 5, '0')`),
    supplierId: uuid().notNull().references(() => suppliers.id),
    status: purchaseOrderStatusEnum().notNull().default('draft'),
    expectedDate: date({ mode: 'string' }),
    note: text(),
    sentAt: timestamp({ withTimezone: true }),
    /** The one e-mail that carried it to the supplier: a second send finds it and sends nothing. */
    sentMailId: uuid()
      .unique()
      .references(() => mailMessages.id),
    createdBy: uuid().references(() => users.id),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [index().on(t.status), index().on(t.supplierId)],
)
export type PurchaseOrderRow = typeof purchaseOrders.$inferSelect

/** One part on a purchase order: how many, at what unit price, and how many have come in. */
export const purchaseOrderLines = pgTable(
  'purchase_order_lines',
  {
    id: id(),
    purchaseOrderId: uuid()
      .notNull()
      .references(() => purchaseOrders.id, { onDelete: 'cascade' }),
    partId: uuid().notNull().references(() => parts.id),
    /** Pipe only: the stick length ordered. */
    stickLength: integer(),
    quantity: integer().notNull(),
    unitPriceCents: integer().notNull(),
    received: integer().notNull().default(0),
    /** Set when the line is closed with less than ordered (the supplier will send no more): why. */
    closedShortReason: text(),
    createdAt: createdAt(),
  },
  (t) => [
    unique().on(t.purchaseOrderId, t.partId),
    index().on(t.partId),
    check('purchase_order_lines_quantity_positive', sql`${t.quantity} >= 1`),
    check('purchase_order_lines_price_not_negative', sql`${t.unitPriceCents} >= 0`),
    check('purchase_order_lines_received_not_negative', sql`${t.received} >= 0`),
  ],
)
export type PurchaseOrderLineRow = typeof purchaseOrderLines.$inferSelect

/** Each receipt against a line: the ledger move it made, and why when it was more or less than due. */
export const purchaseOrderReceipts = pgTable(
  'purchase_order_receipts',
  {
    id: id(),
    lineId: uuid()
      .notNull()
      .references(() => purchaseOrderLines.id, { onDelete: 'cascade' }),
    quantity: integer().notNull(),
    stockMoveId: uuid().references(() => stockMoves.id),
    reason: text(),
    createdBy: uuid().references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [index().on(t.lineId), check('purchase_order_receipts_quantity_positive', sql`${t.quantity} >= 1`)],
)

export const purchaseOrdersRelations = relations(purchaseOrders, ({ many, one }) => ({
  lines: many(purchaseOrderLines),
  supplier: one(suppliers, { fields: [purchaseOrders.supplierId], references: [suppliers.id] }),
}))
export const purchaseOrderLinesRelations = relations(purchaseOrderLines, ({ one }) => ({
  purchaseOrder: one(purchaseOrders, { fields: [purchaseOrderLines.purchaseOrderId], references: [purchaseOrders.id] }),
  part: one(parts, { fields: [purchaseOrderLines.partId], references: [parts.id] }),
}))
