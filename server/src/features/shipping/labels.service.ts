import { randomUUID } from 'node:crypto'
import { and, desc, eq, inArray } from 'drizzle-orm'
import { z } from 'zod'
import { LabelAddressSchema } from '@kitwright/shared/address'
import type { BuyLabel, PackView, VoidLabel } from '@kitwright/shared/pack'
import { sscc } from '@kitwright/shared/domain/gs1'
import { carrierEvents, orders, parcels, shipments, shippingLabels, shopSettings, type ShipmentRow } from '../../db/schema/index'
import type { Deps } from '../../deps'
import type { SessionUser } from '../../lib/auth'
import { recordAudit, type AuditContext } from '../../lib/audit'
import { Conflict, Forbidden, HttpError, NotFound, Unavailable } from '../../lib/http-errors'
import { addOrderEvent } from '../orders/orders.service'
import { lockShipment, nextSsccSerials } from '../pack/pack.queries'
import { checkShipTo, packView, weighRequest } from '../pack/pack.service'
import type { Carrier, CarrierLabel, ShipmentRequest, TrackingUpdate } from './carrier'

export type LabelDeps = Pick<Deps, 'db' | 'pool' | 'carrier' | 'logger'>


/** What a purchase under way needs to be finished after a crash: kept on the shipment as `labelRequest`. */
const LabelRequestSchema = z.object({
  carrier: z.string(),
  service: z.string(),
  request: z.object({
    from: LabelAddressSchema,
    to: LabelAddressSchema,
    parcels: z.array(z.object({ weightGrams: z.number(), lengthMm: z.number(), widthMm: z.number(), heightMm: z.number() })),
    reference: z.string(),
  }),
  weighed: z.array(
    z.object({
      position: z.number().int(),
      boxId: z.string(),
      boxName: z.string(),
      length: z.number().int(),
      width: z.number().int(),
      height: z.number().int(),
      workOrderIds: z.array(z.string()),
      estimatedGrams: z.number().int(),
      scaleGrams: z.number().int().nullable(),
      actualGrams: z.number().int(),
      dimensionalGrams: z.number().int(),
      billableGrams: z.number().int(),
    }),
  ),
})
type LabelRequest = z.infer<typeof LabelRequestSchema>

function carrierOf(deps: LabelDeps): Carrier {
  if (!deps.carrier) throw new Unavailable('No carrier is set up (CARRIER_API_KEY): labels cannot be bought')
  return deps.carrier
}

const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms))

/**
 * Runs `fn` while holding a PostgreSQL advisory lock named by `name`, so two benches, two taps or two
 * API processes never work on one order's label at once. A waiter gives its connection back between
 * tries (ten waiting buys cannot starve the pool the holder needs); a crashed holder's lock goes with
 * its connection.
 */
export async function withLabelLock<T>(deps: LabelDeps, name: string, fn: () => Promise<T>): Promise<T> {
  const deadline = Date.now() + 45_000
  for (;;) {
    const client = await deps.pool.connect()
    let locked = false
    try {
      const { rows } = await client.query<{ ok: boolean }>('select pg_try_advisory_lock(hashtextextended($1, 0)) as ok', [name])
      locked = rows[0]?.ok === true
    } catch (err) {
      client.release(err instanceof Error ? err : true)
      throw err
    }
    if (!locked) {
      client.release()
      if (Date.now() > deadline) throw new Conflict('Another bench is buying or voiding this label right now; wait a moment and look again')
      await sleep(100 + Math.floor(Math.random() * 100))
      continue
    }
    try {
      return await fn()
    } finally {
      try {
        await client.query('select pg_advisory_unlock(hashtextextended($1, 0))', [name])
        client.release()
      } catch (err) {
        // A lost connection drops the lock with it; the client is discarded, not reused.
        deps.logger.warn({ err, lock: name }, 'could not release the label lock cleanly; the connection is dropped')
        client.release(err instanceof Error ? err : true)
      }
    }
  }
}

