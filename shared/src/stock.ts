import { z } from 'zod'

/** The kinds of move in the stock ledger. */
export const STOCK_MOVE_KINDS = ['receive', 'adjust', 'reserve', 'release', 'consume', 'offcut_in', 'offcut_out', 'ship'] as const
/** A kind of stock move. */
export const StockMoveKindSchema = z.enum(STOCK_MOVE_KINDS)
/** A kind of stock move. */
export type StockMoveKind = z.infer<typeof StockMoveKindSchema>

/** Kinds that change what is on hand; the others (reserve, release) change what is promised. */
export const ON_HAND_MOVE_KINDS: readonly StockMoveKind[] = ['receive', 'adjust', 'consume', 'offcut_in', 'offcut_out', 'ship']

/** Where an offcut is in its life. */
export const OFFCUT_STATUSES = ['in_stock', 'reserved', 'used', 'scrapped'] as const
