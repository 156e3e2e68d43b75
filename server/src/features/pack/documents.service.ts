import { formatDateOf } from '@kitwright/shared/dates'
import { RevisionFrameSchema } from '@kitwright/shared/kits'
import { depthForVolume } from '@kitwright/shared/domain/reservoir'
import { formatWeight } from '@kitwright/shared/domain/weights'
import type { Db } from '../../db/client'
import type { OrderRow, ShopSettingsRow } from '../../db/schema/index'
import { Conflict, NotFound } from '../../lib/http-errors'
import { shipFromOf } from '../settings/settings.service'
import { needsElectricalCautions } from '../labels/care-sheet'
import { packingSlipPdf, type PackingSlip, type SlipLine } from '../labels/packing-slip.pdf'
import { shippingLabelPdf } from '../labels/shipping-label.pdf'
import { loadPackData, shippingSplit } from './pack-view'
import { bomOfRevisions, findShipment, parcelsOf } from './pack.queries'

function addressLines(a: { name: string; line1: string; line2: string | null; city: string; region: string | null; postalCode: string; country: string }) {
  return [a.name, a.line1, ...(a.line2 ? [a.line2] : []), `${a.city}${a.region ? `, ${a.region}` : ''} ${a.postalCode}`, a.country]
}

function shipToLines(o: OrderRow) {
  return addressLines({
    name: o.shipName,
    line1: o.shipLine1,
    line2: o.shipLine2,
    city: o.shipCity,
    region: o.shipRegion,
    postalCode: o.shipPostalCode,
    country: o.shipCountry,
  })
}

/** The shop's ship-from address (also where returns go), as set on the settings page. */
function senderLines(s: ShopSettingsRow) {
  const a = shipFromOf(s)
  return a ? addressLines({ ...a, line2: a.line2 ?? null, region: a.region ?? null }) : []
}

async function shipmentData(db: Db, shipmentId: string) {
  const shipment = await findShipment(db, shipmentId)
  if (!shipment) throw new NotFound('No such shipment')
  return loadPackData(db, shipment.orderId, shipment.id)
}

/**
 * The packing slip of a shipment: the units going (with an approved partial shipment, those
 * confirmed; after shipping, those in its parcels), their bags, and each revision's fill line from
 * the reservoir calculator (the tote's shape and the revision's water volume).
 */
export async function packingSlip(db: Db, shipmentId: string, paper: 'letter' | 'a4'): Promise<Buffer> {
  const data = await shipmentData(db, shipmentId)
  const shipment = data.shipment!
  const recorded = shipment.status === 'packing' ? [] : await parcelsOf(db, shipment.id)
  const going = new Set(recorded.length ? recorded.flatMap((p) => p.workOrderIds) : shippingSplit(data).shipping)
  const units = data.units.filter((u) => going.has(u.workOrder.id))
  const lineOf = new Map<string, SlipLine>()
  for (const u of units) {
    const bags = data.items.filter((i) => i.workOrderId === u.workOrder.id && i.kind === 'bag')
    const built = data.items.some((i) => i.workOrderId === u.workOrder.id && i.kind === 'unit') || u.revision.frameInputs !== null
    lineOf.set(u.workOrder.id, {
      title: `${u.kitName} (${u.kitSku}), serial ${u.workOrder.serial}`,
      detail: built
        ? `Revision ${u.revision.code}, assembled and leak-tested${bags.length ? `; with ${bags.map((b) => b.description.split(' of loose')[0]!.toLowerCase()).join(', ')} of loose parts` : ''}`
        : `Spare-parts pack, revision ${u.revision.code}`,
    })
  }
  const lines = [...lineOf.values()]
  // Each parcel its own section: its tracking number and the units the packer put in it (bags travel with their unit).
  const parcels: PackingSlip['parcels'] = recorded.map((p) => ({
    position: p.position,
    of: recorded.length,
    trackingNumber: p.trackingNumber ?? shipment.trackingNumber,
    boxName: p.boxName,
    lines: p.workOrderIds.map((id) => lineOf.get(id)).filter((l) => l !== undefined),
  }))
  const fillLines: PackingSlip['fillLines'] = []
  for (const rev of new Map(units.map((u) => [u.revision.id, u])).values()) {
    const frame = RevisionFrameSchema.safeParse(rev.revision.frameInputs)
    const ml = rev.revision.leakTestWaterVolumeMl
    if (!frame.success || !frame.data.tote || ml === null) continue
    const depth = depthForVolume(frame.data.tote, ml / 1000, 'L')
    if (depth.ok) fillLines.push({ kit: `${rev.kitName} (${rev.kitSku} rev ${rev.revision.code})`, depth: depth.depth, litres: ml / 1000 })
  }
  // Electrical cautions only when something in this box runs on mains power.
  const bom = await bomOfRevisions(db, [...new Set(units.map((u) => u.revision.id))])
  const electricalParts = needsElectricalCautions(bom) ? [...new Set(bom.filter((b) => b.electrical).map((b) => b.name))] : []
  const placed = formatDateOf(data.order.placedAt, 'UTC')
  const backOrdered = data.units.filter((u) => !going.has(u.workOrder.id) && u.workOrder.status !== 'shipped').map((u) => u.workOrder.serial)
  return packingSlipPdf(
    {
      shopName: data.settings.shopName,
      sender: senderLines(data.settings),
      contact: data.settings.replyToAddress ?? data.settings.mailFromAddress,
      orderNumber: data.order.number,
      placedAt: placed,
      customerName: data.order.customerName,
      shipTo: shipToLines(data.order),
      // With parcel sections each carries its own tracking number.
      trackingNumber: parcels.length > 0 ? null : shipment.trackingNumber,
      lines,
      parcels,
      backOrdered: shipment.partialApprovedAt || shipment.status !== 'packing' ? backOrdered : [],
      fillLines,
      electricalParts,
    },
    paper,
  )
}

/** The 4 × 6 in label of a labelled (or shipped) shipment, one page per parcel. */
export async function shippingLabel(db: Db, shipmentId: string): Promise<Buffer> {
  const data = await shipmentData(db, shipmentId)
  const shipment = data.shipment!
  if (shipment.status === 'packing' || !shipment.trackingNumber) throw new Conflict('No label is bought for this shipment yet')
  const recorded = await parcelsOf(db, shipment.id)
  const serialOf = new Map(data.units.map((u) => [u.workOrder.id, u.workOrder.serial]))
  const routing = (shipment.labelData as { routingCode?: unknown } | null)?.routingCode
  return shippingLabelPdf({
    from: senderLines(data.settings),
    to: shipToLines(data.order),
    carrier: shipment.carrier ?? '',
    service: shipment.service ?? '',
    trackingNumber: shipment.trackingNumber,
    routingCode: typeof routing === 'string' ? routing : '',
    orderNumber: data.order.number,
    companyPrefixLength: data.settings.gs1CompanyPrefix?.length ?? 7,
    parcels: recorded.map((p) => ({
      sscc: p.sscc,
      weight: formatWeight(p.billableGrams, data.settings.displayUnit),
      contents: p.workOrderIds.map((id) => serialOf.get(id) ?? '?').join(', '),
      trackingNumber: p.trackingNumber,
    })),
  })
}
