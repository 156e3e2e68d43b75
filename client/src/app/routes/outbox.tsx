import { useQuery } from '@tanstack/react-query'
import { useCallback, useMemo } from 'react'
import { useSearchParams } from 'react-router-dom'
import { MAIL_STATUS_LABELS, MAIL_STATUSES_FOR_FILTER, MailListQuerySchema, type MailListQuery } from '@kitwright/shared/mail'
import { querySearchWithDefaults, queryToSearch } from '@kitwright/shared/pagination'
import { Field, Select } from '../../components/ui/field'
import { ServerTable } from '../../components/ui/server-table'
import { mailListOptions } from '../../features/mail/api/mail-queries'
import { getMailColumns } from '../../features/mail/components/mail-columns'
import { MailReader } from '../../features/mail/components/mail-reader'

/** The outbox: every e-mail the shop sent or is about to send, newest first; open one to read it. */
export function Component() {
  const [params, setParams] = useSearchParams()
  const query = querySearchWithDefaults(MailListQuerySchema, params)
  const openId = params.get('message')
  const list = useQuery(mailListOptions(query))
  const go = useCallback(
    (change: Partial<MailListQuery>, message: string | null) => {
      const next = new URLSearchParams(queryToSearch(MailListQuerySchema, { ...query, ...change }))
      if (message) next.set('message', message)
      setParams(next)
    },
    [query, setParams],
  )
  const columns = useMemo(() => getMailColumns((id) => go({}, id)), [go])
  return (
    <div className="space-y-4">
      <h1 className="text-3xl font-bold">Outbox</h1>
      <p className="max-w-3xl text-stone-700">
        Every e-mail Kitwright sends to customers. Messages wait here while the mail relay is unreachable and go out by themselves when it is back.
      </p>
      <Field label="Status">
        <Select value={query.status ?? ''} onChange={(e) => go({ status: (e.target.value || undefined) as MailListQuery['status'], page: 1 }, openId)} className="w-48">
          <option value="">Any</option>
          {MAIL_STATUSES_FOR_FILTER.map((s) => (
            <option key={s} value={s}>
              {MAIL_STATUS_LABELS[s]}
            </option>
          ))}
        </Select>
      </Field>
      {openId && <MailReader id={openId} onClose={() => go({}, null)} />}
      {list.isError ? (
        <p role="alert">{list.error.message}</p>
      ) : (
        <ServerTable
          label="Outbox"
          items={list.data?.items ?? []}
          total={list.data?.total ?? 0}
          columns={columns}
          query={{ ...query, sort: 'createdAt', dir: 'desc' }}
          onQueryChange={({ sort: _s, dir: _d, ...change }) => go(change, openId)}
          loading={list.isFetching}
          getRowId={(m) => m.id}
          noun={['message', 'messages']}
          emptyText={query.status ? 'No messages with this status' : 'No e-mail yet: messages appear here when orders come in'}
        />
      )}
    </div>
  )
}
