import type { PaymentStatus } from '@kitwright/shared/orders'
import { PAYMENT_STATUS_LABELS } from '@kitwright/shared/status-words'

/** The store's word on payment. */
export function PaymentText({ status }: { status: PaymentStatus }) {
  return <span className={status === 'paid' ? 'text-stone-700' : 'font-bold text-amber-800'}>{PAYMENT_STATUS_LABELS[status]}</span>
}
