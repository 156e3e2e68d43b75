import { and, asc, eq, inArray, isNull, sql } from 'drizzle-orm'
import type { LotChoice, UnitLotNeed } from '@kitwright/shared/lots'
import { ON_HAND_MOVE_KINDS } from '@kitwright/shared/stock'
import type { Db, Tx } from '../../db/client'
import { bomLines, parts, stockLots, unitLots, users, type NewStockMoveRow, type StockLotRow, type UnitLotRow } from '../../db/schema/index'

type Conn = Db | Tx

const ON_HAND = sql.join(ON_HAND_MOVE_KINDS.map((k) => sql`${k}`), sql`, `)

/**
 * The lot row of each receipt line that names one (created the first time a lot comes in; codes
 * match whatever their case), or null for lines without a lot. Call under the parts' lock.
 */
export async function lotIdsFor(tx: Tx, lines: readonly { partId: string; lot: string | null }[]): Promise<(string | null)[]> {
  const wanted = lines.filter((l): l is { partId: string; lot: string } => !!l.lot)
  if (wanted.length === 0) return lines.map(() => null)
  await tx
    .insert(stockLots)
    .values(wanted.map((l) => ({ partId: l.partId, code: l.lot })))
    .onConflictDoNothing()
  const found = await tx
    .select({ id: stockLots.id, partId: stockLots.partId, code: stockLots.code })
    .from(stockLots)
    .where(inArray(stockLots.partId, [...new Set(wanted.map((l) => l.partId))]))
  const key = (partId: string, code: string) => `${partId}|${code.toUpperCase()}`
  const byKey = new Map(found.map((f) => [key(f.partId, f.code), f.id]))
  return lines.map((l) => (l.lot ? (byKey.get(key(l.partId, l.lot)) ?? null) : null))
}

/** A lot of the part by its code, whatever its case. */
export async function findLotByCode(db: Conn, partId: string, code: string): Promise<StockLotRow | undefined> {
  const [row] = await db.select().from(stockLots).where(and(eq(stockLots.partId, partId), sql`upper(${stockLots.code}) = upper(${code})`))
  return row
}

/**
 * Every lot of the parts with what is on hand in it (the ledger moves that carry it) and what of it is
 * fitted into units still in the shop (fitted, not yet shipped off the shelf): free = on hand − fitted.
 */
export async function lotBalances(db: Conn, partIds: readonly string[]): Promise<(LotChoice & { partId: string; onHand: number })[]> {
  if (partIds.length === 0) return []
  const result = await db.execute<{ lotId: string; partId: string; code: string; firstReceivedAt: Date | string; onHand: number; fitted: number }>(sql`
    select l.id as "lotId", l.part_id as "partId", l.code, l.first_received_at as "firstReceivedAt",
      coalesce((select sum(m.quantity) from stock_moves m where m.lot_id = l.id and m.kind in (${ON_HAND})), 0)::int as "onHand",
      coalesce((select sum(u.quantity) from unit_lots u join work_orders w on w.id = u.work_order_id
        where u.lot_id = l.id and u.undone_at is null and w.status <> 'shipped'), 0)::int as "fitted"
    from stock_lots l
    where l.part_id in ${[...new Set(partIds)]}
    order by l.first_received_at, l.code
  `)
  return result.rows.map((r) => ({
    lotId: r.lotId,
    partId: r.partId,
    code: r.code,
    firstReceivedAt: new Date(r.firstReceivedAt).toISOString(),
    onHand: r.onHand,
    free: r.onHand - r.fitted,
  }))
}

/** The lot-tracked lines of a revision's bill of materials (one per part, quantities summed). */
export async function lotTrackedBom(db: Conn, revisionId: string) {
  return db
    .select({ partId: parts.id, sku: parts.sku, name: parts.name, quantity: sql<number>`sum(${bomLines.quantity})::int` })
    .from(bomLines)
    .innerJoin(parts, eq(parts.id, bomLines.partId))
    .where(and(eq(bomLines.revisionId, revisionId), eq(parts.lotTracked, true)))
    .groupBy(parts.id, parts.sku, parts.name)
    .orderBy(asc(parts.sku))
}

