import { eq, sql } from 'drizzle-orm'
import type { LengthUnit } from '@kitwright/shared/domain/units'
import {
  formatStickLength,
  type AdjustStock,
  type PackingList,
  type PackingListPreview,
  type ReceiveStock,
  type ReleaseStock,
  type ReservationLine,
  type ReserveStock,
  type StockLedger,
  type StockListQuery,
  type StockMovesQuery,
  type StockMovesResult,
  type StockPage,
  type StockPartOption,
} from '@kitwright/shared/stock'
import type { Db, Tx } from '../../db/client'
import { parts, purchaseOrders, shopSettings, suppliers, type NewStockMoveRow, type PartRow } from '../../db/schema/index'
import type { SessionUser } from '../../lib/auth'
import { BadRequest, Conflict, NotFound } from '../../lib/http-errors'
import { findPurchaseOrderByNumber, receiveOnPurchaseOrder, type PurchaseReceiptLine } from '../purchasing/purchase-orders.service'
import { findLotByCode, lotBalances, lotIdsFor } from '../lots/lots.queries'
import { readPackingList } from './packing-list'
import { stockCsv } from './stock-export'
import { toLedgerEntry, toStockMove, toStockRow } from './stock.mapper'
import { insertMoves, lockParts, selectBuckets, selectHeld, selectLedger, selectPartOptions, selectStockRows, type BucketBalance } from './stock.queries'

/** Who made a move: recorded on every ledger line. */
export type Actor = Pick<SessionUser, 'id' | 'name'>

async function displayUnit(db: Db | Tx): Promise<LengthUnit> {
  const [row] = await db.select({ unit: shopSettings.displayUnit }).from(shopSettings).where(eq(shopSettings.id, 1))
  return row?.unit ?? 'in'
}

function partLabel(part: Pick<PartRow, 'sku' | 'name'>) {
  return `${part.sku} ${part.name}`
}

export async function listStock(db: Db, query: StockListQuery): Promise<StockPage> {
  const records = await selectStockRows(db, { ...query, limit: query.pageSize, offset: (query.page - 1) * query.pageSize })
  let total = records[0]?.total ?? 0
  if (records.length === 0 && query.page > 1) {
    // Past the last page: the count still tells the client where the last page is.
    total = (await selectStockRows(db, { ...query, limit: 1, offset: 0 }))[0]?.total ?? 0
  }
  return { items: records.map(toStockRow), total, page: query.page, pageSize: query.pageSize }
}

/** Every row matching the stock page's search and filters (not just one page), as CSV. */
export async function exportStock(db: Db, query: StockListQuery): Promise<string> {
  const records = await selectStockRows(db, { ...query, limit: undefined })
  return stockCsv(records.map(toStockRow), await displayUnit(db))
}

export async function listStockPartOptions(db: Db): Promise<StockPartOption[]> {
  return selectPartOptions(db)
}

export async function stockLedger(db: Db, query: StockMovesQuery): Promise<StockLedger> {
  const [balance] = await selectStockRows(db, { partIds: [query.partId] })
  if (!balance) throw new NotFound('No such part in stock (it may have been retired)')
  const moves = await selectLedger(db, query.partId, query.limit)
  const lots = (await lotBalances(db, [query.partId]))
    .filter((l) => l.onHand !== 0)
    .map(({ lotId, code, firstReceivedAt, onHand, free }) => ({ lotId, code, firstReceivedAt, onHand, free }))
  return { balance: toStockRow(balance), moves: moves.map(toLedgerEntry), totalMoves: moves[0]?.totalMoves ?? 0, lots }
}

// ---------------------------------------------------------------------------------------------------
// Checks shared by receiving, adjusting and reserving

