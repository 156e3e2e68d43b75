import { z } from 'zod'
import type { DimDivisor } from '@kitwright/shared/domain/weights'
import type { PackItem, PackView, Parcel } from '@kitwright/shared/pack'
import type { Db, Tx } from '../../db/client'
import type { BoxRow, OrderRow, ShipmentRow, ShopSettingsRow } from '../../db/schema/index'
import { NotFound } from '../../lib/http-errors'
import { customsProblems } from './customs.service'
import { proposeParcels, unitGrams, weighParcel, type UnitWeight } from './parcel-weights'
import {
  activeBoxes,
  bomOfRevisions,
  cutPartsOfRevisions,
  findOrder,
  findShipment,
  latestLeakTests,
  openShipmentOf,
  parcelsOf,
  shippingSettings,
  standingChecks,
  unitsOfOrder,
  userName,
  shippedShipmentsOf,
  voidedLabelsOf,
} from './pack.queries'
import { ORDER_STATUS_LABELS, WORK_ORDER_STATUS_LABELS, statusInSentence } from '@kitwright/shared/status-words'

type Conn = Db | Tx
type UnitRow = Awaited<ReturnType<typeof unitsOfOrder>>[number]

/** Everything the pack bench knows of one order, read in one go. */
export interface PackData {
  order: OrderRow
  units: UnitRow[]
  shipment: ShipmentRow | null
  items: PackItem[]
  weights: Map<string, UnitWeight>
  boxes: BoxRow[]
  settings: ShopSettingsRow
  partialApprovedByName: string | null
}

/** The item keys of a unit: the unit itself (or the pack, when it has no build) and its hardware bags. */
export const unitKey = (serial: string) => `unit:${serial}`
export const packKey = (serial: string) => `pack:${serial}`
export const bagKey = (serial: string, sku: string) => `bag:${serial}:${sku}`

/** Why a unit may not be packed yet, in the bench's words, or null when it may. */
function unitProblem(u: UnitRow, latest: { passed: boolean } | undefined, built: boolean): string | null {
  const wo = u.workOrder
  if (!built) return null
  const hasProtocol = u.revision.leakTestWaterVolumeMl !== null && u.revision.leakTestMinPressurePa !== null
  if (wo.status === 'built' && (!hasProtocol || latest?.passed)) return null
  if (wo.status === 'rework' || (latest && !latest.passed))
    return `Unit ${wo.serial} has not passed its leak test (the last test failed): it goes back to the build bench for rework`
  if (wo.status === 'built') return `Unit ${wo.serial} has not passed its leak test (none is recorded): it goes back to the build bench`
  if (wo.status === 'waiting_cut' || wo.status === 'cut')
    return `Unit ${wo.serial} is not built yet (${wo.status === 'cut' ? 'cut, waiting for the build bench' : 'waiting for cutting'}) and has not passed its leak test`
  if (wo.status === 'building') return `Unit ${wo.serial} is still at the build bench and has not passed its leak test`
  return `Unit ${wo.serial} is ${statusInSentence(WORK_ORDER_STATUS_LABELS, wo.status)}`
}

