import type { ReactNode } from 'react'

/**
 * A plain table of a report's numbers: the header, then one row per line. The `numeric` columns
 * are right-aligned (by default every column but the first).
 */
export function NumbersTable({ label, header, rows, empty, numeric }: { label: string; header: string[]; rows: ReactNode[][]; empty: string; numeric?: number[] }) {
  const right = (i: number) => (numeric ? numeric.includes(i) : i > 0)
  return (
    <div className="overflow-x-auto rounded-lg border border-stone-300 bg-white">
      <table className="w-full text-left text-sm" aria-label={label}>
        <thead className="bg-stone-50 text-stone-600">
          <tr>
            {header.map((h, i) => (
              <th key={h} className={right(i) ? 'px-3 py-2 text-right font-bold' : 'px-3 py-2 font-bold'}>
                {h}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {rows.map((row, r) => (
            <tr key={r} className="border-t border-stone-200">
              {row.map((cell, i) => (
                <td key={i} className={right(i) ? 'px-3 py-1.5 text-right tabular-nums' : 'px-3 py-1.5'}>
                  {cell}
                </td>
              ))}
            </tr>
          ))}
          {rows.length === 0 && (
            <tr>
              <td colSpan={header.length} className="px-3 py-4 text-center text-stone-500">
                {empty}
              </td>
            </tr>
          )}
        </tbody>
      </table>
    </div>
  )
}