async function openOrLatestShipment(deps: LabelDeps, orderId: string): Promise<ShipmentRow | undefined> {
  const [row] = await deps.db.select().from(shipments).where(eq(shipments.orderId, orderId)).orderBy(desc(shipments.createdAt)).limit(1)
  return row
}

/** Step 1: the purchase recorded as `buying` with a fresh idempotency key and what is being bought, before any carrier call. */
async function recordBuying(deps: LabelDeps, orderId: string, input: BuyLabel): Promise<ShipmentRow> {
  const { data, weighed, request } = await weighRequest(deps, orderId, input)
  const carrierName = data.settings.carrierName
  if (!carrierName) throw new Conflict('The shop has no carrier set: an owner sets it in shop settings (the carrier name as the shipping service names it)')
  await checkShipTo(carrierOf(deps), request, data.order.number)
  const stored: LabelRequest = {
    carrier: carrierName,
    service: input.service,
    request: { ...request },
    weighed: weighed.map(({ serials: _serials, ...p }) => p),
  }
  return deps.db.transaction(async (tx) => {
    const shipment = await lockShipment(tx, data.shipment!.id)
    if (!shipment) throw new NotFound('No such shipment')
    if (shipment.status !== 'packing') return shipment
    const [updated] = await tx
      .update(shipments)
      .set({ status: 'buying', labelKey: randomUUID(), labelRequest: stored, carrierRef: null })
      .where(eq(shipments.id, shipment.id))
      .returning()
    return updated!
  })
}

/** A refused purchase (nothing was bought): the shipment goes back to packing so the packer can change the parcels or the service. */
async function abandonPurchase(deps: LabelDeps, shipmentId: string, key: string) {
  await deps.db
    .update(shipments)
    .set({ status: 'packing', labelKey: null, labelRequest: null, carrierRef: null })
    .where(and(eq(shipments.id, shipmentId), eq(shipments.status, 'buying'), eq(shipments.labelKey, key)))
}

/** The last step: parcels with their SSCCs and tracking numbers, the label kept, the shipment labelled, all in one transaction. */
async function recordLabel(deps: LabelDeps, shipment: ShipmentRow, stored: LabelRequest, label: CarrierLabel, actor: SessionUser | null) {
  if (label.parcels.length !== stored.weighed.length)
    throw new Unavailable(
      `The carrier sold ${label.parcels.length} parcel labels for ${stored.weighed.length} parcels; ask the office to check the carrier account before shipping`,
    )
  await deps.db.transaction(async (tx) => {
    const locked = await lockShipment(tx, shipment.id)
    if (!locked || locked.status !== 'buying' || locked.labelKey !== shipment.labelKey) return
    const [settings] = await tx.select().from(shopSettings).limit(1)
    if (!settings?.gs1CompanyPrefix) throw new Conflict('The shop has no GS1 Company Prefix for SSCCs; an owner sets it in shop settings')
    const serials = await nextSsccSerials(tx, stored.weighed.length)
    await tx.insert(parcels).values(
      stored.weighed.map((p, i) => ({
        shipmentId: shipment.id,
        position: p.position,
        boxId: p.boxId,
        boxName: p.boxName,
        length: p.length,
        width: p.width,
        height: p.height,
        workOrderIds: p.workOrderIds,
        estimatedGrams: p.estimatedGrams,
        scaleGrams: p.scaleGrams,
        actualGrams: p.actualGrams,
        dimensionalGrams: p.dimensionalGrams,
        billableGrams: p.billableGrams,
        sscc: sscc({ extensionDigit: settings.ssccExtensionDigit, companyPrefix: settings.gs1CompanyPrefix!, serialReference: serials[i]! }),
        trackingNumber: label.parcels[i]!.trackingNumber,
      })),
    )
    const now = new Date()
    await tx.insert(shippingLabels).values({
      shipmentId: shipment.id,
      idempotencyKey: shipment.labelKey!,
      carrier: label.carrier,
      service: label.service,
      carrierRef: label.carrierRef,
      trackingNumbers: label.parcels.map((p) => p.trackingNumber),
      carrierParcelRefs: label.parcels.map((p) => p.carrierParcelRef),
      chargeCents: label.chargeCents,
      boughtAt: now,
      boughtBy: actor?.id ?? null,
    })
    await tx
      .update(shipments)
      .set({
        status: 'labelled',
        carrier: label.carrier,
        service: label.service,
        trackingNumber: label.parcels[0]!.trackingNumber,
        chargeCents: label.chargeCents,
        carrierRef: label.carrierRef,
        labelData: { routingCode: label.routingCode },
        labelledAt: now,
        labelledBy: actor?.id ?? locked.labelledBy,
      })
      .where(eq(shipments.id, shipment.id))
    const numbers = label.parcels.map((p) => p.trackingNumber).join(', ')
    await addOrderEvent(tx, {
      orderId: shipment.orderId,
      kind: 'label_bought',
      message: `Label bought: ${label.carrier} ${label.service}, tracking ${numbers}, ${label.parcels.length} parcel${label.parcels.length === 1 ? '' : 's'}`,
      data: { shipmentId: shipment.id, trackingNumbers: label.parcels.map((p) => p.trackingNumber), idempotencyKey: shipment.labelKey },
      actor: actor ?? undefined,
    })
  })
}

