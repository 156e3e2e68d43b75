import { z } from 'zod'

/** How money for an order arrived outside the web store. */
export const PAYMENT_METHODS = ['card_by_phone', 'cash', 'bank_transfer', 'payment_link'] as const
export const PaymentMethodSchema = z.enum(PAYMENT_METHODS, { error: `Use one of ${PAYMENT_METHODS.join(', ')}` })
export type PaymentMethod = z.infer<typeof PaymentMethodSchema>
/** What each method is called on screen. */
export const PAYMENT_METHOD_LABELS: Record<PaymentMethod, string> = {
  card_by_phone: 'Card taken by phone',
  cash: 'Cash',
  bank_transfer: 'Bank transfer',
  payment_link: 'Payment link',
}

/** The life of a payment link: being created at the payment service, open for the customer, paid, or failed to create. */
export const PAYMENT_LINK_STATUSES = ['creating', 'open', 'paid', 'failed'] as const

/** A payment a planner records by hand (the methods a person takes; links record themselves). */
export const RecordPaymentSchema = z
  .object({
    method: z.enum(['card_by_phone', 'cash', 'bank_transfer'], { error: 'Choose how the customer paid: card by phone, cash or bank transfer' }),
    amountCents: z
      .number({ error: 'Enter the amount paid' })
      .int('Enter the amount in whole cents')
      .positive('The amount must be more than zero')
      .max(100_000_000, 'That amount is too large; check it'),
    reference: z.string().trim().max(200, 'Keep the reference under 200 characters').nullish().transform((v) => v || null),
  })
  .strict()
export type RecordPayment = z.infer<typeof RecordPaymentSchema>

export const OrderPaymentSchema = z.object({
  id: z.string().uuid(),
  method: PaymentMethodSchema,
  amountCents: z.number().int(),
  reference: z.string().nullable(),
  recordedAt: z.string(),
  recordedBy: z.string().nullable(),
})
export type OrderPayment = z.infer<typeof OrderPaymentSchema>

export const PaymentLinkSchema = z.object({
  id: z.string().uuid(),
  status: z.enum(PAYMENT_LINK_STATUSES),
  amountCents: z.number().int(),
  url: z.string().nullable(),
  error: z.string().nullable(),
  createdAt: z.string(),
  paidAt: z.string().nullable(),
})
export type PaymentLink = z.infer<typeof PaymentLinkSchema>

/** What an order's payment panel shows: the total, what was paid, what is left, and the links sent. */
export const OrderPaymentsSchema = z.object({
  totalCents: z.number().int(),
  paidCents: z.number().int(),
  dueCents: z.number().int(),
  currency: z.string(),
  paymentStatus: z.enum(['pending', 'paid', 'refunded']),
  payments: z.array(OrderPaymentSchema),
  links: z.array(PaymentLinkSchema),
  /** False when no payment service is set up (no PAYMENT_SERVICE_KEY), so no link can be sent. */
  linksAvailable: z.boolean(),
})
export type OrderPayments = z.infer<typeof OrderPaymentsSchema>