/** What is wrong with moving `stickLength` of this part, or null when it fits the part's kind. */
function stickLengthProblem(part: PartRow, stickLength: number | null, unit: LengthUnit, required: boolean): string | null {
  const lengths = part.stickLengths.map((l) => formatStickLength(l, unit)).join(', ')
  if (part.kind !== 'stock_length') {
    return stickLength === null ? null : `${partLabel(part)} is not pipe: leave the stick length empty`
  }
  if (stickLength === null) return required ? `${partLabel(part)} is pipe, kept by the stick: give the stick length (${lengths})` : null
  if (!part.stickLengths.includes(stickLength)) {
    return `${partLabel(part)} is not bought in ${formatStickLength(stickLength, unit)} sticks: use ${part.stickLengths.length > 1 ? 'one of ' : ''}${lengths}`
  }
  return null
}

function bucketKey(partId: string, stickLength: number | null) {
  return `${partId}|${stickLength ?? ''}`
}

function indexBuckets(rows: BucketBalance[]) {
  const byBucket = new Map<string, BucketBalance>()
  const byPart = new Map<string, { onHand: number; reserved: number }>()
  for (const r of rows) {
    byBucket.set(bucketKey(r.partId, r.stickLength), r)
    const total = byPart.get(r.partId) ?? { onHand: 0, reserved: 0 }
    byPart.set(r.partId, { onHand: total.onHand + r.onHand, reserved: total.reserved + r.reserved })
  }
  return {
    bucket: (partId: string, stickLength: number | null) => byBucket.get(bucketKey(partId, stickLength)) ?? { onHand: 0, reserved: 0 },
    part: (partId: string) => byPart.get(partId) ?? { onHand: 0, reserved: 0 },
  }
}

/** Locks the parts (sorted ids) and returns them by id; every id must be an active part. */
async function lockActiveParts(tx: Tx, partIds: readonly string[], fieldOf: (partId: string) => string) {
  const locked = await lockParts(tx, partIds)
  const byId = new Map(locked.map((p) => [p.id, p]))
  const fields: Record<string, string> = {}
  for (const id of partIds) {
    const part = byId.get(id)
    if (!part) fields[fieldOf(id)] = 'No such part'
    else if (!part.active) fields[fieldOf(id)] = `${partLabel(part)} is retired; reactivate it first`
  }
  const first = Object.values(fields)[0]
  if (first) throw new BadRequest(first, fields)
  return byId
}

// ---------------------------------------------------------------------------------------------------
// Receiving

interface ResolvedReceiveLine {
  partId: string
  quantity: number
  stickLength: number | null
  reference: string | null
  /** The supplier's lot, for a lot-tracked part. */
  lot: string | null
}

/** What is wrong with the lot of a receipt line, or null: a lot-tracked part needs one, any other part takes none. */
export function lotProblem(part: PartRow, lot: string | null): string | null {
  if (part.lotTracked && !lot) return `${partLabel(part)} is tracked by lot: give the supplier's lot printed on the bag or box`
  if (!part.lotTracked && lot) return `${partLabel(part)} is not tracked by lot: leave the lot empty, or mark the part lot-tracked on its page first`
  return null
}

/** Appends one receive move per line, in one transaction, after checking each line against its locked part. */
async function receiveLines(tx: Tx, lines: ResolvedReceiveLine[], actor: Actor, unit: LengthUnit) {
  const byId = await lockActiveParts(
    tx,
    lines.map((l) => l.partId),
    (id) => `lines.${lines.findIndex((l) => l.partId === id)}.partId`,
  )
  const fields: Record<string, string> = {}
  lines.forEach((line, i) => {
    const problem = stickLengthProblem(byId.get(line.partId)!, line.stickLength, unit, true)
    if (problem) fields[`lines.${i}.stickLength`] = problem
    const lot = lotProblem(byId.get(line.partId)!, line.lot)
    if (lot) fields[`lines.${i}.lot`] = lot
  })
  const first = Object.entries(fields)[0]
  if (first) throw new BadRequest(`Line ${Number(first[0].split('.')[1]) + 1}: ${first[1]}`, fields)
  const lotIds = await lotIdsFor(tx, lines)
  const rows = await insertMoves(
    tx,
    lines.map(
      (l, i): NewStockMoveRow => ({
        partId: l.partId,
        kind: 'receive',
        quantity: l.quantity,
        stickLength: l.stickLength,
        lotId: lotIds[i] ?? null,
        reference: l.reference,
        createdBy: actor.id,
      }),
    ),
  )
  return { moves: rows.map((r) => toStockMove(r, actor)) }
}

