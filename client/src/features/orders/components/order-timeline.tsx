import type { OrderEvent } from '@kitwright/shared/orders'
import { cn } from '../../../lib/cn'
import { formatDateTime } from './format'

const WARN = new Set(['unmapped_line', 'shortage', 'cancelled', 'held', 'recall'])

/** Every event of an order, oldest first, with who did it (the store or Kitwright when no one). */
export function OrderTimeline({ events }: { events: OrderEvent[] }) {
  if (events.length === 0) return <p className="text-stone-500">Nothing has happened to this order yet.</p>
  return (
    <ol aria-label="Timeline" className="space-y-3 border-l-2 border-stone-300 pl-4">
      {events.map((e) => (
        <li key={e.id} className="relative">
          <span aria-hidden className={cn('absolute top-1.5 -left-[1.4rem] size-3 rounded-full', WARN.has(e.kind) ? 'bg-amber-600' : 'bg-brand-600')} />
          <p className={cn(WARN.has(e.kind) && 'font-bold text-amber-900')}>{e.message}</p>
          <p className="text-sm text-stone-500">
            {formatDateTime(e.createdAt)} · {e.actorName ?? 'Store / Kitwright'}
          </p>
        </li>
      ))}
    </ol>
  )
}
