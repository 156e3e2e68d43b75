import { useQuery } from '@tanstack/react-query'
import { useState, type FormEvent } from 'react'
import { toast } from 'sonner'
import { formatDateTime } from '@kitwright/shared/dates'
import { dollarsToCents, formatMoney } from '@kitwright/shared/money'
import type { OrderDetail } from '@kitwright/shared/orders'
import { PAYMENT_METHOD_LABELS, RecordPaymentSchema } from '@kitwright/shared/payments'
import { Button } from '../../../components/ui/button'
import { Field, Input, Select } from '../../../components/ui/field'
import { ApiError } from '../../../lib/api-client'
import { orderPaymentsOptions, useRecordPayment, useSendPaymentLink } from '../api/order-payments'

const LINK_WORDS = { creating: 'Being made', open: 'Sent, waiting for the customer', paid: 'Paid', failed: 'Could not be made' } as const

/**
 * An order the shop collects itself (a phone order): what is due, the payments taken, and two ways
 * to take the rest — record a payment taken by phone, in cash or by transfer, or e-mail the customer
 * a link to pay through the payment service.
 */
export function PaymentPanel({ order }: { order: OrderDetail }) {
  const panel = useQuery({ ...orderPaymentsOptions(order.id), enabled: order.source !== 'store' })
  const record = useRecordPayment(order.id)
  const sendLink = useSendPaymentLink(order.id)
  const [method, setMethod] = useState<'card_by_phone' | 'cash' | 'bank_transfer'>('card_by_phone')
  const [amount, setAmount] = useState('')
  const [reference, setReference] = useState('')
  const [errors, setErrors] = useState<Record<string, string>>({})

  if (order.source === 'store' || !panel.data) return null
  const p = panel.data

  const submit = (e: FormEvent) => {
    e.preventDefault()
    const parsed = RecordPaymentSchema.safeParse({ method, amountCents: amount.trim() ? dollarsToCents(amount) : p.dueCents, reference })
    if (!parsed.success) {
      setErrors(Object.fromEntries(parsed.error.issues.map((i) => [String(i.path[0]), Number.isNaN(dollarsToCents(amount)) ? 'Enter dollars and cents, e.g. 189.00' : i.message])))
      return
    }
    setErrors({})
    record.mutate(parsed.data, {
      onSuccess: (after) => {
        setAmount('')
        setReference('')
        toast.success(after.paymentStatus === 'paid' ? `Order ${order.number} is paid in full` : `Payment recorded; ${formatMoney(after.dueCents, after.currency)} still due`)
      },
      onError: (err) => setErrors(err instanceof ApiError ? { form: err.message, ...(err.body.fields ?? {}) } : { form: 'Could not reach Kitwright; nothing was recorded' }),
    })
  }

  return (
    <section aria-label="Payment" className="space-y-3 rounded-lg border border-stone-300 bg-white p-4">
      <h2 className="text-xl font-bold">Payment</h2>
      <p className="tabular-nums">
        Total {formatMoney(p.totalCents, p.currency)} · paid {formatMoney(p.paidCents, p.currency)} ·{' '}
        <span className={p.dueCents > 0 ? 'font-bold text-amber-900' : 'font-bold text-green-800'}>{p.dueCents > 0 ? `${formatMoney(p.dueCents, p.currency)} due` : 'nothing due'}</span>
      </p>
      {p.payments.length > 0 && (
        <ul aria-label="Payments received" className="list-disc pl-6">
          {p.payments.map((x) => (
            <li key={x.id}>
              {formatMoney(x.amountCents, p.currency)} · {PAYMENT_METHOD_LABELS[x.method]}
              {x.reference ? ` · ${x.reference}` : ''} · {formatDateTime(x.recordedAt)}
            </li>
          ))}
        </ul>
      )}
      {p.links.length > 0 && (
        <ul aria-label="Payment links" className="list-disc pl-6">
          {p.links.map((l) => (
            <li key={l.id}>
              Link for {formatMoney(l.amountCents, p.currency)}: {LINK_WORDS[l.status]}
              {l.error && l.status !== 'open' ? ` (${l.error})` : ''} · {formatDateTime(l.createdAt)}
            </li>
          ))}
        </ul>
      )}
      {p.dueCents > 0 && order.status !== 'cancelled' && (
        <>
          <form onSubmit={submit} className="grid items-end gap-3 sm:grid-cols-[14rem_10rem_1fr_auto]" aria-label="Record a payment">
            <Field label="How they paid">
              <Select value={method} onChange={(e) => setMethod(e.target.value as typeof method)}>
                {(['card_by_phone', 'cash', 'bank_transfer'] as const).map((m) => (
                  <option key={m} value={m}>
                    {PAYMENT_METHOD_LABELS[m]}
                  </option>
                ))}
              </Select>
            </Field>
            <Field label="Amount ($)" error={errors.amountCents}>
              <Input inputMode="decimal" placeholder={(p.dueCents / 100).toFixed(2)} value={amount} onChange={(e) => setAmount(e.target.value)} aria-invalid={!!errors.amountCents} />
            </Field>
            <Field label="Reference (optional)" error={errors.reference}>
              <Input value={reference} onChange={(e) => setReference(e.target.value)} placeholder="Receipt or transfer number" />
            </Field>
            <Button type="submit" disabled={record.isPending}>
              Record payment
            </Button>
          </form>
          {errors.form && (
            <p role="alert" className="text-red-800">
              {errors.form}
            </p>
          )}
          <div className="flex flex-wrap items-center gap-3">
            <Button
              variant="secondary"
              disabled={!p.linksAvailable || sendLink.isPending}
              onClick={() =>
                sendLink.mutate(undefined, {
                  onSuccess: () => toast.success(`Payment link e-mailed to ${order.customer.email}`),
                  onError: (err) => toast.error(err instanceof ApiError ? err.message : 'Could not reach Kitwright; try again'),
                })
              }
            >
              E-mail a payment link for {formatMoney(p.dueCents, p.currency)}
            </Button>
            <span className="text-sm text-stone-600">
              {p.linksAvailable
                ? 'The customer pays through the payment service; the order is marked paid when it tells us. Sending again re-sends the same link.'
                : 'No payment service is set up (PAYMENT_SERVICE_KEY), so links cannot be sent.'}
            </span>
          </div>
        </>
      )}
    </section>
  )
}
