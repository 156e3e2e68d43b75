import { useState } from 'react'
import type { ReleasePreview, ReleaseResult } from '@kitwright/shared/work-orders'
import { Button } from '../../../components/ui/button'
import { ApiError } from '../../../lib/api-client'
import { cn } from '../../../lib/cn'
import { useReleaseOrders, useReleasePreview } from '../api/use-release-orders'
import { formatDay } from './format'

const OUTCOME_WORDS = { release: 'Will be released', release_short: 'Will be released short', refuse: 'Will not be released' } as const

/** What a finished bulk release said, as one summary: released orders, then each refusal with its reason. */
type Summary = { released: ReleaseResult['released']; refused: { number: string | null; message: string }[] }

function summaryOfError(err: unknown): Summary {
  if (!(err instanceof ApiError)) return { released: [], refused: [{ number: null, message: 'Could not reach Kitwright; check the connection and try again' }] }
  const perOrder = Object.entries(err.body.fields ?? {}).filter(([key]) => key.startsWith('orders.'))
  if (perOrder.length > 0) return { released: [], refused: perOrder.map(([, message]) => ({ number: null, message })) }
  return { released: [], refused: [{ number: null, message: err.message }] }
}

/**
 * Releasing the chosen orders in two steps: a preview of who gets the free stock (rush first, then the
 * oldest promise) and who would be refused, then the release itself, whose outcome stays on screen as
 * one summary until the planner closes it.
 */
export function BulkReleasePanel({ orderIds, onDone }: { orderIds: string[]; onDone: () => void }) {
  const preview = useReleasePreview()
  const release = useReleaseOrders()
  const [summary, setSummary] = useState<Summary | null>(null)
  const [allowShort, setAllowShort] = useState(false)

  const look = (short: boolean) => {
    setAllowShort(short)
    setSummary(null)
    preview.mutate({ orderIds, allowShort: short })
  }
  const confirm = () =>
    release.mutate(
      { orderIds, allowShort },
      {
        onSuccess: (r) => setSummary({ released: r.released, refused: r.refused }),
        onError: (err) => setSummary(summaryOfError(err)),
      },
    )

  if (summary) return <ReleaseSummary summary={summary} onClose={onDone} />
  return (
    <div className="space-y-3 rounded-lg border border-brand-600 bg-brand-50 p-3">
      <div className="flex flex-wrap items-center gap-3">
        <span className="font-bold">
          {orderIds.length} order{orderIds.length === 1 ? '' : 's'} chosen
        </span>
        <Button onClick={() => look(false)} disabled={preview.isPending || orderIds.length === 0}>
          Release chosen orders…
        </Button>
        <Button variant="ghost" onClick={onDone}>
          Clear
        </Button>
        <span className="text-stone-700">Stock goes to rush orders first, then to the oldest promised date; you see who gets what before anything is released.</span>
      </div>
      {preview.isError && (
        <p role="alert" className="text-red-800">
          {preview.error instanceof ApiError ? preview.error.message : 'Could not reach Kitwright'}
        </p>
      )}
      {preview.data && <PreviewTable preview={preview.data} />}
      {preview.data && (
        <div className="flex flex-wrap items-center gap-3">
          <Button onClick={confirm} disabled={release.isPending || !preview.data.plan.some((p) => p.outcome !== 'refuse')}>
            Release {preview.data.plan.filter((p) => p.outcome !== 'refuse').length} order(s) as shown
          </Button>
          {!allowShort && preview.data.plan.some((p) => p.outcome === 'refuse' && p.parts.some((x) => x.short > 0)) && (
            <Button variant="danger" onClick={() => look(true)} disabled={preview.isPending}>
              Show releasing short orders anyway
            </Button>
          )}
        </div>
      )}
    </div>
  )
}

function PreviewTable({ preview }: { preview: ReleasePreview }) {
  return (
    <div className="overflow-x-auto rounded-md border border-stone-300 bg-white">
      <table className="w-full text-left" aria-label="Release preview">
        <thead className="bg-stone-50 text-sm text-stone-600">
          <tr>
            <th className="px-3 py-2">Turn</th>
            <th className="px-3 py-2">Order</th>
            <th className="px-3 py-2">Promised</th>
            <th className="px-3 py-2">Outcome</th>
            <th className="px-3 py-2">Parts</th>
          </tr>
        </thead>
        <tbody>
          {preview.plan.map((p) => (
            <tr key={p.orderId} className={cn('border-t border-stone-200 align-top', p.outcome === 'refuse' && 'bg-red-50')}>
              <td className="px-3 py-2 tabular-nums">{p.turn}</td>
              <td className="px-3 py-2 font-bold">
                {p.number}
                {p.priority === 'rush' && <span className="ml-2 rounded bg-amber-200 px-2 text-sm text-amber-950">Rush</span>}
              </td>
              <td className="px-3 py-2">{formatDay(p.promisedShipDate)}</td>
              <td className={cn('px-3 py-2 font-bold', p.outcome === 'refuse' ? 'text-red-800' : p.outcome === 'release_short' ? 'text-amber-900' : 'text-green-800')}>
                {OUTCOME_WORDS[p.outcome]}
                {p.reason && <span className="block font-normal">{p.reason}</span>}
              </td>
              <td className="px-3 py-2 text-sm">
                {p.parts.filter((x) => x.short > 0 || p.outcome !== 'refuse').map((x) => (
                  <span key={x.partId} className="block">
                    {x.sku}: takes {x.takes} of {x.needed} ({x.freeBefore} free at its turn){x.short > 0 ? `, short ${x.short}` : ''}
                  </span>
                ))}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  )
}

function ReleaseSummary({ summary, onClose }: { summary: Summary; onClose: () => void }) {
  const units = summary.released.reduce((n, o) => n + o.workOrders.length, 0)
  return (
    <div role="status" aria-label="Release summary" className="space-y-2 rounded-lg border border-stone-300 bg-white p-4">
      <p className="font-bold">
        {summary.released.length > 0
          ? `Released ${summary.released.length} order${summary.released.length === 1 ? '' : 's'} into ${units} work order${units === 1 ? '' : 's'}.`
          : 'No order was released.'}
      </p>
      {summary.refused.length > 0 && (
        <>
          <p className="font-bold text-red-800">Not released ({summary.refused.length}):</p>
          <ul className="list-disc pl-6 text-red-900">
            {summary.refused.map((r, i) => (
              <li key={i}>{r.message}</li>
            ))}
          </ul>
        </>
      )}
      <Button variant="secondary" onClick={onClose}>
        Close
      </Button>
    </div>
  )
}
