import type { PaymentStatus } from '@kitwright/shared/orders'

const PAYMENT_WORDS: Record<PaymentStatus, string> = { pending: 'Payment pending', paid: 'Paid', refunded: 'Refunded' }

/** The store's word on payment. */
export function PaymentText({ status }: { status: PaymentStatus }) {
  return <span className={status === 'paid' ? 'text-stone-700' : 'font-bold text-amber-800'}>{PAYMENT_WORDS[status]}</span>
}
