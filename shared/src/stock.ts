import { z } from 'zod'
import { LENGTH_BASE_PER_FOOT, formatLength, type Length, type LengthUnit } from './domain/units'
import { PageNumberSchema, PageOf, PageSizeSchema, SortDirSchema } from './pagination'
import { OptionalLotCodeSchema } from './lots'
import { LengthSchema, PartKindSchema } from './parts'

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

const uuid = z.string().uuid('Not a valid id')

/** One stick length of a pipe part and its balances (pipe is kept per stick length). */
export const StickBalanceSchema = z.object({
  stickLength: z.number().int(),
  onHand: z.number().int(),
  reserved: z.number().int(),
  available: z.number().int(),
})
/** One stick length of a pipe part and its balances. */
export type StickBalance = z.infer<typeof StickBalanceSchema>

/** One row of the stock page: a part and its balances, all derived from the ledger. */
export const StockRowSchema = z.object({
  partId: uuid,
  sku: z.string(),
  name: z.string(),
  kind: PartKindSchema,
  unitOfMeasure: z.string(),
  shelfLocation: z.string().nullable(),
  /** The stick lengths a pipe part is bought in (empty for other kinds). */
  stickLengths: z.array(z.number().int()),
  onHand: z.number().int(),
  reserved: z.number().int(),
  available: z.number().int(),
  reorderPoint: z.number().int(),
  reorderQuantity: z.number().int(),
  /** Available is at or below the reorder point. */
  low: z.boolean(),
  /** Pipe: balances per stick length (empty for other kinds). */
  sticks: z.array(StickBalanceSchema),
  /** Pipe: offcuts in stock, how many and their total length in base units. */
  offcuts: z.object({ count: z.number().int(), totalLength: z.number().int() }),
})
/** One row of the stock page. */
export type StockRow = z.infer<typeof StockRowSchema>

/** Columns the stock page sorts by on the server. */
export const STOCK_SORTS = ['sku', 'name', 'kind', 'shelfLocation', 'onHand', 'reserved', 'available', 'reorderPoint'] as const
/** A column the stock page sorts by. */
export type StockSort = (typeof STOCK_SORTS)[number]

const flag = z
  .union([z.boolean(), z.enum(['true', 'false', '1', '0'])])
  .transform((v) => v === true || v === 'true' || v === '1')

/** Query of the stock page and its CSV export: search, filters, sort and page. */
export const StockListQuerySchema = z.object({
  q: z.string().trim().max(100, 'Use at most 100 characters').optional().transform((v) => v || undefined),
  kind: PartKindSchema.optional(),
  lowOnly: flag.default(false),
  sort: z.enum(STOCK_SORTS).default('sku'),
  dir: SortDirSchema.default('asc'),
  page: PageNumberSchema,
  pageSize: PageSizeSchema,
})
/** Query of the stock page (parsed, defaults filled in). */
export type StockListQuery = z.infer<typeof StockListQuerySchema>

/** One page of the stock page's rows. */
export const StockPageSchema = PageOf(StockRowSchema)
/** One page of the stock page's rows. */
export type StockPage = z.infer<typeof StockPageSchema>

/** A part as the stock forms pick it: enough to choose it and its stick length. */
export const StockPartOptionSchema = z.object({
  id: uuid,
  sku: z.string(),
  name: z.string(),
  kind: PartKindSchema,
  unitOfMeasure: z.string(),
  stickLengths: z.array(z.number().int()),
  /** Received by the supplier's lot: the receiving form asks for it. */
  lotTracked: z.boolean().default(false),
})
/** A part as the stock forms pick it. */
export type StockPartOption = z.infer<typeof StockPartOptionSchema>

/** One move of the ledger as the API shows it, with the balances right after it. */
export const StockMoveSchema = z.object({
  id: uuid,
  partId: uuid,
  kind: StockMoveKindSchema,
  quantity: z.number().int(),
  stickLength: z.number().int().nullable(),
  offcutId: z.string().nullable(),
  /** The supplier's lot that moved (lot-tracked parts). */
  lotId: z.string().nullable().default(null),
  workOrderId: z.string().nullable(),
  reason: z.string().nullable(),
  reference: z.string().nullable(),
  createdAt: z.string(),
  createdBy: z.object({ id: z.string(), name: z.string() }).nullable(),
})
/** One move of the ledger. */
export type StockMove = z.infer<typeof StockMoveSchema>

/** A ledger line with the part's running balances after it, so each balance is explained by its moves. */
export const LedgerEntrySchema = StockMoveSchema.extend({
  /** The supplier's lot code of a lot-tracked move. */
  lotCode: z.string().nullable().default(null),
  onHandAfter: z.number().int(),
  reservedAfter: z.number().int(),
})
/** A ledger line with the running balances after it. */
export type LedgerEntry = z.infer<typeof LedgerEntrySchema>

