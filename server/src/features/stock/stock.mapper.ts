import type { LedgerEntry, StickBalance, StockMove, StockRow } from '@kitwright/shared/stock'
import type { StockMoveRow } from '../../db/schema/index'
import type { LedgerRecord, StockRowRecord } from './stock.queries'

function iso(value: Date | string) {
  return (value instanceof Date ? value : new Date(value)).toISOString()
}

/**
 * Pipe balances per stick length: every stick length the part is bought in (zero when none moved),
 * plus any other length still in the ledger (a stick length dropped from the part but still on the shelf).
 */
function stickBalances(record: StockRowRecord): StickBalance[] {
  if (record.kind !== 'stock_length') return []
  const byLength = new Map<number, StickBalance>()
  for (const length of record.stickLengths) byLength.set(length, { stickLength: length, onHand: 0, reserved: 0, available: 0 })
  for (const s of record.sticks) {
    if (s.stickLength === null) continue
    const onHand = Number(s.onHand)
    const reserved = Number(s.reserved)
    if (!byLength.has(s.stickLength) && onHand === 0 && reserved === 0) continue
    byLength.set(s.stickLength, { stickLength: s.stickLength, onHand, reserved, available: onHand - reserved })
  }
  return [...byLength.values()].sort((a, b) => a.stickLength - b.stickLength)
}

export function toStockRow(record: StockRowRecord): StockRow {
  return {
    partId: record.partId,
    sku: record.sku,
    name: record.name,
    kind: record.kind,
    unitOfMeasure: record.unitOfMeasure,
    shelfLocation: record.shelfLocation,
    stickLengths: record.stickLengths,
    onHand: record.onHand,
    reserved: record.reserved,
    available: record.available,
    reorderPoint: record.reorderPoint,
    reorderQuantity: record.reorderQuantity,
    low: record.available <= record.reorderPoint,
    sticks: stickBalances(record),
    offcuts: { count: record.offcutCount, totalLength: Number(record.offcutLength) },
  }
}

export function toStockMove(row: StockMoveRow, actor: { id: string; name: string } | null): StockMove {
  return {
    id: row.id,
    partId: row.partId,
    kind: row.kind,
    quantity: row.quantity,
    stickLength: row.stickLength,
    offcutId: row.offcutId,
    lotId: row.lotId,
    workOrderId: row.workOrderId,
    reason: row.reason,
    reference: row.reference,
    createdAt: row.createdAt.toISOString(),
    createdBy: actor,
  }
}

export function toLedgerEntry(record: LedgerRecord): LedgerEntry {
  return {
    id: record.id,
    partId: record.partId,
    kind: record.kind,
    quantity: record.quantity,
    stickLength: record.stickLength,
    offcutId: record.offcutId,
    lotId: record.lotId,
    lotCode: record.lotCode,
    workOrderId: record.workOrderId,
    reason: record.reason,
    reference: record.reference,
    createdAt: iso(record.createdAt),
    createdBy: record.createdById && record.createdByName ? { id: record.createdById, name: record.createdByName } : null,
    onHandAfter: record.onHandAfter,
    reservedAfter: record.reservedAfter,
  }
}
