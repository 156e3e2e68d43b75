import type { PackView } from '@kitwright/shared/pack'
import { formatDateTime } from '@kitwright/shared/dates'
import { VoidLabel } from './void-label'

/**
 * The order's shipments that have left: label and tracking, labels voided before, and (for a planner
 * or the owner, checked again on the server) voiding a mistaken label so the carrier refunds it.
 */
export function ShippedPanel({ view, office, onError }: { view: PackView; office: boolean; onError: (message: string) => void }) {
  return (
    <section aria-label="Shipped" className="space-y-3 rounded-lg border-2 border-stone-400 bg-white p-4">
      {view.shipped.map((s) => (
        <div key={s.id} className="space-y-2">
          <p className="text-xl">
            Shipped{s.shippedAt ? ` ${formatDateTime(s.shippedAt)}` : ''}: {s.carrier} {s.service}
            {s.trackingNumber ? (
              <>
                , tracking <strong className="font-mono">{s.trackingNumber}</strong>
              </>
            ) : (
              ', label voided'
            )}
            {s.trackingStatus ? ` (${s.trackingStatus.replace(/_/g, ' ')})` : ''}
          </p>
          {s.voidedLabels.length > 0 && (
            <ul className="list-disc pl-6 text-lg">
              {s.voidedLabels.map((l) => (
                <li key={l.trackingNumbers.join()}>
                  Voided {l.trackingNumbers.join(', ')} ({l.service}) {formatDateTime(l.at)}: {l.reason}
                  {l.refundStatus ? ` · refund ${l.refundStatus}` : ''}
                </li>
              ))}
            </ul>
          )}
          {s.canVoid &&
            (office ? (
              <VoidLabel shipment={s} onError={onError} />
            ) : (
              <p className="text-lg text-stone-700">A mistaken label on a shipped parcel is voided by a planner or the owner.</p>
            ))}
        </div>
      ))}
    </section>
  )
}
