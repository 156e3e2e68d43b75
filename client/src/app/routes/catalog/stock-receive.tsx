import { Link } from 'react-router-dom'
import { paths } from '../../../config/paths'
import { PackingListUpload } from '../../../features/stock/components/packing-list-upload'
import { ReceiveForm } from '../../../features/stock/components/receive-form'

export function Component() {
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
        <ReceiveForm />
      </section>
      <section className="space-y-2">
        <h2 className="text-xl font-bold">Or load the supplier's packing list</h2>
        <PackingListUpload />
      </section>
    </div>
  )
}
