import { useQuery } from '@tanstack/react-query'
import { useCallback, useState } from 'react'
import { Link, useSearchParams } from 'react-router-dom'
import { OrderListQuerySchema, type OrderListQuery } from '@kitwright/shared/orders'
import { querySearchWithDefaults, queryToSearch } from '@kitwright/shared/pagination'
import { paths } from '../../../config/paths'
import { ordersExportHref, ordersListOptions } from '../../../features/orders/api/order-queries'
import { BulkReleasePanel } from '../../../features/orders/components/bulk-release-panel'
import { OrdersFilters } from '../../../features/orders/components/orders-filters'
import { OrdersTable } from '../../../features/orders/components/orders-table'

const linkButton = 'inline-flex h-11 items-center rounded-md px-4 font-bold'

export function Component() {
  const [searchParams, setSearchParams] = useSearchParams()
  // Page, sort, filters and search live in the URL; a bad or stale link falls back to defaults.
  const query = querySearchWithDefaults(OrderListQuerySchema, searchParams)
  const list = useQuery(ordersListOptions(query))
  const [selected, setSelected] = useState<ReadonlySet<string>>(new Set())
  const toggle = useCallback((id: string) => setSelected((prev) => (prev.has(id) ? new Set([...prev].filter((x) => x !== id)) : new Set([...prev, id]))), [])
  const onQueryChange = useCallback(
    (change: Partial<OrderListQuery>) =>
      setSearchParams((prev) => queryToSearch(OrderListQuerySchema, { ...querySearchWithDefaults(OrderListQuerySchema, prev), ...change }), { replace: true }),
    [setSearchParams],
  )
  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-center gap-3">
        <h1 className="mr-auto text-3xl font-bold">Orders</h1>
        <Link to={paths.orderNew.href()} className={`${linkButton} bg-brand-700 text-white hover:bg-brand-900`}>
          New phone order
        </Link>
        <Link to={paths.ordersImport.href()} className={`${linkButton} border border-stone-300 bg-white hover:bg-stone-50`}>
          Import CSV
        </Link>
        <a href={ordersExportHref(query)} download className={`${linkButton} border border-stone-300 bg-white hover:bg-stone-50`}>
          Export CSV
        </a>
      </div>
      <OrdersFilters query={query} onQueryChange={onQueryChange} />
      {selected.size > 0 && <BulkReleasePanel key={[...selected].join()} orderIds={[...selected]} onDone={() => setSelected(new Set())} />}
      {list.isError ? (
        <p role="alert" className="text-red-700">
          {list.error.message}
        </p>
      ) : (
        <OrdersTable
          items={list.data?.items ?? []}
          total={list.data?.total ?? 0}
          query={query}
          onQueryChange={onQueryChange}
          loading={list.isFetching}
          selected={selected}
          toggle={toggle}
        />
      )}
    </div>
  )
}
