import { relations, sql } from 'drizzle-orm'
import { boolean, check, index, integer, jsonb, pgEnum, pgSequence, pgTable, text, timestamp, unique, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import { LABEL_STATUSES, PACK_CHECK_METHODS, SHIPMENT_STATUSES } from '@kitwright/shared/pack-status'
import { createdAt, id } from './columns'
import { orders, workOrders } from './orders'
import { parts } from './parts'
import { users } from './users'

export const shipmentStatusEnum = pgEnum('shipment_status', SHIPMENT_STATUSES)
export const packCheckMethodEnum = pgEnum('pack_check_method', PACK_CHECK_METHODS)
export const labelStatusEnum = pgEnum('label_status', LABEL_STATUSES)

/** Serial references of SSCCs, shop-wide and never reused (one per parcel). */
export const ssccSerialSeq = pgSequence('sscc_serial_seq', { startWith: 1 })

/**
 * A shipping box the pack bench can choose: outside size in base length units and its own weight in
 * grams. `partId` links the packaging part of the BOM the box is (a carton), when it is one.
 */
export const boxes = pgTable(
  'boxes',
  {
    id: id(),
    code: text().notNull().unique(),
    name: text().notNull(),
    partId: uuid().references(() => parts.id),
    length: integer().notNull(),
    width: integer().notNull(),
    height: integer().notNull(),
    weightGrams: integer().notNull(),
    active: boolean().notNull().default(true),
    createdAt: createdAt(),
  },
  (t) => [
    check('boxes_size_positive', sql`${t.length} > 0 and ${t.width} > 0 and ${t.height} > 0`),
    check('boxes_weight_not_negative', sql`${t.weightGrams} >= 0`),
  ],
)
export type BoxRow = typeof boxes.$inferSelect

/**
 * One shipment of an order: opened at the pack bench by the first check, labelled once the carrier
 * sold a label (tracking number), shipped when it leaves. An order has at most one open shipment; a
 * partial shipment approved by a planner leaves the rest for a later one.
 */
export const shipments = pgTable(
  'shipments',
  {
    id: id(),
    orderId: uuid().notNull().references(() => orders.id),
    status: shipmentStatusEnum().notNull().default('packing'),
    carrier: text(),
    service: text(),
    trackingNumber: text().unique(),
    chargeCents: integer(),
    /**
     * What the carrier returned for the label (its routing code and the like). The 4 × 6 in label PDF
     * is drawn from this row and its parcels whenever it is asked for, so no PDF bytes are stored.
     */
    labelData: jsonb(),
    labelledAt: timestamp({ withTimezone: true }),
    labelledBy: uuid().references(() => users.id),
    /**
     * The idempotency key of the label purchase under way or done, recorded (status `buying`) before
     * the carrier is called and sent with every call of that purchase, so a retry, a second tap or a
     * restart after a crash finds the same label instead of buying another.
     */
    labelKey: uuid().unique(),
    /** What is being bought (service and parcels as the packer set them), kept so a purchase can be finished after a crash. */
    labelRequest: jsonb(),
    /** The carrier's own id for the purchase (its order of parcels), recorded before the label is paid for. */
    carrierRef: text(),
    /** The latest tracking status the carrier reported (`in_transit`, `delivered`…), and when. */
    trackingStatus: text(),
    trackingUpdatedAt: timestamp({ withTimezone: true }),
    deliveredAt: timestamp({ withTimezone: true }),
    partialApprovedAt: timestamp({ withTimezone: true }),
    partialApprovedBy: uuid().references(() => users.id),
    partialNote: text(),
    shippedAt: timestamp({ withTimezone: true }),
    shippedBy: uuid().references(() => users.id),
    createdBy: uuid().notNull().references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [
    index().on(t.orderId),
    // Units shipped per day (reports).
    index().on(t.shippedAt),
    uniqueIndex('shipments_one_open_per_order').on(t.orderId).where(sql`${t.status} <> 'shipped'`),
    // Compared as text: a value added to the enum cannot be used in the migration that adds it.
    check('shipments_labelled_has_tracking', sql`${t.status}::text in ('packing', 'buying') or ${t.trackingNumber} is not null`),
    check('shipments_buying_has_key', sql`${t.status}::text <> 'buying' or ${t.labelKey} is not null`),
  ],
)
export type ShipmentRow = typeof shipments.$inferSelect

/**
 * One parcel of a shipment: its box (size copied, so a later change to the box leaves it as shipped),
 * the units in it, its weights in grams and its SSCC-18. `estimatedGrams` is the BOM weights plus the
 * box; a scale reading, when taken, is the actual weight instead.
 */
export const parcels = pgTable(
  'parcels',
  {
    id: id(),
    shipmentId: uuid().notNull().references(() => shipments.id, { onDelete: 'cascade' }),
    position: integer().notNull(),
    boxId: uuid().references(() => boxes.id),
    boxName: text().notNull(),
    length: integer().notNull(),
    width: integer().notNull(),
    height: integer().notNull(),
    workOrderIds: uuid().array().notNull(),
    estimatedGrams: integer().notNull(),
    scaleGrams: integer(),
    actualGrams: integer().notNull(),
    dimensionalGrams: integer().notNull(),
    billableGrams: integer().notNull(),
    sscc: text().notNull().unique(),
    /** The carrier's tracking number of this parcel (each parcel has its own; null on parcels recorded before that). */
    trackingNumber: text().unique(),
    createdAt: createdAt(),
  },
  (t) => [
    unique().on(t.shipmentId, t.position),
    check('parcels_weights_positive', sql`${t.actualGrams} > 0 and ${t.billableGrams} >= ${t.actualGrams} and ${t.billableGrams} >= ${t.dimensionalGrams}`),
    check('parcels_sscc_18_digits', sql`${t.sscc} ~ '^[0-9]{18}$'`),
  ],
)
export type ParcelRow = typeof parcels.$inferSelect

/**
 * Every label the carrier sold for a shipment, kept after a void: who bought it, its tracking numbers
 * (one per parcel) and price, and when voided, why, by whom and what the carrier said of the refund.
 */
export const shippingLabels = pgTable(
  'shipping_labels',
  {
    id: id(),
    shipmentId: uuid().notNull().references(() => shipments.id, { onDelete: 'cascade' }),
    idempotencyKey: uuid().notNull().unique(),
    status: labelStatusEnum().notNull().default('bought'),
    carrier: text().notNull(),
    service: text().notNull(),
    carrierRef: text().notNull(),
    trackingNumbers: text().array().notNull(),
    /** The carrier's id of each parcel's label, in parcel order (a refund names these). */
    carrierParcelRefs: text().array().notNull(),
    chargeCents: integer().notNull(),
    boughtAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    boughtBy: uuid().references(() => users.id),
    voidReason: text(),
    voidedAt: timestamp({ withTimezone: true }),
    voidedBy: uuid().references(() => users.id),
    /** The carrier's answer to the refund: `submitted`, `refunded` or `rejected`. */
    refundStatus: text(),
  },
  (t) => [index().on(t.shipmentId), check('shipping_labels_void_has_reason', sql`${t.status}::text <> 'voided' or ${t.voidReason} is not null`)],
)
export type ShippingLabelRow = typeof shippingLabels.$inferSelect

/** A signed tracking event from the carrier, kept by its id so a redelivery changes nothing. */
export const carrierEvents = pgTable('carrier_events', {
  id: text().primaryKey(),
  trackingNumber: text().notNull(),
  status: text().notNull(),
  body: jsonb().notNull(),
  shipmentId: uuid().references(() => shipments.id),
  receivedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
})

/**
 * A pack-bench confirmation that one item is in the box: a unit (by a scan of its bin or serial), a
 * spare-parts pack or a kit's hardware bag (by a scan or a tick). `itemKey` names the item within
 * the order. An undo sets `undoneAt`; at most one check per item stands.
 */
export const packChecks = pgTable(
  'pack_checks',
  {
    id: id(),
    shipmentId: uuid().notNull().references(() => shipments.id, { onDelete: 'cascade' }),
    workOrderId: uuid().notNull().references(() => workOrders.id),
    itemKey: text().notNull(),
    method: packCheckMethodEnum().notNull(),
    /** The code scanned, for a scan. */
    code: text(),
    checkedBy: uuid().notNull().references(() => users.id),
    checkedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    undoneAt: timestamp({ withTimezone: true }),
    undoneBy: uuid().references(() => users.id),
  },
  (t) => [
    index().on(t.shipmentId),
    uniqueIndex('pack_checks_one_standing').on(t.shipmentId, t.itemKey).where(sql`${t.undoneAt} is null`),
  ],
)
export type PackCheckRow = typeof packChecks.$inferSelect

export const shipmentsRelations = relations(shipments, ({ one, many }) => ({
  order: one(orders, { fields: [shipments.orderId], references: [orders.id] }),
  parcels: many(parcels),
  checks: many(packChecks),
}))
export const parcelsRelations = relations(parcels, ({ one }) => ({
  shipment: one(shipments, { fields: [parcels.shipmentId], references: [shipments.id] }),
  box: one(boxes, { fields: [parcels.boxId], references: [boxes.id] }),
}))
export const packChecksRelations = relations(packChecks, ({ one }) => ({
  shipment: one(shipments, { fields: [packChecks.shipmentId], references: [shipments.id] }),
  workOrder: one(workOrders, { fields: [packChecks.workOrderId], references: [workOrders.id] }),
}))
export const boxesRelations = relations(boxes, ({ one }) => ({
  part: one(parts, { fields: [boxes.partId], references: [parts.id] }),
}))
