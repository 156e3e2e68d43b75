import { useState } from 'react'
import { formatWeight, poundsToGrams } from '@kitwright/shared/domain/weights'
import type { PackView, Quote } from '@kitwright/shared/pack'
import { Button } from '../../../components/ui/button'
import { useLengthUnit } from '../../../lib/shop-settings'
import { useBuyLabel, useQuote } from '../api/pack-queries'

interface Draft {
  /** Stable across moves, so React keeps each parcel's inputs. */
  key: number
  workOrderIds: string[]
  boxId: string
  scale: string
}

/** Moves a unit (with its bags) to parcel `to`, or to a new parcel when `to` is null; empty parcels go. */
function moveUnit(drafts: readonly Draft[], workOrderId: string, to: number | null, newParcel: Omit<Draft, 'workOrderIds'>): Draft[] {
  const moved = drafts.map((d) => ({ ...d, workOrderIds: d.workOrderIds.filter((id) => id !== workOrderId) }))
  const next =
    to === null
      ? [...moved, { ...newParcel, workOrderIds: [workOrderId] }]
      : moved.map((d) => (d.key === to ? { ...d, workOrderIds: [...d.workOrderIds, workOrderId] } : d))
  return next.filter((d) => d.workOrderIds.length > 0)
}

const money = (cents: number) => `$${(cents / 100).toFixed(2)}`

/**
 * The parcels before the label: which units go in which parcel (the packer may move any), box and
 * scale reading per parcel, the carrier's prices, one tap to buy.
 */
export function ParcelsPanel({ view, onError }: { view: PackView; onError: (message: string) => void }) {
  const { unit, format } = useLengthUnit()
  const weightUnit = unit === 'in' ? 'lb' : 'kg'
  const [drafts, setDrafts] = useState<Draft[]>(() =>
    view.parcels.map((p, i) => ({ key: i + 1, workOrderIds: p.workOrderIds, boxId: p.boxId ?? view.boxes[0]?.id ?? '', scale: '' })),
  )
  const serialOf = new Map(view.items.map((i) => [i.workOrderId, i.serial]))
  const move = (workOrderId: string, to: number | null) => {
    setQuotes(null)
    // A new parcel starts in the box the unit came out of; the packer may choose another.
    setDrafts((all) =>
      moveUnit(all, workOrderId, to, {
        key: Math.max(0, ...all.map((d) => d.key)) + 1,
        boxId: all.find((d) => d.workOrderIds.includes(workOrderId))?.boxId ?? view.boxes[0]?.id ?? '',
        scale: '',
      }),
    )
  }
  const [quotes, setQuotes] = useState<Quote[] | null>(null)
  const quote = useQuote()
  const buy = useBuyLabel()

  function parcelsInput() {
    return drafts.map((d, i) => {
      const text = d.scale.trim()
      const reading = text === '' ? null : Number(text)
      if (reading !== null && (!Number.isFinite(reading) || reading <= 0))
        throw new Error(`Parcel ${i + 1}: enter the scale reading in ${weightUnit} as a number above zero, or leave it empty`)
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
      <p className="text-lg">
        Proposed: one parcel per unit that has its own carton; packs without one ride in the first parcel. Move a unit to another parcel if it goes elsewhere:
        its bags go with it, and the packing slip lists each parcel with its own tracking number.
      </p>
      {drafts.map((d, i) => {
        const box = view.boxes.find((b) => b.id === d.boxId)
        // The server's weights hold while the parcel is as proposed; after a move it weighs again at Get prices.
        const p = view.parcels.find((x) => x.workOrderIds.join() === d.workOrderIds.join() && x.boxId === d.boxId)
        return (
          <fieldset key={d.key} className="space-y-2 rounded-lg border-2 border-stone-300 bg-white p-3">
            <legend className="px-1 text-xl font-bold">
              Parcel {i + 1}: {d.workOrderIds.map((id) => serialOf.get(id) ?? '?').join(', ')}
            </legend>
            <ul className="space-y-2">
              {d.workOrderIds.map((id) => (
                <li key={id} className="flex flex-wrap items-center gap-2">
                  <span className="min-w-24 text-lg font-bold">{serialOf.get(id) ?? '?'}</span>
                  {drafts
                    .filter((other) => other.key !== d.key)
                    .map((other) => (
                      <Button key={other.key} size="bench" variant="secondary" onClick={() => move(id, other.key)}>
                        Move to parcel {drafts.indexOf(other) + 1}
                      </Button>
                    ))}
                  {d.workOrderIds.length > 1 && (
                    <Button size="bench" variant="secondary" onClick={() => move(id, null)}>
                      Own parcel
                    </Button>
                  )}
                </li>
              ))}
            </ul>
            <div className="flex flex-wrap gap-4">
              <label className="block">
                <span className="block text-lg font-bold">Box</span>
                <select
                  className="h-14 rounded-md border-2 border-stone-400 bg-white px-3 text-lg"
                  value={d.boxId}
                  onChange={(e) => update(i, { boxId: e.target.value })}
                >
                  {view.boxes.map((b) => (
                    <option key={b.id} value={b.id}>
                      {b.name}
                    </option>
                  ))}
                </select>
              </label>
              <label className="block">
                <span className="block text-lg font-bold">Scale reading ({weightUnit}), if weighed</span>
                <input
                  inputMode="decimal"
                  className="h-14 w-40 rounded-md border-2 border-stone-400 px-3 text-2xl"
                  value={d.scale}
                  onChange={(e) => update(i, { scale: e.target.value })}
                />
              </label>
            </div>
            <p className="text-lg">
              {box ? `${format(box.length)} × ${format(box.width)} × ${format(box.height)}` : ''}
              {p ? (
                <>
                  {' '}
                  · estimated {formatWeight(p.estimatedGrams, unit)} (parts and box) · dimensional {formatWeight(p.dimensionalGrams, unit)} · billable{' '}
                  <strong>{formatWeight(p.billableGrams, unit)}</strong>
                </>
              ) : (
                ' · weighed again when you get prices'
              )}
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
