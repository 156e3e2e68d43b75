import { useQuery } from '@tanstack/react-query'
import type { PackView } from '@kitwright/shared/pack'
import { customsDeclarationHref, customsSummaryOptions, packingSlipHref, shippingLabelHref } from '../api/pack-queries'

const LINK = 'inline-flex h-14 items-center rounded-md border-2 border-stone-400 bg-white px-5 text-lg font-bold'

/** The printed papers: the packing slip once packing started, the label once it is bought, and for a shipment abroad its customs declaration beside the label. */
export function PrintLinks({ view }: { view: PackView }) {
  const s = view.shipment
  const labelled = s !== null && s.status !== 'packing' && s.status !== 'buying'
  const customs = useQuery({ ...customsSummaryOptions(s?.id ?? '', s?.status ?? ''), enabled: labelled })
  if (!s) return null
  const forms = [...new Set(customs.data?.parcels.map((p) => p.form) ?? [])].join(' / ')
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
      {labelled && customs.data?.required && customs.data.ready && (
        <a className={LINK} href={customsDeclarationHref(s.id)} target="_blank" rel="noreferrer">
          Customs declaration {forms} (4 × 6 in, print with the label)
        </a>
      )}
      {labelled && customs.data?.required && !customs.data.ready && (
        <p className="basis-full text-lg font-bold text-red-800">Customs declaration cannot be printed: {customs.data.problems.join('; ')}</p>
      )}
    </nav>
  )
}
