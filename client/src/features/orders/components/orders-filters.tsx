import { useQuery } from '@tanstack/react-query'
import { useCallback } from 'react'
import { ORDER_STAGE_LABELS, ORDER_STAGES } from '@kitwright/shared/order-stage'
import { ORDER_PRIORITY_LABELS, type OrderListQuery } from '@kitwright/shared/orders'
import { ORDER_PRIORITIES } from '@kitwright/shared/orders-status'
import { Input, Select } from '../../../components/ui/field'
import { SearchField } from '../../../components/ui/search-field'
import { orderKitsOptions } from '../api/order-queries'

interface Props {
  query: OrderListQuery
  onQueryChange: (change: Partial<OrderListQuery>) => void
}

const labelText = 'block text-sm font-bold text-stone-700'

/** Search and filters of the orders list; every change goes to the URL and back to page 1. */
export function OrdersFilters({ query, onQueryChange }: Props) {
  const kits = useQuery(orderKitsOptions())
  const onSearch = useCallback((q: string | undefined) => onQueryChange({ q, page: 1 }), [onQueryChange])
  return (
    <div className="flex flex-wrap items-end gap-3">
      <SearchField value={query.q} onSearch={onSearch} placeholder="Order number, customer or e-mail" />
      <label className="block space-y-1">
        <span className={labelText}>Status</span>
        <Select value={query.stage ?? ''} onChange={(e) => onQueryChange({ stage: (e.target.value || undefined) as OrderListQuery['stage'], status: undefined, page: 1 })} className="w-44">
          <option value="">Any status</option>
          {ORDER_STAGES.map((s) => (
            <option key={s} value={s}>
              {ORDER_STAGE_LABELS[s]}
            </option>
          ))}
        </Select>
      </label>
      <label className="block space-y-1">
        <span className={labelText}>Priority</span>
        <Select value={query.priority ?? ''} onChange={(e) => onQueryChange({ priority: (e.target.value || undefined) as OrderListQuery['priority'], page: 1 })} className="w-32">
          <option value="">Any</option>
          {ORDER_PRIORITIES.map((p) => (
            <option key={p} value={p}>
              {ORDER_PRIORITY_LABELS[p]}
            </option>
          ))}
        </Select>
      </label>
      <label className="flex h-11 items-center gap-2 self-end">
        <input type="checkbox" className="size-5 accent-brand-700" checked={query.late === 'true'} onChange={(e) => onQueryChange({ late: e.target.checked ? 'true' : undefined, page: 1 })} />
        <span className="font-bold text-stone-700">Late only</span>
      </label>
      <label className="block space-y-1">
        <span className={labelText}>Kit</span>
        <Select value={query.kitId ?? ''} onChange={(e) => onQueryChange({ kitId: e.target.value || undefined, page: 1 })} className="w-56">
          <option value="">Any kit</option>
          {(kits.data ?? []).map((k) => (
            <option key={k.id} value={k.id}>
              {k.sku} · {k.name}
            </option>
          ))}
        </Select>
      </label>
      <label className="block space-y-1">
        <span className={labelText}>Placed from</span>
        <Input type="date" value={query.from ?? ''} max={query.to} onChange={(e) => onQueryChange({ from: e.target.value || undefined, page: 1 })} className="w-44" />
      </label>
      <label className="block space-y-1">
        <span className={labelText}>Placed to</span>
        <Input type="date" value={query.to ?? ''} min={query.from} onChange={(e) => onQueryChange({ to: e.target.value || undefined, page: 1 })} className="w-44" />
      </label>
    </div>
  )
}
