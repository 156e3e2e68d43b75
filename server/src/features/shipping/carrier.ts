/**
 * The seam between Kitwright and a carrier's label service. Kitwright speaks to this interface only;
 * `easypost-carrier.ts` fits it over a hosted shipping API's official SDK, and another carrier's SDK
 * gets an adapter of its own beside it.
 */

/** An address as a carrier takes it. */
export interface CarrierAddress {
  name: string
  line1: string
  line2: string | null
  city: string
  region: string | null
  postalCode: string
  country: string
  phone?: string | null
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
  /**
   * A return label: `from` and `to` stay as on the outbound label (the shop and the customer) and the
   * carrier swaps them, so the customer sends the parcel back to the shop.
   */
  isReturn?: boolean
}

/** One of the carrier's services with its price for these parcels. */
export interface CarrierQuote {
  carrier: string
  service: string
  name: string
  days: number
  chargeCents: number
}

/** A label the carrier sold: one tracking number per parcel, in parcel order. */
export interface CarrierLabel {
  /** The carrier's id of the purchase (all parcels). */
  carrierRef: string
  carrier: string
  service: string
  chargeCents: number
  parcels: { trackingNumber: string; carrierParcelRef: string }[]
  /** What the carrier wants printed besides the tracking number (its sort code), if anything. */
  routingCode: string | null
}

/** The carrier's answer to a refund request. */
export type RefundStatus = 'submitted' | 'refunded' | 'rejected'

/** Where a parcel is, in the carrier's words. */
export interface TrackingUpdate {
  /** The carrier's event id (a redelivery repeats it). */
  eventId: string
  trackingNumber: string
  /** `pre_transit`, `in_transit`, `out_for_delivery`, `delivered`, `return_to_sender`, `failure`… */
  status: string
  /** The carrier's latest line of detail, if any. */
  detail: string | null
  at: string
}

export type AddressCheck = { ok: true } | { ok: false; message: string }

/** A carrier's label service. Every call that spends money carries the caller's idempotency key. */
export interface Carrier {
  /** Whether the carrier can deliver to the address, and what to fix when not. */
  checkAddress(address: CarrierAddress): Promise<AddressCheck>
  /** Prices for the parcels, of every carrier and service the account offers. */
  quote(request: ShipmentRequest): Promise<CarrierQuote[]>
  /** Records the parcels with the carrier, unpaid; the same key gives back the same purchase. Returns the carrier's id of it. */
  prepareLabel(request: ShipmentRequest, idempotencyKey: string): Promise<string>
  /** Pays for the label of a prepared purchase; when it was paid for already, gives that label back. */
  buyLabel(carrierRef: string, choice: { carrier: string; service: string }, idempotencyKey: string): Promise<CarrierLabel>
  /** The label of a purchase, if the carrier sold it (to reconcile after a crash), else null. */
  findLabel(carrierRef: string): Promise<CarrierLabel | null>
  /** Asks the carrier to refund every parcel's label. */
  voidLabel(carrierParcelRefs: string[]): Promise<RefundStatus>
  /** A parcel's latest tracking status, asked of the carrier. */
  trackingStatus(trackingNumber: string, carrier: string): Promise<Omit<TrackingUpdate, 'eventId'>>
  /** Checks a signed tracking event's signature and reads it; throws `CarrierEventRejected` when it does not verify. */
  readEvent(rawBody: Buffer, headers: Record<string, string | string[] | undefined>): TrackingUpdate | null
}

/** A tracking event whose signature does not verify, or that is not an event at all. */
export class CarrierEventRejected extends Error {}
