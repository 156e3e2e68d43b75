import { useQuery } from '@tanstack/react-query'
import { useState } from 'react'
import { Link, useParams } from 'react-router-dom'
import { formatDateTime } from '@kitwright/shared/dates'
import { RETURN_DISPOSITION_LABELS, RETURN_LABEL_STATUS_LABELS, RETURN_STATUS_LABELS, WORK_ORDER_STATUS_LABELS, wordFor } from '@kitwright/shared/status-words'
import { Button } from '../../../components/ui/button'
import { Field, Select } from '../../../components/ui/field'
import { Section } from '../../../components/ui/section'
import { paths } from '../../../config/paths'
import { meOptions } from '../../../features/auth/api/auth-queries'
import { returnDetailOptions, useBuyReturnLabel, useReceiveReturn } from '../../../features/returns/api/return-queries'
import { DecisionForm } from '../../../features/returns/components/decision-form'
import { DispositionForm } from '../../../features/returns/components/disposition-form'
import { ReturnPhotos } from '../../../features/returns/components/return-photos'

/** A sentence ends with one full stop, whether or not its last words brought their own. */
const sentence = (text: string) => (/[.!?]$/.test(text) ? `${text} ` : `${text}. `)
const money = (cents: number, currency: string) => `${(cents / 100).toFixed(2)} ${currency}`

