import { relations, sql } from 'drizzle-orm'
import { check, index, integer, jsonb, pgEnum, pgSequence, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import { RETURN_DECISIONS, RETURN_DISPOSITIONS, RETURN_LABEL_STATUSES, RETURN_STATUSES } from '@kitwright/shared/returns-status'
import { reworkEntries } from './build'
import { createdAt, id } from './columns'
import { orders, workOrders } from './orders'
import { users } from './users'

export const returnStatusEnum = pgEnum('return_status', RETURN_STATUSES)
export const returnDecisionEnum = pgEnum('return_decision', RETURN_DECISIONS)
export const returnLabelStatusEnum = pgEnum('return_label_status', RETURN_LABEL_STATUSES)
export const returnDispositionEnum = pgEnum('return_disposition', RETURN_DISPOSITIONS)

/** Return numbers, shop-wide and never reused (`R-1001`). */
export const returnNumberSeq = pgSequence('return_number_seq', { startWith: 1001 })

/** The shop's own list of return reasons, in order; while it is empty the defaults stand. */
export const returnReasons = pgTable('return_reasons', {
  id: id(),
  label: text().notNull().unique(),
  position: integer().notNull(),
  createdAt: createdAt(),
})
export type ReturnReasonRow = typeof returnReasons.$inferSelect

/**
 * A unit the customer sends back, opened by its serial: why (one of the shop's reasons, copied so a
 * later rename keeps history), notes, photos; a return label bought once through the carrier
 * (recorded `buying` with its idempotency key before the carrier is called, as outbound labels are);
 * received by a scan at the pack bench; then decided: repair (the unit back to the build bench with a
 * rework entry that only a new passing leak test resolves), replace (a new order released the normal
 * way) or refund (noted here; the store moves the money).
 */
export const returns = pgTable(
  'returns',
  {
    id: id(),
    number: text().notNull().unique(),
    workOrderId: uuid().notNull().references(() => workOrders.id),
    orderId: uuid().notNull().references(() => orders.id),
    status: returnStatusEnum().notNull().default('awaiting_parcel'),
    reason: text().notNull(),
    notes: text(),
    openedBy: uuid().notNull().references(() => users.id),
    openedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    labelStatus: returnLabelStatusEnum().notNull().default('none'),
    /** The idempotency key of the label purchase, recorded before the carrier is called. */
    labelKey: uuid().unique(),
    /** What is being bought (addresses, parcel, service), kept so a purchase can be finished after a crash. */
    labelRequest: jsonb(),
    carrierRef: text(),
    carrier: text(),
    service: text(),
    trackingNumber: text().unique(),
    carrierParcelRef: text(),
    chargeCents: integer(),
    labelData: jsonb(),
    labelBoughtAt: timestamp({ withTimezone: true }),
    labelBoughtBy: uuid().references(() => users.id),
    receivedAt: timestamp({ withTimezone: true }),
    receivedBy: uuid().references(() => users.id),
    /** What the packer scanned to receive it (the label's tracking number or the serial). */
    receivedCode: text(),
    decision: returnDecisionEnum(),
    decisionNote: text(),
    decidedAt: timestamp({ withTimezone: true }),
    decidedBy: uuid().references(() => users.id),
    /** Repair: the build steps reopened (their ticks undone) and the rework entry a new leak test resolves. */
    reopenedStepIds: uuid().array(),
    reworkEntryId: uuid().references(() => reworkEntries.id),
    /** Replace: the replacement order and its unit. */
    replacementOrderId: uuid().references(() => orders.id),
    replacementWorkOrderId: uuid().references(() => workOrders.id),
    /** Refund: what the store paid back, in the order's currency (cents). */
    refundCents: integer(),
    /**
     * Replace or refund: what became of the returned unit, recorded once by the office (back to stock
     * as a spare, or scrapped with a reason in the note).
     */
    disposition: returnDispositionEnum(),
    dispositionNote: text(),
    disposedAt: timestamp({ withTimezone: true }),
    disposedBy: uuid().references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [
    index().on(t.workOrderId),
    index().on(t.orderId),
    index().on(t.status, t.openedAt),
    // One undecided return per unit at a time.
    uniqueIndex('returns_one_undecided_per_unit').on(t.workOrderId).where(sql`${t.status} in ('awaiting_parcel', 'received')`),
    check('returns_buying_has_key', sql`${t.labelStatus}::text = 'none' or ${t.labelKey} is not null`),
    check('returns_bought_has_tracking', sql`${t.labelStatus}::text <> 'bought' or ${t.trackingNumber} is not null`),
    check('returns_decided_has_decision', sql`${t.status}::text in ('awaiting_parcel', 'received') = (${t.decision} is null)`),
    check('returns_refund_not_negative', sql`${t.refundCents} is null or ${t.refundCents} >= 0`),
    // Only a unit the customer no longer gets back (replaced or refunded) is disposed of; a scrap says why.
    check('returns_disposition_after_replace_or_refund', sql`${t.disposition} is null or ${t.status}::text in ('replace', 'refund')`),
    check('returns_disposition_complete', sql`(${t.disposition} is null) = (${t.disposedAt} is null) and (${t.disposition} is null) = (${t.disposedBy} is null)`),
    check('returns_scrap_has_reason', sql`${t.disposition}::text is distinct from 'scrapped' or ${t.dispositionNote} is not null`),
  ],
)
export type ReturnRow = typeof returns.$inferSelect

/**
 * A photo of a returned unit in the S3 bucket, presigned and confirmed as the build bench's are: the
 * row is written at presign (type and size promised); `uploadedAt` once a HEAD found it as promised.
 */
export const returnPhotos = pgTable(
  'return_photos',
  {
    id: id(),
    returnId: uuid().notNull().references(() => returns.id),
    key: text().notNull().unique(),
    contentType: text().notNull(),
    size: integer().notNull(),
    uploadedBy: uuid().notNull().references(() => users.id),
    uploadedAt: timestamp({ withTimezone: true }),
    createdAt: createdAt(),
  },
  (t) => [index().on(t.returnId), check('return_photos_size_positive', sql`${t.size} > 0`)],
)
export type ReturnPhotoRow = typeof returnPhotos.$inferSelect

export const returnsRelations = relations(returns, ({ one, many }) => ({
  workOrder: one(workOrders, { fields: [returns.workOrderId], references: [workOrders.id] }),
  order: one(orders, { fields: [returns.orderId], references: [orders.id] }),
  photos: many(returnPhotos),
}))
export const returnPhotosRelations = relations(returnPhotos, ({ one }) => ({
  return: one(returns, { fields: [returnPhotos.returnId], references: [returns.id] }),
}))