/** One purchase as recorded before the carrier is called: its key, what is bought, and the carrier's reference once known. */
export interface LabelPurchase {
  key: string
  carrierRef: string | null
  request: ShipmentRequest
  choice: { carrier: string; service: string }
  /** A purchase found in `buying` (a retry, or after a crash): the label may already be paid for. */
  resuming: boolean
  /** Keeps the carrier's reference on the purchase before paying, so a retry never registers it twice. */
  saveRef: (ref: string) => Promise<unknown>
}

/**
 * The carrier's side of buying a label exactly once, for outbound and return labels alike: the
 * shipment registered under the purchase's key (its reference kept before paying), then the label
 * found (paid before a crash) or paid for with the same key.
 */
export async function payForLabel(carrier: Carrier, purchase: LabelPurchase): Promise<{ ref: string; label: CarrierLabel }> {
  let ref = purchase.carrierRef
  let label: CarrierLabel | null = null
  if (!ref) {
    ref = await carrier.prepareLabel(purchase.request, purchase.key)
    await purchase.saveRef(ref)
  } else if (purchase.resuming) {
    label = await carrier.findLabel(ref)
  }
  label ??= await carrier.buyLabel(ref, purchase.choice, purchase.key)
  return { ref, label }
}

/**
 * Finishes the purchase a shipment in `buying` stands for: the parcels recorded with the carrier under
 * the purchase's key (the id kept before paying), then the label found (paid before a crash) or paid
 * for with the same key, then recorded. A refusal by the carrier puts the shipment back to packing;
 * a carrier out of reach leaves it `buying`, to be finished by the next try.
 */
async function finishPurchase(deps: LabelDeps, shipment: ShipmentRow, actor: SessionUser | null, resuming: boolean) {
  const carrier = carrierOf(deps)
  const key = shipment.labelKey!
  const stored = LabelRequestSchema.parse(shipment.labelRequest)
  try {
    const { ref, label } = await payForLabel(carrier, {
      key,
      carrierRef: shipment.carrierRef,
      request: stored.request,
      choice: { carrier: stored.carrier, service: stored.service },
      resuming,
      saveRef: (carrierRef) =>
        deps.db
          .update(shipments)
          .set({ carrierRef })
          .where(and(eq(shipments.id, shipment.id), eq(shipments.labelKey, key))),
    })
    await recordLabel(deps, { ...shipment, carrierRef: ref }, stored, label, actor)
  } catch (err) {
    if (err instanceof Conflict) {
      deps.logger.warn({ err, shipmentId: shipment.id }, 'the carrier refused the label; the shipment is back to packing')
      await abandonPurchase(deps, shipment.id, key)
    } else {
      deps.logger.error({ err, shipmentId: shipment.id, idempotencyKey: key }, 'label purchase not finished; it stays "buying" and the next try finishes it')
    }
    throw err
  }
}

