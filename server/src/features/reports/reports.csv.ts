import Papa from 'papaparse'
import { neutraliseCsvCell } from '@kitwright/shared/csv'

/** One cell of a report's CSV: text (made safe for spreadsheets), a number, or empty. */
export type CsvCell = string | number | null

/** A report as a table: the header and one row per line. */
export interface CsvTable {
  header: string[]
  rows: CsvCell[][]
}

/**
 * A table as CSV text: text cells that could start a spreadsheet formula get a leading `'`
 * (neutraliseCsvCell, after OWASP "CSV Injection"), numbers stay numbers, empty cells are empty;
 * with a byte-order mark so spreadsheet programs read it as UTF-8, and CRLF line ends (RFC 4180).
 */
export function tableCsv(table: CsvTable): string {
  const data = table.rows.map((row) => row.map((cell) => (cell === null ? '' : typeof cell === 'string' ? neutraliseCsvCell(cell) : cell)))
  return '\ufeff' + Papa.unparse({ fields: table.header.map(neutraliseCsvCell), data }, { newline: '\r\n' })
}

/** A share (0–1) as a percentage with one decimal, for a CSV cell. */
export function percentCell(share: number | null): number | null {
  return share === null ? null : Math.round(share * 1000) / 10
}

/** A number of days with one decimal, for a CSV cell. */
export function daysCell(days: number | null): number | null {
  return days === null ? null : Math.round(days * 10) / 10
}