/** One return: the unit, why, its label, its photos, receiving, and the decision. */
export function Component() {
  const { returnId = '' } = useParams()
  const { data: me } = useQuery(meOptions())
  const office = me?.role === 'admin' || me?.role === 'planner'
  const receiver = office || me?.role === 'packer'
  const { data: ret, error } = useQuery(returnDetailOptions(returnId))
  const buy = useBuyReturnLabel()
  const receive = useReceiveReturn()
  const [service, setService] = useState('ground')
  if (error) return <p role="alert">{error.message}</p>
  if (!ret) return <p>Loading…</p>
  const d = ret.decision
  return (
    <div className="max-w-5xl space-y-6">
      <div>
        <Link to={paths.returns.href()} className="text-brand-700 underline">
          All returns
        </Link>
        <h1 className="text-4xl font-bold">
          Return {ret.number} · {RETURN_STATUS_LABELS[ret.status]}
        </h1>
      </div>
      <Section title="Unit and reason">
        <dl className="grid grid-cols-[max-content_1fr] gap-x-6 gap-y-2 text-lg">
          <dt className="font-bold">Unit</dt>
          <dd>
            <Link className="font-bold text-brand-700 underline" to={paths.unit.href(ret.unit.serial)}>
              {ret.unit.serial}
            </Link>{' '}
            · {ret.unit.kitName} ({ret.unit.kitSku} rev {ret.unit.revisionCode}) · {wordFor(WORK_ORDER_STATUS_LABELS, ret.unit.status)}
          </dd>
          <dt className="font-bold">Order</dt>
          <dd>
            {ret.order.number} · {ret.order.customerName}
          </dd>
          <dt className="font-bold">Reason</dt>
          <dd>{ret.reason}</dd>
          {ret.notes && (
            <>
              <dt className="font-bold">Notes</dt>
              <dd>{ret.notes}</dd>
            </>
          )}
          <dt className="font-bold">Opened</dt>
          <dd>
            {formatDateTime(ret.openedAt)} by {ret.openedBy.name}
          </dd>
          <dt className="font-bold">Received</dt>
          <dd>
            {ret.received
              ? `${formatDateTime(ret.received.at)} by ${ret.received.by.name}${ret.received.code ? ` (scanned ${ret.received.code})` : ''}`
              : 'Not yet: the pack bench scans the parcel in on the Returns page'}
          </dd>
        </dl>
        {receiver && ret.status === 'awaiting_parcel' && (
          <Button size="bench" disabled={receive.isPending} onClick={() => receive.mutate(ret.label.trackingNumber ?? ret.number)}>
            {receive.isPending ? 'Receiving…' : 'Receive this parcel'}
          </Button>
        )}
        {receive.isError && (
          <p role="alert" className="rounded-md border-2 border-red-600 bg-red-50 p-3 text-lg text-red-900">
            {receive.error.message}
          </p>
        )}
      </Section>

      <Section title="Return label">
        <p className="text-lg">
          {RETURN_LABEL_STATUS_LABELS[ret.label.status]}
          {ret.label.trackingNumber && ` · ${ret.label.carrier ?? ''} ${ret.label.service ?? ''} · tracking ${ret.label.trackingNumber}`}
          {ret.label.chargeCents !== null && ` · ${money(ret.label.chargeCents, 'USD')}`}
        </p>
        {ret.label.status === 'bought' && (
          <a
            className="inline-flex h-14 items-center rounded-md border-2 border-brand-700 px-6 text-lg font-bold text-brand-900"
            href={`/api/returns/${ret.id}/label.pdf`}
            target="_blank"
            rel="noreferrer"
          >
            Print the return label (PDF)
          </a>
        )}
        {office && ret.label.status !== 'bought' && ret.status === 'awaiting_parcel' && (
          <div className="flex flex-wrap items-end gap-3">
            <Field label="Service">
              <Select value={service} onChange={(e) => setService(e.target.value)} className="h-14 w-48 text-lg">
                <option value="ground">Ground</option>
                <option value="express">Express</option>
              </Select>
            </Field>
            <Button size="bench" disabled={buy.isPending} onClick={() => buy.mutate({ id: ret.id, service })}>
              {buy.isPending ? 'Buying…' : ret.label.status === 'buying' ? 'Finish buying the label' : 'Buy return label'}
            </Button>
          </div>
        )}
        {buy.isError && (
          <p role="alert" className="rounded-md border-2 border-red-600 bg-red-50 p-3 text-lg text-red-900">
            {buy.error.message}
          </p>
        )}
      </Section>

      <Section title="Photos">
        <ReturnPhotos ret={ret} />
      </Section>

      <Section title="Decision">
        {!d && ret.status === 'awaiting_parcel' && <p className="text-lg">Decide once the parcel is back in the shop.</p>}
        {!d &&
          ret.status === 'received' &&
          (office ? <DecisionForm ret={ret} /> : <p className="text-lg">Back in the shop: the office decides repair, replace or refund.</p>)}
        {d && (
          <div className="space-y-2 text-lg">
            <p>
              <strong>{RETURN_STATUS_LABELS[ret.status]}</strong> on {formatDateTime(d.at)} by {d.by.name}
              {d.note ? `: ${d.note}` : ''}
            </p>
            {d.kind === 'repair' && (
              <p>
                {d.reopenedSteps.length > 0 ? sentence(`Steps to do again: ${d.reopenedSteps.map((s) => `${s.position}. ${s.text}`).join('; ')}`) : ''}
                {d.repaired
                  ? 'Repaired: the new leak test passed and the unit is ready again.'
                  : 'At the build bench: it needs a new leak test before it is ready again.'}
              </p>
            )}
            {d.replacement && (
              <p>
                Replacement unit {d.replacement.serial} ({wordFor(WORK_ORDER_STATUS_LABELS, d.replacement.status)}) on order{' '}
                <Link className="font-bold text-brand-700 underline" to={paths.order.href(d.replacement.orderId)}>
                  {d.replacement.orderNumber}
                </Link>
              </p>
            )}
            {d.refundCents !== null && <p>Refund noted: {money(d.refundCents, ret.order.currency)}</p>}
          </div>
        )}
      </Section>

      {(ret.status === 'replace' || ret.status === 'refund') && (
        <Section title="The returned unit">
          {ret.disposition ? (
            <p className="text-lg">
              <strong>{RETURN_DISPOSITION_LABELS[ret.disposition.kind]}</strong> on {formatDateTime(ret.disposition.at)} by {ret.disposition.by.name}
              {ret.disposition.note ? `: ${ret.disposition.note}` : ''}
              {ret.disposition.kind === 'spare' ? ` (kept whole on the spares shelf as ${ret.unit.serial})` : ''}
            </p>
          ) : office ? (
            <DispositionForm ret={ret} />
          ) : (
            <p className="text-lg">Set it on the returns shelf: the office records whether it goes back to stock as a spare or is scrapped.</p>
          )}
        </Section>
      )}
    </div>
  )
}
