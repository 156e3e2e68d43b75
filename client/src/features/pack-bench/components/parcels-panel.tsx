import { useState } from 'react'
import { formatWeight, poundsToGrams } from '@kitwright/shared/domain/weights'
import type { PackView, Quote } from '@kitwright/shared/pack'
import { Button } from '../../../components/ui/button'
import { useLengthUnit } from '../../../lib/shop-settings'
import { useBuyLabel, useQuote } from '../api/pack-queries'

interface Draft {
  workOrderIds: string[]
  boxId: string
  scale: string
}

const money = (cents: number) => `$${(cents / 100).toFixed(2)}`

/** The parcels before the label: box and scale reading per parcel, the carrier's prices, one tap to buy. */
export function ParcelsPanel({ view, onError }: { view: PackView; onError: (message: string) => void }) {
  const { unit, format } = useLengthUnit()
  const weightUnit = unit === 'in' ? 'lb' : 'kg'
  const [drafts, setDrafts] = useState<Draft[]>(() => view.parcels.map((p) => ({ workOrderIds: p.workOrderIds, boxId: p.boxId ?? view.boxes[0]?.id ?? '', scale: '' })))
  const [quotes, setQuotes] = useState<Quote[] | null>(null)
  const quote = useQuote()
  const buy = useBuyLabel()

  function parcelsInput() {
    return drafts.map((d, i) => {
      const text = d.scale.trim()
      const reading = text === '' ? null : Number(text)
      if (reading !== null && (!Number.isFinite(reading) || reading <= 0)) throw new Error(`Parcel ${i + 1}: enter the scale reading in ${weightUnit} as a number above zero, or leave it empty`)
      const grams = reading === null ? null : Math.round(unit === 'in' ? poundsToGrams(reading) : reading * 1000)
      return { workOrderIds: d.workOrderIds, boxId: d.boxId, scaleGrams: grams }
    })
  }
  const update = (i: number, change: Partial<Draft>) => {
    setQuotes(null)
    setDrafts((all) => all.map((d, n) => (n === i ? { ...d, ...change } : d)))
  }

  return (
    <div className="space-y-3">
      {view.parcels.map((p, i) => {
        const box = view.boxes.find((b) => b.id === drafts[i]?.boxId)
        return (
          <fieldset key={p.position} className="space-y-2 rounded-lg border-2 border-stone-300 bg-white p-3">
            <legend className="px-1 text-xl font-bold">
              Parcel {p.position}: {p.serials.join(', ')}
            </legend>
            <div className="flex flex-wrap gap-4">
              <label className="block">
                <span className="block text-lg font-bold">Box</span>
                <select className="h-14 rounded-md border-2 border-stone-400 bg-white px-3 text-lg" value={drafts[i]?.boxId} onChange={(e) => update(i, { boxId: e.target.value })}>
                  {view.boxes.map((b) => (
                    <option key={b.id} value={b.id}>
                      {b.name}
                    </option>
                  ))}
                </select>
              </label>
              <label className="block">
                <span className="block text-lg font-bold">Scale reading ({weightUnit}), if weighed</span>
                <input inputMode="decimal" className="h-14 w-40 rounded-md border-2 border-stone-400 px-3 text-2xl" value={drafts[i]?.scale ?? ''} onChange={(e) => update(i, { scale: e.target.value })} />
              </label>
            </div>
            <p className="text-lg">
              {box ? `${format(box.length)} × ${format(box.width)} × ${format(box.height)}` : ''} · estimated {formatWeight(p.estimatedGrams, unit)} (parts and box) · dimensional {formatWeight(p.dimensionalGrams, unit)} · billable{' '}
              <strong>{formatWeight(p.billableGrams, unit)}</strong>
            </p>
          </fieldset>
        )
      })}
      <div className="flex flex-wrap gap-3">
        <Button
          size="bench"
          variant="secondary"
          disabled={!view.canLabel || quote.isPending}
          onClick={() => {
            try {
              quote.mutate({ orderId: view.order.id, parcels: parcelsInput() }, { onSuccess: setQuotes, onError: (e) => onError(e.message) })
            } catch (e) {
              onError(e instanceof Error ? e.message : String(e))
            }
          }}
        >
          Get prices
        </Button>
        {quotes?.map((q) => (
          <Button
            key={q.service}
            size="bench"
            disabled={buy.isPending}
            onClick={() => buy.mutate({ orderId: view.order.id, service: q.service, parcels: parcelsInput() }, { onError: (e) => onError(e.message) })}
          >
            Buy {q.name} label · {money(q.chargeCents)} · {q.days} days
          </Button>
        ))}
      </div>
    </div>
  )
}
