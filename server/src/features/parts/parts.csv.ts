import Papa from 'papaparse'
import { neutraliseCsvCell, restoreCsvCell } from '@kitwright/shared/csv'
import { PART_CSV_COLUMNS, partToCsvRecord, REQUIRED_PART_CSV_COLUMNS, type PartCsvColumn, type PartCsvError, type PartCsvRecord } from '@kitwright/shared/parts-csv'
import type { LengthUnit } from '@kitwright/shared/domain/units'
import type { Part } from '@kitwright/shared/parts'

/** A data row of an import file: its row number in the file (header = 1) and its cells by column. */
export interface CsvRow {
  row: number
  record: PartCsvRecord
}

export interface ReadCsv {
  /** The columns the file has, so an update can leave the others as they are. */
  columns: PartCsvColumn[]
  rows: CsvRow[]
  errors: PartCsvError[]
}

function headerName(cell: string) {
  return cell.trim().toLowerCase().replace(/[\s-]+/g, '_')
}

/**
 * Splits an import file into rows with papaparse. Row numbers are the file's records counting the
 * header as 1; blank lines keep their number (so the numbers match a spreadsheet) but hold no part.
 */
export function readPartsCsv(text: string): ReadCsv {
  const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), { header: false, skipEmptyLines: false, delimitersToGuess: [',', ';', '\t'] })
  const errors: PartCsvError[] = []
  for (const e of parsed.errors) {
    // With one column only papaparse cannot tell the delimiter; it falls back to a comma, which is right.
    if (e.code === 'UndetectableDelimiter') continue
    errors.push({ row: (e.row ?? 0) + 1, column: null, message: `${e.message}; quote cells that hold commas, quotes or line breaks` })
  }
  const [header = [], ...data] = parsed.data
  const known = new Set<string>(PART_CSV_COLUMNS)
  const columns: PartCsvColumn[] = []
  header.forEach((cell, i) => {
    const name = headerName(cell)
    if (!known.has(name)) errors.push({ row: 1, column: cell, message: `Unknown column "${cell}" (column ${i + 1}); use ${PART_CSV_COLUMNS.join(', ')}` })
    else if (columns.includes(name as PartCsvColumn)) errors.push({ row: 1, column: name, message: `The column "${name}" appears twice` })
    columns.push(name as PartCsvColumn)
  })
  for (const required of REQUIRED_PART_CSV_COLUMNS) {
    if (!columns.includes(required)) errors.push({ row: 1, column: required, message: `The header needs a "${required}" column` })
  }
  if (errors.some((e) => e.row === 1)) return { columns, rows: [], errors }

  const rows: CsvRow[] = []
  data.forEach((cells, i) => {
    const row = i + 2
    if (cells.every((c) => c.trim() === '')) return
    if (cells.length !== columns.length) {
      errors.push({ row, column: null, message: `The row has ${cells.length} cells but the header has ${columns.length}; check for a missing or extra comma` })
      return
    }
    const record: PartCsvRecord = {}
    columns.forEach((c, j) => {
      record[c] = restoreCsvCell(cells[j] ?? '')
    })
    rows.push({ row, record })
  })
  if (rows.length === 0 && errors.length === 0) errors.push({ row: 1, column: null, message: 'The file has a header but no parts below it' })
  return { columns, rows, errors }
}

/** All parts as a CSV file, lengths exact in the shop's unit, cells safe to open in a spreadsheet. */
export function writePartsCsv(parts: Part[], unit: LengthUnit): string {
  const data = parts.map((p) => {
    const record = partToCsvRecord(p, unit)
    return PART_CSV_COLUMNS.map((c) => neutraliseCsvCell(record[c]))
  })
  // The byte-order mark lets spreadsheets read the file as UTF-8 (part names hold ° and ×).
  return `\uFEFF${Papa.unparse({ fields: [...PART_CSV_COLUMNS], data }, { newline: '\r\n' })}\r\n`
}
