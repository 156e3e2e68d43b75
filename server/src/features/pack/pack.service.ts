import { and, eq, isNull } from 'drizzle-orm'
import type { ApprovePartial, PackView, Quote, QuoteRequest } from '@kitwright/shared/pack'
import { LENGTH_BASE_PER_MM } from '@kitwright/shared/domain/units'
import type { Db, Tx } from '../../db/client'
import { packChecks, shipments, type ShipmentRow } from '../../db/schema/index'
import type { Deps } from '../../deps'
import type { SessionUser } from '../../lib/auth'
import { recordAudit, type AuditContext } from '../../lib/audit'
import { BadRequest, Conflict, NotFound, Unavailable } from '../../lib/http-errors'
import { addOrderEvent } from '../orders/orders.service'
import type { Carrier, ShipmentRequest } from '../shipping/carrier'
import { weighParcel } from './parcel-weights'
import { buildPackView, divisorOf, loadPackData, packKey, unitKey, type PackData } from './pack-view'
import { findBinByCode, findOrder, findWorkOrder, findWorkOrderBySerial, lockOrderRow, lockShipment, openShipmentOf } from './pack.queries'
import { latestWeighingOf } from '../bag-weights/bag-weights.queries'
import { ORDER_STATUS_LABELS, statusInSentence } from '@kitwright/shared/status-words'

type PackDeps = Pick<Deps, 'db' | 'carrier'>

export async function packView(deps: PackDeps, orderId: string, shipmentId?: string): Promise<PackView> {
  const data = await loadPackData(deps.db, orderId, shipmentId)
  return buildPackView(deps.db, data, { carrierReady: Boolean(deps.carrier) })
}

/** A scanned bin or serial → the work order it stands for, or a message that says what is wrong. */
async function resolveCode(db: Db | Tx, raw: string) {
  const code = raw.trim().toUpperCase()
  const bin = await findBinByCode(db, code)
  if (bin) {
    if (!bin.workOrderId)
      throw new Conflict(`Bin ${bin.code} holds no unit (it is on the rack); scan the bin that came from the build bench, or type the serial`)
    const wo = await findWorkOrder(db, bin.workOrderId)
    if (!wo) throw new NotFound(`Bin ${bin.code} names a unit that does not exist`)
    return { wo, via: `bin ${bin.code}` }
  }
  const wo = await findWorkOrderBySerial(db, code)
  if (!wo) throw new NotFound(`No bin or serial "${code}": check the label and scan again`)
  return { wo, via: `serial ${wo.serial}` }
}

/** A scan with no order open: the order of the scanned bin or serial, to pack. */
export async function lookupForPacking(deps: PackDeps, code: string): Promise<PackView> {
  const { wo } = await resolveCode(deps.db, code)
  if (wo.status === 'shipped') throw new Conflict(`Unit ${wo.serial} has already shipped`)
  if (wo.status === 'cancelled') throw new Conflict(`Unit ${wo.serial} was cancelled; do not pack it`)
  return packView(deps, wo.orderId)
}

/** The order's open shipment, opened by the first check; refused once its label is bought. */
async function openShipment(tx: Tx, data: PackData, actor: SessionUser): Promise<ShipmentRow> {
  const order = await lockOrderRow(tx, data.order.id)
  if (!order) throw new NotFound('No such order')
  if (order.status !== 'released' && order.status !== 'partially_shipped')
    throw new Conflict(`Order ${order.number} is ${statusInSentence(ORDER_STATUS_LABELS, order.status)}; only released orders are packed`)
  const open = await openShipmentOf(tx, order.id)
  if (open) {
    const locked = (await lockShipment(tx, open.id))!
    if (locked.status === 'buying')
      throw new Conflict(`The label for order ${order.number} is being bought; the box is closed. Wait for it, or void the label to open the box again`)
    if (locked.status !== 'packing')
      throw new Conflict(
        `The label for order ${order.number} is bought; the box is closed. Ship it as labelled, or void the label (with the reason) to open the box again`,
      )
    return locked
  }
  const [created] = await tx.insert(shipments).values({ orderId: order.id, createdBy: actor.id }).returning()
  return created!
}

async function confirm(
  tx: Tx,
  shipment: ShipmentRow,
  item: { key: string; workOrderId: string },
  method: 'scan' | 'tick',
  code: string | null,
  actor: SessionUser,
) {
  await tx
    .insert(packChecks)
    .values({ shipmentId: shipment.id, workOrderId: item.workOrderId, itemKey: item.key, method, code, checkedBy: actor.id })
    .onConflictDoNothing()
}

/**
 * A scan at the open order: a bin or serial of this order confirms its unit (or pack). A bin or unit
 * of another order, a unit that has not passed its leak test, or an unknown code is refused with
 * what is wrong; nothing is recorded.
 */
