import { createHmac, randomBytes, randomInt } from 'node:crypto'
import { existsSync, mkdirSync, readFileSync, renameSync, writeFileSync } from 'node:fs'
import { createServer, type IncomingMessage, type ServerResponse } from 'node:http'
import path from 'node:path'
import { z } from 'zod'

/**
 * The local carrier stand-in: answers, on 127.0.0.1, the HTTP calls the hosted shipping API's official
 * SDK makes for Kitwright (address check, orders of parcels with their rates, buying, refunds,
 * trackers), so the app runs the SDK unchanged against it. Its carrier "Brindlepost", services,
 * prices and number format are invented for Kitwright's tests and demo; they are no real carrier's.
 *
 * It keeps its state (orders, idempotency keys, the tracking counter) in `<dir>/carrier-state.json`,
 * so after a restart a retried purchase finds its label and no tracking number is handed out twice.
 */
export const STANDIN_CARRIER = 'Brindlepost'

const AddressSchema = z.object({
  name: z.string().min(1),
  street1: z.string().min(1),
  street2: z.string().nullish(),
  city: z.string().min(1),
  state: z.string().nullish(),
  zip: z.string().min(1),
  country: z.string().length(2),
})
const OUNCES_PER_70_KG = 70_000 / 28.349523125
const ParcelSchema = z.object({
  length: z.number().positive(),
  width: z.number().positive(),
  height: z.number().positive(),
  weight: z.number().positive().max(OUNCES_PER_70_KG, 'A parcel may weigh at most 70 kg'),
})
const OrderRequestSchema = z.object({
  order: z.object({
    reference: z.string().nullish(),
    /** A return label: the addresses are the outbound ones and the carrier swaps them. */
    is_return: z.boolean().nullish(),
    from_address: AddressSchema,
    to_address: AddressSchema,
    shipments: z.array(z.object({ parcel: ParcelSchema, reference: z.string().nullish() })).min(1),
  }),
})

/** The stand-in's services: a base price per parcel and a price per started pound of weight. */
const SERVICES = [
  { service: 'ground', days: 5, baseCents: 895, perLbCents: 45 },
  { service: 'express', days: 2, baseCents: 1995, perLbCents: 95 },
] as const

interface StoredShipment {
  id: string
  reference: string | null
  parcel: z.infer<typeof ParcelSchema>
  tracking_code: string | null
  selected: { service: string; cents: number } | null
  refund_status: string | null
}
interface StoredOrder {
  id: string
  reference: string | null
  international: boolean
  to_zip: string
  is_return?: boolean
  shipments: StoredShipment[]
  idempotencyKey: string | null
  buyKey: string | null
}
interface State {
  counter: number
  orders: Record<string, StoredOrder>
  keys: Record<string, string>
  trackers: Record<string, { status: string; details: { message: string; datetime: string }[] }>
}

function priceCents(service: (typeof SERVICES)[number], parcel: z.infer<typeof ParcelSchema>, international: boolean) {
  const cents = service.baseCents + Math.ceil(parcel.weight / 16) * service.perLbCents
  return international ? cents * 2 : cents
}

const money = (cents: number) => (cents / 100).toFixed(2)

function rateJson(order: StoredOrder, shipment: StoredShipment | null, service: (typeof SERVICES)[number]) {
  const parcels = shipment ? [shipment] : order.shipments
  const cents = parcels.reduce((sum, s) => sum + priceCents(service, s.parcel, order.international), 0)
  return {
    id: `rate_${service.service}_${(shipment ?? order).id}`,
    object: 'Rate',
    carrier: STANDIN_CARRIER,
    service: service.service,
    rate: money(cents),
    currency: 'USD',
    delivery_days: service.days + (order.international ? 3 : 0),
    shipment_id: shipment?.id ?? null,
  }
}

