import Papa from 'papaparse'
import { NewOrderSchema, type NewOrder, type NewOrderDraft } from '@kitwright/shared/orders'
import {
  ORDER_CSV_COLUMNS,
  ORDER_CSV_EXPORT_ONLY_COLUMNS,
  REQUIRED_ORDER_CSV_COLUMNS,
  type OrderCsvColumn,
  type OrderCsvError,
} from '@kitwright/shared/orders-csv'
import { neutraliseCsvCell, restoreCsvCell } from '@kitwright/shared/csv'
import { parseDollars } from '@kitwright/shared/parts-csv'

type OrderRecord = Partial<Record<OrderCsvColumn, string>>

/** An order read from the file: its rows, and the order when every row of it reads cleanly. */
export interface CsvOrder {
  number: string
  /** The file rows of its lines, in line order. */
  rows: number[]
  customerName: string
  input: NewOrder | null
}

export interface ReadOrdersCsv {
  orders: CsvOrder[]
  errors: OrderCsvError[]
}

/** Columns that belong to the order (repeated on each of its rows); the others describe the line. */
const ORDER_COLUMNS: readonly OrderCsvColumn[] = ORDER_CSV_COLUMNS.filter(
  (c) => !['kit_sku', 'store_product_id', 'description', 'quantity', 'unit_price'].includes(c),
)

/** Where each field of a new order is in the file, to point a rule's complaint at the right cell. */
const FIELD_COLUMNS: Record<string, OrderCsvColumn> = {
  number: 'order_number',
  placedAt: 'placed_at',
  promisedShipDate: 'promised_ship_date',
  'customer.name': 'customer_name',
  'customer.email': 'customer_email',
  'customer.phone': 'customer_phone',
  'shipTo.name': 'ship_name',
  'shipTo.line1': 'ship_line1',
  'shipTo.line2': 'ship_line2',
  'shipTo.city': 'ship_city',
  'shipTo.region': 'ship_region',
  'shipTo.postalCode': 'ship_postal_code',
  'shipTo.country': 'ship_country',
  currency: 'currency',
  paymentStatus: 'payment_status',
  note: 'note',
  kitSku: 'kit_sku',
  storeProductId: 'store_product_id',
  description: 'description',
  quantity: 'quantity',
  unitPriceCents: 'unit_price',
}

function headerName(cell: string) {
  return cell.trim().toLowerCase().replace(/[\s-]+/g, '_')
}

/** A placed date as a file holds it: an ISO date-time, or a bare date read as midnight UTC. */
function placedAtText(text: string) {
  return /^\d{4}-\d{2}-\d{2}$/.test(text) ? `${text}T00:00:00Z` : text
}

type Group = { row: number; record: OrderRecord }[]

/** The header's cells as known columns (null for an export-only or bad cell), with what is wrong with it. */
function readHeader(header: string[], errors: OrderCsvError[]): (OrderCsvColumn | null)[] {
  const known = new Set<string>(ORDER_CSV_COLUMNS)
  const ignored = new Set<string>(ORDER_CSV_EXPORT_ONLY_COLUMNS)
  const columns: (OrderCsvColumn | null)[] = []
  header.forEach((cell, i) => {
    const name = headerName(cell)
    if (ignored.has(name)) columns.push(null)
    else if (!known.has(name)) {
      errors.push({ row: 1, column: cell, message: `Unknown column "${cell}" (column ${i + 1}); use ${ORDER_CSV_COLUMNS.join(', ')}` })
      columns.push(null)
    } else if (columns.includes(name as OrderCsvColumn)) {
      errors.push({ row: 1, column: name, message: `The column "${name}" appears twice` })
      columns.push(null)
    } else columns.push(name as OrderCsvColumn)
  })
  for (const required of REQUIRED_ORDER_CSV_COLUMNS) {
    if (!columns.includes(required)) errors.push({ row: 1, column: required, message: `The header needs a "${required}" column` })
  }
  if (!columns.includes('kit_sku') && !columns.includes('store_product_id')) {
    errors.push({ row: 1, column: 'kit_sku', message: 'The header needs a "kit_sku" column (or "store_product_id") to say what each line is' })
  }
  return columns
}

/** The data rows grouped by order number, skipping blank rows and reporting malformed ones. */
function groupRows(data: string[][], width: number, columns: (OrderCsvColumn | null)[], errors: OrderCsvError[]): Map<string, Group> {
  const groups = new Map<string, Group>()
  data.forEach((cells, i) => {
    const row = i + 2
    if (cells.every((c) => c.trim() === '')) return
    if (cells.length !== width) {
      errors.push({ row, column: null, message: `The row has ${cells.length} cells but the header has ${width}; check for a missing or extra comma` })
      return
    }
    const record: OrderRecord = {}
    columns.forEach((c, j) => {
      if (c) record[c] = restoreCsvCell(cells[j] ?? '').trim()
    })
    const number = record.order_number ?? ''
    if (number === '') {
      errors.push({ row, column: 'order_number', message: 'Enter the order number (repeat it on every line of the order)' })
      return
    }
    groups.set(number, [...(groups.get(number) ?? []), { row, record }])
  })
  if (groups.size === 0 && errors.length === 0) errors.push({ row: 1, column: null, message: 'The file has a header but no order lines below it' })
  return groups
}

