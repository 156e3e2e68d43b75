import type { ReactNode } from 'react'
import { cn } from '../../lib/cn'
import { PlainTable, rowClass } from './plain-table'

/** One column of an import preview: its heading and what a row shows in it. */
export interface PreviewColumn<T> {
  header: string
  cell: (row: T) => ReactNode
  /** Extra classes of the cell: `tabular-nums` for figures, `font-bold` for the key. */
  className?: string
}

/**
 * What a CSV import would do, row by row, before anything is saved: rows with problems are tinted
 * red so the user fixes them first. The orders, parts and packing-list imports all show this table.
 */
export function PreviewTable<T>({ rows, columns, rowKey, flagged, label = 'Import preview' }: {
  rows: readonly T[]
  columns: PreviewColumn<T>[]
  rowKey: (row: T) => string | number
  flagged: (row: T) => boolean
  label?: string
}) {
  return (
    <PlainTable label={label} headers={columns.map((c) => c.header)}>
      {rows.map((row) => (
        <tr key={rowKey(row)} className={rowClass(flagged(row))}>
          {columns.map((c) => (
            <td key={c.header} className={cn('px-3 py-2', c.className)}>
              {c.cell(row)}
            </td>
          ))}
        </tr>
      ))}
    </PlainTable>
  )
}
