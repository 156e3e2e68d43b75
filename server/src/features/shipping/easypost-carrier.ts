import EasyPostClient from '@easypost/api'
import { z } from 'zod'
import { Conflict, Unavailable } from '../../lib/http-errors'
import { CarrierEventRejected, type Carrier, type CarrierAddress, type CarrierLabel, type CarrierParcel, type ShipmentRequest } from './carrier'

/** 1 in = 25.4 mm exactly; 1 oz (avoirdupois) = 28.349523125 g exactly (international yard and pound agreement, 1959). */
const MM_PER_IN = 25.4
const G_PER_OZ = 28.349523125

/** The hosted API's address, rate, parcel, order and tracker objects: only the fields Kitwright reads. */
const RateSchema = z.object({ id: z.string(), carrier: z.string(), service: z.string(), rate: z.string(), delivery_days: z.number().nullish() })
const ShipmentSchema = z.object({
  id: z.string(),
  tracking_code: z.string().nullish(),
  selected_rate: RateSchema.nullish(),
  refund_status: z.string().nullish(),
  postage_label: z.object({ label_url: z.string().nullish() }).passthrough().nullish(),
  usps_zone: z.union([z.string(), z.number()]).nullish(),
})
const OrderSchema = z.object({ id: z.string(), reference: z.string().nullish(), shipments: z.array(ShipmentSchema), rates: z.array(RateSchema).default([]) })
const TrackerSchema = z.object({
  tracking_code: z.string(),
  status: z.string(),
  updated_at: z.string().nullish(),
  tracking_details: z.array(z.object({ message: z.string().nullish(), datetime: z.string().nullish() })).default([]),
})
const EventSchema = z.object({ id: z.string(), description: z.string(), result: z.unknown() })

/** A service code as people read it: `ground` → Ground, `next_day_air` → Next day air, `Priority` stays. */
function serviceName(service: string): string {
  const words = service.replace(/[_-]+/g, ' ').trim()
  return words.charAt(0).toUpperCase() + words.slice(1)
}

/** Money as the API writes it ("12.34") → integer cents. */
function cents(amount: string): number {
  const value = Number(amount)
  if (!Number.isFinite(value)) throw new Unavailable(`The carrier answered a price we cannot read ("${amount}")`)
  return Math.round(value * 100)
}

function address(a: CarrierAddress) {
  return {
    name: a.name,
    street1: a.line1,
    street2: a.line2 ?? undefined,
    city: a.city,
    state: a.region ?? undefined,
    zip: a.postalCode,
    country: a.country,
    phone: a.phone ?? undefined,
  }
}

/** Size in inches and weight in ounces, rounded up to a tenth as the API takes them. */
function parcel(p: CarrierParcel) {
  const tenth = (n: number) => Math.ceil(n * 10) / 10
  return {
    length: tenth(p.lengthMm / MM_PER_IN),
    width: tenth(p.widthMm / MM_PER_IN),
    height: tenth(p.heightMm / MM_PER_IN),
    weight: tenth(p.weightGrams / G_PER_OZ),
  }
}

/** The SDK's error → an answer that tells the packer what happened, never a bare 500. */
function carrierError(err: unknown, doing: string): Error {
  const e = err as { statusCode?: unknown; message?: unknown; code?: unknown; errors?: unknown }
  const status = typeof e?.statusCode === 'number' ? e.statusCode : null
  const message = typeof e?.message === 'string' && e.message ? e.message : String(err)
  if (status !== null && status >= 400 && status < 500 && status !== 408 && status !== 429) {
    const fields = Array.isArray(e.errors)
      ? e.errors.map((f: { field?: string; message?: string }) => [f.field, f.message].filter(Boolean).join(': ')).filter(Boolean)
      : []
    return new Conflict(`The carrier refused ${doing}: ${message}${fields.length ? ` (${fields.join('; ')})` : ''}`)
  }
  return new Unavailable(`The carrier could not be reached ${doing} (${message}); nothing was lost, try again in a minute`)
}

