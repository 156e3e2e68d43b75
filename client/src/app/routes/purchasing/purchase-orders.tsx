import { useQuery } from '@tanstack/react-query'
import { useEffect, useState } from 'react'
import { Link, useSearchParams } from 'react-router-dom'
import { toast } from 'sonner'
import { dollarsToCents, formatMoney } from '@kitwright/shared/money'
import { PurchaseOrderStatusSchema, type PurchaseOrder } from '@kitwright/shared/purchasing'
import { PURCHASE_ORDER_STATUS_WORDS, PURCHASE_ORDER_STATUSES, type PurchaseOrderStatus } from '@kitwright/shared/purchasing-status'
import { Button } from '../../../components/ui/button'
import { Field, Input, Select } from '../../../components/ui/field'
import { paths } from '../../../config/paths'
import { purchaseOrderOptions, purchaseOrdersOptions, useCancelPurchaseOrder, useSendPurchaseOrder, useUpdatePurchaseOrder } from '../../../features/purchasing/api/purchasing-queries'
import { ApiError } from '../../../lib/api-client'
import { cn } from '../../../lib/cn'

const th = 'px-3 py-2 font-bold'
const td = 'px-3 py-2 tabular-nums'

function errorText(err: unknown) {
  return err instanceof ApiError ? err.message : 'Could not reach Kitwright; check the connection and try again'
}

/** Purchase orders, newest first; open one to edit the draft, send it, or see what has come in. */
export function Component() {
  const [params, setParams] = useSearchParams()
  const status = PurchaseOrderStatusSchema.safeParse(params.get('status')).data
  const openId = params.get('po')
  const list = useQuery(purchaseOrdersOptions({ status }))
  const go = (next: { status?: PurchaseOrderStatus; po?: string | null }) => {
    const p = new URLSearchParams()
    const s = 'status' in next ? next.status : status
    if (s) p.set('status', s)
    const po = 'po' in next ? next.po : openId
    if (po) p.set('po', po)
    setParams(p)
  }
  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-end gap-3">
        <div className="mr-auto">
          <h1 className="text-3xl font-bold">Purchase orders</h1>
          <p className="max-w-3xl text-stone-700">
            Drafts come from the Shortages page, one per supplier. Edit a draft, then send it: the supplier gets the PDF by e-mail once, and what it
            holds counts as on order. Receive the goods on the <Link className="underline" to={paths.stockReceive.href()}>Receive stock</Link> page.
          </p>
        </div>
        <Field label="Status">
          <Select value={status ?? ''} onChange={(e) => go({ status: PurchaseOrderStatusSchema.safeParse(e.target.value).data })} className="w-48">
            <option value="">Any</option>
            {PURCHASE_ORDER_STATUSES.map((s) => (
              <option key={s} value={s}>
                {PURCHASE_ORDER_STATUS_WORDS[s]}
              </option>
            ))}
          </Select>
        </Field>
      </div>
      {openId && <PurchaseOrderEditor id={openId} onClose={() => go({ po: null })} />}
      {list.isError ? (
        <p role="alert">{list.error.message}</p>
      ) : (
        <div className="overflow-x-auto rounded-lg border border-stone-300 bg-white">
          <table className="w-full text-left" aria-label="Purchase orders">
            <thead className="bg-stone-50 text-sm text-stone-600">
              <tr>
                <th className={th}>Number</th>
                <th className={th}>Supplier</th>
                <th className={th}>Status</th>
                <th className={th}>Lines</th>
                <th className={th}>Total</th>
                <th className={th}>Expected</th>
              </tr>
            </thead>
            <tbody>
              {(list.data ?? []).map((po) => (
                <tr key={po.id} className={cn('border-t border-stone-200', po.id === openId && 'bg-amber-50')}>
                  <td className="px-3 py-2">
                    <button type="button" className="font-bold underline" onClick={() => go({ po: po.id })}>
                      {po.number}
                    </button>
                  </td>
                  <td className="px-3 py-2">{po.supplier.name}</td>
                  <td className="px-3 py-2" data-status={po.status}>
                    {PURCHASE_ORDER_STATUS_WORDS[po.status]}
                  </td>
                  <td className={td}>{po.lines.length}</td>
                  <td className={td}>{formatMoney(po.totalCents)}</td>
                  <td className={td}>{po.expectedDate ?? '—'}</td>
                </tr>
              ))}
              {list.data?.length === 0 && (
                <tr>
                  <td colSpan={6} className="px-3 py-6 text-center text-stone-500">
                    No purchase orders{status ? ' in this state' : ' yet: draft them from the Shortages page'}.
                  </td>
                </tr>
              )}
            </tbody>
          </table>
        </div>
      )}
    </div>
  )
}

