import { useQuery } from '@tanstack/react-query'
import { useCallback, useMemo } from 'react'
import { useSearchParams } from 'react-router-dom'
import { AuditQuerySchema, BENCHES, type AuditQuery } from '@kitwright/shared/audit'
import { querySearchWithDefaults, queryToSearch } from '@kitwright/shared/pagination'
import { Field, Input, Select } from '../../../components/ui/field'
import { SearchField } from '../../../components/ui/search-field'
import { ServerTable } from '../../../components/ui/server-table'
import { auditListOptions } from '../../../features/audit/api/audit-queries'
import { getAuditColumns } from '../../../features/audit/components/audit-columns'

const ACTION_GROUPS: [string, string][] = [
  ['', 'Every change'],
  ['auth.', 'Sign-ins'],
  ['user.', 'Users'],
  ['part.', 'Parts'],
  ['kit', 'Kits and revisions'],
  ['stock.', 'Stock'],
  ['order', 'Orders and releases'],
  ['cut', 'Cut runs and the cut bench'],
  ['build.', 'Build bench'],
  ['ship', 'Shipments'],
  ['settings.', 'Shop settings'],
]

export function Component() {
  const [params, setParams] = useSearchParams()
  const query = querySearchWithDefaults(AuditQuerySchema, params)
  const list = useQuery(auditListOptions(query))
  const columns = useMemo(() => getAuditColumns(), [])
  const onQueryChange = useCallback(
    (change: Partial<AuditQuery>) => setParams(new URLSearchParams(queryToSearch(AuditQuerySchema, { ...query, ...change }))),
    [query, setParams],
  )
  const onSearch = useCallback((q: string | undefined) => onQueryChange({ q, page: 1 }), [onQueryChange])
  return (
    <div className="space-y-4">
      <h1 className="text-3xl font-bold">Audit trail</h1>
      <div className="flex flex-wrap items-end gap-3">
        <SearchField value={query.q} onSearch={onSearch} placeholder="Words, e-mail or id" />
        <Field label="Change">
          <Select value={query.action ?? ''} onChange={(e) => onQueryChange({ action: e.target.value || undefined, page: 1 })} className="w-56">
            {ACTION_GROUPS.map(([value, label]) => (
              <option key={label} value={value}>
                {label}
              </option>
            ))}
          </Select>
        </Field>
        <Field label="Bench">
          <Select value={query.bench ?? ''} onChange={(e) => onQueryChange({ bench: (e.target.value || undefined) as AuditQuery['bench'], page: 1 })} className="w-36">
            <option value="">Any</option>
            {BENCHES.map((b) => (
              <option key={b} value={b}>
                {b}
              </option>
            ))}
          </Select>
        </Field>
        <Field label="From">
          <Input type="date" value={query.from ?? ''} onChange={(e) => onQueryChange({ from: e.target.value || undefined, page: 1 })} />
        </Field>
        <Field label="To">
          <Input type="date" value={query.to ?? ''} onChange={(e) => onQueryChange({ to: e.target.value || undefined, page: 1 })} />
        </Field>
      </div>
      {list.isError ? (
        <p role="alert">{list.error.message}</p>
      ) : (
        <ServerTable
          label="Audit trail"
          items={list.data?.items ?? []}
          total={list.data?.total ?? 0}
          columns={columns}
          query={{ ...query, sort: 'at', dir: 'desc' }}
          onQueryChange={({ sort: _s, dir: _d, ...change }) => onQueryChange(change)}
          loading={list.isFetching}
          getRowId={(e) => e.id}
          noun={['change', 'changes']}
          emptyText="No changes match these filters"
        />
      )}
    </div>
  )
}