export interface EasyPostCarrierConfig {
  apiKey: string
  /** The API's base URL; the local stand-in's for `npm start` and the tests, unset for the hosted service. */
  baseUrl?: string
  /** The secret tracking events are signed with (the webhook's secret in the carrier account). */
  webhookSecret?: string
  timeoutMs?: number
}

/**
 * A carrier account on a hosted shipping API, through its official SDK (`@easypost/api`). A label of
 * several parcels is the API's order of one shipment per parcel, so each parcel gets its own tracking
 * number. The purchase's idempotency key travels as the `Idempotency-Key` header and as the order's
 * reference; a purchase already paid for is found again by its order id.
 */
export function easyPostCarrier(config: EasyPostCarrierConfig): Carrier {
  const options = { baseUrl: config.baseUrl, timeout: config.timeoutMs ?? 20_000 }
  const plain = new EasyPostClient(config.apiKey, options)
  /** A client whose every request carries the purchase's key. */
  const keyed = (key: string) =>
    new EasyPostClient(config.apiKey, {
      ...options,
      requestMiddleware: (req: { set(name: string, value: string): unknown }) => (req.set('Idempotency-Key', key), req),
    })

  async function call<T>(doing: string, fn: () => Promise<T>): Promise<T> {
    try {
      return await fn()
    } catch (err) {
      throw carrierError(err, doing)
    }
  }

  function labelOf(order: z.infer<typeof OrderSchema>): CarrierLabel | null {
    if (order.shipments.length === 0 || order.shipments.some((s) => !s.tracking_code || !s.selected_rate)) return null
    const first = order.shipments[0]!.selected_rate!
    return {
      carrierRef: order.id,
      carrier: first.carrier,
      service: first.service,
      chargeCents: order.shipments.reduce((sum, s) => sum + cents(s.selected_rate!.rate), 0),
      parcels: order.shipments.map((s) => ({ trackingNumber: s.tracking_code!, carrierParcelRef: s.id })),
      routingCode: order.shipments[0]!.usps_zone != null ? `ZONE ${order.shipments[0]!.usps_zone}` : null,
    }
  }

  function orderParams(request: ShipmentRequest, reference: string) {
    return {
      reference,
      // The API's return flag: it swaps the two addresses on the label (its docs, "Return").
      ...(request.isReturn ? { is_return: true } : {}),
      from_address: address(request.from),
      to_address: address(request.to),
      shipments: request.parcels.map((p, i) => ({ parcel: parcel(p), reference: `${request.reference}/${i + 1}` })),
    }
  }

  return {
    async checkAddress(a) {
      try {
        await plain.Address.createAndVerify(address(a))
        return { ok: true }
      } catch (err) {
        const e = carrierError(err, 'the address')
        if (e instanceof Conflict) return { ok: false, message: e.message.replace(/^The carrier refused the address: /, '') }
        throw e
      }
    },
    async quote(request) {
      const order = OrderSchema.parse(await call('to quote', () => plain.Order.create(orderParams(request, request.reference))))
      // The order's rates are per service for all its parcels together.
      return order.rates.map((r) => ({
        carrier: r.carrier,
        service: r.service,
        name: serviceName(r.service),
        days: r.delivery_days ?? 0,
        chargeCents: cents(r.rate),
      }))
    },
    async prepareLabel(request, key) {
      const order = OrderSchema.parse(await call('to record the parcels', () => keyed(key).Order.create(orderParams(request, key))))
      return order.id
    },
    async buyLabel(carrierRef, choice, key) {
      try {
        const order = OrderSchema.parse(await keyed(key).Order.buy(carrierRef, choice.carrier, choice.service))
        const label = labelOf(order)
        if (!label) throw new Unavailable('The carrier answered the purchase without a tracking number for every parcel; try again to fetch the label')
        return label
      } catch (err) {
        if (err instanceof Unavailable) throw err
        // Paid for already (a retry after a lost answer): the label is on the carrier's order.
        let found: CarrierLabel | null = null
        try {
          found = await this.findLabel(carrierRef)
        } catch (lookup) {
          // The purchase's own error is the answer; the failed look-up goes with it as its cause.
          const answer = carrierError(err, 'the label')
          ;(answer as Error & { cause?: unknown }).cause = lookup
          throw answer
        }
        if (found) return found
        throw carrierError(err, 'the label')
      }
    },
    async findLabel(carrierRef) {
      return labelOf(OrderSchema.parse(await call('to look up the label', () => plain.Order.retrieve(carrierRef))))
    },
    async voidLabel(refs) {
      const answers = await Promise.all(
        refs.map((id) => call('the refund', () => plain.Shipment.refund(id)).then((s) => ShipmentSchema.parse(s).refund_status ?? 'submitted')),
      )
      if (answers.includes('rejected')) return 'rejected'
      return answers.every((a) => a === 'refunded') ? 'refunded' : 'submitted'
    },
    async trackingStatus(trackingNumber, carrier) {
      const t = TrackerSchema.parse(await call('to track the parcel', () => plain.Tracker.create({ tracking_code: trackingNumber, carrier })))
      const last = t.tracking_details.at(-1)
      return {
        trackingNumber: t.tracking_code,
        status: t.status,
        detail: last?.message ?? null,
        at: last?.datetime ?? t.updated_at ?? new Date().toISOString(),
      }
    },
    readEvent(rawBody, headers) {
      if (!config.webhookSecret) throw new CarrierEventRejected('CARRIER_WEBHOOK_SECRET is not set on this server')
      const flat: Record<string, string> = {}
      for (const [k, v] of Object.entries(headers)) if (typeof v === 'string') flat[k.toLowerCase()] = v
      let body: unknown
      try {
        body = plain.Utils.validateWebhook(rawBody, flat, config.webhookSecret)
      } catch (err) {
        throw new CarrierEventRejected(`the signature does not verify (${err instanceof Error ? err.message : String(err)})`)
      }
      const event = EventSchema.safeParse(body)
      if (!event.success) throw new CarrierEventRejected('the body is not a carrier event')
      if (!event.data.description.startsWith('tracker.')) return null
      const tracker = TrackerSchema.safeParse(event.data.result)
      if (!tracker.success) throw new CarrierEventRejected('the tracking event has no tracker')
      const last = tracker.data.tracking_details.at(-1)
      return {
        eventId: event.data.id,
        trackingNumber: tracker.data.tracking_code,
        status: tracker.data.status,
        detail: last?.message ?? null,
        at: last?.datetime ?? tracker.data.updated_at ?? new Date().toISOString(),
      }
    },
  }
}

