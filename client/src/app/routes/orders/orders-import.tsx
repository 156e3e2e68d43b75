import { Link, useNavigate } from 'react-router-dom'
import { paths } from '../../../config/paths'
import { OrdersImport } from '../../../features/orders/components/orders-import'

export function Component() {
  const navigate = useNavigate()
  return (
    <div className="space-y-6">
      <p>
        <Link to={paths.orders.href()} className="font-bold text-brand-700 hover:underline">
          ← Orders
        </Link>
      </p>
      <h1 className="text-3xl font-bold">Import orders from CSV</h1>
      <OrdersImport onImported={() => void navigate(paths.orders.href())} />
    </div>
  )
}