/** Receives goods from the receiving form: lines by part id or SKU; all lines or none. */
export async function receiveStock(db: Db, input: ReceiveStock, actor: Actor): Promise<StockMovesResult> {
  const skus = input.lines.filter((l) => l.partId === undefined && l.sku !== undefined).map((l) => l.sku!.toLowerCase())
  const bySku = new Map<string, string>()
  if (skus.length > 0) {
    const found = await db
      .select({ id: parts.id, sku: parts.sku })
      .from(parts)
      .where(sql`lower(${parts.sku}) in ${[...new Set(skus)]}`)
    for (const p of found) bySku.set(p.sku.toLowerCase(), p.id)
  }
  const fields: Record<string, string> = {}
  const resolved = input.lines.map((l, i): ResolvedReceiveLine => {
    const partId = l.partId ?? bySku.get(l.sku!.toLowerCase())
    if (!partId) fields[`lines.${i}.sku`] = `No part with SKU ${l.sku}`
    return { partId: partId ?? '', quantity: l.quantity, stickLength: l.stickLength, reference: l.reference, lot: l.lot }
  })
  const first = Object.values(fields)[0]
  if (first) throw new BadRequest(first, fields)
  const unit = await displayUnit(db)
  const purchaseOrderId = input.purchaseOrderId
  if (!purchaseOrderId) return db.transaction((tx) => receiveLines(tx, resolved, actor, unit))
  // Against a purchase order: its lines are checked and counted, and the receipt is priced from it.
  const skuOf = new Map(
    (
      await db
        .select({ id: parts.id, sku: parts.sku })
        .from(parts)
        .where(sql`${parts.id} in ${[...new Set(resolved.map((l) => l.partId))]}`)
    ).map((p) => [p.id, p.sku]),
  )
  const receipt = resolved.map(
    (l, i): PurchaseReceiptLine => ({
      partId: l.partId,
      quantity: l.quantity,
      reason: input.lines[i]!.reason,
      closeShort: input.lines[i]!.closeShort,
      field: `lines.${i}`,
      label: skuOf.get(l.partId) ?? 'that part',
    }),
  )
  return db.transaction(async (tx) => {
    const { moves } = await receiveOnPurchaseOrder(tx, purchaseOrderId, receipt, actor, async (number) => {
      return (
        await receiveLines(
          tx,
          resolved.map((l) => ({ ...l, reference: l.reference ?? number })),
          actor,
          unit,
        )
      ).moves
    })
    return { moves }
  })
}

