import { useMemo } from 'react'
import type { Part, PartListQuery } from '@kitwright/shared/parts'
import { ServerTable } from '../../../components/ui/server-table'
import { useLengthUnit } from '../../../lib/shop-settings'
import { getPartsColumns } from './parts-columns'

interface Props {
  items: Part[]
  total: number
  query: PartListQuery
  onQueryChange: (change: Partial<PartListQuery>) => void
  loading: boolean
}

/** The parts list: the server pages and sorts; this shows one page and asks for others. */
export function PartsTable({ items, total, query, onQueryChange, loading }: Props) {
  const { format } = useLengthUnit()
  const columns = useMemo(() => getPartsColumns(format), [format])
  return (
    <ServerTable
      label="Parts"
      items={items}
      total={total}
      columns={columns}
      query={query}
      onQueryChange={onQueryChange}
      loading={loading}
      getRowId={(p) => p.id}
      noun={['part', 'parts']}
      emptyText="No parts match; clear the search or the filters"
    />
  )
}
