import type { PackView } from '@kitwright/shared/pack'

/** Which order is on the bench, and where it goes. */
export function OrderHeader({ view }: { view: PackView }) {
  const to = view.order.shipTo
  return (
    <div className="flex flex-wrap items-start justify-between gap-4 rounded-lg border-2 border-stone-300 bg-white p-4">
      <div>
        <h2 className="text-3xl font-bold">Order {view.order.number}</h2>
        <p className="text-xl">{view.order.customerName}</p>
        {view.alreadyShipped.length > 0 && <p className="text-lg">Shipped earlier: {view.alreadyShipped.join(', ')}</p>}
      </div>
      <address className="text-lg not-italic">
        <strong>Ship to</strong>
        <br />
        {to.name}
        <br />
        {to.line1}
        {to.line2 ? `, ${to.line2}` : ''}
        <br />
        {to.city}
        {to.region ? `, ${to.region}` : ''} {to.postalCode} {to.country}
      </address>
    </div>
  )
}