export async function scanItem(deps: PackDeps, orderId: string, code: string, actor: SessionUser): Promise<PackView> {
  await deps.db.transaction(async (tx) => {
    const data = await loadPackData(tx, orderId)
    const { wo, via } = await resolveCode(tx, code)
    if (wo.orderId !== orderId) {
      // Only for the other order's number in the answer; if it cannot be read the answer says "another order" and still refuses.
      const other = await findOrder(tx, wo.orderId)
      throw new Conflict(
        `Wrong box: ${via} holds unit ${wo.serial} of order ${other?.number ?? 'another order'}, not of order ${data.order.number}. Set it aside and scan this order's bins`,
      )
    }
    if (wo.status === 'shipped') throw new Conflict(`Unit ${wo.serial} has already shipped`)
    const item = data.items.find((i) => i.key === unitKey(wo.serial) || i.key === packKey(wo.serial))
    if (!item) throw new Conflict(`Unit ${wo.serial} is not on order ${data.order.number}'s packing list`)
    if (item.problem) throw new Conflict(item.problem)
    const shipment = await openShipment(tx, data, actor)
    await confirm(tx, shipment, { key: item.key, workOrderId: item.workOrderId }, 'scan', code.trim().toUpperCase(), actor)
  })
  return packView(deps, orderId)
}

/** One tap confirms a bag or a pack; units need a scan. */
export async function tickItem(deps: PackDeps, orderId: string, itemKey: string, actor: SessionUser): Promise<PackView> {
  await deps.db.transaction(async (tx) => {
    const data = await loadPackData(tx, orderId)
    const item = data.items.find((i) => i.key === itemKey)
    if (!item) throw new NotFound(`No item "${itemKey}" on order ${data.order.number}'s packing list`)
    if (!item.tickable) throw new BadRequest(`Scan unit ${item.serial}'s bin or serial to confirm it; a unit cannot be ticked by hand`)
    if (item.problem) throw new Conflict(item.problem)
    // A bag the scale refused stays out of the box until it is put right and weighed again.
    const weighed = await latestWeighingOf(tx, item.workOrderId, item.key)
    if (weighed && !weighed.accepted)
      throw new Conflict(
        `${item.kind === 'pack' ? 'Pack' : 'Bag'} ${item.serial}: ${weighed.words}. Put right what is named and weigh it again before it goes in the box`,
      )
    const shipment = await openShipment(tx, data, actor)
    await confirm(tx, shipment, item, 'tick', null, actor)
  })
  return packView(deps, orderId)
}

/** Takes back a confirmation (the item came out of the box again); kept on record as undone. */
export async function undoItem(deps: PackDeps, orderId: string, itemKey: string, actor: SessionUser): Promise<PackView> {
  await deps.db.transaction(async (tx) => {
    const data = await loadPackData(tx, orderId)
    if (!data.shipment) throw new Conflict('Nothing is confirmed yet; there is nothing to undo')
    const shipment = await openShipment(tx, data, actor)
    const [row] = await tx
      .update(packChecks)
      .set({ undoneAt: new Date(), undoneBy: actor.id })
      .where(and(eq(packChecks.shipmentId, shipment.id), eq(packChecks.itemKey, itemKey), isNull(packChecks.undoneAt)))
      .returning({ id: packChecks.id })
    if (!row) throw new Conflict('That item is not confirmed; there is nothing to undo')
  })
  return packView(deps, orderId)
}

/**
 * A planner lets what is confirmed go now and back-orders the rest: the rest's work orders stay as
 * they are for a later shipment. Needs at least one unit fully confirmed.
 */
export async function approvePartial(deps: PackDeps, orderId: string, input: ApprovePartial, actor: SessionUser, audit: AuditContext): Promise<PackView> {
  await deps.db.transaction(async (tx) => {
    const data = await loadPackData(tx, orderId)
    if (!data.shipment) throw new Conflict(`Nothing of order ${data.order.number} is confirmed yet; scan what goes now first`)
    const shipment = await openShipment(tx, data, actor)
    const byUnit = new Map<string, boolean>()
    for (const i of data.items) byUnit.set(i.workOrderId, (byUnit.get(i.workOrderId) ?? true) && i.check !== null && i.problem === null)
    const ready = [...byUnit.values()].filter(Boolean).length
    if (ready === 0) throw new Conflict('No unit is fully confirmed (with its bags); confirm what goes now, then approve')
    if (ready === byUnit.size) throw new Conflict('Everything is confirmed: ship it all, no partial shipment is needed')
    await tx.update(shipments).set({ partialApprovedAt: new Date(), partialApprovedBy: actor.id, partialNote: input.note }).where(eq(shipments.id, shipment.id))
    const waiting = data.items.filter((i) => byUnit.get(i.workOrderId) === false).map((i) => i.serial)
    const summary = `Partial shipment of order ${data.order.number} approved: ${[...new Set(waiting)].join(', ')} back-ordered (${input.note})`
    await addOrderEvent(tx, { orderId, kind: 'partial_shipment_approved', message: summary, actor })
    await recordAudit(tx, audit, { action: 'shipment.approve_partial', entityType: 'order', entityId: orderId, summary })
  })
  return packView(deps, orderId)
}

