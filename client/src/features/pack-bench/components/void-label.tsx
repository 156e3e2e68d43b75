import { useState } from 'react'
import { Button } from '../../../components/ui/button'
import { useVoidLabel } from '../api/pack-queries'

/**
 * Voids a bought label, with the reason (kept in the audit): the carrier is asked to refund it and,
 * before shipping, the box opens again for a new label. Two taps: open, then confirm with a reason.
 */
export function VoidLabel({ shipment: s, onError }: { shipment: { id: string; trackingNumber: string | null; canVoid: boolean } | null; onError: (message: string) => void }) {
  const [open, setOpen] = useState(false)
  const [reason, setReason] = useState('')
  const voidLabel = useVoidLabel()
  if (!s || !s.canVoid) return null
  if (!open) {
    return (
      <Button size="bench" variant="secondary" onClick={() => setOpen(true)}>
        Void label…
      </Button>
    )
  }
  return (
    <form
      aria-label="Void the label"
      className="flex flex-wrap items-end gap-3 rounded-lg border-2 border-red-700 bg-red-50 p-3"
      onSubmit={(e) => {
        e.preventDefault()
        voidLabel.mutate({ shipmentId: s.id, reason }, { onError: (err) => onError(err.message), onSuccess: () => { setOpen(false); setReason('') } })
      }}
    >
      <label className="block min-w-64 flex-1">
        <span className="block text-lg font-bold">Void label {s.trackingNumber} and ask the carrier for a refund, because…</span>
        <input className="h-14 w-full rounded-md border-2 border-stone-400 px-3 text-lg" value={reason} onChange={(e) => setReason(e.target.value)} />
      </label>
      <Button size="bench" variant="danger" type="submit" disabled={voidLabel.isPending}>
        Void label
      </Button>
      <Button size="bench" variant="secondary" type="button" onClick={() => setOpen(false)}>
        Keep it
      </Button>
    </form>
  )
}