/** Reads a packing list and checks every row against the parts, saving nothing; `rowPurchaseOrders` says which purchase order each row goes against (not sent to the browser). */
export async function previewPackingList(db: Db | Tx, input: PackingList): Promise<PackingListPreview & { rowPurchaseOrders: (string | null)[] }> {
  const unit = await displayUnit(db)
  const { lines, fileErrors } = readPackingList(input.csv, input.defaultReference, unit)
  const skus = [...new Set(lines.map((l) => l.sku.toLowerCase()).filter((s) => s !== ''))]
  const found = skus.length
    ? await db
        .select()
        .from(parts)
        .where(sql`lower(${parts.sku}) in ${skus}`)
    : []
  const bySku = new Map(found.map((p) => [p.sku.toLowerCase(), p]))
  // Suppliers and purchase orders the file names (or the one chosen), each looked up once.
  const supplierNames = [...new Set(lines.map((l) => l.supplier?.toLowerCase()).filter((n): n is string => !!n))]
  const knownSuppliers = supplierNames.length
    ? await db
        .select({ id: suppliers.id, name: suppliers.name })
        .from(suppliers)
        .where(sql`lower(${suppliers.name}) in ${supplierNames}`)
    : []
  const supplierByName = new Map(knownSuppliers.map((s) => [s.name.toLowerCase(), s]))
  const chosen = input.purchaseOrderId
    ? ((
        await db
          .select({ id: purchaseOrders.id, number: purchaseOrders.number, supplierId: purchaseOrders.supplierId })
          .from(purchaseOrders)
          .where(eq(purchaseOrders.id, input.purchaseOrderId))
      )[0] ?? null)
    : null
  if (input.purchaseOrderId && !chosen) fileErrors.push('No such purchase order: choose it again from the list')
  const poByNumber = new Map<string, Awaited<ReturnType<typeof findPurchaseOrderByNumber>>>()
  for (const n of new Set(lines.map((l) => l.purchaseOrder?.toUpperCase()).filter((n): n is string => !!n)))
    poByNumber.set(n, await findPurchaseOrderByNumber(db, n))
  const rows = lines.map((line) => {
    const part = line.sku ? bySku.get(line.sku.toLowerCase()) : undefined
    const errors = [...line.errors]
    const po = line.purchaseOrder ? poByNumber.get(line.purchaseOrder.toUpperCase()) : chosen
    if (line.purchaseOrder && !po) errors.push(`No purchase order ${line.purchaseOrder}: correct the number or leave the cell empty`)
    else if (line.purchaseOrder && chosen && po && po.id !== chosen.id)
      errors.push(`The row names ${po.number} but the list is received against ${chosen.number}`)
    if (line.supplier) {
      const supplier = supplierByName.get(line.supplier.toLowerCase())
      if (!supplier) errors.push(`No supplier named "${line.supplier}": add it on the Suppliers page or correct the name`)
      else if (po && po.supplierId !== supplier.id) errors.push(`${po.number} is not from ${supplier.name}`)
    }
    if (line.sku && !part) errors.push(`No part with SKU ${line.sku}: add the part first or correct the SKU`)
    else if (part && !part.active) errors.push(`${partLabel(part)} is retired; reactivate it first`)
    else if (part && !line.stickLengthUnreadable) {
      const problem = stickLengthProblem(part, line.stickLength, unit, true)
      if (problem) errors.push(problem)
    }
    if (part?.active) {
      const problem = lotProblem(part, line.lot)
      if (problem)
        errors.push(
          problem.replace('leave the lot empty', 'leave its lot cell empty').replace("give the supplier's lot", "fill its lot cell with the supplier's lot"),
        )
    }
    return {
      row: line.row,
      sku: part?.sku ?? line.sku,
      partId: part?.id ?? null,
      partName: part?.name ?? null,
      quantity: line.quantity,
      stickLength: line.stickLength,
      reference: line.reference,
      purchaseOrderNumber: po?.number ?? null,
      purchaseOrderId: po?.id ?? null,
      reason: line.reason,
      lot: line.lot,
      errors,
    }
  })
  const errors = [...fileErrors, ...rows.flatMap((r) => r.errors.map((e) => `Row ${r.row}: ${e}`))]
  return {
    rows: rows.map(({ purchaseOrderId: _id, ...r }) => r),
    rowPurchaseOrders: rows.map((r) => r.purchaseOrderId),
    fileErrors,
    errors,
    ok: errors.length === 0,
  }
}