interface LineDraft {
  partId: string
  sku: string
  name: string
  stickLength: number | null
  quantity: string
  price: string
}

/** Dollars as typed, in cents; a minus sign is kept so the server can say a price cannot be negative. */
function priceCents(text: string): number {
  return text.trim().startsWith('-') ? Math.round(Number(text) * 100) : dollarsToCents(text)
}

function toLines(po: PurchaseOrder): LineDraft[] {
  return po.lines.map((l) => ({ partId: l.partId, sku: l.sku, name: l.name, stickLength: l.stickLength, quantity: String(l.quantity), price: (l.unitPriceCents / 100).toFixed(2) }))
}

/** One purchase order: a draft's lines, prices and date are edited here; a sent one shows what has come in. */
function PurchaseOrderEditor({ id, onClose }: { id: string; onClose: () => void }) {
  const po = useQuery(purchaseOrderOptions(id))
  const update = useUpdatePurchaseOrder()
  const send = useSendPurchaseOrder()
  const cancel = useCancelPurchaseOrder()
  const [lines, setLines] = useState<LineDraft[]>([])
  const [expectedDate, setExpectedDate] = useState('')
  const [note, setNote] = useState('')
  const [fieldErrors, setFieldErrors] = useState<Record<string, string>>({})
  useEffect(() => {
    if (!po.data) return
    setLines(toLines(po.data))
    setExpectedDate(po.data.expectedDate ?? '')
    setNote(po.data.note ?? '')
    setFieldErrors({})
  }, [po.data])
  if (po.isError) return <p role="alert">{po.error.message}</p>
  if (!po.data) return <p className="text-stone-500">Opening the purchase order…</p>
  const order = po.data
  const draft = order.status === 'draft'
  const input = () => ({
    expectedDate: expectedDate || null,
    note: note || null,
    lines: lines.map((l) => ({ partId: l.partId, stickLength: l.stickLength, quantity: Number(l.quantity), unitPriceCents: priceCents(l.price) })),
  })
  const save = async () => {
    setFieldErrors({})
    try {
      await update.mutateAsync({ id, input: input() })
      toast.success(`${order.number} saved`)
      return true
    } catch (err) {
      if (err instanceof ApiError) setFieldErrors(err.body.fields ?? {})
      toast.error(errorText(err))
      return false
    }
  }
  const total = lines.reduce((s, l) => s + (Number(l.quantity) || 0) * (dollarsToCents(l.price) || 0), 0)
  return (
    <section aria-label={`Purchase order ${order.number}`} className="space-y-4 rounded-lg border border-stone-300 bg-white p-4">
      <div className="flex flex-wrap items-start gap-3">
        <div className="mr-auto">
          <h2 className="text-2xl font-bold">
            {order.number} · {order.supplier.name}
          </h2>
          <p className="text-stone-700">
            <span data-testid="po-status">{PURCHASE_ORDER_STATUS_WORDS[order.status]}</span>
            {order.sentAt ? ` · sent ${order.sentAt.slice(0, 10)} to ${order.supplier.email ?? ''}` : ''}
            {order.supplier.minimumOrderCents > 0 ? ` · the supplier's minimum order is ${formatMoney(order.supplier.minimumOrderCents)}` : ''}
          </p>
        </div>
        <a className="underline" href={`/api/purchase-orders/${order.id}/pdf`} target="_blank" rel="noreferrer">
          Open the PDF
        </a>
        <Button variant="ghost" onClick={onClose}>
          Close
        </Button>
      </div>
      <div className="overflow-x-auto">
        <table className="w-full text-left" aria-label="Lines">
          <thead className="bg-stone-50 text-sm text-stone-600">
            <tr>
              <th className={th}>Part</th>
              <th className={th}>Quantity</th>
              <th className={th}>Unit price ($)</th>
              <th className={th}>Line total</th>
              {!draft && <th className={th}>Received</th>}
              {!draft && <th className={th}>Still to come</th>}
            </tr>
          </thead>
          <tbody>
            {lines.map((l, i) => {
              const line = order.lines[i]
              return (
                <tr key={l.partId} className="border-t border-stone-200">
                  <td className="px-3 py-2">
                    <span className="block font-bold">{l.sku}</span>
                    <span className="block text-sm text-stone-600">{l.name}</span>
                  </td>
                  <td className="px-3 py-2">
                    {draft ? (
                      <Field label={`Quantity of ${l.sku}`} error={fieldErrors[`lines.${i}.quantity`]}>
                        <Input className="w-28" inputMode="numeric" value={l.quantity} onChange={(e) => setLines(lines.map((x, j) => (j === i ? { ...x, quantity: e.target.value } : x)))} />
                      </Field>
                    ) : (
                      l.quantity
                    )}
                  </td>
                  <td className="px-3 py-2">
                    {draft ? (
                      <Field label={`Unit price of ${l.sku}`} error={fieldErrors[`lines.${i}.unitPriceCents`]}>
                        <Input className="w-28" inputMode="decimal" value={l.price} onChange={(e) => setLines(lines.map((x, j) => (j === i ? { ...x, price: e.target.value } : x)))} />
                      </Field>
                    ) : (
                      formatMoney(dollarsToCents(l.price))
                    )}
                  </td>
                  <td className={td}>{formatMoney((Number(l.quantity) || 0) * (dollarsToCents(l.price) || 0))}</td>
                  {!draft && <td className={td}>{line?.received ?? 0}</td>}
                  {!draft && (
                    <td className={td}>
                      {line?.outstanding ?? 0}
                      {line?.closedShortReason ? <span className="block text-sm text-stone-600">Closed short: {line.closedShortReason}</span> : null}
                    </td>
                  )}
                </tr>
              )
            })}
          </tbody>
        </table>
      </div>
      <p className="font-bold">Total {formatMoney(total)}</p>
      {draft ? (
        <div className="grid gap-3 md:grid-cols-2">
          <Field label="Expected date" hint="When the goods should arrive; shortages show it" error={fieldErrors.expectedDate}>
            <Input type="date" value={expectedDate} onChange={(e) => setExpectedDate(e.target.value)} />
          </Field>
          <Field label="Note to the supplier (optional)" error={fieldErrors.note}>
            <Input value={note} onChange={(e) => setNote(e.target.value)} />
          </Field>
        </div>
      ) : (
        <p className="text-stone-700">Expected {order.expectedDate ?? '—'}{order.note ? ` · ${order.note}` : ''}</p>
      )}
      <div className="flex flex-wrap gap-3">
        {draft && (
          <Button variant="secondary" disabled={update.isPending} onClick={() => void save()}>
            Save the draft
          </Button>
        )}
        {draft && (
          <Button
            disabled={send.isPending || update.isPending}
            onClick={async () => {
              if (!(await save())) return
              send.mutate(id, {
                onSuccess: (sent) => toast.success(`${sent.number} sent to ${sent.supplier.email ?? sent.supplier.name}`),
                onError: (err) => toast.error(errorText(err)),
              })
            }}
          >
            Send to the supplier
          </Button>
        )}
        {(order.status === 'draft' || order.status === 'sent') && (
          <Button
            variant="ghost"
            disabled={cancel.isPending}
            onClick={() => cancel.mutate(id, { onSuccess: (c) => toast.success(`${c.number} cancelled`), onError: (err) => toast.error(errorText(err)) })}
          >
            Cancel the order
          </Button>
        )}
        {(order.status === 'sent' || order.status === 'partly_received') && (
          <Link className="self-center underline" to={`${paths.stockReceive.href()}?po=${order.id}`}>
            Receive against {order.number}
          </Link>
        )}
      </div>
    </section>
  )
}
