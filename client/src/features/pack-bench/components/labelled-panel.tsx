import { formatSscc } from '@kitwright/shared/domain/gs1'
import { formatWeight } from '@kitwright/shared/domain/weights'
import type { PackView, ShipResult } from '@kitwright/shared/pack'
import { Button } from '../../../components/ui/button'
import { useLengthUnit } from '../../../lib/shop-settings'
import { useShip } from '../api/pack-queries'
import { VoidLabel } from './void-label'

/** The label is bought: the parcels with their SSCCs, and one tap to ship. */
export function LabelledPanel({ view, onShipped, onError }: { view: PackView; onShipped: (result: ShipResult) => void; onError: (message: string) => void }) {
  const { unit } = useLengthUnit()
  const ship = useShip()
  const s = view.shipment!
  return (
    <div className="space-y-3 rounded-lg border-2 border-brand-600 bg-white p-4">
      <p className="text-2xl">
        Label bought: {s.carrier} {s.service}, tracking <strong className="font-mono">{s.trackingNumber}</strong>
      </p>
      <ul className="space-y-1 text-lg">
        {view.parcels.map((p) => (
          <li key={p.position}>
            Parcel {p.position} ({p.serials.join(', ')}): {p.boxName}, billable {formatWeight(p.billableGrams, unit)}, SSCC {p.sscc ? formatSscc(p.sscc, 7) : ''}
            {p.trackingNumber && (
              <>
                , tracking <span className="font-mono">{p.trackingNumber}</span>
              </>
            )}
          </li>
        ))}
      </ul>
      <Button size="bench" className="h-20 w-full text-2xl" disabled={ship.isPending} onClick={() => ship.mutate(view.order.id, { onSuccess: onShipped, onError: (e) => onError(e.message) })}>
        Ship order {view.order.number}
      </Button>
      <VoidLabel shipment={s} onError={onError} />
    </div>
  )
}
