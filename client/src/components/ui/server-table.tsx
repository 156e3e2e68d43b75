import { getCoreRowModel, useReactTable, type ColumnDef, type Row, type SortingState, type Updater } from '@tanstack/react-table'
import type { HTMLAttributes } from 'react'
import { pageCount, PAGE_SIZES, type SortDir } from '@kitwright/shared/pagination'
import { Button } from './button'
import { Select } from './field'
import { TableView } from './table-view'

/** The page, size and sort of a server-side list, as kept in the URL. */
export interface ServerListState<S extends string> {
  page: number
  pageSize: number
  sort: S
  dir: SortDir
}

interface Props<T, S extends string> {
  label: string
  items: T[]
  total: number
  columns: ColumnDef<T, unknown>[]
  query: ServerListState<S>
  onQueryChange: (change: Partial<ServerListState<S>>) => void
  loading: boolean
  getRowId: (row: T) => string
  /** What one and many items are called: ['part', 'parts']. */
  noun: [string, string]
  emptyText: string
  rowProps?: (row: Row<T>) => HTMLAttributes<HTMLTableRowElement> & Record<`data-${string}`, unknown>
}

/** A list the server pages and sorts: shows one page, asks for others through `onQueryChange`. */
export function ServerTable<T, S extends string>({ label, items, total, columns, query, onQueryChange, loading, getRowId, noun, emptyText, rowProps }: Props<T, S>) {
  const sorting: SortingState = [{ id: query.sort, desc: query.dir === 'desc' }]
  const pages = pageCount(total, query.pageSize)
  const table = useReactTable({
    data: items,
    columns,
    state: { sorting, pagination: { pageIndex: query.page - 1, pageSize: query.pageSize } },
    manualPagination: true,
    manualSorting: true,
    enableSortingRemoval: false,
    pageCount: pages,
    getRowId,
    onSortingChange: (updater: Updater<SortingState>) => {
      const first = (typeof updater === 'function' ? updater(sorting) : updater)[0]
      if (first) onQueryChange({ sort: first.id as S, dir: first.desc ? 'desc' : 'asc', page: 1 })
    },
    getCoreRowModel: getCoreRowModel(),
  })
  return (
    <div className="space-y-3">
      <TableView table={table} label={label} busy={loading} emptyText={loading ? `Loading ${noun[1]}…` : emptyText} rowProps={rowProps} />
      <div className="flex flex-wrap items-center gap-3">
        <Button size="sm" variant="secondary" disabled={query.page <= 1} onClick={() => onQueryChange({ page: query.page - 1 })}>
          Previous
        </Button>
        <span>
          Page {Math.min(query.page, pages)} of {pages} · {total} {total === 1 ? noun[0] : noun[1]}
        </span>
        <Button size="sm" variant="secondary" disabled={query.page >= pages} onClick={() => onQueryChange({ page: query.page + 1 })}>
          Next
        </Button>
        <label className="ml-auto flex items-center gap-2 text-sm">
          Per page
          <Select className="h-9 w-24" value={query.pageSize} onChange={(e) => onQueryChange({ pageSize: Number(e.target.value), page: 1 })}>
            {PAGE_SIZES.map((n) => (
              <option key={n} value={n}>
                {n}
              </option>
            ))}
          </Select>
        </label>
      </div>
    </div>
  )
}
