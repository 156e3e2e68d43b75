import { formatDateOf } from '@kitwright/shared/dates'
import { useQuery } from '@tanstack/react-query'
import { useParams } from 'react-router-dom'
import { PASCALS_PER_PSI } from '@kitwright/shared/kits'
import { PublicUnitRecordSchema } from '@kitwright/shared/public-record'
import { apiFetch } from '../../lib/api-client'

const psi = (pa: number) => (pa / PASCALS_PER_PSI).toFixed(1)
const day = (iso: string) => formatDateOf(iso)

/** What a customer sees through the link in their shipping e-mail: how their unit was built and tested. */
export function Component() {
  const { token = '' } = useParams()
  const record = useQuery({
    queryKey: ['public-record', token],
    queryFn: ({ signal }) => apiFetch(`/public/unit-records/${encodeURIComponent(token)}`, PublicUnitRecordSchema, { signal }),
    retry: false,
  })
  if (record.isError) return <p role="alert" className="mx-auto max-w-2xl p-8 text-xl">{record.error.message}</p>
  if (!record.data) return <p className="p-8">Loading…</p>
  const r = record.data
  return (
    <main className="mx-auto max-w-3xl space-y-6 p-6">
      <header>
        <p className="text-stone-600">{r.shopName}</p>
        <h1 className="text-4xl font-bold">
          Your {r.kit.name}, serial {r.serial}
        </h1>
        <p className="text-stone-600">Revision {r.revisionCode}</p>
      </header>
      <section className="space-y-2">
        <h2 className="text-2xl font-bold">Leak test</h2>
        {r.leakTests.length === 0 && <p>This kit has no leak test.</p>}
        <ul className="space-y-1">
          {r.leakTests.map((t) => (
            <li key={t.attempt}>
              <strong>{t.passed ? 'Passed' : 'Did not pass'}</strong> on {day(t.at)}: {psi(t.startPressurePa)} psi held {t.holdMinutes} minutes,{' '}
              {psi(t.endPressurePa)} psi at the end{t.attempt > 1 ? ` (test ${t.attempt}, after a fix)` : ''}.
            </li>
          ))}
        </ul>
      </section>
      {r.photos.length > 0 && (
        <section className="space-y-2">
          <h2 className="text-2xl font-bold">Photos</h2>
          <div className="grid grid-cols-2 gap-3">
            {r.photos.map((p) => (p.url ? <img key={p.url} src={p.url} alt={`Your unit, photographed on ${day(p.at)}`} className="rounded-lg border border-stone-300" /> : null))}
          </div>
        </section>
      )}
      {r.lots.length > 0 && (
        <section className="space-y-2">
          <h2 className="text-2xl font-bold">Parts by supplier's lot</h2>
          <ul className="space-y-1">
            {r.lots.map((l) => (
              <li key={`${l.sku}-${l.lotCode}`}>
                {l.quantity} × {l.name} ({l.sku}) from lot <strong className="font-mono">{l.lotCode}</strong>
              </li>
            ))}
          </ul>
        </section>
      )}
      <section className="space-y-2">
        <h2 className="text-2xl font-bold">How it was built</h2>
        <ol className="list-decimal space-y-1 pl-6">
          {r.steps.map((s) => (
            <li key={s.position}>
              {s.text} {s.doneAt && <span className="text-stone-600">— {day(s.doneAt)}</span>}
            </li>
          ))}
        </ol>
      </section>
      <p className="rounded-md border-l-4 border-amber-500 bg-amber-50 p-3">
        The pump runs on mains power next to water: use a ground-fault protected (GFCI/RCD) outlet, keep a drip loop in the cord, keep
        the plug dry, and unplug the pump before reaching into the water. Local electrical codes and licensed practice come first.
      </p>
    </main>
  )
}
