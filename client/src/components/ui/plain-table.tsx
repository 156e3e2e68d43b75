import type { ReactNode } from 'react'
import { cn } from '../../lib/cn'

/** A header cell: its text, and whether its column holds figures (right-aligned). */
export type PlainHeader = string | { label: ReactNode; key?: string; numeric?: boolean; className?: string }

/**
 * The one frame of a hand-drawn table: a bordered box that scrolls sideways on a narrow screen, a
 * labelled table and its header row. Rows come as children (`<tr className={rowClass}>`). Lists
 * the user sorts or pages use TableView / DataTable / ServerTable instead.
 */
export function PlainTable({ label, headers, children, className }: { label: string; headers: PlainHeader[]; children: ReactNode; className?: string }) {
  return (
    <div className="overflow-x-auto rounded-lg border border-stone-300 bg-white">
      <table className={cn('w-full text-left', className)} aria-label={label}>
        <thead className="bg-stone-50 text-sm text-stone-600">
          <tr>
            {headers.map((h, i) => {
              const head = typeof h === 'string' ? { label: h } : h
              return (
                <th key={typeof h === 'string' ? h : (h.key ?? i)} className={cn('px-3 py-2 font-bold', head.numeric && 'text-right', head.className)}>
                  {head.label}
                </th>
              )
            })}
          </tr>
        </thead>
        <tbody>{children}</tbody>
      </table>
    </div>
  )
}

/** The classes of a body row; a flagged row (a problem, a shortage) is tinted red. */
export function rowClass(flagged?: boolean): string {
  return cn('border-t border-stone-200', flagged && 'bg-red-50')
}

/** A body row saying the table is empty, across every column. */
export function EmptyRow({ columns, children }: { columns: number; children: ReactNode }) {
  return (
    <tr>
      <td colSpan={columns} className="px-3 py-4 text-center text-stone-500">
        {children}
      </td>
    </tr>
  )
}