function orderJson(order: StoredOrder) {
  return {
    id: order.id,
    object: 'Order',
    mode: 'test',
    reference: order.reference,
    is_return: order.is_return === true,
    shipments: order.shipments.map((s) => ({
      id: s.id,
      object: 'Shipment',
      reference: s.reference,
      parcel: { object: 'Parcel', ...s.parcel },
      tracking_code: s.tracking_code,
      refund_status: s.refund_status,
      rates: SERVICES.map((svc) => rateJson(order, s, svc)),
      selected_rate: s.selected
        ? {
            id: `rate_${s.selected.service}_${s.id}`,
            object: 'Rate',
            carrier: STANDIN_CARRIER,
            service: s.selected.service,
            rate: money(s.selected.cents),
            currency: 'USD',
          }
        : null,
      postage_label: s.tracking_code ? { object: 'PostageLabel', label_url: null } : null,
      usps_zone: s.tracking_code ? order.to_zip.slice(0, 1) : null,
    })),
    rates: SERVICES.map((svc) => rateJson(order, null, svc)),
  }
}

async function readJson(req: IncomingMessage): Promise<unknown> {
  const chunks: Buffer[] = []
  for await (const chunk of req) chunks.push(chunk as Buffer)
  const text = Buffer.concat(chunks).toString('utf8')
  if (!text) return {}
  try {
    return JSON.parse(text)
  } catch (err) {
    return { unreadable: err instanceof Error ? err.message : String(err) }
  }
}

function send(res: ServerResponse, status: number, body: unknown) {
  res.writeHead(status, { 'content-type': 'application/json' })
  res.end(JSON.stringify(body))
}
const refuse = (res: ServerResponse, status: number, code: string, message: string, errors: { field: string; message: string }[] = []) =>
  send(res, status, { error: { code, message, errors } })

/** Whether the stand-in can "deliver" to an address: postal codes of the two countries it knows by shape. */
function checkPostalCode(country: string, zip: string): string | null {
  if (country === 'US' && !/^\d{5}(-\d{4})?$/.test(zip.trim())) return 'US ZIP codes are 5 digits (or ZIP+4)'
  if (country === 'CA' && !/^[A-Z]\d[A-Z] ?\d[A-Z]\d$/i.test(zip.trim())) return 'Canadian postal codes look like K0A 1A0'
  return null
}

/**
 * Signs a tracking event as the hosted API does: `X-Hmac-Signature: hmac-sha256-hex=<hex>` of the body
 * under the webhook secret (NFKD-normalised). Bodies carry no `weight` field (the SDK rewrites those).
 */
export function signCarrierEvent(secret: string, body: string): string {
  return `hmac-sha256-hex=${createHmac('sha256', Buffer.from(secret.normalize('NFKD'), 'utf8'))
    .update(body, 'utf8')
    .digest('hex')}`
}

/** A tracking event body as the hosted API posts it (`tracker.updated`). */
export function trackingEventBody(input: { eventId?: string; trackingCode: string; status: string; message?: string; at?: Date }) {
  const at = (input.at ?? new Date()).toISOString()
  return JSON.stringify({
    id: input.eventId ?? `evt_${randomBytes(12).toString('hex')}`,
    object: 'Event',
    description: 'tracker.updated',
    created_at: at,
    result: {
      object: 'Tracker',
      tracking_code: input.trackingCode,
      status: input.status,
      carrier: STANDIN_CARRIER,
      updated_at: at,
      tracking_details: [{ message: input.message ?? input.status.replace(/_/g, ' '), status: input.status, datetime: at }],
    },
  })
}

