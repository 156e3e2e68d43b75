import { PART_KINDS, PART_KIND_LABELS } from '@kitwright/shared/parts'
import type { StockListQuery } from '@kitwright/shared/stock'
import { FilterBar, FilterCheck, FilterSelect } from '../../../components/ui/filter-bar'

interface Props {
  query: StockListQuery
  onQueryChange: (change: Partial<StockListQuery>) => void
}

const KIND_OPTIONS = PART_KINDS.map((k) => ({ value: k, label: PART_KIND_LABELS[k] }))

/** Search and filters of the stock page; every change goes to the URL and back to page 1. */
export function StockFilters({ query, onQueryChange }: Props) {
  return (
    <FilterBar query={query} onQueryChange={onQueryChange} placeholder="SKU, name or shelf">
      <FilterSelect
        label="Kind"
        value={query.kind ?? ''}
        onChange={(v) => onQueryChange({ kind: (v || undefined) as StockListQuery['kind'], page: 1 })}
        options={KIND_OPTIONS}
        anyLabel="All kinds"
        className="w-48"
      />
      <FilterCheck label="Low stock only" checked={query.lowOnly} onChange={(lowOnly) => onQueryChange({ lowOnly, page: 1 })} />
    </FilterBar>
  )
}
