import { useQuery } from '@tanstack/react-query'
import { Link, useSearchParams } from 'react-router-dom'
import { formatDateTime } from '@kitwright/shared/dates'
import { Field, Input } from '../../../components/ui/field'
import { paths } from '../../../config/paths'
import { lotListOptions } from '../../../features/lots/api/lot-queries'

const th = 'px-3 py-2 font-bold'
const td = 'px-3 py-2'

/** Lots and recalls: every supplier's lot received of the lot-tracked parts; open one to see every unit built with it. */
export function Component() {
  const [search, setSearch] = useSearchParams()
  const q = search.get('q') ?? ''
  const lots = useQuery(lotListOptions({ q: q.trim() || undefined }))
  return (
    <div className="space-y-4">
      <div>
        <h1 className="text-3xl font-bold">Lots and recalls</h1>
        <p className="max-w-3xl text-stone-700">
          Each supplier's lot of a lot-tracked part (the pump, the sprayers) as it was received. Open a lot to see every unit built with it, who it went to and when, and to
          tell those customers.
        </p>
      </div>
      <Field label="Find a lot" hint="A lot code, a SKU or a part name">
        <Input className="max-w-md" value={q} onChange={(e) => setSearch(e.target.value ? { q: e.target.value } : {}, { replace: true })} aria-label="Find a lot" />
      </Field>
      {lots.isError && <p role="alert" className="text-red-700">{lots.error.message}</p>}
      {lots.data && lots.data.items.length === 0 && <p className="text-lg">{q ? `No lot matches "${q}".` : 'No lot received yet: mark a part lot-tracked, then receive it with its lot.'}</p>}
      {lots.data && lots.data.items.length > 0 && (
        <div className="overflow-x-auto rounded-lg border border-stone-300 bg-white">
          <table className="w-full text-left" aria-label="Lots">
            <thead className="bg-stone-50 text-stone-600">
              <tr>
                <th className={th}>Lot</th>
                <th className={th}>Part</th>
                <th className={th}>First received</th>
                <th className={`${th} text-right`}>Received</th>
                <th className={`${th} text-right`}>On hand</th>
                <th className={`${th} text-right`}>Units built with it</th>
              </tr>
            </thead>
            <tbody>
              {lots.data.items.map((l) => (
                <tr key={l.id} className="border-t border-stone-200">
                  <td className={td}>
                    <Link to={paths.lot.href(l.id)} className="font-mono font-bold text-brand-700 underline">
                      {l.code}
                    </Link>
                  </td>
                  <td className={td}>
                    {l.part.sku} · {l.part.name}
                  </td>
                  <td className={td}>{formatDateTime(l.firstReceivedAt)}</td>
                  <td className={`${td} text-right`}>{l.received}</td>
                  <td className={`${td} text-right`}>{l.onHand}</td>
                  <td className={`${td} text-right`}>{l.units}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </div>
  )
}
