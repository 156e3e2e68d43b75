import { useQuery } from '@tanstack/react-query'
import { useState } from 'react'
import { Link, useParams } from 'react-router-dom'
import { toast } from 'sonner'
import { formatDateTime } from '@kitwright/shared/dates'
import { WORK_ORDER_STATUS_LABELS } from '@kitwright/shared/status-words'
import { Button } from '../../../components/ui/button'
import { Caution, Section } from '../../../components/ui/section'
import { paths } from '../../../config/paths'
import { lotDetailOptions, recallCsvHref, useNotifyRecall } from '../../../features/lots/api/lot-queries'
import { ApiError } from '../../../lib/api-client'

const th = 'px-3 py-2 font-bold'
const td = 'px-3 py-2 align-top'

const DEFAULT_MESSAGE =
  'Please stop using the part from this lot until we have checked it. Reply to this e-mail and we will send you a replacement from another lot, at no cost to you.'

/** One lot: its receipts, every unit built with it and where each went, the CSV, and "Tell the customers". */
export function Component() {
  const { lotId = '' } = useParams()
  const lot = useQuery(lotDetailOptions(lotId))
  const notify = useNotifyRecall(lotId)
  const [message, setMessage] = useState(DEFAULT_MESSAGE)
  const [confirming, setConfirming] = useState(false)
  const [problem, setProblem] = useState<string | null>(null)
  if (lot.isPending) return <p className="text-lg">Loading the lot…</p>
  if (lot.isError)
    return (
      <p role="alert" className="text-lg text-red-700">
        {lot.error.message}
      </p>
    )
  const d = lot.data
  const toTell = d.customers - d.customersNotified
  const send = () => {
    setProblem(null)
    notify.mutate(
      { message },
      {
        onSuccess: (r) => {
          setConfirming(false)
          toast.success(
            r.queued > 0
              ? `${r.queued} e-mail${r.queued === 1 ? '' : 's'} queued; they go out from the outbox`
              : 'Every customer of this lot has been told already',
          )
        },
        onError: (err) => setProblem(err instanceof ApiError ? err.message : 'Could not reach Kitwright; check the connection and try again'),
      },
    )
  }
  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-end gap-3">
        <div className="mr-auto">
          <p>
            <Link to={paths.lots.href()} className="text-brand-700 underline">
              ◀ Lots and recalls
            </Link>
          </p>
          <h1 className="text-3xl font-bold">
            Lot <span className="font-mono">{d.code}</span> of {d.part.sku}
          </h1>
          <p className="text-lg text-stone-700">
            {d.part.name} · first received {formatDateTime(d.firstReceivedAt)} · {d.received} received, {d.onHand} on hand · {d.recall.length} unit
            {d.recall.length === 1 ? '' : 's'} built with it
          </p>
        </div>
        <a
          href={recallCsvHref(d.id)}
          download
          className="inline-flex h-11 items-center rounded-md border border-stone-300 bg-white px-4 font-bold hover:bg-stone-50"
        >
          Download the recall list (CSV)
        </a>
      </div>

      <Section title="Units built with this lot" id="lot-units">
        {d.recall.length === 0 ? (
          <p>No unit has been built with this lot (or every fit of it was undone).</p>
        ) : (
          <div className="overflow-x-auto">
            <table className="w-full text-left" aria-label="Units built with this lot">
              <thead className="bg-stone-50 text-stone-600">
                <tr>
                  <th className={th}>Serial</th>
                  <th className={th}>Order</th>
                  <th className={th}>Customer</th>
                  <th className={th}>Shipped</th>
                  <th className={th}>Where it went</th>
                  <th className={th}>Told</th>
                </tr>
              </thead>
              <tbody>
                {d.recall.map((u) => (
                  <tr key={u.workOrderId} className="border-t border-stone-200">
                    <td className={`${td} whitespace-nowrap`}>
                      <Link to={paths.unit.href(u.serial)} className="font-bold text-brand-700 underline">
                        {u.serial}
                      </Link>
                      <span className="block text-sm text-stone-600">× {u.quantity} fitted</span>
                    </td>
                    <td className={`${td} whitespace-nowrap`}>
                      <Link to={paths.order.href(u.order.id)} className="text-brand-700 underline">
                        {u.order.number}
                      </Link>
                    </td>
                    <td className={td}>
                      {u.customer.name}
                      <span className="block text-sm text-stone-600">{u.customer.email}</span>
                    </td>
                    <td className={td}>
                      {u.shippedAt ? (
                        <>
                          {formatDateTime(u.shippedAt)}
                          {u.trackingNumber && <span className="block text-sm text-stone-600">tracking {u.trackingNumber}</span>}
                        </>
                      ) : (
                        <span className="font-bold text-amber-800">Still in the shop ({WORK_ORDER_STATUS_LABELS[u.status]})</span>
                      )}
                    </td>
                    <td className={td}>
                      {u.shipTo.name}, {u.shipTo.line1}
                      {u.shipTo.line2 ? `, ${u.shipTo.line2}` : ''}, {u.shipTo.city}
                      {u.shipTo.region ? `, ${u.shipTo.region}` : ''} {u.shipTo.postalCode}, {u.shipTo.country}
                    </td>
                    <td className={td}>{u.notifiedAt ? formatDateTime(u.notifiedAt) : '—'}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
      </Section>

      <Section title="Tell the customers" id="lot-notify">
        <p>
          One e-mail to each customer with a unit of this lot ({d.customers} customer{d.customers === 1 ? '' : 's'}, {d.customersNotified} told already). Each
          customer is told once; a customer whose unit is built with the lot later is told the next time you press it. Each order's timeline records it.
        </p>
        <Caution>
          If the part runs on mains power, the e-mail also tells customers to switch off and unplug it before touching the water, and defers to local electrical
          codes.
        </Caution>
        <label className="block">
          <span className="block font-bold">What the customer should do (goes into every e-mail)</span>
          <textarea
            value={message}
            onChange={(e) => setMessage(e.target.value)}
            rows={3}
            className="mt-1 w-full max-w-3xl rounded-md border border-stone-300 p-2"
            aria-label="What the customer should do"
          />
        </label>
        {!confirming ? (
          <Button disabled={toTell === 0} onClick={() => setConfirming(true)}>
            {toTell === 0 ? (d.customers === 0 ? 'No customer to tell' : 'Every customer has been told') : `Tell the customers (${toTell})`}
          </Button>
        ) : (
          <div role="alertdialog" aria-label="Confirm the e-mails" className="space-y-2 rounded-md border-2 border-amber-600 bg-amber-50 p-3">
            <p className="font-bold">
              Queue {toTell} e-mail{toTell === 1 ? '' : 's'} about lot {d.code}? They cannot be called back once sent.
            </p>
            <div className="flex gap-3">
              <Button disabled={notify.isPending} onClick={send}>
                Yes, e-mail {toTell} customer{toTell === 1 ? '' : 's'}
              </Button>
              <Button variant="secondary" onClick={() => setConfirming(false)}>
                Not now
              </Button>
            </div>
          </div>
        )}
        {problem && (
          <p role="alert" className="text-red-700">
            {problem}
          </p>
        )}
        <p>
          <Link to={paths.outbox.href()} className="text-brand-700 underline">
            See the e-mails in the outbox
          </Link>
        </p>
      </Section>

      <Section title="Receipts of this lot" id="lot-receipts">
        <ul className="list-disc pl-5">
          {d.receipts.map((r, i) => (
            <li key={i}>
              {r.quantity} received {formatDateTime(r.at)}
              {r.reference ? `, packing list ${r.reference}` : ''}
              {r.by ? ` by ${r.by.name}` : ''}
            </li>
          ))}
        </ul>
      </Section>
    </div>
  )
}