/** Receives a whole packing list in one transaction, or nothing when any row has a problem. */
export async function receivePackingList(db: Db, input: PackingList, actor: Actor): Promise<StockMovesResult & { preview: PackingListPreview }> {
  return db.transaction(async (tx) => {
    const preview = await previewPackingList(tx, input)
    if (!preview.ok) {
      const fields: Record<string, string> = {}
      for (const r of preview.rows) if (r.errors.length) fields[`rows.${r.row}`] = r.errors.join('; ')
      const count = preview.errors.length
      throw new BadRequest(`Nothing was received: the packing list has ${count} problem${count === 1 ? '' : 's'}. ${preview.errors[0]}`, fields)
    }
    const unit = await displayUnit(tx)
    const { rowPurchaseOrders, ...shown } = preview
    const lines = preview.rows.map((r) => ({ partId: r.partId!, quantity: r.quantity!, stickLength: r.stickLength, reference: r.reference, lot: r.lot }))
    // Rows on no purchase order are received as before; the others per order, each checked and counted against it.
    const plain = lines.filter((_, i) => !rowPurchaseOrders[i])
    const moves = plain.length ? (await receiveLines(tx, plain, actor, unit)).moves : []
    for (const poId of [...new Set(rowPurchaseOrders.filter((id): id is string => !!id))].sort()) {
      const idx = rowPurchaseOrders.flatMap((id, i) => (id === poId ? [i] : []))
      const receipt = idx.map((i): PurchaseReceiptLine => {
        const r = preview.rows[i]!
        return { partId: r.partId!, quantity: r.quantity!, reason: r.reason, closeShort: false, field: `rows.${r.row}`, label: r.sku }
      })
      const done = await receiveOnPurchaseOrder(tx, poId, receipt, actor, async (number) => {
        return (
          await receiveLines(
            tx,
            idx.map((i) => ({ ...lines[i]!, reference: lines[i]!.reference ?? number })),
            actor,
            unit,
          )
        ).moves
      })
      moves.push(...done.moves)
    }
    return { moves, preview: shown }
  })
}

// ---------------------------------------------------------------------------------------------------
// Adjusting

/**
 * The lot an adjustment of a lot-tracked part changes (under the part's lock): it must have been
 * received, and what comes off may not be more than is on its shelf (on hand less what is fitted
 * into units still in the shop).
 */
async function adjustableLot(tx: Tx, part: PartRow, code: string, quantity: number): Promise<string> {
  const lots = await lotBalances(tx, [part.id])
  const lot = await findLotByCode(tx, part.id, code)
  if (!lot) {
    const known = lots
      .filter((l) => l.onHand > 0)
      .map((l) => l.code)
      .join(', ')
    const message = `No lot "${code}" of ${part.sku} has been received: ${known ? `choose one of ${known}` : 'none is in stock'}, or receive a new lot on Receive stock`
    throw new Conflict(message, { lot: `No lot ${code} of ${part.sku}` })
  }
  const balance = lots.find((l) => l.lotId === lot.id)
  const onHand = balance?.onHand ?? 0
  const free = Math.max(0, balance?.free ?? 0)
  if (quantity < 0 && -quantity > free) {
    const fitted = onHand - free
    const message = `Cannot take ${-quantity} off lot ${lot.code} of ${part.sku}: only ${free} of it ${free === 1 ? 'is' : 'are'} on the shelf (${onHand} on hand${fitted > 0 ? `, ${fitted} fitted into units still in the shop` : ''}). Count again, or adjust by at most -${free}.`
    throw new Conflict(message, { quantity: `At most -${free} from lot ${lot.code}` })
  }
  return lot.id
}

/**
 * An adjustment with its reason. On-hand may not go below zero, nor below what is reserved (release
 * the reservation first), so that available never goes negative.
 */
export async function adjustStock(db: Db, input: AdjustStock, actor: Actor): Promise<StockMovesResult> {
  const unit = await displayUnit(db)
  return db.transaction(async (tx) => {
    const byId = await lockActiveParts(tx, [input.partId], () => 'partId')
    const part = byId.get(input.partId)!
    const problem = stickLengthProblem(part, input.stickLength, unit, true)
    if (problem) throw new BadRequest(problem, { stickLength: problem })
    const lotIssue = lotProblem(part, input.lot)
    if (lotIssue) throw new BadRequest(lotIssue, { lot: lotIssue })
    const lotId = input.lot ? await adjustableLot(tx, part, input.lot, input.quantity) : null
    const balances = indexBuckets(await selectBuckets(tx, [part.id]))
    const bucket = balances.bucket(part.id, input.stickLength)
    const total = balances.part(part.id)
    const what = input.stickLength === null ? partLabel(part) : `${partLabel(part)} (${formatStickLength(input.stickLength, unit)} sticks)`
    if (bucket.onHand + input.quantity < 0) {
      const message = `Cannot take ${-input.quantity} off ${what}: only ${bucket.onHand} on hand. Count again, or adjust by at most -${bucket.onHand}.`
      throw new Conflict(message, { quantity: `At most -${bucket.onHand}` })
    }
    const free = Math.max(0, Math.min(total.onHand - total.reserved, bucket.onHand - bucket.reserved))
    if (input.quantity < 0 && -input.quantity > free) {
      const message = `Cannot take ${-input.quantity} off ${what}: ${total.reserved} ${total.reserved === 1 ? 'is' : 'are'} reserved for work orders and only ${free} could go. Release the reservation first.`
      throw new Conflict(message, { quantity: 'More than is free of reservations' })
    }
    const rows = await insertMoves(tx, [
      { partId: part.id, kind: 'adjust', quantity: input.quantity, stickLength: input.stickLength, lotId, reason: input.reason, createdBy: actor.id },
    ])
    return { moves: rows.map((r) => toStockMove(r, actor)) }
  })
}

