import { useQuery } from '@tanstack/react-query'
import { Link, useParams } from 'react-router-dom'
import { paths } from '../../../config/paths'
import { MeasurementFlagList } from '../../../features/build-bench/components/measurement-flags-panel'
import { orderDetailOptions } from '../../../features/orders/api/order-queries'
import { OrderDetailView } from '../../../features/orders/components/order-detail-view'

export function Component() {
  const { orderId = '' } = useParams()
  const order = useQuery(orderDetailOptions(orderId))
  return (
    <div className="space-y-4">
      <p>
        <Link to={paths.orders.href()} className="font-bold text-brand-700 hover:underline">
          ← Orders
        </Link>
      </p>
      {order.isError ? (
        <p role="alert" className="text-red-700">
          {order.error.message}
        </p>
      ) : order.data ? (
        <OrderDetailView order={order.data} measurementFlags={<MeasurementFlagList flags={order.data.measurementFlags} withOrder={false} />} />
      ) : (
        <p className="text-stone-500">Loading the order…</p>
      )}
    </div>
  )
}
