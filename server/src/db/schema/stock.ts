import { sql } from 'drizzle-orm'
import { check, index, integer, pgEnum, pgSequence, pgTable, text, uuid } from 'drizzle-orm/pg-core'
import { OFFCUT_STATUSES, STOCK_MOVE_KINDS } from '@kitwright/shared/stock'
import { createdAt, id } from './columns'
import { stockLots } from './lots'
import { parts } from './parts'
import { users } from './users'

export const stockMoveKindEnum = pgEnum('stock_move_kind', STOCK_MOVE_KINDS)
export const offcutStatusEnum = pgEnum('offcut_status', OFFCUT_STATUSES)

/** Numbers of offcut labels, shop-wide and never reused. */
export const offcutCodeSeq = pgSequence('offcut_code_seq', { startWith: 1 })

/** A remnant of pipe at or above the shop's minimum, kept in stock with its own length and label. */
export const offcuts = pgTable(
  'offcuts',
  {
    id: id(),
    /**
     * The code on its label, `OC-` and a number from a sequence: unique by construction (a unique
     * constraint besides), short enough for a Code 128 on a 2 × 1 in label.
     */
    code: text()
      .notNull()
      .unique()
      .default(sql`'OC-' || lpad(nextval('offcut_code_seq')::text, 6, '0')`),
    partId: uuid().notNull().references(() => parts.id),
    length: integer().notNull(),
    status: offcutStatusEnum().notNull().default('in_stock'),
    note: text(),
    createdAt: createdAt(),
  },
  (t) => [index().on(t.partId, t.status), check('offcuts_length_positive', sql`${t.length} > 0`)],
)
export type OffcutRow = typeof offcuts.$inferSelect

/**
 * The stock ledger: one row per move, never updated or deleted. `quantity` is a signed change:
 * receive, adjust, consume, offcut_in, offcut_out and ship change what is on hand; reserve and
 * release change what is promised to work orders. Balances are sums (see stock.queries.ts).
 * For pipe, `stickLength` says which stick length moved (on-hand is kept per stick length).
 */
export const stockMoves = pgTable(
  'stock_moves',
  {
    id: id(),
    partId: uuid().notNull().references(() => parts.id),
    kind: stockMoveKindEnum().notNull(),
    quantity: integer().notNull(),
    stickLength: integer(),
    offcutId: uuid().references(() => offcuts.id),
    /** The supplier's lot that moved, for a lot-tracked part (stock per lot is the sum of its moves). */
    lotId: uuid().references(() => stockLots.id),
    /** Work order the move is for (reservations, consumption); the FK arrives with work orders. */
    workOrderId: uuid(),
    /** Why: required for adjustments; the supplier's packing-list number for receipts. */
    reason: text(),
    reference: text(),
    createdBy: uuid().references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [
    index().on(t.partId, t.kind),
    index().on(t.workOrderId),
    index().on(t.createdAt),
    index().on(t.lotId),
    check('stock_moves_quantity_not_zero', sql`${t.quantity} <> 0`),
    check(
      'stock_moves_sign_by_kind',
      sql`(${t.kind} in ('receive', 'offcut_in', 'reserve') and ${t.quantity} > 0)
        or (${t.kind} in ('consume', 'offcut_out', 'ship', 'release') and ${t.quantity} < 0)
        or ${t.kind} = 'adjust'`,
    ),
    check('stock_moves_adjust_has_reason', sql`${t.kind} <> 'adjust' or coalesce(${t.reason}, '') <> ''`),
  ],
)
export type StockMoveRow = typeof stockMoves.$inferSelect
export type NewStockMoveRow = typeof stockMoves.$inferInsert
