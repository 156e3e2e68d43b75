import Stripe from 'stripe'
import { z } from 'zod'

/**
 * The hosted payment service, through its official SDK (the `stripe` package): a checkout page per
 * payment link, and signed events when the customer pays. `PAYMENT_SERVICE_URL` points the SDK at
 * another host (the local stand-in that `npm start` and `npm test` run); unset, it talks to the
 * service itself. Another service's SDK fits behind the same two functions.
 */
export interface PaymentService {
  /** Creates (or, with the same key, returns again) a checkout the customer pays at. */
  createCheckout(input: CheckoutInput, idempotencyKey: string): Promise<{ id: string; url: string }>
  /** Checks the signature of a delivered event and reads it; throws `PaymentSignatureError` when it does not hold. */
  readEvent(rawBody: Buffer, signature: string | undefined): PaymentEvent
}

export interface CheckoutInput {
  orderId: string
  orderNumber: string
  amountCents: number
  currency: string
  customerEmail: string
  /** Where the service sends the customer once they have paid. */
  returnUrl: string
}

/** A payment event, reduced to what Kitwright acts on. */
export type PaymentEvent =
  | { id: string; type: 'checkout.paid'; checkoutId: string; paymentId: string; amountCents: number; orderId: string | null }
  | { id: string; type: 'other'; name: string }

export class PaymentSignatureError extends Error {}

const PaymentEnvSchema = z.object({
  PAYMENT_SERVICE_KEY: z.string().min(1).optional(),
  PAYMENT_SERVICE_URL: z.string().url('PAYMENT_SERVICE_URL must be the payment service\'s API address, e.g. http://127.0.0.1:54332 for the local stand-in').optional(),
  PAYMENT_WEBHOOK_SECRET: z.string().min(16, 'PAYMENT_WEBHOOK_SECRET must be the signing secret the payment service shows for Kitwright\'s webhook (16 characters or more)').optional(),
})

/** The service from the environment; null when no key is set (payment links are then not offered). */
export function paymentServiceFromEnv(env: NodeJS.ProcessEnv): PaymentService | null {
  const parsed = PaymentEnvSchema.safeParse(env)
  if (!parsed.success) throw new Error(parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('\n'))
  const { PAYMENT_SERVICE_KEY: key, PAYMENT_SERVICE_URL: url, PAYMENT_WEBHOOK_SECRET: secret } = parsed.data
  if (!key) return null
  if (!secret) throw new Error('PAYMENT_WEBHOOK_SECRET: set it with PAYMENT_SERVICE_KEY, so Kitwright can tell real payment events from forged ones')
  return stripePaymentService({ key, url, webhookSecret: secret })
}

export function stripePaymentService(config: { key: string; url?: string; webhookSecret: string }): PaymentService {
  const target = config.url ? new URL(config.url) : null
  const stripe = new Stripe(config.key, {
    maxNetworkRetries: 2,
    timeout: 20_000,
    ...(target ? { host: target.hostname, port: Number(target.port || (target.protocol === 'https:' ? 443 : 80)), protocol: target.protocol.replace(':', '') as 'http' | 'https' } : {}),
  })
  return {
    async createCheckout(input, idempotencyKey) {
      const session = await stripe.checkout.sessions.create(
        {
          mode: 'payment',
          customer_email: input.customerEmail,
          client_reference_id: input.orderId,
          metadata: { orderId: input.orderId, orderNumber: input.orderNumber },
          line_items: [{ quantity: 1, price_data: { currency: input.currency.toLowerCase(), unit_amount: input.amountCents, product_data: { name: `Order ${input.orderNumber}` } } }],
          success_url: input.returnUrl,
        },
        { idempotencyKey },
      )
      if (!session.url) throw new Error(`The payment service made checkout ${session.id} without an address to pay at`)
      return { id: session.id, url: session.url }
    },
    readEvent(rawBody, signature) {
      if (!signature) throw new PaymentSignatureError('the Stripe-Signature header is missing')
      let event: Stripe.Event
      try {
        event = stripe.webhooks.constructEvent(rawBody, signature, config.webhookSecret)
      } catch (err) {
        throw new PaymentSignatureError(err instanceof Error ? err.message : String(err))
      }
      if (event.type === 'checkout.session.completed') {
        const session = event.data.object
        if (session.payment_status !== 'paid') return { id: event.id, type: 'other', name: `${event.type} (${session.payment_status})` }
        const paymentId = typeof session.payment_intent === 'string' ? session.payment_intent : (session.payment_intent?.id ?? session.id)
        return { id: event.id, type: 'checkout.paid', checkoutId: session.id, paymentId, amountCents: session.amount_total ?? 0, orderId: session.client_reference_id ?? null }
      }
      return { id: event.id, type: 'other', name: event.type }
    },
  }
}
