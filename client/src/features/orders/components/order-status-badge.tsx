import { ORDER_STATUS_LABELS, type OrderStatus, type PaymentStatus } from '@kitwright/shared/orders'
import { cn } from '../../../lib/cn'

const TONES: Record<OrderStatus, string> = {
  open: 'bg-sky-100 text-sky-900',
  released: 'bg-brand-100 text-brand-900',
  partially_shipped: 'bg-amber-100 text-amber-900',
  shipped: 'bg-stone-200 text-stone-800',
  cancelled: 'bg-stone-100 text-stone-500 line-through',
}

/** An order's status in words, with the late flag beside it when it is past its promised date. */
export function OrderStatusBadge({ status, late }: { status: OrderStatus; late?: boolean }) {
  return (
    <span className="inline-flex flex-wrap gap-1">
      <span className={cn('rounded px-2 py-0.5 text-sm font-bold', TONES[status])}>{ORDER_STATUS_LABELS[status]}</span>
      {late && <span className="rounded bg-red-700 px-2 py-0.5 text-sm font-bold text-white">Late</span>}
    </span>
  )
}

const PAYMENT_WORDS: Record<PaymentStatus, string> = { pending: 'Payment pending', paid: 'Paid', refunded: 'Refunded' }

/** The store's word on payment. */
export function PaymentText({ status }: { status: PaymentStatus }) {
  return <span className={status === 'paid' ? 'text-stone-700' : 'font-bold text-amber-800'}>{PAYMENT_WORDS[status]}</span>
}