/** Every lot fit of a unit, standing and undone, oldest first, with the lot's code. */
export async function fitsOfWorkOrder(db: Conn, workOrderId: string) {
  return db
    .select({ fit: unitLots, code: stockLots.code, byName: users.name })
    .from(unitLots)
    .innerJoin(stockLots, eq(stockLots.id, unitLots.lotId))
    .innerJoin(users, eq(users.id, unitLots.fittedBy))
    .where(eq(unitLots.workOrderId, workOrderId))
    .orderBy(asc(unitLots.fittedAt), asc(unitLots.id))
}

/** The unit's lot-tracked parts: how many each takes, the lots fitted, and the lots to choose from (oldest first). */
export async function lotNeedsOf(db: Conn, workOrder: { id: string; kitRevisionId: string }): Promise<UnitLotNeed[]> {
  const bom = await lotTrackedBom(db, workOrder.kitRevisionId)
  if (bom.length === 0) return []
  const fits = await fitsOfWorkOrder(db, workOrder.id)
  const balances = await lotBalances(db, bom.map((b) => b.partId))
  return bom.map((b) => {
    const fitted = fits
      .filter((f) => f.fit.partId === b.partId && f.fit.undoneAt === null)
      .map((f) => ({ id: f.fit.id, lotId: f.fit.lotId, lotCode: f.code, quantity: f.fit.quantity, by: { id: f.fit.fittedBy, name: f.byName }, at: f.fit.fittedAt.toISOString(), undoneAt: null }))
    const left = Math.max(0, b.quantity - fitted.reduce((n, f) => n + f.quantity, 0))
    const choices = left === 0 ? [] : balances.filter((l) => l.partId === b.partId && l.free > 0).map(({ lotId, code, firstReceivedAt, free }) => ({ lotId, code, firstReceivedAt, free }))
    return { partId: b.partId, sku: b.sku, name: b.name, quantity: b.quantity, fitted, left, choices }
  })
}

/** How many of the unit's lot-tracked parts still lack their lot (for readiness). */
export async function lotsMissingOf(db: Conn, workOrder: { id: string; kitRevisionId: string }): Promise<number> {
  const bom = await lotTrackedBom(db, workOrder.kitRevisionId)
  if (bom.length === 0) return 0
  const fits = await db
    .select({ partId: unitLots.partId, quantity: sql<number>`sum(${unitLots.quantity})::int` })
    .from(unitLots)
    .where(and(eq(unitLots.workOrderId, workOrder.id), isNull(unitLots.undoneAt)))
    .groupBy(unitLots.partId)
  const fitted = new Map(fits.map((f) => [f.partId, f.quantity]))
  return bom.filter((b) => (fitted.get(b.partId) ?? 0) < b.quantity).length
}

/** Whether any lot was ever fitted into the unit (the first fit starts the build, like the first tick). */
export async function hasLotFits(db: Conn, workOrderId: string): Promise<boolean> {
  const [row] = await db.select({ id: unitLots.id }).from(unitLots).where(eq(unitLots.workOrderId, workOrderId)).limit(1)
  return row !== undefined
}

/**
 * The ship moves of one unit, with each lot-tracked part split by the lots fitted into it, so the
 * lot's stock goes down as its units leave. Anything not covered by a fit ships without a lot.
 */
export async function splitShipMovesByLot(tx: Tx, workOrderId: string, moves: NewStockMoveRow[]): Promise<NewStockMoveRow[]> {
  const fits: Pick<UnitLotRow, 'partId' | 'lotId' | 'quantity'>[] = await tx
    .select({ partId: unitLots.partId, lotId: unitLots.lotId, quantity: unitLots.quantity })
    .from(unitLots)
    .where(and(eq(unitLots.workOrderId, workOrderId), isNull(unitLots.undoneAt)))
    .orderBy(asc(unitLots.fittedAt), asc(unitLots.id))
  if (fits.length === 0) return moves
  const out: NewStockMoveRow[] = []
  const remaining = fits.map((f) => ({ ...f }))
  for (const move of moves) {
    let left = -move.quantity
    for (const f of remaining) {
      if (left === 0) break
      if (f.partId !== move.partId || f.quantity === 0) continue
      const take = Math.min(left, f.quantity)
      out.push({ ...move, quantity: -take, lotId: f.lotId })
      f.quantity -= take
      left -= take
    }
    if (left > 0) out.push({ ...move, quantity: -left })
  }
  return out
}
