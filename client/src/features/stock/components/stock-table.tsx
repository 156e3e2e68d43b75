import { flexRender, getCoreRowModel, useReactTable, type SortingState, type Updater } from '@tanstack/react-table'
import { useMemo } from 'react'
import { useNavigate } from 'react-router-dom'
import { pageCount, PAGE_SIZES } from '@kitwright/shared/pagination'
import { formatStickLength, type StockListQuery, type StockRow, type StockSort } from '@kitwright/shared/stock'
import { Button } from '../../../components/ui/button'
import { Select } from '../../../components/ui/field'
import { paths } from '../../../config/paths'
import { cn } from '../../../lib/cn'
import { useLengthUnit } from '../../../lib/shop-settings'
import { getStockColumns } from './stock-columns'

interface Props {
  items: StockRow[]
  total: number
  query: StockListQuery
  onQueryChange: (change: Partial<StockListQuery>) => void
  loading: boolean
}

/** The stock page's table: the server sorts and pages; low rows are tinted and carry a "Low" badge. */
export function StockTable({ items, total, query, onQueryChange, loading }: Props) {
  const { unit, format } = useLengthUnit()
  const navigate = useNavigate()
  const columns = useMemo(() => getStockColumns((v) => formatStickLength(v, unit), format), [unit, format])
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
    getRowId: (r) => r.partId,
    onSortingChange: (updater: Updater<SortingState>) => {
      const next = typeof updater === 'function' ? updater(sorting) : updater
      const first = next[0]
      if (first) onQueryChange({ sort: first.id as StockSort, dir: first.desc ? 'desc' : 'asc', page: 1 })
    },
    getCoreRowModel: getCoreRowModel(),
  })
  return (
    <div className="space-y-3">
      <div className="overflow-x-auto rounded-lg border border-stone-300 bg-white" aria-busy={loading}>
        <table className="w-full text-left" aria-label="Stock">
          <thead className="bg-stone-50 text-sm text-stone-600">
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id}>
                {group.headers.map((header) => {
                  const sorted = header.column.getIsSorted()
                  return (
                    <th key={header.id} className="px-3 py-2 font-bold whitespace-nowrap" aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : undefined}>
                      {header.column.getCanSort() ? (
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
            {table.getRowModel().rows.map((row) => (
              <tr
                key={row.id}
                data-low={row.original.low || undefined}
                onClick={() => void navigate(paths.stockPart.href(row.original.partId))}
                className={cn('cursor-pointer border-t border-stone-200 hover:bg-stone-50', row.original.low && 'bg-amber-50 hover:bg-amber-100')}
              >
                {row.getVisibleCells().map((cell) => (
                  <td key={cell.id} className="px-3 py-2 align-middle">
                    {flexRender(cell.column.columnDef.cell, cell.getContext())}
                  </td>
                ))}
              </tr>
            ))}
            {items.length === 0 && (
              <tr>
                <td colSpan={columns.length} className="px-3 py-6 text-center text-stone-500">
                  {loading ? 'Loading stock…' : 'No parts match; clear the search or the filters'}
                </td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
      <div className="flex flex-wrap items-center gap-3">
        <Button size="sm" variant="secondary" disabled={query.page <= 1} onClick={() => onQueryChange({ page: query.page - 1 })}>
          Previous
        </Button>
        <span>
          Page {Math.min(query.page, pages)} of {pages} · {total} {total === 1 ? 'part' : 'parts'}
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
