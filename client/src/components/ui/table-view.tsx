import { flexRender, type Row, type Table } from '@tanstack/react-table'
import type { HTMLAttributes } from 'react'
import { cn } from '../../lib/cn'

/** Draws a TanStack table: sortable headers as buttons (no hover-only controls), rows, an empty line. */
export function TableView<T>({
  table,
  label,
  emptyText,
  busy,
  rowProps,
}: {
  table: Table<T>
  label?: string
  emptyText: string
  busy?: boolean
  rowProps?: (row: Row<T>) => HTMLAttributes<HTMLTableRowElement> & Record<`data-${string}`, unknown>
}) {
  const rows = table.getRowModel().rows
  return (
    <div className="overflow-x-auto rounded-lg border border-stone-300 bg-white" aria-busy={busy}>
      <table className="w-full text-left" aria-label={label}>
        <thead className="bg-stone-50 text-sm text-stone-600">
          {table.getHeaderGroups().map((group) => (
            <tr key={group.id}>
              {group.headers.map((header) => {
                const sorted = header.column.getIsSorted()
                return (
                  <th key={header.id} className="px-3 py-2 font-bold whitespace-nowrap" aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : undefined}>
                    {header.isPlaceholder ? null : header.column.getCanSort() ? (
                      <button type="button" className="font-bold" onClick={header.column.getToggleSortingHandler()}>
                        {flexRender(header.column.columnDef.header, header.getContext())}
                        {sorted === 'asc' ? ' ▲' : sorted === 'desc' ? ' ▼' : ''}
                      </button>
                    ) : (
                      flexRender(header.column.columnDef.header, header.getContext())
                    )}
                  </th>
                )
              })}
            </tr>
          ))}
        </thead>
        <tbody>
          {rows.map((row) => {
            const extra = rowProps?.(row) ?? {}
            return (
              <tr key={row.id} {...extra} className={cn('border-t border-stone-200', extra.className)}>
                {row.getVisibleCells().map((cell) => (
                  <td key={cell.id} className="px-3 py-2 align-middle">
                    {flexRender(cell.column.columnDef.cell, cell.getContext())}
                  </td>
                ))}
              </tr>
            )
          })}
          {rows.length === 0 && (
            <tr>
              <td colSpan={table.getAllLeafColumns().length} className="px-3 py-6 text-center text-stone-500">
                {emptyText}
              </td>
            </tr>
          )}
        </tbody>
      </table>
    </div>
  )
}
