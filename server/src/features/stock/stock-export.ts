import Papa from 'papaparse'
import { neutraliseCsvCell } from '@kitwright/shared/csv'
import type { LengthUnit } from '@kitwright/shared/domain/units'
import { PART_KIND_LABELS } from '@kitwright/shared/parts'
import { formatLength } from '@kitwright/shared/domain/units'
import { formatStickLength, type StockRow } from '@kitwright/shared/stock'

export const STOCK_EXPORT_HEADER = [
  'SKU', 'Name', 'Kind', 'Shelf', 'Unit', 'On hand', 'Reserved', 'Available', 'Reorder point', 'Reorder quantity', 'Low', 'Sticks', 'Offcuts', 'Offcut length',
]

/** The stock page as CSV: one row per part, text cells neutralised, numbers as numbers. */
export function stockCsv(rows: StockRow[], unit: LengthUnit): string {
  const data = rows.map((r) => [
    r.sku, r.name, PART_KIND_LABELS[r.kind], r.shelfLocation ?? '', r.unitOfMeasure,
    r.onHand, r.reserved, r.available, r.reorderPoint, r.reorderQuantity, r.low ? 'yes' : 'no',
    r.sticks.map((s) => `${formatStickLength(s.stickLength, unit)}: ${s.onHand} on hand, ${s.available} available`).join('; '),
    r.kind === 'stock_length' ? r.offcuts.count : '',
    r.kind === 'stock_length' && r.offcuts.count > 0 ? formatLength(r.offcuts.totalLength, unit) : '',
  ].map((cell) => (typeof cell === 'string' ? neutraliseCsvCell(cell) : cell)))
  // A byte-order mark so spreadsheet programs read the file as UTF-8 (½, ×, accents in names).
  return '\ufeff' + Papa.unparse({ fields: STOCK_EXPORT_HEADER, data }, { newline: '\r\n' })
}
