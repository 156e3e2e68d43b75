import { useMemo } from 'react'
import type { Order, OrderListQuery } from '@kitwright/shared/orders'
import { ServerTable } from '../../../components/ui/server-table'
import { getOrdersColumns, type OrderSelection } from './orders-columns'

interface Props extends OrderSelection {
  items: Order[]
  total: number
  query: OrderListQuery
  onQueryChange: (change: Partial<OrderListQuery>) => void
  loading: boolean
}

/** The orders list: the server pages, sorts and filters; this shows one page and asks for others. */
export function OrdersTable({ items, total, query, onQueryChange, loading, selected, toggle }: Props) {
  const columns = useMemo(() => getOrdersColumns({ selected, toggle }), [selected, toggle])
  return (
    <ServerTable
      label="Orders"
      items={items}
      total={total}
      columns={columns}
      query={query}
      onQueryChange={onQueryChange}
      loading={loading}
      getRowId={(o) => o.id}
      noun={['order', 'orders']}
      emptyText="No orders match; clear the search or the filters"
      rowProps={(row) => ({ 'data-late': row.original.late ? 'true' : undefined, className: row.original.late ? 'bg-red-50' : undefined })}
    />
  )
}
