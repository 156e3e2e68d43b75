import { eq, sql } from 'drizzle-orm'
import type { ScanResult } from '@kitwright/shared/scan'
import { formatLength } from '@kitwright/shared/domain/units'
import type { Db } from '../../db/client'
import { bins, kitRevisions, kits, offcuts, orders, parts, workOrders } from '../../db/schema/index'
import { NotFound } from '../../lib/http-errors'
import { getShopSettings } from '../settings/settings.service'

type WorkOrderStatus = typeof workOrders.$inferSelect.status

/** Where a unit goes next, by its status. */
function nextForUnit(status: WorkOrderStatus): ScanResult['next'] {
  switch (status) {
    case 'waiting_cut':
      return { place: 'cut', message: 'Waiting for its pipe at the cut bench' }
    case 'cut':
    case 'building':
      return { place: 'build', message: 'Take it to the build bench' }
    case 'rework':
      return { place: 'build', message: 'Failed its leak test: back to the build bench for rework' }
    case 'built':
      return { place: 'pack', message: 'Built and tested: take it to the pack bench' }
    case 'packed':
      return { place: 'pack', message: 'Packed: waiting to ship at the pack bench' }
    case 'shipped':
      return { place: 'done', message: 'Shipped to the customer' }
    case 'cancelled':
      return { place: 'office', message: 'Cancelled: give the bin and parts to the planner' }
  }
}

async function unitBySerial(db: Db, serial: string) {
  const [row] = await db
    .select({ wo: workOrders, kitName: kits.name, revCode: kitRevisions.code, binCode: bins.code })
    .from(workOrders)
    .innerJoin(kitRevisions, eq(kitRevisions.id, workOrders.kitRevisionId))
    .innerJoin(kits, eq(kits.id, kitRevisions.kitId))
    .leftJoin(bins, eq(bins.workOrderId, workOrders.id))
    .where(sql`upper(${workOrders.serial}) = upper(${serial})`)
  return row
}

/**
 * Resolves any Kitwright code — a bin, a unit's serial, an order number, an offcut label, a part's
 * SKU — to what it is and where it should go next. Codes are matched without regard to case,
 * because scanners and hands type both.
 */
export async function resolveScan(db: Db, code: string): Promise<ScanResult> {
  const base = { code, workOrderSerial: null, orderId: null, partId: null }
  const offcutMatch = /^OC-([0-9a-f]{8})$/i.exec(code)
  // Every kind of code is looked up at once: one round trip to the database whatever was scanned.
  const [[bin], unit, [order], [oc], [part], settings] = await Promise.all([
    db.select().from(bins).where(sql`upper(${bins.code}) = upper(${code})`),
    unitBySerial(db, code),
    db.select().from(orders).where(sql`upper(${orders.number}) = upper(${code})`),
    offcutMatch
      ? db
          .select({ oc: offcuts, sku: parts.sku, partId: parts.id })
          .from(offcuts)
          .innerJoin(parts, eq(parts.id, offcuts.partId))
          // Offcut labels read OC- and the first 8 hex digits of the offcut's id.
          .where(sql`${offcuts.id}::text like ${`${offcutMatch[1]!.toLowerCase()}%`}`)
      : Promise.resolve([]),
    db.select().from(parts).where(sql`upper(${parts.sku}) = upper(${code})`),
    offcutMatch ? getShopSettings(db) : Promise.resolve(null),
  ])

  if (bin) {
    if (!bin.workOrderId) return { ...base, kind: 'bin', code: bin.code, title: `Bin ${bin.code} is empty`, status: bin.status, next: { place: 'cut', message: 'Free: fill it at the cut bench' } }
    const [wo] = await db.select({ serial: workOrders.serial }).from(workOrders).where(eq(workOrders.id, bin.workOrderId))
    const held = wo ? await unitBySerial(db, wo.serial) : undefined
    if (!held) throw new NotFound(`Bin ${bin.code} points at a unit Kitwright cannot find; tell the planner`)
    return {
      ...base,
      kind: 'bin',
      code: bin.code,
      title: `Bin ${bin.code} holds unit ${held.wo.serial} (${held.kitName}, rev ${held.revCode})`,
      status: held.wo.status,
      next: nextForUnit(held.wo.status),
      workOrderSerial: held.wo.serial,
      orderId: held.wo.orderId,
    }
  }

  if (unit) {
    return {
      ...base,
      kind: 'work_order',
      code: unit.wo.serial,
      title: `Unit ${unit.wo.serial}: ${unit.kitName}, rev ${unit.revCode}${unit.binCode ? `, in bin ${unit.binCode}` : ''}`,
      status: unit.wo.status,
      next: nextForUnit(unit.wo.status),
      workOrderSerial: unit.wo.serial,
      orderId: unit.wo.orderId,
    }
  }

  if (order) {
    const next: ScanResult['next'] =
      order.status === 'open'
        ? { place: 'office', message: 'Not released yet: the planner releases it into work orders' }
        : order.status === 'shipped'
          ? { place: 'done', message: 'Shipped' }
          : order.status === 'cancelled'
            ? { place: 'office', message: 'Cancelled' }
            : { place: 'pack', message: 'In production; the pack bench ships it when every unit is built' }
    return { ...base, kind: 'order', code: order.number, title: `Order ${order.number} for ${order.customerName}`, status: order.status, next, orderId: order.id }
  }

  if (oc && settings) {
    const next: ScanResult['next'] =
      oc.oc.status === 'in_stock'
        ? { place: 'stock', message: 'Put it on the offcut rack; the next cut run uses it first' }
        : oc.oc.status === 'reserved'
          ? { place: 'cut', message: 'Reserved by a published cut run: take it to the cut bench' }
          : { place: 'done', message: oc.oc.status === 'used' ? 'Already cut up' : 'Scrapped' }
    return { ...base, kind: 'offcut', code: code.toUpperCase(), title: `Offcut of ${oc.sku}, ${formatLength(oc.oc.length, settings.displayUnit)}`, status: oc.oc.status, next, partId: oc.partId }
  }

  if (part) {
    return {
      ...base,
      kind: 'part',
      code: part.sku,
      title: `${part.sku}: ${part.name}`,
      status: part.active ? 'active' : 'deactivated',
      next: { place: 'stock', message: part.shelfLocation ? `Shelf ${part.shelfLocation}` : 'No shelf set for this part' },
      partId: part.id,
    }
  }

  throw new NotFound(`No bin, unit, order, offcut or part has the code "${code}". Check the label and scan again.`)
}
