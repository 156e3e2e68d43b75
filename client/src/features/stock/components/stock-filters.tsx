import { useCallback } from 'react'
import { PART_KINDS, PART_KIND_LABELS } from '@kitwright/shared/parts'
import type { StockListQuery } from '@kitwright/shared/stock'
import { Select } from '../../../components/ui/field'
import { SearchField } from '../../../components/ui/search-field'

interface Props {
  query: StockListQuery
  onQueryChange: (change: Partial<StockListQuery>) => void
}

/** Search and filters of the stock page; every change goes to the URL and back to page 1. */
export function StockFilters({ query, onQueryChange }: Props) {
  const onSearch = useCallback((q: string | undefined) => onQueryChange({ q, page: 1 }), [onQueryChange])
  return (
    <div className="flex flex-wrap items-end gap-3">
      <SearchField value={query.q} onSearch={onSearch} placeholder="SKU, name or shelf" />
      <label className="block space-y-1">
        <span className="block text-sm font-bold text-stone-700">Kind</span>
        <Select value={query.kind ?? ''} onChange={(e) => onQueryChange({ kind: (e.target.value || undefined) as StockListQuery['kind'], page: 1 })} className="w-48">
          <option value="">All kinds</option>
          {PART_KINDS.map((k) => (
            <option key={k} value={k}>
              {PART_KIND_LABELS[k]}
            </option>
          ))}
        </Select>
      </label>
      <label className="flex h-11 items-center gap-2 font-bold">
        <input type="checkbox" className="size-5 accent-brand-700" checked={query.lowOnly} onChange={(e) => onQueryChange({ lowOnly: e.target.checked, page: 1 })} />
        Low stock only
      </label>
    </div>
  )
}
