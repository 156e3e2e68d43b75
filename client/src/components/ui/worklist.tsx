import { useEffect, useState, type ReactNode } from 'react'
import { formatWaited } from '@kitwright/shared/domain/worklist'
import { cn } from '../../lib/cn'

/** A calendar day from the API (`2026-12-03`) as people read it: `Thu 3 Dec`. */
function dayText(date: string): string {
  return new Date(`${date}T12:00:00Z`).toLocaleDateString(undefined, { weekday: 'short', day: 'numeric', month: 'short', timeZone: 'UTC' })
}

/** Now, ticking once a minute, so the waited times stay true on a bench left open all day. */
export function useMinuteClock(): Date {
  const [now, setNow] = useState(() => new Date())
  useEffect(() => {
    const timer = setInterval(() => setNow(new Date()), 60_000)
    return () => clearInterval(timer)
  }, [])
  return now
}

export interface Urgency {
  rush: boolean
  late: boolean
  promisedShipDate: string | null
  waitingSince: string
}

/** Rush and late as words on solid colour (readable in a bright shop, not by colour alone), the promise and the wait. */
export function UrgencyLine({ item, now }: { item: Urgency; now: Date }) {
  return (
    <span className="flex flex-wrap items-center gap-2 text-lg">
      {item.rush && <span className="rounded bg-orange-600 px-2 py-0.5 font-bold text-white">RUSH</span>}
      {item.late && <span className="rounded bg-red-700 px-2 py-0.5 font-bold text-white">LATE</span>}
      <span>{item.promisedShipDate ? `ship by ${dayText(item.promisedShipDate)}` : 'no ship date'}</span>
      <span className="text-stone-700">· waiting {formatWaited(item.waitingSince, now)}</span>
    </span>
  )
}

/** A bench worklist: each row one big tap target (at least 64 px high) that opens the item. */
export function Worklist<T extends Urgency>({
  label,
  items,
  empty,
  itemKey,
  itemLabel,
  onPick,
  children,
  current,
  role,
}: {
  label: string
  items: readonly T[] | undefined
  empty: string
  itemKey: (item: T) => string
  /** The row's accessible name, e.g. "Unit U-1003". */
  itemLabel: (item: T) => string
  onPick: (item: T) => void
  children: (item: T) => ReactNode
  current?: string | null
  /** `group` where the list is a choice among a few (the cut bench's runs); a region otherwise. */
  role?: 'group'
}) {
  const now = useMinuteClock()
  return (
    <section aria-label={label} role={role} className="space-y-2">
      <h2 className="text-2xl font-bold">{label}</h2>
      {items === undefined && <p className="text-xl text-stone-600">Reading the list…</p>}
      {items?.length === 0 && <p className="rounded-lg border-2 border-stone-300 bg-white p-4 text-xl">{empty}</p>}
      {items && items.length > 0 && (
        <ol className="space-y-2">
          {items.map((item) => (
            <li key={itemKey(item)}>
              <button
                type="button"
                aria-label={itemLabel(item)}
                aria-current={current === itemKey(item) ? 'true' : undefined}
                onClick={() => onPick(item)}
                className={cn(
                  'flex min-h-16 w-full flex-col items-start gap-1 rounded-lg border-2 bg-white px-4 py-3 text-left hover:bg-stone-50 focus-visible:outline-3 focus-visible:outline-brand-600',
                  item.rush || item.late ? 'border-l-8 border-orange-600' : 'border-stone-300',
                  current === itemKey(item) && 'border-brand-700 bg-brand-50',
                )}
              >
                <span className="text-xl">{children(item)}</span>
                <UrgencyLine item={item} now={now} />
              </button>
            </li>
          ))}
        </ol>
      )}
    </section>
  )
}