// ---------------------------------------------------------------------------------------------------
// Reserving and releasing

/** Sums lines asking for the same part and stick length, keeping the first line's index for messages. */
function mergeLines(lines: readonly ReservationLine[]) {
  const merged = new Map<string, ReservationLine & { index: number }>()
  lines.forEach((l, index) => {
    const key = bucketKey(l.partId, l.stickLength)
    const seen = merged.get(key)
    merged.set(key, seen ? { ...seen, quantity: seen.quantity + l.quantity } : { ...l, index })
  })
  return [...merged.values()]
}

/**
 * Reserves stock for a work order (or, with `workOrderId: null`, a manual hold) inside the caller's
 * transaction. The parts rows are locked `FOR UPDATE` in sorted-id order before available is
 * recomputed from the ledger, so concurrent reservations queue and available never goes below
 * zero. Pipe lines may name a stick length; available is then checked for that length as well as
 * for the part. Throws Conflict (409) saying what is short, and reserves nothing, when any line
 * cannot be met. `actor` is null when the system reserved it (a paid order released automatically).
 */
export async function reserveStock(
  tx: Tx,
  input: Pick<ReserveStock, 'workOrderId' | 'lines'> & { reason?: string | null },
  actor: Actor | null,
): Promise<StockMovesResult> {
  const lines = mergeLines(input.lines)
  const byId = await lockActiveParts(
    tx,
    lines.map((l) => l.partId),
    (id) => `lines.${lines.find((l) => l.partId === id)!.index}.partId`,
  )
  const unit = await displayUnit(tx)
  for (const l of lines) {
    const problem = stickLengthProblem(byId.get(l.partId)!, l.stickLength, unit, false)
    if (problem) throw new BadRequest(problem, { [`lines.${l.index}.stickLength`]: problem })
  }
  const balances = indexBuckets(await selectBuckets(tx, [...byId.keys()]))
  const shortages: string[] = []
  const fields: Record<string, string> = {}
  const wantedByPart = new Map<string, number>()
  for (const l of lines) wantedByPart.set(l.partId, (wantedByPart.get(l.partId) ?? 0) + l.quantity)
  for (const [partId, wanted] of wantedByPart) {
    const total = balances.part(partId)
    const available = total.onHand - total.reserved
    if (wanted > available) {
      shortages.push(`${partLabel(byId.get(partId)!)}: wanted ${wanted}, available ${Math.max(0, available)}`)
      const index = lines.find((l) => l.partId === partId)!.index
      fields[`lines.${index}.quantity`] = `Only ${Math.max(0, available)} available`
    }
  }
  for (const l of lines) {
    if (l.stickLength === null) continue
    const bucket = balances.bucket(l.partId, l.stickLength)
    const available = bucket.onHand - bucket.reserved
    if (l.quantity > available) {
      shortages.push(
        `${partLabel(byId.get(l.partId)!)} in ${formatStickLength(l.stickLength, unit)} sticks: wanted ${l.quantity}, available ${Math.max(0, available)}`,
      )
      fields[`lines.${l.index}.quantity`] = `Only ${Math.max(0, available)} available in ${formatStickLength(l.stickLength, unit)} sticks`
    }
  }
  if (shortages.length > 0) throw new Conflict(`Not enough stock to reserve: ${shortages.join('; ')}`, fields)
  const rows = await insertMoves(
    tx,
    lines.map(
      (l): NewStockMoveRow => ({
        partId: l.partId,
        kind: 'reserve',
        quantity: l.quantity,
        stickLength: l.stickLength,
        workOrderId: input.workOrderId,
        reason: input.reason ?? null,
        createdBy: actor?.id ?? null,
      }),
    ),
  )
  return { moves: rows.map((r) => toStockMove(r, actor)) }
}