export async function startCarrierFake(opts: { port: number; directory: string }) {
  mkdirSync(opts.directory, { recursive: true })
  const file = path.join(opts.directory, 'carrier-state.json')
  const state: State = existsSync(file) ? (JSON.parse(readFileSync(file, 'utf8')) as State) : { counter: 0, orders: {}, keys: {}, trackers: {} }
  const save = () => {
    writeFileSync(`${file}.tmp`, JSON.stringify(state))
    renameSync(`${file}.tmp`, file)
  }
  const newId = (prefix: string) => `${prefix}_${randomBytes(12).toString('hex')}`
  // Invented format: BP, a running number kept across restarts, and 4 random digits.
  const nextTracking = () => {
    state.counter += 1
    return `BP${String(state.counter).padStart(9, '0')}${String(randomInt(10_000)).padStart(4, '0')}`
  }

  const server = createServer((req, res) => {
    void (async () => {
      const url = new URL(req.url ?? '/', 'http://127.0.0.1')
      if (!req.headers.authorization) return refuse(res, 401, 'APIKEY.REQUIRED', 'No API key was sent')
      const key = typeof req.headers['idempotency-key'] === 'string' ? req.headers['idempotency-key'] : null
      const route = `${req.method} ${url.pathname.replace(/\/+$/, '')}`
      let m: RegExpExecArray | null

      if (route === 'POST /v2/addresses/create_and_verify') {
        const parsed = z.object({ address: AddressSchema }).safeParse(await readJson(req))
        if (!parsed.success)
          return refuse(
            res,
            422,
            'ADDRESS.VERIFY.FAILURE',
            'Unable to verify address.',
            parsed.error.issues.map((i) => ({ field: i.path.slice(1).join('.'), message: i.message })),
          )
        const problem = checkPostalCode(parsed.data.address.country, parsed.data.address.zip)
        if (problem) return refuse(res, 422, 'ADDRESS.VERIFY.FAILURE', 'Unable to verify address.', [{ field: 'zip', message: problem }])
        return send(res, 200, {
          address: { id: newId('adr'), object: 'Address', ...parsed.data.address, verifications: { delivery: { success: true, errors: [] } } },
        })
      }

      if (route === 'POST /v2/orders') {
        if (key && state.keys[`order:${key}`]) return send(res, 200, orderJson(state.orders[state.keys[`order:${key}`]!]!))
        const parsed = OrderRequestSchema.safeParse(await readJson(req))
        if (!parsed.success) {
          const issue = parsed.error.issues[0]
          return refuse(res, 422, 'PARAMETER.INVALID', `${issue?.path.slice(1).join('.') || 'order'}: ${issue?.message ?? 'invalid'}`)
        }
        const o = parsed.data.order
        const order: StoredOrder = {
          id: newId('order'),
          reference: o.reference ?? null,
          international: o.from_address.country !== o.to_address.country,
          // A return goes to the outbound label's sender (the shop).
          to_zip: o.is_return ? o.from_address.zip : o.to_address.zip,
          is_return: o.is_return === true,
          shipments: o.shipments.map((s) => ({
            id: newId('shp'),
            reference: s.reference ?? null,
            parcel: s.parcel,
            tracking_code: null,
            selected: null,
            refund_status: null,
          })),
          idempotencyKey: key,
          buyKey: null,
        }
        // Quotes are not kept: only an order made with an idempotency key can be bought.
        if (key) {
          state.orders[order.id] = order
          state.keys[`order:${key}`] = order.id
          save()
        }
        return send(res, 201, orderJson(order))
      }

      if (req.method === 'GET' && (m = /^\/v2\/orders\/([\w-]+)$/.exec(url.pathname))) {
        const order = state.orders[m[1]!]
        return order ? send(res, 200, orderJson(order)) : refuse(res, 404, 'NOT_FOUND', 'The requested resource could not be found.')
      }

      if (req.method === 'POST' && (m = /^\/v2\/orders\/([\w-]+)\/buy$/.exec(url.pathname))) {
        const order = state.orders[m[1]!]
        if (!order) return refuse(res, 404, 'NOT_FOUND', 'The requested resource could not be found.')
        const parsed = z.object({ carrier: z.string(), service: z.string() }).safeParse(await readJson(req))
        if (!parsed.success) return refuse(res, 422, 'PARAMETER.REQUIRED', 'Choose a carrier and a service')
        if (order.buyKey) {
          // The same purchase asked again (same key) gets the same label; another purchase is refused.
          return key === order.buyKey ? send(res, 200, orderJson(order)) : refuse(res, 422, 'ORDER.POSTAGE.EXISTS', 'This order has already been purchased.')
        }
        if (parsed.data.carrier !== STANDIN_CARRIER)
          return refuse(res, 422, 'ORDER.BUY.FAILURE', `No rates of carrier "${parsed.data.carrier}" on this account`)
        const service = SERVICES.find((s) => s.service === parsed.data.service)
        if (!service) return refuse(res, 422, 'ORDER.BUY.FAILURE', `No service "${parsed.data.service}"; choose ${SERVICES.map((s) => s.service).join(' or ')}`)
        order.buyKey = key ?? newId('buy')
        for (const s of order.shipments) {
          s.tracking_code = nextTracking()
          s.selected = { service: service.service, cents: priceCents(service, s.parcel, order.international) }
          state.trackers[s.tracking_code] = { status: 'pre_transit', details: [{ message: 'Label created', datetime: new Date().toISOString() }] }
        }
        save()
        return send(res, 200, orderJson(order))
      }

      if (req.method === 'POST' && (m = /^\/v2\/shipments\/([\w-]+)\/refund$/.exec(url.pathname))) {
        const shipment = Object.values(state.orders)
          .flatMap((o) => o.shipments)
          .find((s) => s.id === m![1])
        if (!shipment) return refuse(res, 404, 'NOT_FOUND', 'The requested resource could not be found.')
        if (!shipment.tracking_code) return refuse(res, 422, 'SHIPMENT.REFUND.UNAVAILABLE', 'This shipment has no label to refund.')
        shipment.refund_status ??= 'submitted'
        save()
        return send(res, 200, { id: shipment.id, object: 'Shipment', tracking_code: shipment.tracking_code, refund_status: shipment.refund_status })
      }

      if (route === 'POST /v2/trackers') {
        const parsed = z.object({ tracker: z.object({ tracking_code: z.string(), carrier: z.string().nullish() }) }).safeParse(await readJson(req))
        if (!parsed.success) return refuse(res, 422, 'PARAMETER.REQUIRED', 'Name the tracking code')
        const tracker = state.trackers[parsed.data.tracker.tracking_code]
        if (!tracker) return refuse(res, 422, 'TRACKER.CREATE.FAILURE', 'No parcel has that tracking code')
        return send(res, 200, {
          id: `trk_${parsed.data.tracker.tracking_code}`,
          object: 'Tracker',
          tracking_code: parsed.data.tracker.tracking_code,
          carrier: STANDIN_CARRIER,
          status: tracker.status,
          tracking_details: tracker.details,
          updated_at: tracker.details.at(-1)?.datetime,
        })
      }

      return refuse(res, 404, 'NOT_FOUND', `The stand-in does not answer ${route}`)
    })().catch((err: unknown) => refuse(res, 500, 'INTERNAL_SERVER_ERROR', err instanceof Error ? err.message : 'failed'))
  })
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject)
    server.listen(opts.port, '127.0.0.1', () => resolve())
  })
  const address = server.address()
  const port = typeof address === 'object' && address ? address.port : opts.port
  return {
    port,
    /** The base URL the SDK takes (`baseUrl`). */
    url: `http://127.0.0.1:${port}/v2/`,
    /** Moves a parcel's tracker on (as the carrier's scans would) and returns the event the carrier would post. */
    advance(trackingCode: string, status: string, message?: string) {
      const tracker = state.trackers[trackingCode]
      if (!tracker) throw new Error(`no tracker ${trackingCode}`)
      const at = new Date()
      tracker.status = status
      tracker.details.push({ message: message ?? status.replace(/_/g, ' '), datetime: at.toISOString() })
      save()
      return trackingEventBody({ trackingCode, status, message, at })
    },
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  }
}