/** The order's pack data with its open shipment, or with `shipmentId` that shipment (shipped or not). */
export async function loadPackData(db: Conn, orderId: string, shipmentId?: string): Promise<PackData> {
  const order = await findOrder(db, orderId)
  if (!order) throw new NotFound('No such order')
  const settings = await shippingSettings(db)
  if (!settings) throw new NotFound('The shop has no settings yet; run the set-up (npm start) to create them')
  const units = await unitsOfOrder(db, orderId)
  const revisionIds = [...new Set(units.map((u) => u.revision.id))]
  // One after the other: inside a transaction they share one connection.
  const bom = await bomOfRevisions(db, revisionIds)
  const pieces = await cutPartsOfRevisions(db, revisionIds)
  const boxes = await activeBoxes(db)
  const shipment = shipmentId ? await findShipment(db, shipmentId) : await openShipmentOf(db, orderId)
  const latest = await latestLeakTests(
    db,
    units.map((u) => u.workOrder.id),
  )
  const checks = shipment ? await standingChecks(db, shipment.id) : []
  const checkOf = new Map(checks.map((c) => [c.check.itemKey, c]))
  const boxOfPart = new Map(boxes.filter((b) => b.partId).map((b) => [b.partId!, b.id]))
  const boxPartIds = new Set(boxOfPart.keys())
  const items: PackItem[] = []
  const weights = new Map<string, UnitWeight>()
  for (const u of units) {
    const wo = u.workOrder
    const revBom = bom.filter((b) => b.revisionId === u.revision.id)
    const revPieces = pieces.filter((p) => p.revisionId === u.revision.id)
    const built = revPieces.length > 0
    weights.set(wo.id, {
      workOrderId: wo.id,
      serial: wo.serial,
      grams: unitGrams(revBom, revPieces, boxPartIds),
      boxId: revBom.map((b) => boxOfPart.get(b.partId)).find((id) => id !== undefined) ?? null,
    })
    if (wo.status === 'shipped') continue
    const base = {
      workOrderId: wo.id,
      serial: wo.serial,
      workOrderStatus: wo.status,
      kit: { sku: u.kitSku, name: u.kitName },
      revisionCode: u.revision.code,
      binCode: u.binCode,
    }
    const check = (key: string) => {
      const c = checkOf.get(key)
      return c ? { method: c.check.method, code: c.check.code, by: { id: c.check.checkedBy, name: c.byName }, at: c.check.checkedAt.toISOString() } : null
    }
    const problem = unitProblem(u, latest.get(wo.id), built)
    if (built) {
      items.push({
        ...base,
        key: unitKey(wo.serial),
        kind: 'unit',
        description: `${u.kitName} (${u.kitSku} rev ${u.revision.code}), unit ${wo.serial}`,
        problem,
        tickable: false,
        check: check(unitKey(wo.serial)),
      })
      // The kit's loose parts travel in bags beside the unit: each bag-like packaging line (counted "each", not a box).
      for (const b of revBom.filter((x) => x.kind === 'packaging' && x.unitOfMeasure === 'each' && !boxPartIds.has(x.partId))) {
        const key = bagKey(wo.serial, b.sku)
        items.push({
          ...base,
          key,
          kind: 'bag',
          description: `${b.name} of loose parts for ${wo.serial} (net cups, collars and fittings as listed)`,
          problem: null,
          tickable: true,
          check: check(key),
        })
      }
    } else {
      const contents = revBom
        .filter((b) => b.kind !== 'packaging')
        .map((b) => `${b.quantity} × ${b.name}`)
        .join(', ')
      items.push({
        ...base,
        key: packKey(wo.serial),
        kind: 'pack',
        description: `${u.kitName} (${u.kitSku}), pack ${wo.serial}: ${contents}`,
        problem: wo.status === 'built' ? null : `Pack ${wo.serial} is ${statusInSentence(WORK_ORDER_STATUS_LABELS, wo.status)}`,
        tickable: true,
        check: check(packKey(wo.serial)),
      })
    }
  }
  const partialApprovedByName = await userName(db, shipment?.partialApprovedBy ?? null)
  return { order, units, shipment: shipment ?? null, items, weights, boxes, settings, partialApprovedByName }
}

export function divisorOf(settings: ShopSettingsRow): DimDivisor {
  return { value: settings.dimWeightDivisor, system: settings.dimWeightSystem }
}

/** What is missing from the shop's settings for a label, in words. */
export function labelSettingsProblems(settings: ShopSettingsRow): string[] {
  const problems: string[] = []
  if (!settings.senderName || !settings.senderLine1 || !settings.senderCity || !settings.senderPostalCode || !settings.senderCountry) {
    problems.push('The ship-from address is not set: the owner sets it in the shop settings')
  }
  if (!settings.gs1CompanyPrefix) problems.push('The GS1 company prefix for parcel SSCCs is not set: the owner sets it in the shop settings')
  if (!settings.carrierName)
    problems.push("The shop's carrier is not set: the owner sets it in the shop settings (the carrier name as the shipping service names it)")
  return problems
}