/** Checks the parcels cover exactly the units going now, and weighs them into the carrier's request. */
export async function weighRequest(deps: PackDeps, orderId: string, input: QuoteRequest) {
  const data = await loadPackData(deps.db, orderId)
  const view = await buildPackView(deps.db, data, { carrierReady: Boolean(deps.carrier) })
  if (!view.canLabel) throw new Conflict(`Not ready for a label: ${view.blockers.join('; ')}`)
  const going = new Set(data.items.filter((i) => view.shippingSerials.includes(i.serial)).map((i) => i.workOrderId))
  const seen = new Set<string>()
  const fields: Record<string, string> = {}
  input.parcels.forEach((p, i) => {
    for (const id of p.workOrderIds) {
      if (!going.has(id)) fields[`parcels.${i}.workOrderIds`] = 'A unit that is not going in this shipment'
      else if (seen.has(id)) fields[`parcels.${i}.workOrderIds`] = 'A unit already in another parcel'
      seen.add(id)
    }
    if (!data.boxes.some((b) => b.id === p.boxId)) fields[`parcels.${i}.boxId`] = 'No such box'
  })
  const missing = [...going].filter((id) => !seen.has(id)).map((id) => data.weights.get(id)?.serial)
  if (missing.length > 0) fields.parcels = `Put ${missing.join(', ')} in a parcel`
  const first = Object.values(fields)[0]
  if (first) throw new BadRequest(`Check the parcels: ${first}`, fields)
  const boxById = new Map(data.boxes.map((b) => [b.id, b]))
  const weighed = input.parcels.map((p, i) => weighParcel({ position: i + 1, ...p }, boxById.get(p.boxId)!, data.weights, divisorOf(data.settings)))
  const s = data.settings
  const o = data.order
  const request: ShipmentRequest = {
    from: {
      name: s.senderName!,
      line1: s.senderLine1!,
      line2: s.senderLine2,
      city: s.senderCity!,
      region: s.senderRegion,
      postalCode: s.senderPostalCode!,
      country: s.senderCountry!,
    },
    to: {
      name: o.shipName,
      line1: o.shipLine1,
      line2: o.shipLine2,
      city: o.shipCity,
      region: o.shipRegion,
      postalCode: o.shipPostalCode,
      country: o.shipCountry,
    },
    parcels: weighed.map((p) => ({
      weightGrams: p.billableGrams,
      lengthMm: p.length / LENGTH_BASE_PER_MM,
      widthMm: p.width / LENGTH_BASE_PER_MM,
      heightMm: p.height / LENGTH_BASE_PER_MM,
    })),
    reference: o.number,
  }
  return { data, weighed, request }
}

function carrierOf(deps: PackDeps) {
  if (!deps.carrier) throw new Unavailable('No carrier is set up (CARRIER_API_KEY): labels cannot be bought')
  return deps.carrier
}

/** Asks the carrier whether it can deliver to the order's ship-to address; refuses with what to fix when not. */
export async function checkShipTo(carrier: Carrier, request: ShipmentRequest, orderNumber: string) {
  const check = await carrier.checkAddress(request.to)
  if (!check.ok)
    throw new Conflict(
      `The carrier cannot deliver to order ${orderNumber}'s ship-to address: ${check.message}. Correct the address on the order (a planner), then quote again`,
    )
}

/** The carrier's services and prices for these parcels, of the shop's carrier only. */
export async function quoteShipment(deps: PackDeps, orderId: string, input: QuoteRequest): Promise<Quote[]> {
  const carrier = carrierOf(deps)
  const { data, request } = await weighRequest(deps, orderId, input)
  const carrierName = data.settings.carrierName
  if (!carrierName) throw new Conflict('The shop has no carrier set: an owner sets it in shop settings (the carrier name as the shipping service names it)')
  await checkShipTo(carrier, request, data.order.number)
  const quotes = (await carrier.quote(request)).filter((q) => q.carrier.toLowerCase() === carrierName.toLowerCase())
  if (quotes.length === 0)
    throw new Conflict(`The carrier account offers no service of ${carrierName} for these parcels; check the carrier name in shop settings`)
  return quotes.map((q) => ({ service: q.service, name: q.name, days: q.days, chargeCents: q.chargeCents }))
}
