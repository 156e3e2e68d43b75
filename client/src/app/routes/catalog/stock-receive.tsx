import { useQuery } from '@tanstack/react-query'
import { Link, useSearchParams } from 'react-router-dom'
import { purchaseOrdersOptions } from '../../../features/purchasing/api/purchasing-queries'
import { paths } from '../../../config/paths'
import { PackingListUpload } from '../../../features/stock/components/packing-list-upload'
import { ReceiveForm } from '../../../features/stock/components/receive-form'

export function Component() {
  const [params] = useSearchParams()
  const sent = useQuery(purchaseOrdersOptions({ status: 'sent' }))
  const partly = useQuery(purchaseOrdersOptions({ status: 'partly_received' }))
  const openOrders = [...(partly.data ?? []), ...(sent.data ?? [])]
  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-center gap-3">
        <h1 className="mr-auto text-3xl font-bold">Receive stock</h1>
        <Link to={paths.stock.href()} className="font-bold text-brand-700 hover:underline">
          Back to stock
        </Link>
      </div>
      <section className="space-y-2">
        <h2 className="text-xl font-bold">Count it in by hand</h2>
        <ReceiveForm openOrders={openOrders} initialPurchaseOrderId={params.get('po') ?? ''} />
      </section>
      <section className="space-y-2">
        <h2 className="text-xl font-bold">Or load the supplier's packing list</h2>
        <PackingListUpload />
      </section>
    </div>
  )
}
