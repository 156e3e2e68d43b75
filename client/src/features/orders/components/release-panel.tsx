import { useState } from 'react'
import { toast } from 'sonner'
import type { OrderDetail } from '@kitwright/shared/orders'
import { Button } from '../../../components/ui/button'
import { ApiError } from '../../../lib/api-client'
import { useReleaseOrders } from '../api/use-release-orders'

/** What a refused release said: its message and, when stock was short, each short part. */
interface Refusal {
  message: string
  short: { sku: string; words: string }[]
}

function refusalOf(err: unknown): Refusal {
  if (!(err instanceof ApiError)) return { message: 'Could not reach Kitwright; check the connection and try again', short: [] }
  const short = Object.entries(err.body.fields ?? {})
    .filter(([key]) => key.startsWith('short.'))
    .map(([key, words]) => ({ sku: key.slice('short.'.length), words }))
  return { message: err.message, short }
}

/**
 * Releases an open order into work orders. When stock is short the server refuses and names each
 * short part; the planner may then release anyway, reserving what is free and recording the rest.
 */
export function ReleasePanel({ order }: { order: OrderDetail }) {
  const release = useReleaseOrders()
  const [refusal, setRefusal] = useState<Refusal | null>(null)
  if (order.status !== 'open') return null

  const run = (allowShort: boolean) =>
    release.mutate(
      { orderIds: [order.id], allowShort },
      {
        onSuccess: (result) => {
          setRefusal(null)
          const done = result.released[0]
          if (!done) return
          const short = done.shortages.length ? `; short: ${done.shortages.map((s) => `${s.sku} ×${s.short}`).join(', ')}` : ''
          toast.success(`Released ${order.number} into ${done.workOrders.length} work order${done.workOrders.length === 1 ? '' : 's'}${short}`)
        },
        onError: (err) => setRefusal(refusalOf(err)),
      },
    )

  const blocked = order.unmappedLines > 0
  return (
    <div className="space-y-3 rounded-lg border border-brand-600 bg-brand-50 p-4">
      <div className="flex flex-wrap items-center gap-3">
        <Button onClick={() => run(false)} disabled={release.isPending}>
          Release into work orders
        </Button>
        <span className="text-stone-700">
          One work order per unit, at each kit's newest released revision; hardware and packaging are reserved now, pipe when a cut run is published.
        </span>
      </div>
      {blocked && (
        <p className="font-bold text-amber-900">
          {order.unmappedLines} line{order.unmappedLines === 1 ? ' maps' : 's map'} to no kit: set the store product on the right kit first.
        </p>
      )}
      {refusal && (
        <div role="alert" className="space-y-2 rounded-md border border-red-300 bg-white p-3 text-red-900">
          <p className="font-bold">{refusal.short.length ? 'Not enough stock to release this order' : refusal.message}</p>
          {refusal.short.length > 0 && (
            <>
              <ul aria-label="Short parts" className="list-disc pl-6">
                {refusal.short.map((s) => (
                  <li key={s.sku}>
                    <span className="font-bold">{s.sku}</span>: {s.words}
                  </li>
                ))}
              </ul>
              <div className="flex flex-wrap items-center gap-3">
                <Button variant="danger" onClick={() => run(true)} disabled={release.isPending}>
                  Release anyway with shortages
                </Button>
                <span className="text-stone-700">Reserves what is free; the units wait for the rest, listed on the shortages page.</span>
              </div>
            </>
          )}
        </div>
      )}
    </div>
  )
}
