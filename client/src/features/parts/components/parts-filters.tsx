import { PART_KINDS, PART_KIND_LABELS, type PartListQuery } from '@kitwright/shared/parts'
import { FilterBar, FilterSelect } from '../../../components/ui/filter-bar'

interface Props {
  query: PartListQuery
  onQueryChange: (change: Partial<PartListQuery>) => void
}

const KIND_OPTIONS = PART_KINDS.map((k) => ({ value: k, label: PART_KIND_LABELS[k] }))
const ACTIVE_OPTIONS = [
  { value: 'true', label: 'Active' },
  { value: 'false', label: 'Deactivated' },
  { value: 'all', label: 'All' },
]

/** Search and filters of the parts list; every change goes to the URL and back to page 1. */
export function PartsFilters({ query, onQueryChange }: Props) {
  return (
    <FilterBar query={query} onQueryChange={onQueryChange} placeholder="SKU, name or supplier">
      <FilterSelect
        label="Kind"
        value={query.kind ?? ''}
        onChange={(v) => onQueryChange({ kind: (v || undefined) as PartListQuery['kind'], page: 1 })}
        options={KIND_OPTIONS}
        anyLabel="All kinds"
        className="w-48"
      />
      <FilterSelect
        label="Status"
        value={query.active}
        onChange={(v) => onQueryChange({ active: v as PartListQuery['active'], page: 1 })}
        options={ACTIVE_OPTIONS}
        className="w-44"
      />
    </FilterBar>
  )
}
