import Papa from 'papaparse'
import { parseLength, type LengthUnit } from '@kitwright/shared/domain/units'

/** One data row of a packing list, read but not yet checked against the parts. */
export interface PackingListLine {
  /** Line in the file, the header being row 1 (what a spreadsheet shows). */
  row: number
  sku: string
  quantity: number | null
  stickLength: number | null
  reference: string | null
  /** The supplier the row names (checked against the suppliers), the purchase order it came on, and why it is more than due. */
  supplier: string | null
  purchaseOrder: string | null
  reason: string | null
  /** The supplier's lot (lot-tracked parts). */
  lot: string | null
  /** The stick length cell held something that is not a length (already among the errors). */
  stickLengthUnreadable: boolean
  errors: string[]
}

export interface ReadPackingList {
  lines: PackingListLine[]
  fileErrors: string[]
}

/** Header words suppliers use for each column we read; matching ignores case, spaces, dashes and dots. */
const COLUMN_ALIASES = {
  sku: ['sku', 'part', 'part_sku', 'item', 'item_no'],
  quantity: ['quantity', 'qty', 'quantity_shipped', 'shipped'],
  stick_length: ['stick_length', 'length', 'stick'],
  reference: ['reference', 'ref', 'packing_list', 'packing_list_no', 'delivery_note'],
  supplier: ['supplier', 'vendor'],
  purchase_order: ['purchase_order', 'po', 'po_number', 'purchase_order_no'],
  reason: ['reason', 'note'],
  lot: ['lot', 'lot_no', 'lot_number', 'lot_code', 'batch', 'batch_no'],
} as const
type Column = keyof typeof COLUMN_ALIASES

/** Most rows one packing list may hold. */
export const MAX_PACKING_LIST_ROWS = 2000

function normaliseHeader(h: string) {
  return h.replace(/^\ufeff/, '').trim().toLowerCase().replace(/[\s.\-#]+/g, '_').replace(/^_+|_+$/g, '')
}

/**
 * Reads a supplier packing list: the header row names the columns (any order, extra columns
 * ignored), every other non-blank row is one line. Each problem is kept with the row it is on.
 */
export function readPackingList(csv: string, defaultReference: string | null, unit: LengthUnit): ReadPackingList {
  // NUL bytes mean binary or UTF-16 text, not a CSV; the database could not even look such a SKU up.
  if (csv.includes('\u0000')) return { lines: [], fileErrors: ['The file holds NUL bytes, so it is not CSV text: save it from the spreadsheet as "CSV UTF-8" and upload that'] }
  const parsed = Papa.parse<string[]>(csv.replace(/^\ufeff/, ''), { header: false, skipEmptyLines: false })
  const records = parsed.data
  const fileErrors: string[] = []
  const header = (records[0] ?? []).map(normaliseHeader)
  const index = {} as Record<Column, number>
  for (const column of Object.keys(COLUMN_ALIASES) as Column[]) {
    index[column] = header.findIndex((h) => (COLUMN_ALIASES[column] as readonly string[]).includes(h))
  }
  for (const required of ['sku', 'quantity'] as const) {
    if (index[required] < 0) {
      const found = header.filter((h) => h !== '').join(', ') || 'nothing'
      fileErrors.push(`The packing list needs a header row with a "${required}" column (found: ${found}). Columns: sku, quantity, stick_length, reference.`)
    }
  }
  if (fileErrors.length > 0) return { lines: [], fileErrors }

  // Papa's row numbers count records from 0, the header included.
  const parseErrors = new Map<number, string[]>()
  for (const e of parsed.errors) {
    if (e.row === undefined) continue
    parseErrors.set(e.row, [...(parseErrors.get(e.row) ?? []), `The row cannot be read as CSV: ${e.message}`])
  }

  const lines: PackingListLine[] = []
  records.forEach((record, i) => {
    if (i === 0 || record.every((cell) => cell.trim() === '')) return
    const cell = (column: Column) => (index[column] >= 0 ? (record[index[column]] ?? '').trim() : '')
    const errors = [...(parseErrors.get(i) ?? [])]
    const sku = cell('sku')
    if (sku === '') errors.push('The SKU is empty')
    const qtyText = cell('quantity')
    let quantity: number | null = null
    if (!/^\d+$/.test(qtyText) || Number(qtyText) < 1) errors.push(`The quantity must be a whole number of at least 1 (found "${qtyText}")`)
    else if (Number(qtyText) > 1_000_000) errors.push('The quantity is over 1 000 000: check the row')
    else quantity = Number(qtyText)
    const lengthText = cell('stick_length')
    let stickLength: number | null = null
    const length = lengthText === '' ? null : parseLength(lengthText, unit)
    if (length?.ok) stickLength = length.value
    else if (length) errors.push(`Stick length "${lengthText}": ${length.message}`)
    const reference = cell('reference') || defaultReference
    if (reference && reference.length > 80) errors.push('The reference is longer than 80 characters')
    const reason = cell('reason')
    if (reason.length > 200) errors.push('The reason is longer than 200 characters')
    const lot = cell('lot')
    if (lot.length > 40) errors.push('The lot is longer than 40 characters')
    else if (/[\u0000-\u001f\u007f]/.test(lot)) errors.push('The lot holds control characters: type it again')
    lines.push({
      row: i + 1,
      sku,
      quantity,
      stickLength,
      reference: reference || null,
      supplier: cell('supplier') || null,
      purchaseOrder: cell('purchase_order') || null,
      reason: reason || null,
      lot: lot || null,
      stickLengthUnreadable: length?.ok === false, errors })
  })
  if (lines.length === 0) fileErrors.push('The packing list has no rows under its header')
  if (lines.length > MAX_PACKING_LIST_ROWS) fileErrors.push(`The packing list has ${lines.length} rows; split it into files of at most ${MAX_PACKING_LIST_ROWS}`)
  return { lines, fileErrors }
}
