import { z } from 'zod'

/** One thing to fix in an import file: its row (the header is row 1), its column, and what to do. */
export const CsvRowErrorSchema = z.object({ row: z.number().int().min(1), column: z.string().nullable(), message: z.string() })
/** One thing to fix in an import file. */
export type CsvRowError = z.infer<typeof CsvRowErrorSchema>

/**
 * The key of one row error in a 400 answer's `fields` (`rows.3.unit_cost`), and back. The import
 * endpoint answers with the one error shape of the API, so row errors travel as fields.
 */
export function csvErrorKey(e: CsvRowError): string {
  return `rows.${e.row}.${e.column ?? '_'}`
}
/** Reads row errors back from a 400 answer's `fields`; other keys are ignored. */
export function csvErrorsFromFields(fields: Record<string, string>): CsvRowError[] {
  const out: CsvRowError[] = []
  for (const [key, message] of Object.entries(fields)) {
    const m = /^rows\.(\d+)\.(.+)$/.exec(key)
    if (m) out.push({ row: Number(m[1]), column: m[2] === '_' ? null : m[2]!, message })
  }
  return out.sort((a, b) => a.row - b.row)
}

// OWASP, CSV Injection: a cell starting with = + - @ tab or carriage return may run as a formula in a
// spreadsheet; prefixing a single quote makes the spreadsheet show it as text.
const FORMULA_START = /^[=+\-@\t\r]/

/** A cell made safe to open in a spreadsheet: text that could start a formula gets a leading `'`. */
export function neutraliseCsvCell(value: string): string {
  return FORMULA_START.test(value) ? `'${value}` : value
}

/** Undoes {@link neutraliseCsvCell} on import, so an exported file imports back unchanged. */
export function restoreCsvCell(value: string): string {
  return value.startsWith("'") && FORMULA_START.test(value.slice(1)) ? value.slice(1) : value
}


/** A row error as people read it: `Row 4, quantity: Use a whole number`. */
export function csvRowText(e: CsvRowError): string {
  return `Row ${e.row}${e.column ? `, ${e.column}` : ''}: ${e.message}`
}
