import { useCallback } from 'react'
import { PART_KINDS, PART_KIND_LABELS, type PartListQuery } from '@kitwright/shared/parts'
import { Select } from '../../../components/ui/field'
import { SearchField } from '../../../components/ui/search-field'

interface Props {
  query: PartListQuery
  onQueryChange: (change: Partial<PartListQuery>) => void
}

/** Search and filters of the parts list; every change goes to the URL and back to page 1. */
export function PartsFilters({ query, onQueryChange }: Props) {
  const onSearch = useCallback((q: string | undefined) => onQueryChange({ q, page: 1 }), [onQueryChange])
  return (
    <div className="flex flex-wrap items-end gap-3">
      <SearchField value={query.q} onSearch={onSearch} placeholder="SKU, name or supplier" />
      <label className="block space-y-1">
        <span className="block text-sm font-bold text-stone-700">Kind</span>
        <Select
          value={query.kind ?? ''}
          onChange={(e) => onQueryChange({ kind: (e.target.value || undefined) as PartListQuery['kind'], page: 1 })}
          className="w-48"
        >
          <option value="">All kinds</option>
          {PART_KINDS.map((k) => (
            <option key={k} value={k}>
              {PART_KIND_LABELS[k]}
            </option>
          ))}
        </Select>
      </label>
      <label className="block space-y-1">
        <span className="block text-sm font-bold text-stone-700">Status</span>
        <Select value={query.active} onChange={(e) => onQueryChange({ active: e.target.value as PartListQuery['active'], page: 1 })} className="w-44">
          <option value="true">Active</option>
          <option value="false">Deactivated</option>
          <option value="all">All</option>
        </Select>
      </label>
    </div>
  )
}
