import { desc, eq, sql } from 'drizzle-orm'
import type { Role } from '@kitwright/shared/roles'
import type { ScanResult } from '@kitwright/shared/scan'
import { formatLength } from '@kitwright/shared/domain/units'
import { RETURN_DISPOSITION_LABELS, RETURN_STATUS_LABELS } from '@kitwright/shared/status-words'
import type { Db } from '../../db/client'
import { bins, kitRevisions, kits, offcuts, orders, parts, returns, workOrders, type ReturnRow } from '../../db/schema/index'
import { Conflict, NotFound } from '../../lib/http-errors'
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

async function unitById(db: Db, id: string) {
  const [row] = await db
    .select({ wo: workOrders, kitName: kits.name, revCode: kitRevisions.code, binCode: bins.code })
    .from(workOrders)
    .innerJoin(kitRevisions, eq(kitRevisions.id, workOrders.kitRevisionId))
    .innerJoin(kits, eq(kits.id, kitRevisions.kitId))
    .leftJoin(bins, eq(bins.workOrderId, workOrders.id))
    .where(eq(workOrders.id, id))
  return row
}

type CodeKind = ScanResult['kind']

/**
 * Which thing a code names, in one query over every kind. Offcut labels carry their own code from a
 * sequence (OC-000123), matched exactly like the rest. Every code is unique within its kind; should
 * the same text name things of two kinds (a part SKU typed like a bin code), the scan is refused with
 * both named rather than one picked.
 */
async function kindOfCode(db: Db, code: string): Promise<{ kind: CodeKind; id: string } | undefined> {
  const { rows } = await db.execute<{ kind: CodeKind; id: string; label: string }>(sql`
    select 'bin' as kind, id::text as id, code as label from bins where upper(code) = upper(${code})
    union all select 'work_order', id::text, serial from work_orders where upper(serial) = upper(${code})
    union all select 'order', id::text, number from orders where upper(number) = upper(${code})
    union all select 'offcut', id::text, code from offcuts where upper(code) = upper(${code})
    union all select 'part', id::text, sku from parts where upper(sku) = upper(${code})
    union all select 'return', id::text, number from returns where upper(tracking_number) = upper(${code}) or upper(number) = upper(${code})
    limit 3`)
  if (rows.length > 1) {
    const names: Record<CodeKind, string> = { bin: 'bin', work_order: 'unit', order: 'order', offcut: 'offcut', part: 'part', return: 'return' }
    throw new Conflict(
      `The code "${code}" names ${rows.map((r) => `${names[r.kind] ?? r.kind} ${r.label}`).join(' and ')}; Kitwright will not guess which. Scan the other label on it, or ask the planner to rename one`,
    )
  }
  return rows[0]
}

/** Who opens returns (their page and the returns screen): the office, and the pack bench that receives them. */
const RETURN_READERS: readonly Role[] = ['admin', 'planner', 'packer']

/** Where a returned unit goes next, by where its return is. */
function nextForReturn(ret: ReturnRow, role: Role): ScanResult['next'] {
  switch (ret.status) {
    case 'awaiting_parcel':
      return {
        place: 'pack',
        message: RETURN_READERS.includes(role)
          ? "A customer's parcel coming back: receive it on its return page, then set it on the returns shelf"
          : "A customer's parcel coming back: take it to the pack bench to be received",
      }
    case 'received':
      return { place: 'office', message: 'Back in the shop: on the returns shelf for the office to decide' }
    case 'repair':
      return { place: 'build', message: 'Sent for repair: the build bench reworks it and tests it again' }
    case 'replace':
    case 'refund':
      if (ret.disposition === 'spare') return { place: 'stock', message: `${RETURN_DISPOSITION_LABELS.spare}: kept whole on the spares shelf under its serial` }
      if (ret.disposition === 'scrapped') return { place: 'done', message: `${RETURN_DISPOSITION_LABELS.scrapped}${ret.dispositionNote ? `: ${ret.dispositionNote}` : ''}` }
      return { place: 'office', message: `${RETURN_STATUS_LABELS[ret.status]}: the office records whether the unit goes back to stock as a spare or is scrapped` }
  }
}

/**
 * Resolves any Kitwright code — a bin, a unit's serial, an order number, an offcut label, a part's
 * SKU, a return label's tracking number or a return's number — to what it is and where it should go
 * next. Codes are matched without regard to case, because scanners and hands type both. A return is
 * named to everyone (so a parcel found anywhere reaches the pack bench), but only those who may
 * open returns get its id.
 */
