import { useState } from 'react'
import type { PackView } from '@kitwright/shared/pack'
import { Button } from '../../../components/ui/button'
import { useApprovePartial } from '../api/pack-queries'

/** A planner lets what is confirmed go now and back-orders the rest, saying why. */
export function PartialApproval({ view, onError }: { view: PackView; onError: (message: string) => void }) {
  const [note, setNote] = useState('')
  const approve = useApprovePartial()
  if (view.shipment?.partialApproval) {
    const a = view.shipment.partialApproval
    return (
      <p className="rounded-lg border-2 border-amber-600 bg-amber-50 p-3 text-lg">
        Partial shipment approved by {a.by.name}: {a.note}. Back-ordered: {view.backOrderedSerials.join(', ') || 'nothing'}.
      </p>
    )
  }
  return (
    <form
      aria-label="Approve a partial shipment"
      className="flex flex-wrap items-end gap-3 rounded-lg border-2 border-amber-600 bg-amber-50 p-3"
      onSubmit={(e) => {
        e.preventDefault()
        approve.mutate({ orderId: view.order.id, note }, { onError: (err) => onError(err.message), onSuccess: () => setNote('') })
      }}
    >
      <label className="block min-w-64 flex-1">
        <span className="block text-lg font-bold">Planner: ship what is confirmed, back-order the rest, because…</span>
        <input className="h-14 w-full rounded-md border-2 border-stone-400 px-3 text-lg" value={note} onChange={(e) => setNote(e.target.value)} />
      </label>
      <Button size="bench" type="submit" disabled={approve.isPending}>
        Approve partial shipment
      </Button>
    </form>
  )
}