/**
 * Buys the order's label exactly once. The purchase is recorded (`buying`, idempotency key, what is
 * bought) before the carrier is called, every call carries the key, and one advisory lock per order
 * lets one purchase run at a time: a second tap, a retry or ten buys at once all end with the one
 * label; a purchase cut short by a crash is found again and recorded by the next try.
 */
export async function buyLabel(deps: LabelDeps, orderId: string, input: BuyLabel, actor: SessionUser): Promise<PackView> {
  carrierOf(deps)
  await withLabelLock(deps, `label:${orderId}`, async () => {
    const current = await openOrLatestShipment(deps, orderId)
    if (!current) throw new Conflict('Nothing of this order is packed yet; scan the first item to start packing')
    if (current.status === 'labelled') return
    const resuming = current.status === 'buying'
    const shipment = resuming ? current : await recordBuying(deps, orderId, input)
    if (shipment.status !== 'buying') return
    await finishPurchase(deps, shipment, actor, resuming)
  })
  return packView(deps, orderId)
}

/** Finishes every purchase left `buying` (by a crash or a carrier outage); run by a periodic job. */
export async function finishInterruptedPurchases(deps: LabelDeps): Promise<number> {
  const stuck = await deps.db.select({ orderId: shipments.orderId }).from(shipments).where(eq(shipments.status, 'buying'))
  let finished = 0
  for (const { orderId } of stuck) {
    try {
      await withLabelLock(deps, `label:${orderId}`, async () => {
        const current = await openOrLatestShipment(deps, orderId)
        if (current?.status === 'buying') await finishPurchase(deps, current, null, true)
      })
      finished += 1
    } catch (err) {
      deps.logger.warn({ err, orderId }, 'an interrupted label purchase could not be finished yet')
    }
  }
  return finished
}

/**
 * Voids the shipment's label: recorded first (with the reason, in the audit and on the timeline),
 * then the refund asked of the carrier for every parcel. Before shipping the box opens again (parcels
 * dropped, a new label may be bought); after shipping, only a planner or the owner voids a label
 * bought by mistake, and the shipment stays shipped.
 */
export async function voidLabel(deps: LabelDeps, shipmentId: string, input: VoidLabel, actor: SessionUser, audit: AuditContext): Promise<PackView> {
  const carrier = carrierOf(deps)
  const [found] = await deps.db.select().from(shipments).where(eq(shipments.id, shipmentId))
  if (!found) throw new NotFound('No such shipment')
  const orderId = found.orderId
  await withLabelLock(deps, `label:${orderId}`, async () => {
    const [label] = await deps.db
      .select()
      .from(shippingLabels)
      .where(and(eq(shippingLabels.shipmentId, shipmentId), inArray(shippingLabels.status, ['bought', 'voided'])))
      .orderBy(desc(shippingLabels.boughtAt))
      .limit(1)
    const retryRefund = label?.status === 'voided' && label.refundStatus === 'requesting'
    if (!label || (label.status === 'voided' && !retryRefund)) {
      const [s] = await deps.db.select().from(shipments).where(eq(shipments.id, shipmentId))
      if (s?.status === 'buying') throw new Conflict('The label is still being bought; finish buying it (Buy label again), then void it')
      throw new Conflict('This shipment has no bought label to void')
    }
    if (!retryRefund) {
      await deps.db.transaction(async (tx) => {
        const shipment = await lockShipment(tx, shipmentId)
        if (!shipment) throw new NotFound('No such shipment')
        const shipped = shipment.status === 'shipped'
        if (shipped && actor.role === 'packer') throw new Forbidden('The parcel has shipped: only a planner or the owner may void its label')
        const now = new Date()
        await tx
          .update(shippingLabels)
          .set({ status: 'voided', voidReason: input.reason, voidedAt: now, voidedBy: actor.id, refundStatus: 'requesting' })
          .where(eq(shippingLabels.id, label.id))
        if (!shipped) {
          await tx.delete(parcels).where(eq(parcels.shipmentId, shipmentId))
          await tx
            .update(shipments)
            .set({
              status: 'packing',
              carrier: null,
              service: null,
              trackingNumber: null,
              chargeCents: null,
              labelData: null,
              labelledAt: null,
              labelledBy: null,
              labelKey: null,
              labelRequest: null,
              carrierRef: null,
            })
            .where(eq(shipments.id, shipmentId))
        }
        const [order] = await tx.select({ number: orders.number }).from(orders).where(eq(orders.id, shipment.orderId))
        const summary = `Label voided${shipped ? ' after shipping' : ''} for order ${order?.number ?? ''}: ${label.carrier} ${label.service}, tracking ${label.trackingNumbers.join(', ')}; refund asked of the carrier. Reason: ${input.reason}`
        await addOrderEvent(tx, {
          orderId: shipment.orderId,
          kind: 'label_voided',
          message: summary,
          data: { shipmentId, trackingNumbers: label.trackingNumbers, reason: input.reason },
          actor,
        })
        await recordAudit(tx, audit, {
          action: 'shipment.void_label',
          entityType: 'order',
          entityId: shipment.orderId,
          summary,
          data: { shipmentId, labelId: label.id, reason: input.reason },
        })
      })
    }
    let refund: string
    try {
      refund = await carrier.voidLabel(label.carrierParcelRefs)
    } catch (err) {
      deps.logger.warn({ err, shipmentId }, 'label voided in Kitwright; the refund request did not reach the carrier yet')
      if (err instanceof HttpError)
        throw new HttpError(
          err.status,
          err.code,
          `The label is voided in Kitwright, but the refund request did not go through: ${err.message}. Tap Void label again to ask again`,
        )
      throw err
    }
    await deps.db.update(shippingLabels).set({ refundStatus: refund }).where(eq(shippingLabels.id, label.id))
  })
  return packView(deps, orderId, found.status === 'shipped' ? shipmentId : undefined)
}

