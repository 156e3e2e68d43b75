import { useMemo } from 'react'
import { useNavigate } from 'react-router-dom'
import { formatStickLength, type StockListQuery, type StockRow } from '@kitwright/shared/stock'
import { ServerTable } from '../../../components/ui/server-table'
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
  return (
    <ServerTable
      label="Stock"
      items={items}
      total={total}
      columns={columns}
      query={query}
      onQueryChange={onQueryChange}
      loading={loading}
      getRowId={(r) => r.partId}
      noun={['part', 'parts']}
      emptyText="No parts match; clear the search or the filters"
      rowProps={(row) => ({
        'data-low': row.original.low || undefined,
        onClick: () => void navigate(paths.stockPart.href(row.original.partId)),
        className: cn('cursor-pointer hover:bg-stone-50', row.original.low && 'bg-amber-50 hover:bg-amber-100'),
      })}
    />
  )
}