/** A manual hold (or a reservation for a work order) in its own transaction. */
export function reserveStockNow(db: Db, input: ReserveStock, actor: Actor) {
  return db.transaction((tx) => reserveStock(tx, input, actor))
}

/**
 * Releases reserved stock inside the caller's transaction: for a work order, everything it still
 * holds when no lines are given, otherwise the lines given (from the work order, or from the manual
 * holds when `workOrderId` is null). Refuses to release more than is held. `actor` is null when the
 * store or the system released it (a cancellation from the web store).
 */
export async function releaseReservation(
  tx: Tx,
  input: Pick<ReleaseStock, 'workOrderId' | 'lines'> & { reason?: string | null },
  actor: Actor | null,
): Promise<StockMovesResult> {
  const lines = mergeLines(input.lines)
  const whose = input.workOrderId === null ? 'the manual holds have' : 'this work order holds'
  if (lines.length === 0) {
    if (input.workOrderId === null) throw new BadRequest('Give the lines to release from the manual holds', { lines: 'Add at least one line' })
    const held = await selectHeld(tx, input.workOrderId)
    await lockParts(
      tx,
      held.map((h) => h.partId),
    )
    const current = await selectHeld(tx, input.workOrderId)
    const rows = await insertMoves(
      tx,
      current.map(
        (h): NewStockMoveRow => ({
          partId: h.partId,
          kind: 'release',
          quantity: -h.reserved,
          stickLength: h.stickLength,
          workOrderId: input.workOrderId,
          reason: input.reason ?? null,
          createdBy: actor?.id ?? null,
        }),
      ),
    )
    return { moves: rows.map((r) => toStockMove(r, actor)) }
  }
  const byId = await lockActiveParts(
    tx,
    lines.map((l) => l.partId),
    (id) => `lines.${lines.find((l) => l.partId === id)!.index}.partId`,
  )
  const held = await selectHeld(tx, input.workOrderId, [...byId.keys()])
  const heldOf = (l: ReservationLine) => held.find((h) => h.partId === l.partId && h.stickLength === l.stickLength)?.reserved ?? 0
  const unit = await displayUnit(tx)
  const problems: string[] = []
  const fields: Record<string, string> = {}
  for (const l of lines) {
    const have = heldOf(l)
    if (l.quantity > have) {
      const what =
        l.stickLength === null ? partLabel(byId.get(l.partId)!) : `${partLabel(byId.get(l.partId)!)} in ${formatStickLength(l.stickLength, unit)} sticks`
      problems.push(`${what}: release ${l.quantity}, but ${whose} only ${have}`)
      fields[`lines.${l.index}.quantity`] = `At most ${have}`
    }
  }
  if (problems.length > 0) throw new Conflict(`Cannot release more than is reserved: ${problems.join('; ')}`, fields)
  const rows = await insertMoves(
    tx,
    lines.map(
      (l): NewStockMoveRow => ({
        partId: l.partId,
        kind: 'release',
        quantity: -l.quantity,
        stickLength: l.stickLength,
        workOrderId: input.workOrderId,
        reason: input.reason ?? null,
        createdBy: actor?.id ?? null,
      }),
    ),
  )
  return { moves: rows.map((r) => toStockMove(r, actor)) }
}

/** A release in its own transaction. */
export function releaseReservationNow(db: Db, input: ReleaseStock, actor: Actor) {
  return db.transaction((tx) => releaseReservation(tx, input, actor))
}
