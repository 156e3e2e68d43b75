import { asc, eq, inArray } from 'drizzle-orm'
import { chooseCustomsForm, declareContents, type CustomsDeclaration, type DeclaredContent, type DeclaredUnit } from '@kitwright/shared/domain/customs'
import type { CustomsSummary } from '@kitwright/shared/customs'
import type { Db, Tx } from '../../db/client'
import { bomLines, cutParts, orderLines, parts } from '../../db/schema/index'
import { Conflict, NotFound } from '../../lib/http-errors'
import { customsDeclarationPdf } from '../labels/customs-declaration.pdf'
import { loadPackData, shippingSplit, type PackData } from './pack-view'
import { findShipment, parcelsOf } from './pack.queries'

type Conn = Db | Tx
const NONE = ['00000000-0000-0000-0000-000000000000']

const customsFacts = {
  partId: parts.id,
  sku: parts.sku,
  name: parts.name,
  kind: parts.kind,
  customsDescription: parts.customsDescription,
  hsCode: parts.hsCode,
  originCountry: parts.originCountry,
  unitCostCents: parts.unitCostCents,
  weightGrams: parts.weightGrams,
  stickLengths: parts.stickLengths,
}

/**
 * What one unit of each revision holds, for customs: its BOM parts (packaging left out: cartons and
 * bags are not goods sold) and its cut pipe, pro rata of the stick (weight and cost are per stick of
 * the first stick length, as the shipping weights count them).
 */
export async function revisionContents(db: Conn, revisionIds: readonly string[]): Promise<Map<string, DeclaredContent[]>> {
  const ids = revisionIds.length ? [...revisionIds] : NONE
  const bom = await db
    .select({ revisionId: bomLines.revisionId, quantity: bomLines.quantity, ...customsFacts })
    .from(bomLines)
    .innerJoin(parts, eq(parts.id, bomLines.partId))
    .where(inArray(bomLines.revisionId, ids))
    .orderBy(asc(bomLines.revisionId), asc(bomLines.position))
  const pieces = await db
    .select({ revisionId: cutParts.revisionId, length: cutParts.length, quantity: cutParts.quantity, ...customsFacts })
    .from(cutParts)
    .innerJoin(parts, eq(parts.id, cutParts.partId))
    .where(inArray(cutParts.revisionId, ids))
    .orderBy(asc(cutParts.revisionId), asc(cutParts.position))
  const out = new Map<string, DeclaredContent[]>(revisionIds.map((id) => [id, []]))
  const facts = (p: (typeof bom)[number] | (typeof pieces)[number]) => ({
    sku: p.sku,
    name: p.name,
    customsDescription: p.customsDescription,
    hsCode: p.hsCode,
    originCountry: p.originCountry,
  })
  for (const b of bom) {
    if (b.kind === 'packaging') continue
    out.get(b.revisionId)?.push({ part: facts(b), quantity: b.quantity, netGrams: b.quantity * b.weightGrams, costCents: b.quantity * b.unitCostCents })
  }
  for (const p of pieces) {
    const stick = p.stickLengths[0]
    const share = stick ? (p.length * p.quantity) / stick : 0
    out.get(p.revisionId)?.push({ part: facts(p), quantity: p.quantity, netGrams: share * p.weightGrams, costCents: share * p.unitCostCents })
  }
  return out
}

/** Whether the shipment leaves the country it is shipped from (the shop's ship-from country against the order's). */
export function crossesBorder(data: Pick<PackData, 'order' | 'settings'>): boolean {
  const from = data.settings.senderCountry?.trim().toUpperCase()
  const to = data.order.shipCountry.trim().toUpperCase()
  return Boolean(from) && from !== to
}

/** The units as customs sees them: what the customer paid for each (its order line's unit price) and what it holds. */
async function declaredUnits(db: Conn, data: PackData, workOrderIds: readonly string[]): Promise<Map<string, DeclaredUnit>> {
  const units = data.units.filter((u) => workOrderIds.includes(u.workOrder.id))
  const contents = await revisionContents(db, [...new Set(units.map((u) => u.revision.id))])
  const lineIds = [...new Set(units.map((u) => u.workOrder.orderLineId))]
  const prices = new Map(
    (
      await db
        .select({ id: orderLines.id, unitPriceCents: orderLines.unitPriceCents })
        .from(orderLines)
        .where(inArray(orderLines.id, lineIds.length ? lineIds : NONE))
    ).map((l) => [l.id, l.unitPriceCents]),
  )
  return new Map(
    units.map((u) => [
      u.workOrder.id,
      { serial: u.workOrder.serial, priceCents: prices.get(u.workOrder.orderLineId) ?? 0, contents: contents.get(u.revision.id) ?? [] },
    ]),
  )
}