export async function resolveScan(db: Db, code: string, role: Role): Promise<ScanResult> {
  const base = { code, workOrderSerial: null, orderId: null, partId: null, returnId: null }
  const found = await kindOfCode(db, code)
  if (!found) throw new NotFound(`No bin, unit, order, offcut, part or return has the code "${code}". Check the label and scan again.`)

  switch (found.kind) {
    case 'bin': {
      const [bin] = await db.select().from(bins).where(eq(bins.id, found.id))
      if (!bin!.workOrderId)
        return {
          ...base,
          kind: 'bin',
          code: bin!.code,
          title: `Bin ${bin!.code} is empty`,
          status: bin!.status,
          next: { place: 'cut', message: 'Free: fill it at the cut bench' },
        }
      const held = await unitById(db, bin!.workOrderId)
      if (!held) throw new NotFound(`Bin ${bin!.code} points at a unit Kitwright cannot find; tell the planner`)
      return {
        ...base,
        kind: 'bin',
        code: bin!.code,
        title: `Bin ${bin!.code} holds unit ${held.wo.serial} (${held.kitName}, rev ${held.revCode})`,
        status: held.wo.status,
        next: nextForUnit(held.wo.status),
        workOrderSerial: held.wo.serial,
        orderId: held.wo.orderId,
      }
    }
    case 'work_order': {
      const unit = (await unitById(db, found.id))!
      // A shipped unit in someone's hands has come back: where its latest return says it goes.
      const [ret] =
        unit.wo.status === 'shipped'
          ? await db.select().from(returns).where(eq(returns.workOrderId, unit.wo.id)).orderBy(desc(returns.openedAt)).limit(1)
          : []
      const reader = RETURN_READERS.includes(role)
      return {
        ...base,
        kind: 'work_order',
        code: unit.wo.serial,
        title: `Unit ${unit.wo.serial}: ${unit.kitName}, rev ${unit.revCode}${unit.binCode ? `, in bin ${unit.binCode}` : ''}${ret ? `, returned on ${ret.number}` : ''}`,
        status: unit.wo.status,
        next: ret ? nextForReturn(ret, role) : nextForUnit(unit.wo.status),
        workOrderSerial: unit.wo.serial,
        orderId: unit.wo.orderId,
        returnId: ret && reader ? ret.id : null,
      }
    }
    case 'order': {
      const [order] = await db.select().from(orders).where(eq(orders.id, found.id))
      const next: ScanResult['next'] =
        order!.status === 'open'
          ? { place: 'office', message: 'Not released yet: the planner releases it into work orders' }
          : order!.status === 'shipped'
            ? { place: 'done', message: 'Shipped' }
            : order!.status === 'cancelled'
              ? { place: 'office', message: 'Cancelled' }
              : { place: 'pack', message: 'In production; the pack bench ships it when every unit is built' }
      return {
        ...base,
        kind: 'order',
        code: order!.number,
        title: `Order ${order!.number} for ${order!.customerName}`,
        status: order!.status,
        next,
        orderId: order!.id,
      }
    }
    case 'offcut': {
      const [[oc], settings] = await Promise.all([
        db
          .select({ oc: offcuts, sku: parts.sku, partId: parts.id })
          .from(offcuts)
          .innerJoin(parts, eq(parts.id, offcuts.partId))
          .where(eq(offcuts.id, found.id)),
        getShopSettings(db),
      ])
      const next: ScanResult['next'] =
        oc!.oc.status === 'in_stock'
          ? { place: 'stock', message: 'Put it on the offcut rack; the next cut run uses it first' }
          : oc!.oc.status === 'reserved'
            ? { place: 'cut', message: 'Reserved by a published cut run: take it to the cut bench' }
            : { place: 'done', message: oc!.oc.status === 'used' ? 'Already cut up' : 'Scrapped' }
      return {
        ...base,
        kind: 'offcut',
        code: oc!.oc.code,
        title: `Offcut of ${oc!.sku}, ${formatLength(oc!.oc.length, settings.displayUnit)}`,
        status: oc!.oc.status,
        next,
        partId: oc!.partId,
      }
    }
    case 'part': {
      const [part] = await db.select().from(parts).where(eq(parts.id, found.id))
      return {
        ...base,
        kind: 'part',
        code: part!.sku,
        title: `${part!.sku}: ${part!.name}`,
        status: part!.active ? 'active' : 'deactivated',
        next: { place: 'stock', message: part!.shelfLocation ? `Shelf ${part!.shelfLocation}` : 'No shelf set for this part' },
        partId: part!.id,
      }
    }
    case 'return': {
      const [row] = await db
        .select({ r: returns, serial: workOrders.serial, kitName: kits.name })
        .from(returns)
        .innerJoin(workOrders, eq(workOrders.id, returns.workOrderId))
        .innerJoin(kitRevisions, eq(kitRevisions.id, workOrders.kitRevisionId))
        .innerJoin(kits, eq(kits.id, kitRevisions.kitId))
        .where(eq(returns.id, found.id))
      const ret = row!.r
      const reader = RETURN_READERS.includes(role)
      return {
        ...base,
        kind: 'return',
        code: ret.number,
        title: `Return ${ret.number} of unit ${row!.serial} (${row!.kitName})${reader ? `: ${ret.reason}` : ''}`,
        status: ret.status,
        next: nextForReturn(ret, role),
        workOrderSerial: row!.serial,
        orderId: reader ? ret.orderId : null,
        returnId: reader ? ret.id : null,
      }
    }
  }
}
