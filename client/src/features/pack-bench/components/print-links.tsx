import type { PackView } from '@kitwright/shared/pack'
import { packingSlipHref, shippingLabelHref } from '../api/pack-queries'

const LINK = 'inline-flex h-14 items-center rounded-md border-2 border-stone-400 bg-white px-5 text-lg font-bold'

/** The printed papers: the packing slip once packing started, the label once it is bought. */
export function PrintLinks({ view }: { view: PackView }) {
  const s = view.shipment
  if (!s) return null
  return (
    <nav aria-label="Print" className="flex flex-wrap gap-3">
      <a className={LINK} href={packingSlipHref(s.id, 'letter')} target="_blank" rel="noreferrer">
        Packing slip (Letter)
      </a>
      <a className={LINK} href={packingSlipHref(s.id, 'a4')} target="_blank" rel="noreferrer">
        Packing slip (A4)
      </a>
      {s.status !== 'packing' && (
        <a className={LINK} href={shippingLabelHref(s.id)} target="_blank" rel="noreferrer">
          Shipping label (4 × 6 in)
        </a>
      )}
    </nav>
  )
}
