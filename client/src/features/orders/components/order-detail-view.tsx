import type { ReactNode } from 'react'
import { Link } from 'react-router-dom'
import type { OrderDetail } from '@kitwright/shared/orders'
import { ORDER_SOURCE_LABELS, WORK_ORDER_STATUS_LABELS } from '@kitwright/shared/status-words'
import { paths } from '../../../config/paths'
import { Section } from '../../../components/ui/section'
import { formatDateTime, formatDay, formatMoney } from './format'
import { OrderActionsPanel } from './order-actions-panel'
import { OrderStageBadge } from './order-stage-badge'
import { PaymentText } from './order-status-badge'
import { OrderTimeline } from './order-timeline'
import { PaymentPanel } from './payment-panel'
import { ReleasePanel } from './release-panel'

const th = 'px-3 py-2 font-bold'
const td = 'px-3 py-2'

function Lines({ order }: { order: OrderDetail }) {
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-left" aria-label="Order lines">
        <thead className="bg-stone-50 text-sm text-stone-600">
          <tr>
            <th className={th}>#</th>
            <th className={th}>Kit</th>
            <th className={th}>Quantity</th>
            <th className={th}>Unit price</th>
            <th className={th}>Line total</th>
          </tr>
        </thead>
        <tbody>
          {order.lines.map((l) => (
            <tr key={l.id} className={l.kit ? 'border-t border-stone-200' : 'border-t border-stone-200 bg-amber-50'}>
              <td className={td}>{l.lineNo}</td>
              <td className={td}>
                {l.kit ? (
                  <>
                    <span className="font-bold">{l.kit.sku}</span> · {l.kit.name}
                  </>
                ) : (
                  <span className="font-bold text-amber-900">
                    {l.description} ({l.storeProductId ?? l.sku}) maps to no kit
                  </span>
                )}
              </td>
              <td className={`${td} tabular-nums`}>{l.quantity}</td>
              <td className={`${td} tabular-nums`}>{formatMoney(l.unitPriceCents, order.currency)}</td>
              <td className={`${td} tabular-nums`}>{formatMoney(l.unitPriceCents * l.quantity, order.currency)}</td>
            </tr>
          ))}
          <tr className="border-t border-stone-300 font-bold">
            <td className={td} colSpan={2}>
              Total
            </td>
            <td className={`${td} tabular-nums`}>{order.units}</td>
            <td className={td} />
            <td className={`${td} tabular-nums`}>{formatMoney(order.totalCents, order.currency)}</td>
          </tr>
        </tbody>
      </table>
    </div>
  )
}