function missingText(d: CustomsDeclaration) {
  return d.missing.map((m) => `${m.sku} (${m.name}) has no ${m.fields.join(' and no ')}`).join('; ')
}

/**
 * What stops the label of a shipment abroad: parts without the HS code or country of origin the
 * customs declaration needs. Empty for a domestic shipment.
 */
export async function customsProblems(db: Conn, data: PackData): Promise<string[]> {
  if (!crossesBorder(data)) return []
  const going = shippingSplit(data).shipping
  const declaration = declareContents([...(await declaredUnits(db, data, going)).values()])
  if (declaration.missing.length === 0) return []
  return [`This shipment goes abroad and needs a customs declaration: ${missingText(declaration)}. A planner sets them on the part (Catalog → Parts)`]
}

/** One declaration per parcel: each postal item carries its own, with its own contents, value and form. */
async function parcelDeclarations(db: Db, shipmentId: string) {
  const shipment = await findShipment(db, shipmentId)
  if (!shipment) throw new NotFound('No such shipment')
  const data = await loadPackData(db, shipment.orderId, shipment.id)
  const recorded = shipment.status === 'packing' || shipment.status === 'buying' ? [] : await parcelsOf(db, shipment.id)
  const units = await declaredUnits(
    db,
    data,
    recorded.flatMap((p) => p.workOrderIds),
  )
  const parcels = recorded.map((p) => {
    const declaration = declareContents(p.workOrderIds.map((id) => units.get(id)).filter((u) => u !== undefined))
    return { parcel: p, declaration, ...chooseCustomsForm(declaration.totalValueCents, data.order.currency) }
  })
  return { shipment, data, parcels }
}

/** Whether a shipment needs a customs declaration and, once its parcels are recorded, which form each parcel gets. */
export async function customsSummary(db: Db, shipmentId: string): Promise<CustomsSummary> {
  const { shipment, data, parcels } = await parcelDeclarations(db, shipmentId)
  const required = crossesBorder(data)
  return {
    required,
    shipFromCountry: data.settings.senderCountry ?? null,
    shipToCountry: data.order.shipCountry,
    currency: data.order.currency,
    ready: required && parcels.length > 0 && parcels.every((p) => p.declaration.missing.length === 0),
    problems: required
      ? parcels.length > 0
        ? parcels.filter((p) => p.declaration.missing.length > 0).map((p) => `Parcel ${p.parcel.position}: ${missingText(p.declaration)}`)
        : shipment.status === 'packing' || shipment.status === 'buying'
          ? await customsProblems(db, data)
          : []
      : [],
    parcels: required
      ? parcels.map((p) => ({ position: p.parcel.position, form: p.form, valueCents: p.declaration.totalValueCents, netGrams: p.declaration.totalNetGrams }))
      : [],
  }
}

/**
 * The customs declaration of a labelled shipment abroad, one 4 × 6 in declaration per parcel (CN 22
 * or CN 23 by that parcel's value), printed with the label on the same printer.
 */
export async function customsDeclaration(db: Db, shipmentId: string): Promise<Buffer> {
  const { shipment, data, parcels } = await parcelDeclarations(db, shipmentId)
  if (!crossesBorder(data)) throw new Conflict(`Order ${data.order.number} ships within ${data.order.shipCountry}: no customs declaration is needed`)
  if (parcels.length === 0) throw new Conflict('The customs declaration is printed with the label: buy the label first')
  const missing = parcels.flatMap((p) => p.declaration.missing)
  if (missing.length > 0)
    throw new Conflict(
      `The customs declaration cannot be printed: ${parcels
        .map((p) => missingText(p.declaration))
        .filter(Boolean)
        .join('; ')}. A planner sets them on the part (Catalog → Parts)`,
    )
  const s = data.settings
  const o = data.order
  // The country is printed by name under each address.
  const sender = [s.senderName, s.senderLine1, s.senderLine2, [s.senderCity, s.senderRegion, s.senderPostalCode].filter(Boolean).join(' ')].filter(
    (l): l is string => Boolean(l),
  )
  const addressee = [o.shipName, o.shipLine1, o.shipLine2, [o.shipCity, o.shipRegion, o.shipPostalCode].filter(Boolean).join(' ')].filter((l): l is string =>
    Boolean(l),
  )
  return customsDeclarationPdf({
    sender,
    senderCountry: s.senderCountry ?? '',
    addressee,
    addresseeCountry: o.shipCountry,
    orderNumber: o.number,
    currency: o.currency,
    carrier: shipment.carrier ?? '',
    date: new Date().toISOString().slice(0, 10),
    parcels: parcels.map((p) => ({
      position: p.parcel.position,
      of: parcels.length,
      trackingNumber: p.parcel.trackingNumber ?? shipment.trackingNumber ?? '',
      form: p.form,
      grossGrams: p.parcel.actualGrams,
      declaration: p.declaration,
    })),
  })
}
