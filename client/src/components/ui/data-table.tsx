import {
  getCoreRowModel,
  getFilteredRowModel,
  getSortedRowModel,
  useReactTable,
  type ColumnDef,
  type SortingState,
} from '@tanstack/react-table'
import { useState } from 'react'
import { Input } from './field'
import { TableView } from './table-view'

/**
 * A table for short lists that live wholly in the browser (sorting and search here). Long lists
 * page, sort and filter on the server instead.
 */
export function DataTable<T>({ data, columns, searchLabel }: { data: T[]; columns: ColumnDef<T, unknown>[]; searchLabel?: string }) {
  const [sorting, setSorting] = useState<SortingState>([])
  const [globalFilter, setGlobalFilter] = useState('')
  const table = useReactTable({
    data,
    columns,
    state: { sorting, globalFilter },
    onSortingChange: setSorting,
    onGlobalFilterChange: setGlobalFilter,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
  })
  return (
    <div className="space-y-3">
      {searchLabel && (
        <Input
          type="search"
          aria-label={searchLabel}
          placeholder={searchLabel}
          value={globalFilter}
          onChange={(e) => setGlobalFilter(e.target.value)}
          className="max-w-sm"
        />
      )}
      <TableView table={table} emptyText="Nothing to show" />
    </div>
  )
}
