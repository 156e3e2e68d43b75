import { useQuery } from '@tanstack/react-query'
import { ORDER_STAGE_LABELS, ORDER_STAGES } from '@kitwright/shared/order-stage'
import { ORDER_PRIORITY_LABELS, type OrderListQuery } from '@kitwright/shared/orders'
import { ORDER_PRIORITIES } from '@kitwright/shared/orders-status'
import { Input } from '../../../components/ui/field'
import { FilterBar, FilterCheck, FilterSelect } from '../../../components/ui/filter-bar'
import { orderKitsOptions } from '../api/order-queries'

interface Props {
  query: OrderListQuery
  onQueryChange: (change: Partial<OrderListQuery>) => void
}

const labelText = 'block text-sm font-bold text-stone-700'
const STAGE_OPTIONS = ORDER_STAGES.map((s) => ({ value: s, label: ORDER_STAGE_LABELS[s] }))
const PRIORITY_OPTIONS = ORDER_PRIORITIES.map((p) => ({ value: p, label: ORDER_PRIORITY_LABELS[p] }))

/** Search and filters of the orders list; every change goes to the URL and back to page 1. */
export function OrdersFilters({ query, onQueryChange }: Props) {
  const kits = useQuery(orderKitsOptions())
  const kitOptions = (kits.data ?? []).map((k) => ({ value: k.id, label: `${k.sku} · ${k.name}` }))
  return (
    <FilterBar query={query} onQueryChange={onQueryChange} placeholder="Order number, customer or e-mail">
      <FilterSelect
        label="Status"
        value={query.stage ?? ''}
        onChange={(v) => onQueryChange({ stage: (v || undefined) as OrderListQuery['stage'], status: undefined, page: 1 })}
        options={STAGE_OPTIONS}
        anyLabel="Any status"
        className="w-44"
      />
      <FilterSelect
        label="Priority"
        value={query.priority ?? ''}
        onChange={(v) => onQueryChange({ priority: (v || undefined) as OrderListQuery['priority'], page: 1 })}
        options={PRIORITY_OPTIONS}
        anyLabel="Any"
        className="w-32"
      />
      <FilterCheck label="Late only" checked={query.late === 'true'} onChange={(late) => onQueryChange({ late: late ? 'true' : undefined, page: 1 })} />
      <FilterSelect label="Kit" value={query.kitId ?? ''} onChange={(v) => onQueryChange({ kitId: v || undefined, page: 1 })} options={kitOptions} anyLabel="Any kit" className="w-56" />
      <label className="block space-y-1">
        <span className={labelText}>Placed from</span>
        <Input type="date" value={query.from ?? ''} max={query.to} onChange={(e) => onQueryChange({ from: e.target.value || undefined, page: 1 })} className="w-44" />
      </label>
      <label className="block space-y-1">
        <span className={labelText}>Placed to</span>
        <Input type="date" value={query.to ?? ''} min={query.from} onChange={(e) => onQueryChange({ to: e.target.value || undefined, page: 1 })} className="w-44" />
      </label>
    </FilterBar>
  )
}
