import { useQuery } from '@tanstack/react-query'
import { useCallback } from 'react'
import { Link, useSearchParams } from 'react-router-dom'
import { querySearchWithDefaults, queryToSearch } from '@kitwright/shared/pagination'
import { PartListQuerySchema, type PartListQuery } from '@kitwright/shared/parts'
import { paths } from '../../../config/paths'
import { PARTS_EXPORT_HREF, partsListOptions } from '../../../features/parts/api/part-queries'
import { PartsFilters } from '../../../features/parts/components/parts-filters'
import { PartsTable } from '../../../features/parts/components/parts-table'

const linkButton = 'inline-flex h-11 items-center rounded-md px-4 font-bold'

export function Component() {
  const [searchParams, setSearchParams] = useSearchParams()
  // Page, sort, filters and search live in the URL; a bad or stale link falls back to defaults.
  const query = querySearchWithDefaults(PartListQuerySchema, searchParams)
  const list = useQuery(partsListOptions(query))
  const onQueryChange = useCallback(
    (change: Partial<PartListQuery>) =>
      setSearchParams((prev) => queryToSearch(PartListQuerySchema, { ...querySearchWithDefaults(PartListQuerySchema, prev), ...change }), { replace: true }),
    [setSearchParams],
  )
  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-center gap-3">
        <h1 className="mr-auto text-3xl font-bold">Parts</h1>
        <Link to={paths.partNew.href()} className={`${linkButton} bg-brand-700 text-white hover:bg-brand-900`}>
          New part
        </Link>
        <Link to={paths.partsImport.href()} className={`${linkButton} border border-stone-300 bg-white hover:bg-stone-50`}>
          Import CSV
        </Link>
        <a href={PARTS_EXPORT_HREF} download className={`${linkButton} border border-stone-300 bg-white hover:bg-stone-50`}>
          Export CSV
        </a>
      </div>
      <PartsFilters query={query} onQueryChange={onQueryChange} />
      {list.isError ? (
        <p role="alert" className="text-red-700">
          {list.error.message}
        </p>
      ) : (
        <PartsTable items={list.data?.items ?? []} total={list.data?.total ?? 0} query={query} onQueryChange={onQueryChange} loading={list.isFetching} />
      )}
    </div>
  )
}