function WorkOrders({ order }: { order: OrderDetail }) {
  if (order.workOrders.length === 0) return <p className="text-stone-500">No work orders yet: release the order to make one per unit.</p>
  // Out-of-limits measurements still standing on each unit (undone ones were measured again).
  const standing = new Map<string, number>()
  for (const f of order.measurementFlags) if (f.undoneAt === null) standing.set(f.workOrderId, (standing.get(f.workOrderId) ?? 0) + 1)
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-left" aria-label="Work orders">
        <thead className="bg-stone-50 text-sm text-stone-600">
          <tr>
            <th className={th}>Serial</th>
            <th className={th}>Kit</th>
            <th className={th}>Revision</th>
            <th className={th}>Status</th>
            <th className={th}>Due</th>
          </tr>
        </thead>
        <tbody>
          {order.workOrders.map((w) => (
            <tr key={w.id} className="border-t border-stone-200">
              <td className={`${td} font-mono font-bold`}>{w.serial}</td>
              <td className={td}>{w.kitSku}</td>
              <td className={td}>{w.revisionCode}</td>
              <td className={td}>
                {WORK_ORDER_STATUS_LABELS[w.status]}
                {standing.has(w.id) && (
                  <a href="#order-measurement-flags" className="ml-2 rounded bg-red-700 px-2 text-sm font-bold text-white">
                    {standing.get(w.id) === 1 ? 'measurement out of limits' : `${standing.get(w.id)} measurements out of limits`}
                  </a>
                )}
              </td>
              <td className={td}>{formatDay(w.dueDate)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  )
}

/** Everything about one order: lines, customer, ship-to, its work orders and its timeline. */
/** Stages where the order has a box at the pack bench (and may have a bought label). */
const PACKED_STAGES = new Set<OrderDetail['stage']>(['ready_to_pack', 'partially_shipped', 'shipped'])

/**
 * `measurementFlags` is the list of the order's out-of-limits measurements (the build bench's, drawn
 * by the page), shown under the work orders when there is any.
 */
export function OrderDetailView({ order, measurementFlags }: { order: OrderDetail; measurementFlags?: ReactNode }) {
  const ship = order.shipTo
  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-center gap-3">
        <h1 className="text-3xl font-bold">Order {order.number}</h1>
        <OrderStageBadge stage={order.stage} late={order.late} priority={order.priority} />
      </div>
      <dl className="grid grid-cols-2 gap-x-6 gap-y-1 sm:grid-cols-4">
        <div>
          <dt className="text-sm text-stone-500">Placed</dt>
          <dd>{formatDateTime(order.placedAt)}</dd>
        </div>
        <div>
          <dt className="text-sm text-stone-500">Ship by</dt>
          <dd className={order.late ? 'font-bold text-red-700' : undefined}>{formatDay(order.promisedShipDate)}</dd>
        </div>
        <div>
          <dt className="text-sm text-stone-500">Source</dt>
          <dd>{ORDER_SOURCE_LABELS[order.source]}</dd>
        </div>
        <div>
          <dt className="text-sm text-stone-500">Payment</dt>
          <dd>
            <PaymentText status={order.paymentStatus} />
          </dd>
        </div>
      </dl>
      {order.note && <p className="rounded-md bg-stone-100 p-3">Note: {order.note}</p>}
      {PACKED_STAGES.has(order.stage) && (
        <p>
          {/* The pack bench's view of this order: its papers, its label and tracking, and voiding a mistaken label. */}
          <Link to={`${paths.packBench.href()}?order=${order.id}`} className="font-bold text-brand-700 underline">
            Shipment: papers, label and tracking
          </Link>
        </p>
      )}
      <OrderActionsPanel order={order} />
      <PaymentPanel order={order} />
      {!order.onHold && <ReleasePanel order={order} />}
      <Section title="Lines" id="order-lines">
        <Lines order={order} />
      </Section>
      <div className="grid gap-6 md:grid-cols-2">
        <Section title="Customer" id="order-customer">
          <p className="font-bold">{order.customer.name}</p>
          <p>{order.customer.email}</p>
          {order.customer.phone && <p>{order.customer.phone}</p>}
        </Section>
        <Section title="Ship to" id="order-ship-to">
          <address className="not-italic">
            <span className="block font-bold">{ship.name}</span>
            <span className="block">{ship.line1}</span>
            {ship.line2 && <span className="block">{ship.line2}</span>}
            <span className="block">{[ship.city, ship.region, ship.postalCode].filter(Boolean).join(', ')}</span>
            <span className="block">{ship.country}</span>
          </address>
        </Section>
      </div>
      <Section title={`Work orders (${order.workOrders.length})`} id="order-work-orders">
        <WorkOrders order={order} />
      </Section>
      {order.measurementFlags.length > 0 && measurementFlags && (
        <Section title={`Measurements out of limits (${order.measurementFlags.length})`} id="order-measurement-flags">
          <p className="text-sm text-stone-600">Recorded at the build bench with a reason; newest first. A step undone and measured again shows as reworked.</p>
          {measurementFlags}
        </Section>
      )}
      <Section title="Timeline" id="order-timeline">
        <OrderTimeline events={order.events} />
      </Section>
    </div>
  )
}
