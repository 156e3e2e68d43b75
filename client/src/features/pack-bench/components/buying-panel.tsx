import type { PackView } from '@kitwright/shared/pack'
import { Button } from '../../../components/ui/button'
import { useBuyLabel } from '../api/pack-queries'

/**
 * A label purchase is under way or was cut short (the carrier could not be reached, or the app
 * restarted): one tap finishes it with the same idempotency key, so the label is never bought twice.
 */
export function BuyingPanel({ view, onError }: { view: PackView; onError: (message: string) => void }) {
  const buy = useBuyLabel()
  const parcels = view.parcels.map((p) => ({ workOrderIds: p.workOrderIds, boxId: p.boxId ?? '', scaleGrams: p.scaleGrams }))
  return (
    <div role="status" className="space-y-3 rounded-lg border-2 border-amber-600 bg-amber-50 p-4">
      <p className="text-2xl">
        The label for order {view.order.number} is being bought. If it does not show in a moment, finish buying it: the carrier will not charge twice.
      </p>
      <Button
        size="bench"
        className="h-20 w-full text-2xl"
        disabled={buy.isPending}
        onClick={() => buy.mutate({ orderId: view.order.id, service: 'resume', parcels }, { onError: (e) => onError(e.message) })}
      >
        Finish buying the label
      </Button>
    </div>
  )
}
