import { Link, useNavigate } from 'react-router-dom'
import { paths } from '../../../config/paths'
import { OrderForm } from '../../../features/orders/components/order-form'

export function Component() {
  const navigate = useNavigate()
  return (
    <div className="space-y-6">
      <p>
        <Link to={paths.orders.href()} className="font-bold text-brand-700 hover:underline">
          ← Orders
        </Link>
      </p>
      <h1 className="text-3xl font-bold">New phone order</h1>
      <OrderForm onCreated={(order) => void navigate(paths.order.href(order.id))} />
    </div>
  )
}
