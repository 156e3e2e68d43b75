import { relations, sql } from 'drizzle-orm'
import { check, index, integer, pgTable, text, timestamp, unique, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import { createdAt, id } from './columns'
import { mailMessages, workOrders } from './orders'
import { parts } from './parts'
import { users } from './users'

/**
 * A supplier's lot of a lot-tracked part, as printed on the bag or box. The same lot received twice
 * is one row (codes match whatever their case). Its stock is the sum of the ledger moves that carry it.
 */
export const stockLots = pgTable(
  'stock_lots',
  {
    id: id(),
    partId: uuid().notNull().references(() => parts.id),
    /** The supplier's lot code as first typed or scanned. */
    code: text().notNull(),
    /** When the lot first came in: the bench offers the oldest lots first. */
    firstReceivedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    createdAt: createdAt(),
  },
  (t) => [
    uniqueIndex('stock_lots_part_code').on(t.partId, sql`upper(${t.code})`),
    index('stock_lots_code_upper').on(sql`upper(${t.code})`),
    check('stock_lots_code_not_blank', sql`length(trim(${t.code})) > 0`),
  ],
)
export type StockLotRow = typeof stockLots.$inferSelect

/**
 * A lot fitted into one unit at the build bench: which part, which lot, how many. An undo sets
 * `undoneAt`; rows are never deleted, so the build record and a recall see every change.
 */
export const unitLots = pgTable(
  'unit_lots',
  {
    id: id(),
    workOrderId: uuid().notNull().references(() => workOrders.id),
    partId: uuid().notNull().references(() => parts.id),
    lotId: uuid().notNull().references(() => stockLots.id),
    quantity: integer().notNull(),
    fittedBy: uuid().notNull().references(() => users.id),
    fittedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    undoneAt: timestamp({ withTimezone: true }),
    undoneBy: uuid().references(() => users.id),
  },
  (t) => [
    index().on(t.workOrderId),
    index().on(t.lotId),
    check('unit_lots_quantity_positive', sql`${t.quantity} > 0`),
    check('unit_lots_undo_has_who', sql`(${t.undoneAt} is null) = (${t.undoneBy} is null)`),
  ],
)
export type UnitLotRow = typeof unitLots.$inferSelect

/**
 * One recall notice of one lot to one customer (by e-mail address, lower case): written before the
 * e-mail is queued, so "Tell the customers" pressed twice, or by two planners, mails each customer once.
 */
export const lotRecallNotices = pgTable(
  'lot_recall_notices',
  {
    id: id(),
    lotId: uuid().notNull().references(() => stockLots.id),
    customerEmail: text().notNull(),
    mailId: uuid().references(() => mailMessages.id),
    /** The orders the notice speaks of (each gets a line on its timeline). */
    orderIds: uuid().array().notNull(),
    queuedBy: uuid().notNull().references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [unique().on(t.lotId, t.customerEmail)],
)
export type LotRecallNoticeRow = typeof lotRecallNotices.$inferSelect

export const stockLotsRelations = relations(stockLots, ({ one }) => ({
  part: one(parts, { fields: [stockLots.partId], references: [parts.id] }),
}))
export const unitLotsRelations = relations(unitLots, ({ one }) => ({
  workOrder: one(workOrders, { fields: [unitLots.workOrderId], references: [workOrders.id] }),
  lot: one(stockLots, { fields: [unitLots.lotId], references: [stockLots.id] }),
}))
