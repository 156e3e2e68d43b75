import { z } from 'zod'
import { CsvRowErrorSchema } from './csv'

/**
 * The columns of an orders CSV: one row per order line, the order's own fields repeated on each of
 * its rows. Import matches headers ignoring case and surrounding spaces, in any order; the export
 * writes these columns then {@link ORDER_CSV_EXPORT_ONLY_COLUMNS}, which import reads past, so an
 * exported file imports back. See docs/csv-orders.md.
 */
export const ORDER_CSV_COLUMNS = [
  'order_number',
  'placed_at',
  'promised_ship_date',
  'customer_name',
  'customer_email',
  'customer_phone',
  'ship_name',
  'ship_line1',
  'ship_line2',
  'ship_city',
  'ship_region',
  'ship_postal_code',
  'ship_country',
  'currency',
  'payment_status',
  'note',
  'kit_sku',
  'store_product_id',
  'description',
  'quantity',
  'unit_price',
] as const
/** A column an orders CSV import reads. */
export type OrderCsvColumn = (typeof ORDER_CSV_COLUMNS)[number]

/**
 * Columns the export adds for the reader; import ignores them. `status`, `source` and `payment` are
 * the words shown on screen; `status_code` and `source_code` carry the codes for a program reading the
 * file (`payment_status`, an import column, already holds the payment code).
 */
export const ORDER_CSV_EXPORT_ONLY_COLUMNS = ['status', 'status_code', 'source', 'source_code', 'payment', 'line_total'] as const

/** Columns an import file must have; `kit_sku` or `store_product_id` must be there too. */
export const REQUIRED_ORDER_CSV_COLUMNS: readonly OrderCsvColumn[] = [
  'order_number',
  'placed_at',
  'customer_name',
  'customer_email',
  'ship_line1',
  'ship_city',
  'ship_postal_code',
  'ship_country',
  'quantity',
  'unit_price',
]

/** The body of an import or its preview: the file's text. */
export const OrderCsvBodySchema = z
  .object({ csv: z.string({ error: 'Choose or paste a CSV file' }).min(1, 'Choose or paste a CSV file').max(900_000, 'The file is too large; import at most about 3 000 lines at a time') })
  .strict()
/** The body of an import or its preview. */
export type OrderCsvBody = z.infer<typeof OrderCsvBodySchema>

/** Something to fix (or note) in an import file: the row as in the file (header = row 1), and the column if known. */
export const OrderCsvErrorSchema = CsvRowErrorSchema
/** Something to fix in an import file. */
export type OrderCsvError = z.infer<typeof OrderCsvErrorSchema>

/** What importing a file would do, order by order; nothing is written while `errors` is not empty. */
export const OrderImportPreviewSchema = z.object({
  orders: z.array(
    z.object({
      number: z.string(),
      /** The file rows that hold this order's lines. */
      rows: z.array(z.number().int().min(2)),
      customerName: z.string(),
      lineCount: z.number().int(),
      units: z.number().int(),
      totalCents: z.number().int(),
      /** Create the order, or skip it because its number is already stored; null when its rows have errors. */
      action: z.enum(['create', 'skip']).nullable(),
    }),
  ),
  errors: z.array(OrderCsvErrorSchema),
  /** Worth knowing but no reason to refuse: e.g. a store product that maps to no kit (kept and flagged). */
  warnings: z.array(OrderCsvErrorSchema),
  creates: z.number().int().min(0),
  skips: z.number().int().min(0),
})
/** What importing a file would do. */
export type OrderImportPreview = z.infer<typeof OrderImportPreviewSchema>

/** What an import did: the numbers created, and those skipped because they were already stored. */
export const OrderImportResultSchema = z.object({
  created: z.array(z.string()),
  skipped: z.array(z.string()),
})
/** What an import did. */
export type OrderImportResult = z.infer<typeof OrderImportResultSchema>