/** Query of one part's ledger. */
export const StockMovesQuerySchema = z.object({
  partId: uuid,
  limit: z.coerce.number().int().min(1).max(1000, 'At most 1000 moves at once').default(200),
})
/** Query of one part's ledger. */
export type StockMovesQuery = z.infer<typeof StockMovesQuerySchema>

/** One part's ledger, newest first, with its balances. */
export const StockLedgerSchema = z.object({
  balance: StockRowSchema,
  moves: z.array(LedgerEntrySchema),
  /** How many moves the part has in all (the list may be cut at `limit`). */
  totalMoves: z.number().int(),
  /** A lot-tracked part's lots with stock, oldest first: on hand, and free (not fitted into a unit still in the shop). */
  lots: z.array(z.object({ lotId: z.string(), code: z.string(), firstReceivedAt: z.string(), onHand: z.number().int(), free: z.number().int() })).default([]),
})
/** One part's ledger, newest first, with its balances. */
export type StockLedger = z.infer<typeof StockLedgerSchema>

/** A quantity moved: a whole number from 1 up. */
export const StockQuantitySchema = z.number({ error: 'Enter a quantity' }).int('Use a whole number').min(1, 'Must be at least 1').max(1_000_000, 'At most 1 000 000 at once')
const StickLengthSchema = LengthSchema.nullish().transform((v) => v ?? null)
/** A packing-list number or other reference; blank becomes null. */
export const StockReferenceSchema = z
  .string()
  .trim()
  .max(80, 'Use at most 80 characters')
  .nullish()
  .transform((v) => (v ? v : null))

/** One line of a receipt: the part (by id or SKU), how many, the stick length for pipe, the packing-list no. */
export const ReceiveLineSchema = z
  .object({
    partId: uuid.optional(),
    sku: z.string().trim().min(1).max(40).optional(),
    quantity: StockQuantitySchema,
    stickLength: StickLengthSchema,
    reference: StockReferenceSchema,
    /** The supplier's lot on the bag or box: required for a lot-tracked part, left out for others. */
    lot: OptionalLotCodeSchema,
    /** Against a purchase order: why more than is still due came in, or why the line is closed short. */
    reason: z.string().trim().max(200, 'Use at most 200 characters').nullish().transform((v) => (v ? v : null)),
    /** Against a purchase order: the supplier sends no more of this line (needs a reason). */
    closeShort: z.boolean().default(false),
  })
  .strict()
  .refine((l) => l.partId !== undefined || l.sku !== undefined, { message: 'Choose a part (its id or SKU)', path: ['partId'] })
/** One line of a receipt. */
export type ReceiveLine = z.infer<typeof ReceiveLineSchema>

/** A receipt of goods: one or more lines, saved together or not at all. */
export const ReceiveStockSchema = z
  .object({
    lines: z.array(ReceiveLineSchema).min(1, 'Add at least one line').max(500, 'At most 500 lines at once'),
    /** The purchase order the goods came on (sent or partly received): its lines count what came in. */
    purchaseOrderId: uuid.nullish().transform((v) => v ?? null),
  })
  .strict()
/** A receipt of goods. */
export type ReceiveStock = z.infer<typeof ReceiveStockSchema>
/** A receipt of goods as typed into the form. */
export type ReceiveStockInput = z.input<typeof ReceiveStockSchema>

/** Reasons a planner usually gives for an adjustment; any other text is accepted too. */
export const ADJUST_REASON_SUGGESTIONS = ['Count correction', 'Damaged', 'Found stock', 'Returned to supplier', 'Used for repairs'] as const

/** An adjustment: a signed change of what is on hand, with the reason it is needed. */
export const AdjustStockSchema = z
  .object({
    partId: uuid,
    quantity: z
      .number({ error: 'Enter the change, e.g. -2 or 5' })
      .int('Use a whole number')
      .min(-1_000_000)
      .max(1_000_000)
      .refine((v) => v !== 0, 'The change cannot be zero: use a minus sign to take stock off'),
    stickLength: StickLengthSchema,
    /** The supplier's lot that changes: required for a lot-tracked part, left out for others. */
    lot: OptionalLotCodeSchema,
    reason: z.string({ error: 'Say why the stock changes' }).trim().min(3, 'Say why the stock changes, e.g. Count correction').max(200, 'Use at most 200 characters'),
  })
  .strict()
/** An adjustment of what is on hand. */
export type AdjustStock = z.infer<typeof AdjustStockSchema>
/** An adjustment as typed into the form. */
export type AdjustStockInput = z.input<typeof AdjustStockSchema>