/** Which units go now and which wait: all of them, or with an approved partial shipment the fully confirmed ones. */
export function shippingSplit(data: Pick<PackData, 'items' | 'shipment'>) {
  const byUnit = new Map<string, PackItem[]>()
  for (const item of data.items) byUnit.set(item.workOrderId, [...(byUnit.get(item.workOrderId) ?? []), item])
  const complete = (items: PackItem[]) => items.every((i) => i.check !== null && i.problem === null)
  const partial = data.shipment?.partialApprovedAt != null
  const shipping: string[] = []
  const backOrdered: string[] = []
  for (const [id, items] of byUnit) (partial && !complete(items) ? backOrdered : shipping).push(id)
  return { shipping, backOrdered, byUnit }
}

const BuyingParcelsSchema = z.object({
  weighed: z.array(
    z.object({
      position: z.number().int(),
      boxId: z.string().uuid(),
      boxName: z.string(),
      length: z.number().int(),
      width: z.number().int(),
      height: z.number().int(),
      workOrderIds: z.array(z.string().uuid()),
      estimatedGrams: z.number().int(),
      scaleGrams: z.number().int().nullable(),
      actualGrams: z.number().int(),
      dimensionalGrams: z.number().int(),
      billableGrams: z.number().int(),
    }),
  ),
})

/** The parcels of a purchase under way, as recorded before the carrier was called. */
function buyingParcels(labelRequest: unknown) {
  const parsed = BuyingParcelsSchema.safeParse(labelRequest)
  return parsed.success ? parsed.data.weighed : null
}

function voidedLabels(db: Conn, shipmentId: string) {
  return voidedLabelsOf(db, shipmentId).then((rows) =>
    rows.map((l) => ({
      trackingNumbers: l.trackingNumbers,
      service: l.service,
      reason: l.voidReason ?? '',
      at: l.voidedAt?.toISOString() ?? '',
      refundStatus: l.refundStatus,
    })),
  )
}

/** Shipments of the order that have left: tracking, voided labels, and whether a label is left to void. */
async function shippedOf(db: Conn, orderId: string): Promise<PackView['shipped']> {
  const found = await shippedShipmentsOf(db, orderId)
  return Promise.all(
    found.map(async ({ row, hasLabel }) => ({
      id: row.id,
      carrier: row.carrier,
      service: row.service,
      trackingNumber: row.trackingNumber,
      shippedAt: row.shippedAt?.toISOString() ?? null,
      trackingStatus: row.trackingStatus,
      voidedLabels: await voidedLabels(db, row.id),
      canVoid: hasLabel,
    })),
  )
}

