import type { ReactNode } from 'react'
import { EmptyRow, PlainTable, rowClass } from '../../../components/ui/plain-table'

/**
 * A plain table of a report's numbers: the header, then one row per line. The `numeric` columns
 * are right-aligned (by default every column but the first).
 */
export function NumbersTable({ label, header, rows, empty, numeric }: { label: string; header: string[]; rows: ReactNode[][]; empty: string; numeric?: number[] }) {
  const right = (i: number) => (numeric ? numeric.includes(i) : i > 0)
  return (
    <PlainTable label={label} headers={header.map((h, i) => ({ label: h, key: h, numeric: right(i) }))} className="text-sm">
      {rows.map((row, r) => (
        <tr key={r} className={rowClass()}>
          {row.map((cell, i) => (
            <td key={i} className={right(i) ? 'px-3 py-1.5 text-right tabular-nums' : 'px-3 py-1.5'}>
              {cell}
            </td>
          ))}
        </tr>
      ))}
      {rows.length === 0 && <EmptyRow columns={header.length}>{empty}</EmptyRow>}
    </PlainTable>
  )
}
