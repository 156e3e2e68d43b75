import { useEffect, useState } from 'react'
import { PART_KINDS, PART_KIND_LABELS, type PartListQuery } from '@kitwright/shared/parts'
import { Input, Select } from '../../../components/ui/field'

interface Props {
  query: PartListQuery
  onQueryChange: (change: Partial<PartListQuery>) => void
}

/** Search and filters of the parts list; every change goes to the URL and back to page 1. */
export function PartsFilters({ query, onQueryChange }: Props) {
  const [search, setSearch] = useState(query.q ?? '')
  // Follow the URL when it changes from outside (back button, a link).
  useEffect(() => setSearch(query.q ?? ''), [query.q])
  useEffect(() => {
    if (search.trim() === (query.q ?? '')) return
    const timer = setTimeout(() => onQueryChange({ q: search.trim() || undefined, page: 1 }), 250)
    return () => clearTimeout(timer)
  }, [search, query.q, onQueryChange])
  return (
    <div className="flex flex-wrap items-end gap-3">
      <label className="block space-y-1">
        <span className="block text-sm font-bold text-stone-700">Search</span>
        <Input type="search" placeholder="SKU, name or supplier" value={search} onChange={(e) => setSearch(e.target.value)} className="w-72" />
      </label>
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