/** One line to reserve or release: a part, how many, and for pipe optionally which stick length. */
export const ReservationLineSchema = z
  .object({ partId: uuid, quantity: StockQuantitySchema, stickLength: StickLengthSchema })
  .strict()
/** One line to reserve or release. */
export type ReservationLine = z.infer<typeof ReservationLineSchema>

/** A reservation: stock promised to a work order, or a manual hold when there is no work order. */
export const ReserveStockSchema = z
  .object({
    workOrderId: uuid.nullish().transform((v) => v ?? null),
    lines: z.array(ReservationLineSchema).min(1, 'Add at least one line').max(200),
    reason: z.string().trim().max(200).nullish().transform((v) => (v ? v : null)),
  })
  .strict()
/** A reservation. */
export type ReserveStock = z.infer<typeof ReserveStockSchema>

/**
 * A release of reserved stock: for a work order, everything it still holds (no lines) or the lines
 * given; without a work order, the lines given come off the manual holds.
 */
export const ReleaseStockSchema = z
  .object({
    workOrderId: uuid.nullish().transform((v) => v ?? null),
    lines: z.array(ReservationLineSchema).max(200).default([]),
    reason: z.string().trim().max(200).nullish().transform((v) => (v ? v : null)),
  })
  .strict()
  .refine((r) => r.workOrderId !== null || r.lines.length > 0, { message: 'Give the work order or the lines to release', path: ['lines'] })
/** A release of reserved stock. */
export type ReleaseStock = z.infer<typeof ReleaseStockSchema>

/** The moves a write made. */
export const StockMovesResultSchema = z.object({ moves: z.array(StockMoveSchema) })
/** The moves a write made. */
export type StockMovesResult = z.infer<typeof StockMovesResultSchema>

/**
 * A supplier packing list as CSV text. Columns (header row required, any order, case ignored):
 * `sku`, `quantity`, `stick_length` (pipe only, e.g. `10 ft`, `120 in`, `3048 mm`; a bare number is
 * read in the shop's unit) and `reference` (packing-list no., optional; `defaultReference` fills blanks).
 */
export const PackingListSchema = z
  .object({
    csv: z.string({ error: 'Paste or upload the packing list' }).min(1, 'The packing list is empty').max(500_000, 'The file is too large: at most 500 kB'),
    defaultReference: StockReferenceSchema,
    /** The purchase order the goods came on; its rows may then carry a `reason` column. */
    purchaseOrderId: uuid.nullish().transform((v) => v ?? null),
  })
  .strict()
/** A supplier packing list as CSV text. */
export type PackingList = z.infer<typeof PackingListSchema>

/** The packing-list columns Kitwright reads, in the order its template lists them. */
export const PACKING_LIST_COLUMNS = ['sku', 'quantity', 'stick_length', 'reference', 'supplier', 'purchase_order', 'reason', 'lot'] as const

/** One data row of a packing list as Kitwright read it; `row` is the line number in the file (header = 1). */
export const PackingListRowSchema = z.object({
  row: z.number().int(),
  sku: z.string(),
  partId: z.string().nullable(),
  partName: z.string().nullable(),
  quantity: z.number().int().nullable(),
  stickLength: z.number().int().nullable(),
  reference: z.string().nullable(),
  /** The purchase order the row is received against (the file's column, or the one chosen), when any. */
  purchaseOrderNumber: z.string().nullable().default(null),
  /** Why more than is still due came in. */
  reason: z.string().nullable().default(null),
  /** The supplier's lot (lot-tracked parts). */
  lot: z.string().nullable().default(null),
  errors: z.array(z.string()),
})
/** One data row of a packing list as Kitwright read it. */
export type PackingListRow = z.infer<typeof PackingListRowSchema>

/** What a packing list would receive, and every row's problems, before anything is saved. */
export const PackingListPreviewSchema = z.object({
  rows: z.array(PackingListRowSchema),
  /** Problems of the file as a whole (missing columns, no rows). */
  fileErrors: z.array(z.string()),
  /** Every problem as `Row N: …`, file problems first. */
  errors: z.array(z.string()),
  ok: z.boolean(),
})
/** What a packing list would receive, before anything is saved. */
export type PackingListPreview = z.infer<typeof PackingListPreviewSchema>

/**
 * A stick length as a shop says it: whole feet as `10 ft` in an inch shop, otherwise the usual
 * display of the shop's unit (`118-1/2"`, `3048.0 mm`).
 */
export function formatStickLength(value: Length, unit: LengthUnit): string {
  if (unit === 'in' && value > 0 && value % LENGTH_BASE_PER_FOOT === 0) return `${value / LENGTH_BASE_PER_FOOT} ft`
  return formatLength(value, unit)
}