/** The order's lines as the form would send them; a quantity or price that does not read is reported. */
function linesOf(rows: Group, orderErrors: OrderCsvError[]): NewOrderDraft['lines'] {
  return rows.map(({ row, record }) => {
    const quantityText = record.quantity ?? ''
    const priceText = record.unit_price ?? ''
    const price = parseDollars(priceText)
    if (!/^\d{1,6}$/.test(quantityText)) orderErrors.push({ row, column: 'quantity', message: `Write the quantity as a whole number, e.g. 2 (found "${quantityText}")` })
    if (price === null) orderErrors.push({ row, column: 'unit_price', message: `Write the unit price in dollars and cents, e.g. 189.00 (found "${priceText}")` })
    return {
      kitSku: record.kit_sku || undefined,
      storeProductId: record.store_product_id || undefined,
      description: record.description || undefined,
      quantity: Number(quantityText) || 0,
      unitPriceCents: price ?? 0,
    }
  })
}

/** The order as the form would send it, from the order fields of its first row. */
function draftOf(number: string, cell: (c: OrderCsvColumn) => string, lines: NewOrderDraft['lines']): NewOrderDraft {
  return {
    number,
    customer: { name: cell('customer_name'), email: cell('customer_email'), phone: cell('customer_phone') || undefined },
    shipTo: {
      // A blank ship-to name ships to the customer.
      name: cell('ship_name') || cell('customer_name'),
      line1: cell('ship_line1'),
      line2: cell('ship_line2') || undefined,
      city: cell('ship_city'),
      region: cell('ship_region') || undefined,
      postalCode: cell('ship_postal_code'),
      country: cell('ship_country'),
    },
    placedAt: placedAtText(cell('placed_at')),
    promisedShipDate: cell('promised_ship_date') || undefined,
    note: cell('note') || undefined,
    paymentStatus: (cell('payment_status').toLowerCase() || undefined) as NewOrderDraft['paymentStatus'],
    currency: cell('currency') || 'USD',
    lines,
  }
}

/** One order's rows read and checked with the form's rules; every complaint points at its row and cell. */
function readOrder(number: string, rows: Group): { order: CsvOrder; errors: OrderCsvError[] } {
  const first = rows[0]!
  const orderErrors: OrderCsvError[] = []
  for (const { row, record } of rows.slice(1)) {
    for (const c of ORDER_COLUMNS) {
      if ((record[c] ?? '') !== (first.record[c] ?? '')) {
        orderErrors.push({ row, column: c, message: `Order ${number}: ${c} differs from row ${first.row}; repeat the order's fields exactly on each of its lines` })
      }
    }
  }
  const cell = (c: OrderCsvColumn) => first.record[c] ?? ''
  const result = NewOrderSchema.safeParse(draftOf(number, cell, linesOf(rows, orderErrors)))
  if (!result.success) {
    const done = new Set(orderErrors.map((e) => `${e.row}|${e.column}`))
    for (const issue of result.error.issues) {
      const [head, index, field] = issue.path
      const lineRow = head === 'lines' && typeof index === 'number' ? rows[index]?.row : undefined
      const row = lineRow ?? first.row
      const key = lineRow !== undefined ? String(field ?? 'kitSku') : issue.path.join('.')
      const column = FIELD_COLUMNS[key] ?? null
      const message = issue.path[0] === 'placedAt' ? `Write the placed date as 2026-03-01 or 2026-03-01T14:30:00Z (found "${cell('placed_at')}")` : issue.message
      // A cell already reported (e.g. an unreadable price) is not reported again by the order rules.
      if (done.has(`${row}|${column}`)) continue
      done.add(`${row}|${column}`)
      orderErrors.push({ row, column, message })
    }
  }
  const order = { number, rows: rows.map((r) => r.row), customerName: cell('customer_name'), input: orderErrors.length === 0 && result.success ? result.data : null }
  return { order, errors: orderErrors }
}

/**
 * Reads an orders file with papaparse: one row per order line, rows of one order grouped by its
 * number (they need not be next to each other), each order checked with the same rules as the form.
 * Row numbers count the header as 1, so they match a spreadsheet.
 */
export function readOrdersCsv(text: string): ReadOrdersCsv {
  const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), { header: false, skipEmptyLines: false, delimitersToGuess: [',', ';', '\t'] })
  const errors: OrderCsvError[] = []
  for (const e of parsed.errors) {
    if (e.code === 'UndetectableDelimiter') continue
    errors.push({ row: (e.row ?? 0) + 1, column: null, message: `${e.message}; quote cells that hold commas, quotes or line breaks` })
  }
  const [header = [], ...data] = parsed.data
  const columns = readHeader(header, errors)
  if (errors.some((e) => e.row === 1)) return { orders: [], errors }

  const orders: CsvOrder[] = []
  for (const [number, rows] of groupRows(data, header.length, columns, errors)) {
    const read = readOrder(number, rows)
    errors.push(...read.errors)
    orders.push(read.order)
  }
  errors.sort((a, b) => a.row - b.row)
  return { orders, errors }
}

/** One order line of the export, with its order's fields. */
export interface OrderExportLine {
  record: Record<OrderCsvColumn | (typeof ORDER_CSV_EXPORT_ONLY_COLUMNS)[number], string>
}

/** Order lines as a CSV file (one row per line), every cell safe to open in a spreadsheet. */
export function writeOrdersCsv(lines: OrderExportLine[]): string {
  const fields = [...ORDER_CSV_COLUMNS, ...ORDER_CSV_EXPORT_ONLY_COLUMNS]
  const data = lines.map((l) => fields.map((f) => neutraliseCsvCell(l.record[f])))
  return `\uFEFF${Papa.unparse({ fields, data }, { newline: '\r\n' })}\r\n`
}