const RANK: Record<string, number> = {
  pre_transit: 1,
  in_transit: 2,
  out_for_delivery: 3,
  available_for_pickup: 3,
  delivered: 4,
  return_to_sender: 4,
  failure: 4,
}

/**
 * A signed tracking event from the carrier: kept by its id (a redelivery changes nothing), the
 * shipment's status moved on (never back: events may arrive out of order), and the order's timeline
 * told. An event for a tracking number Kitwright never sold is kept and otherwise ignored.
 */
export async function applyTrackingEvent(deps: Pick<Deps, 'db'>, event: TrackingUpdate): Promise<{ duplicate: boolean; shipmentId: string | null }> {
  return deps.db.transaction(async (tx) => {
    const [parcel] = await tx.select({ shipmentId: parcels.shipmentId }).from(parcels).where(eq(parcels.trackingNumber, event.trackingNumber))
    const shipmentId = parcel?.shipmentId ?? null
    const inserted = await tx
      .insert(carrierEvents)
      .values({ id: event.eventId, trackingNumber: event.trackingNumber, status: event.status, body: event, shipmentId })
      .onConflictDoNothing()
      .returning({ id: carrierEvents.id })
    if (inserted.length === 0) return { duplicate: true, shipmentId }
    if (!shipmentId) return { duplicate: false, shipmentId }
    const shipment = await lockShipment(tx, shipmentId)
    if (!shipment) return { duplicate: false, shipmentId }
    const at = new Date(event.at)
    const when = Number.isNaN(at.getTime()) ? new Date() : at
    if ((RANK[event.status] ?? 0) >= (RANK[shipment.trackingStatus ?? ''] ?? 0)) {
      await tx
        .update(shipments)
        .set({ trackingStatus: event.status, trackingUpdatedAt: when, ...(event.status === 'delivered' ? { deliveredAt: when } : {}) })
        .where(eq(shipments.id, shipmentId))
    }
    const words = event.status.replace(/_/g, ' ')
    await addOrderEvent(tx, {
      orderId: shipment.orderId,
      kind: event.status === 'delivered' ? 'delivered' : 'tracking',
      message: `Parcel ${event.trackingNumber}: ${words}${event.detail && event.detail !== words ? ` (${event.detail})` : ''}`,
      data: { shipmentId, trackingNumber: event.trackingNumber, status: event.status, eventId: event.eventId },
    })
    return { duplicate: false, shipmentId }
  })
}
