import { useQuery } from '@tanstack/react-query'
import { useCallback } from 'react'
import { Link, useSearchParams } from 'react-router-dom'
import { querySearchWithDefaults, queryToSearch } from '@kitwright/shared/pagination'
import { StockListQuerySchema, type StockListQuery } from '@kitwright/shared/stock'
import { paths } from '../../../config/paths'
import { stockExportHref, stockListOptions } from '../../../features/stock/api/stock-queries'
import { StockFilters } from '../../../features/stock/components/stock-filters'
import { StockTable } from '../../../features/stock/components/stock-table'

const linkButton = 'inline-flex h-11 items-center rounded-md px-4 font-bold'

export function Component() {
  const [searchParams, setSearchParams] = useSearchParams()
  // Page, sort, filters and search live in the URL; a bad or stale link falls back to defaults.
  const query = querySearchWithDefaults(StockListQuerySchema, searchParams)
  const list = useQuery(stockListOptions(query))
  const onQueryChange = useCallback(
    (change: Partial<StockListQuery>) =>
      setSearchParams((prev) => queryToSearch(StockListQuerySchema, { ...querySearchWithDefaults(StockListQuerySchema, prev), ...change }), { replace: true }),
    [setSearchParams],
  )
  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-center gap-3">
        <h1 className="mr-auto text-3xl font-bold">Stock</h1>
        <Link to={paths.stockReceive.href()} className={`${linkButton} bg-brand-700 text-white hover:bg-brand-900`}>
          Receive stock
        </Link>
        <a href={stockExportHref(query)} download className={`${linkButton} border border-stone-300 bg-white hover:bg-stone-50`}>
          Export CSV
        </a>
      </div>
      <p className="text-stone-700">
        Every figure is the sum of the part's stock moves: available = on hand − reserved. Rows marked <strong>Low</strong> are at or below their reorder
        point. Open a part to see the moves behind its figures or to record an adjustment.
      </p>
      <StockFilters query={query} onQueryChange={onQueryChange} />
      {list.isError ? (
        <p role="alert" className="text-red-700">
          {list.error.message}
        </p>
      ) : (
        <StockTable items={list.data?.items ?? []} total={list.data?.total ?? 0} query={query} onQueryChange={onQueryChange} loading={list.isFetching} />
      )}
    </div>
  )
}
