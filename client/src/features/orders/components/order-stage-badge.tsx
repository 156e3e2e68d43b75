import { ORDER_STAGE_LABELS, type OrderStage } from '@kitwright/shared/order-stage'
import type { OrderPriority } from '@kitwright/shared/orders'
import { cn } from '../../../lib/cn'

const TONES: Record<OrderStage, string> = {
  received: 'bg-sky-100 text-sky-900',
  released: 'bg-brand-100 text-brand-900',
  in_production: 'bg-indigo-100 text-indigo-900',
  ready_to_pack: 'bg-emerald-100 text-emerald-900',
  partially_shipped: 'bg-amber-100 text-amber-900',
  shipped: 'bg-stone-200 text-stone-800',
  on_hold: 'bg-orange-200 text-orange-950',
  cancelled: 'bg-stone-100 text-stone-500 line-through',
}

/** Where an order is in its life, with the rush and late flags beside it. */
export function OrderStageBadge({ stage, late, priority }: { stage: OrderStage; late?: boolean; priority?: OrderPriority }) {
  return (
    <span className="inline-flex flex-wrap gap-1">
      <span className={cn('rounded px-2 py-0.5 text-sm font-bold', TONES[stage])}>{ORDER_STAGE_LABELS[stage]}</span>
      {priority === 'rush' && <span className="rounded border border-red-700 px-2 py-0.5 text-sm font-bold text-red-800">Rush</span>}
      {late && <span className="rounded bg-red-700 px-2 py-0.5 text-sm font-bold text-white">Late</span>}
    </span>
  )
}
