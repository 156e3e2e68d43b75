import { useQuery } from '@tanstack/react-query'
import { Link, useNavigate, useSearchParams } from 'react-router-dom'
import { toast } from 'sonner'
import { ShortagesQuerySchema } from '@kitwright/shared/work-orders'
import { querySearchWithDefaults } from '@kitwright/shared/pagination'
import { Button } from '../../components/ui/button'
import { Select } from '../../components/ui/field'
import { paths } from '../../config/paths'
import { useDraftFromShortages } from '../../features/purchasing/api/purchasing-queries'
import { ApiError } from '../../lib/api-client'
import { shortagesOptions } from '../../features/shortages/api/shortage-queries'
import { ShortagesTable } from '../../features/shortages/components/shortages-table'
import { useLengthUnit } from '../../lib/shop-settings'

export function Component() {
  const [searchParams, setSearchParams] = useSearchParams()
  const query = querySearchWithDefaults(ShortagesQuerySchema, searchParams)
  const shortages = useQuery(shortagesOptions(query))
  const { format } = useLengthUnit()
  const draft = useDraftFromShortages()
  const navigate = useNavigate()
  const draftOrders = () =>
    draft.mutate(undefined, {
      onSuccess: ({ created, skipped }) => {
        if (created.length > 0) toast.success(`Drafted ${created.map((p) => `${p.number} (${p.supplier.name})`).join(', ')}`)
        else toast.info('No new drafts: nothing to buy that is not already on a draft')
        for (const s of skipped) toast.warning(`${s.sku}: ${s.reason}`)
        if (created.length > 0) navigate(paths.purchaseOrders.href(created.length === 1 ? created[0]!.id : undefined))
      },
      onError: (err) => toast.error(err instanceof ApiError ? err.message : 'Could not reach Kitwright; check the connection and try again'),
    })
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
        <Button disabled={draft.isPending} onClick={draftOrders}>
          Draft purchase orders from shortages
        </Button>
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
        On order: what sent and partly received <Link className="underline" to={paths.purchaseOrders.href()}>purchase orders</Link> still
        bring (ordered − received), with their numbers and expected dates; it is subtracted before a part counts as short (short = needed −
        reserved − free − on order). Drafts are not counted until they are sent. "Draft purchase orders from shortages" makes one draft per
        supplier of the suggested quantities, rounded up to the supplier's pack size and minimum order and priced by their price breaks.
      </p>
    </div>
  )
}
