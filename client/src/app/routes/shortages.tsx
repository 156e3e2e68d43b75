import { useQuery } from '@tanstack/react-query'
import { useSearchParams } from 'react-router-dom'
import { ShortagesQuerySchema } from '@kitwright/shared/work-orders'
import { querySearchWithDefaults } from '@kitwright/shared/pagination'
import { Select } from '../../components/ui/field'
import { shortagesOptions } from '../../features/shortages/api/shortage-queries'
import { ShortagesTable } from '../../features/shortages/components/shortages-table'
import { useLengthUnit } from '../../lib/shop-settings'

export function Component() {
  const [searchParams, setSearchParams] = useSearchParams()
  const query = querySearchWithDefaults(ShortagesQuerySchema, searchParams)
  const shortages = useQuery(shortagesOptions(query))
  const { format } = useLengthUnit()
  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-end gap-3">
        <div className="mr-auto">
          <h1 className="text-3xl font-bold">Shortages</h1>
          <p className="text-stone-700">
            What every open order still needs (released into work orders or not yet released), against what is reserved for it and what is free in
            stock; parts at or below their reorder point are listed too.
            {shortages.data ? ` ${shortages.data.openWorkOrders} open work orders and ${shortages.data.unreleasedOrders} orders not yet released.` : ''}
          </p>
        </div>
        <label className="block space-y-1">
          <span className="block text-sm font-bold text-stone-700">Show</span>
          <Select value={query.only} onChange={(e) => setSearchParams(e.target.value === 'all' ? { only: 'all' } : {}, { replace: true })} className="w-56">
            <option value="short">Short parts only</option>
            <option value="all">Every part needed</option>
          </Select>
        </label>
      </div>
      {shortages.isError ? (
        <p role="alert" className="text-red-700">
          {shortages.error.message}
        </p>
      ) : shortages.data ? (
        <ShortagesTable rows={shortages.data.rows} formatLength={format} />
      ) : (
        <p className="text-stone-500">Adding up the work orders…</p>
      )}
      <p className="text-sm text-stone-600">
        An order not yet released is counted at its kits' newest released revisions, as a release would make it. Pipe is reserved when a cut run
        is published, so before that its need is an estimate: every piece plus one saw kerf, over the longest stick
        the pipe comes in, rounded up; offcuts on the rack are not counted.
      </p>
      <p className="text-sm text-stone-600" aria-label="On order">
        On order: Kitwright keeps no purchase orders yet, so nothing is counted as on its way. The suggested quantities assume nothing has been
        ordered; check with your supplier before ordering again.
      </p>
    </div>
  )
}
