import { csvRowText, type CsvRowError } from '@kitwright/shared/csv'

/** The rows of an import file to fix, each with its row number and column. */
export function CsvRowErrors({ errors }: { errors: readonly CsvRowError[] }) {
  if (errors.length === 0) return null
  return (
    <ul role="alert" aria-label="Rows to fix" className="space-y-1 rounded-lg border border-red-300 bg-red-50 p-4 text-red-900">
      {errors.map((e, i) => (
        <li key={i}>{csvRowText(e)}</li>
      ))}
    </ul>
  )
}