/** The pack bench's view: items, blockers, the parcels proposed (or recorded, once labelled). */
export async function buildPackView(db: Conn, data: PackData, options: { carrierReady: boolean }): Promise<PackView> {
  const { order, shipment, items, settings } = data
  const { shipping, backOrdered, byUnit } = shippingSplit(data)
  const serialOf = new Map(data.units.map((u) => [u.workOrder.id, u.workOrder.serial]))
  const blockers: string[] = []
  if (order.status !== 'released' && order.status !== 'partially_shipped')
    blockers.push(`Order ${order.number} is ${statusInSentence(ORDER_STATUS_LABELS, order.status)}; only released orders are packed`)
  if (order.heldAt) blockers.push(`Order ${order.number} is on hold (${order.holdReason ?? 'no reason given'}); a planner takes it off hold before it ships`)
  if (items.length === 0) blockers.push(`Order ${order.number} has nothing left to pack`)
  for (const id of shipping) {
    for (const item of byUnit.get(id) ?? []) {
      if (item.problem) blockers.push(item.problem)
      else if (!item.check) blockers.push(`Not confirmed yet: ${item.kind === 'unit' ? `unit ${item.serial} (scan its bin or serial)` : item.description}`)
    }
  }
  if (shipping.length === 0 && items.length > 0) blockers.push('Nothing is confirmed to ship yet: scan or tick the items going now')
  if (!shipment && items.length > 0) blockers.push('Scan the first item to start packing')
  if (!options.carrierReady) blockers.push('No carrier is set up (CARRIER_API_KEY): labels cannot be bought')
  blockers.push(...labelSettingsProblems(settings))
  // A shipment abroad needs every part's HS code and origin for its customs declaration.
  if (items.length > 0) blockers.push(...(await customsProblems(db, data)))
  if (data.boxes.length === 0) blockers.push('No shipping box is set up: add the boxes first')

  let parcels: Parcel[] = []
  const buying = shipment?.status === 'buying' ? buyingParcels(shipment.labelRequest) : null
  if (buying) {
    // A purchase under way: the parcels as the packer set them, without SSCCs or tracking numbers yet.
    parcels = buying.map((p) => ({ ...p, serials: p.workOrderIds.map((id) => serialOf.get(id) ?? '?'), sscc: null, trackingNumber: null }))
  } else if (shipment && shipment.status !== 'packing') {
    parcels = (await parcelsOf(db, shipment.id)).map((p) => ({
      position: p.position,
      boxId: p.boxId,
      boxName: p.boxName,
      length: p.length,
      width: p.width,
      height: p.height,
      workOrderIds: p.workOrderIds,
      serials: p.workOrderIds.map((id) => serialOf.get(id) ?? '?'),
      estimatedGrams: p.estimatedGrams,
      scaleGrams: p.scaleGrams,
      actualGrams: p.actualGrams,
      dimensionalGrams: p.dimensionalGrams,
      billableGrams: p.billableGrams,
      sscc: p.sscc,
      trackingNumber: p.trackingNumber,
    }))
  } else {
    const boxById = new Map(data.boxes.map((b) => [b.id, b]))
    parcels = proposeParcels(
      shipping.map((id) => data.weights.get(id)!),
      data.boxes,
    ).map((p, i) => ({
      ...weighParcel(
        { position: i + 1, workOrderIds: p.workOrderIds, boxId: p.boxId, scaleGrams: null },
        boxById.get(p.boxId)!,
        data.weights,
        divisorOf(settings),
      ),
      sscc: null,
      trackingNumber: null,
    }))
  }
  const status = shipment?.status ?? 'packing'
  return {
    order: {
      id: order.id,
      number: order.number,
      status: order.status,
      customerName: order.customerName,
      shipTo: {
        name: order.shipName,
        line1: order.shipLine1,
        line2: order.shipLine2,
        city: order.shipCity,
        region: order.shipRegion,
        postalCode: order.shipPostalCode,
        country: order.shipCountry,
      },
    },
    shipment: shipment
      ? {
          id: shipment.id,
          status: shipment.status,
          carrier: shipment.carrier,
          service: shipment.service,
          trackingNumber: shipment.trackingNumber,
          chargeCents: shipment.chargeCents,
          partialApproval:
            shipment.partialApprovedAt && shipment.partialApprovedBy
              ? {
                  by: { id: shipment.partialApprovedBy, name: data.partialApprovedByName ?? 'Unknown user' },
                  at: shipment.partialApprovedAt.toISOString(),
                  note: shipment.partialNote ?? '',
                }
              : null,
          shippedAt: shipment.shippedAt?.toISOString() ?? null,
          trackingStatus: shipment.trackingStatus,
          trackingUpdatedAt: shipment.trackingUpdatedAt?.toISOString() ?? null,
          voidedLabels: await voidedLabels(db, shipment.id),
          canVoid: shipment.status === 'labelled' || shipment.status === 'shipped',
        }
      : null,
    items,
    shippingSerials: shipping.map((id) => serialOf.get(id)!),
    backOrderedSerials: backOrdered.map((id) => serialOf.get(id)!),
    alreadyShipped: data.units.filter((u) => u.workOrder.status === 'shipped').map((u) => u.workOrder.serial),
    shipped: await shippedOf(db, order.id),
    blockers: status === 'packing' ? blockers : [],
    canLabel: status === 'packing' && blockers.length === 0,
    canShip: status === 'labelled',
    // A purchase under way keeps the box closed; the bench may tap Buy again to finish it.
    canFinishBuying: status === 'buying',
    parcels,
    boxes: data.boxes.map((b) => ({ id: b.id, code: b.code, name: b.name, length: b.length, width: b.width, height: b.height, weightGrams: b.weightGrams })),
  }
}