const CarrierEnvSchema = z.object({
  /** The carrier account's API key; unset → no labels can be bought. */
  CARRIER_API_KEY: z.string().min(1).optional(),
  /** The API's base URL (`…/v2/`); unset → the hosted service. `npm start` and `npm test` point it at the local stand-in. */
  CARRIER_API_URL: z.string().url("CARRIER_API_URL must be the shipping API's base URL ending in /v2/, e.g. http://127.0.0.1:54331/v2/").optional(),
  /** The secret the carrier signs tracking events with (its webhook secret). */
  CARRIER_WEBHOOK_SECRET: z
    .string()
    .min(16, 'CARRIER_WEBHOOK_SECRET must be at least 16 characters, the same as the webhook secret in the carrier account')
    .optional(),
})

/**
 * The carrier chosen by the environment: `CARRIER_API_KEY` → that account (at `CARRIER_API_URL` when
 * set); no key → no carrier, and the pack bench says labels cannot be bought. A bad variable stops
 * the boot with what to fix.
 */
export function carrierFromEnv(source: NodeJS.ProcessEnv = process.env): Carrier | null {
  // An empty variable counts as unset.
  const parsed = CarrierEnvSchema.safeParse(Object.fromEntries(Object.entries(source).filter(([, v]) => v !== '')))
  if (!parsed.success)
    throw new Error(
      `Kitwright cannot start; fix these environment variables (see .env.example):\n${parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`).join('\n')}`,
    )
  const env = parsed.data
  if (!env.CARRIER_API_KEY) return null
  const baseUrl = env.CARRIER_API_URL ? env.CARRIER_API_URL.replace(/\/*$/, '/') : undefined
  return easyPostCarrier({ apiKey: env.CARRIER_API_KEY, baseUrl, webhookSecret: env.CARRIER_WEBHOOK_SECRET })
}
