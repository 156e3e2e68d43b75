import { z } from 'zod'
import { Unavailable } from '../../lib/http-errors'

/** An address as a carrier takes it. */
export interface CarrierAddress {
  name: string
  line1: string
  line2: string | null
  city: string
  region: string | null
  postalCode: string
  country: string
}

/** One parcel as a carrier rates it: billable weight in grams, outside size in millimetres. */
export interface CarrierParcel {
  weightGrams: number
  lengthMm: number
  widthMm: number
  heightMm: number
}

export interface ShipmentRequest {
  from: CarrierAddress
  to: CarrierAddress
  parcels: CarrierParcel[]
  /** Our reference (the order number), printed by the carrier where it has room. */
  reference: string
}

const QuoteSchema = z.object({ service: z.string(), name: z.string(), days: z.number().int(), chargeCents: z.number().int() })
const QuotesSchema = z.object({ quotes: z.array(QuoteSchema) })
const LabelSchema = z.object({
  trackingNumber: z.string().min(1),
  service: z.string(),
  chargeCents: z.number().int(),
  /** What the carrier wants printed on the label besides the tracking number (its sort code). */
  routingCode: z.string(),
})

export type CarrierQuote = z.infer<typeof QuoteSchema>
export type CarrierLabel = z.infer<typeof LabelSchema>

/** A carrier's label service: rates for the parcels, and a label bought for one service. */
export interface Carrier {
  /** The carrier's name, as printed on the label and stored on the shipment. */
  readonly name: string
  quote(request: ShipmentRequest): Promise<CarrierQuote[]>
  buyLabel(request: ShipmentRequest & { service: string }): Promise<CarrierLabel>
}

/** The carrier's own words when it refused, or its status. */
async function failure(res: Response): Promise<string> {
  const body: unknown = await res.json().catch(() => null)
  const message = z.object({ error: z.object({ message: z.string() }) }).safeParse(body)
  return message.success ? message.data.error.message : `the carrier answered ${res.status}`
}

/**
 * A carrier reached over HTTP with JSON: `POST {base}/v1/quotes` and `POST {base}/v1/labels`. The
 * local stand-in (storage-fake/carrier.ts) speaks it; a real carrier gets an adapter of its own
 * behind the same interface.
 */
export function httpCarrier(baseUrl: string, name = 'Kitwright test carrier'): Carrier {
  const base = baseUrl.replace(/\/+$/, '')
  async function post<S extends z.ZodType>(path: string, body: unknown, schema: S): Promise<z.infer<S>> {
    let res: Response
    try {
      res = await fetch(`${base}${path}`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body), signal: AbortSignal.timeout(15_000) })
    } catch (err) {
      throw new Unavailable(`The carrier at ${base} cannot be reached (${err instanceof Error ? err.message : String(err)}); try again in a minute`)
    }
    if (!res.ok) throw new Unavailable(`The carrier refused: ${await failure(res)}`)
    return schema.parse(await res.json())
  }
  return {
    name,
    async quote(request) {
      return (await post('/v1/quotes', request, QuotesSchema)).quotes
    },
    buyLabel(request) {
      return post('/v1/labels', request, LabelSchema)
    },
  }
}

/** The carrier chosen by the environment: `CARRIER_URL` set → that carrier over HTTP; unset → none. */
export function carrierFromEnv(url: string | undefined): Carrier | null {
  return url ? httpCarrier(url) : null
}
