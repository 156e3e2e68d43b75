import { Link } from 'react-router-dom'
import { paths } from '../../../config/paths'
import { cn } from '../../../lib/cn'

interface Tile {
  label: string
  value: string
  detail: string
  alarm: boolean
  href?: string
}

/** The numbers asked for every morning, big, at the top: late orders, stuck units, short parts, lead time. */
export function MorningNumbers({ late, stuck, stuckDays, short, leadDays }: { late?: number; stuck?: number; stuckDays: number; short?: number; leadDays?: number | null }) {
  const show = (n: number | undefined) => (n === undefined ? '…' : String(n))
  const tiles: Tile[] = [
    { label: 'Late orders', value: show(late), detail: 'past the promised ship date, not shipped', alarm: (late ?? 0) > 0, href: '#late-orders' },
    { label: 'Stuck units', value: show(stuck), detail: `no change for ${stuckDays} days or more`, alarm: (stuck ?? 0) > 0, href: '#work-in-progress' },
    { label: 'Short parts', value: show(short), detail: 'open work orders need more than is free', alarm: (short ?? 0) > 0, href: paths.shortages.href() },
    { label: 'Lead time', value: leadDays === undefined ? '…' : leadDays === null ? '—' : `${leadDays.toFixed(1)} d`, detail: 'average, paid to shipped', alarm: false },
  ]
  return (
    <div className="grid grid-cols-2 gap-3 lg:grid-cols-4">
      {tiles.map((t) => {
        const body = (
          <>
            <span className="block text-sm font-bold text-stone-700">{t.label}</span>
            <span className={cn('block text-4xl font-bold tabular-nums', t.alarm ? 'text-red-700' : 'text-stone-900')}>
              <span data-testid={`number-${t.label.toLowerCase().replace(/ /g, '-')}`}>{t.value}</span>
              {t.alarm && <span className="ml-2 align-middle text-base" aria-hidden>⚠</span>}
            </span>
            <span className="block text-sm text-stone-600">{t.detail}</span>
          </>
        )
        const box = cn('block rounded-lg border bg-white p-4', t.alarm ? 'border-red-300 bg-red-50' : 'border-stone-300')
        if (!t.href) return <div key={t.label} className={box}>{body}</div>
        return t.href.startsWith('#') ? (
          <a key={t.label} href={t.href} className={box}>
            {body}
          </a>
        ) : (
          <Link key={t.label} to={t.href} className={box}>
            {body}
          </Link>
        )
      })}
    </div>
  )
}
