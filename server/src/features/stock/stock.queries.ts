import { asc, eq, inArray, sql, type SQL } from 'drizzle-orm'
import { ON_HAND_MOVE_KINDS, type StockListQuery } from '@kitwright/shared/stock'
import type { PartKind } from '@kitwright/shared/parts'
import type { Db, Tx } from '../../db/client'
import { parts, stockMoves, type NewStockMoveRow } from '../../db/schema/index'

type Conn = Db | Tx

// Constants of our own, never user input: safe to inline.
const ON_HAND_KINDS = sql.raw(ON_HAND_MOVE_KINDS.map((k) => `'${k}'`).join(', '))
const RESERVE_KINDS = sql.raw(`'reserve', 'release'`)

/** A stock page row as the balance query returns it, before the mapper shapes it. */
export interface StockRowRecord extends Record<string, unknown> {
  partId: string
  sku: string
  name: string
  kind: PartKind
  unitOfMeasure: string
  shelfLocation: string | null
  stickLengths: number[]
  onHand: number
  reserved: number
  available: number
  reorderPoint: number
  reorderQuantity: number
  /** Per stick length (null: moves of pipe not tied to a stick length). */
  sticks: { stickLength: number | null; onHand: number; reserved: number }[]
  offcutCount: number
  offcutLength: string
  total: number
}

const SORT_COLUMNS: Record<StockListQuery['sort'], SQL> = {
  sku: sql`"sku"`,
  name: sql`"name"`,
  kind: sql`"kind"`,
  shelfLocation: sql`"shelfLocation"`,
  onHand: sql`"onHand"`,
  reserved: sql`"reserved"`,
  available: sql`"available"`,
  reorderPoint: sql`"reorderPoint"`,
}

function like(text: string) {
  return `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`
}

interface BalanceQuery {
  /** Restrict to these parts (ledger and parts alike). */
  partIds?: readonly string[]
  q?: string
  kind?: PartKind
  lowOnly?: boolean
  sort?: StockListQuery['sort']
  dir?: 'asc' | 'desc'
  limit?: number
  offset?: number
}

/**
 * Every balance of the stock page in one statement: the ledger grouped by part and stick length
 * (on-hand from the on-hand kinds, offcut moves apart; reserved from reserve + release), rolled up
 * per part, offcuts in stock from the offcut moves, joined to the active parts, then filtered, sorted
 * and paged in SQL with the full count alongside.
 */
export async function selectStockRows(db: Conn, query: BalanceQuery): Promise<StockRowRecord[]> {
  const moveFilter = query.partIds ? sql`where m.part_id in ${query.partIds.length ? query.partIds : ['00000000-0000-0000-0000-000000000000']}` : sql``
  const partFilters: SQL[] = [sql`p.active`]
  if (query.partIds) partFilters.push(query.partIds.length ? sql`p.id in ${query.partIds}` : sql`false`)
  if (query.q) {
    const pattern = like(query.q)
    partFilters.push(sql`(p.sku ilike ${pattern} or p.name ilike ${pattern} or coalesce(p.shelf_location, '') ilike ${pattern})`)
  }
  if (query.kind) partFilters.push(sql`p.kind = ${query.kind}`)
  const rowFilter = query.lowOnly ? sql`where "available" <= "reorderPoint"` : sql``
  const direction = query.dir === 'desc' ? sql`desc nulls last` : sql`asc nulls last`
  const order = sql`${SORT_COLUMNS[query.sort ?? 'sku']} ${direction}, "sku" asc`
  const page = query.limit !== undefined ? sql`limit ${query.limit} offset ${query.offset ?? 0}` : sql``

  const result = await db.execute<StockRowRecord>(sql`
    with by_stick as (
      select m.part_id, m.stick_length,
        coalesce(sum(m.quantity) filter (where m.kind in (${ON_HAND_KINDS}) and m.offcut_id is null), 0) as on_hand,
        coalesce(sum(m.quantity) filter (where m.kind in (${RESERVE_KINDS})), 0) as reserved
      from stock_moves m
      ${moveFilter}
      group by m.part_id, m.stick_length
    ),
    by_part as (
      select part_id, sum(on_hand) as on_hand, sum(reserved) as reserved,
        json_agg(json_build_object('stickLength', stick_length, 'onHand', on_hand::int, 'reserved', reserved::int) order by stick_length) as sticks
      from by_stick
      group by part_id
    ),
    offcuts_in_stock as (
      select m.part_id, sum(m.quantity) as count, sum(m.quantity::bigint * o.length) as total_length
      from stock_moves m join offcuts o on o.id = m.offcut_id
      ${moveFilter}
      group by m.part_id
    ),
    stock_rows as (
      select p.id as "partId", p.sku, p.name, p.kind, p.unit_of_measure as "unitOfMeasure",
        p.shelf_location as "shelfLocation", p.stick_lengths as "stickLengths",
        coalesce(b.on_hand, 0)::int as "onHand", coalesce(b.reserved, 0)::int as "reserved",
        (coalesce(b.on_hand, 0) - coalesce(b.reserved, 0))::int as "available",
        p.reorder_point as "reorderPoint", p.reorder_quantity as "reorderQuantity",
        coalesce(b.sticks, '[]'::json) as "sticks",
        coalesce(o.count, 0)::int as "offcutCount", coalesce(o.total_length, 0)::text as "offcutLength"
      from parts p
      left join by_part b on b.part_id = p.id
      left join offcuts_in_stock o on o.part_id = p.id
      where ${sql.join(partFilters, sql` and `)}
    )
    select *, (count(*) over ())::int as "total" from stock_rows
    ${rowFilter}
    order by ${order}
    ${page}
  `)
  return result.rows
}

/** A ledger line joined to who made it, with the part's running balances after it. */
export interface LedgerRecord extends Record<string, unknown> {
  id: string
  partId: string
  kind: NewStockMoveRow['kind']
  quantity: number
  stickLength: number | null
  offcutId: string | null
  lotId: string | null
  lotCode: string | null
  workOrderId: string | null
  reason: string | null
  reference: string | null
  createdAt: Date | string
  createdById: string | null
  createdByName: string | null
  onHandAfter: number
  reservedAfter: number
  totalMoves: number
}

/**
 * One part's moves, newest first, each with the on-hand and reserved balances right after it
 * (window sums over the whole ledger, computed before the limit), so the list explains the balance.
 */
export async function selectLedger(db: Conn, partId: string, limit: number): Promise<LedgerRecord[]> {
  const result = await db.execute<LedgerRecord>(sql`
    select m.id, m.part_id as "partId", m.kind, m.quantity, m.stick_length as "stickLength",
      m.offcut_id as "offcutId", m.work_order_id as "workOrderId", m.reason, m.reference, m.created_at as "createdAt",
      u.id as "createdById", u.name as "createdByName", m.lot_id as "lotId", lot.code as "lotCode",
      (sum(case when m.kind in (${ON_HAND_KINDS}) and m.offcut_id is null then m.quantity else 0 end)
        over (order by m.created_at, m.id rows unbounded preceding))::int as "onHandAfter",
      (sum(case when m.kind in (${RESERVE_KINDS}) then m.quantity else 0 end)
        over (order by m.created_at, m.id rows unbounded preceding))::int as "reservedAfter",
      (count(*) over ())::int as "totalMoves"
    from stock_moves m
    left join users u on u.id = m.created_by
    left join stock_lots lot on lot.id = m.lot_id
    where m.part_id = ${partId}
    order by m.created_at desc, m.id desc
    limit ${limit}
  `)
  return result.rows
}

/** On-hand and reserved per part and stick length, for the checks made under a lock. */
export interface BucketBalance extends Record<string, unknown> {
  partId: string
  stickLength: number | null
  onHand: number
  reserved: number
}

/** Balances per part and stick length of the given parts (offcut moves apart), in one grouped query. */
export async function selectBuckets(db: Conn, partIds: readonly string[]): Promise<BucketBalance[]> {
  if (partIds.length === 0) return []
  const result = await db.execute<BucketBalance>(sql`
    select m.part_id as "partId", m.stick_length as "stickLength",
      coalesce(sum(m.quantity) filter (where m.kind in (${ON_HAND_KINDS}) and m.offcut_id is null), 0)::int as "onHand",
      coalesce(sum(m.quantity) filter (where m.kind in (${RESERVE_KINDS})), 0)::int as "reserved"
    from stock_moves m
    where m.part_id in ${partIds}
    group by m.part_id, m.stick_length
  `)
  return result.rows
}

/** What one work order (or, with null, the manual holds) still has reserved, per part and stick length. */
export async function selectHeld(db: Conn, workOrderId: string | null, partIds?: readonly string[]): Promise<BucketBalance[]> {
  const result = await db.execute<BucketBalance>(sql`
    select m.part_id as "partId", m.stick_length as "stickLength", 0 as "onHand", sum(m.quantity)::int as "reserved"
    from stock_moves m
    where m.kind in (${RESERVE_KINDS})
      and m.work_order_id is not distinct from ${workOrderId}::uuid
      ${partIds ? sql`and m.part_id in ${partIds.length ? partIds : ['00000000-0000-0000-0000-000000000000']}` : sql``}
    group by m.part_id, m.stick_length
    having sum(m.quantity) <> 0
    order by m.part_id, m.stick_length nulls first
  `)
  return result.rows
}

/**
 * Locks the parts rows in one fixed order (sorted ids) so that two writers touching the same parts
 * queue instead of deadlocking, and returns them.
 */
export async function lockParts(tx: Tx, partIds: readonly string[]) {
  const ids = [...new Set(partIds)].sort()
  if (ids.length === 0) return []
  return tx.select().from(parts).where(inArray(parts.id, ids)).orderBy(asc(parts.id)).for('update')
}

/** Parts found by SKU (exact, as stored). */
export async function selectPartsBySku(db: Conn, skus: readonly string[]) {
  if (skus.length === 0) return []
  return db.select().from(parts).where(inArray(parts.sku, [...new Set(skus)]))
}

/** Active parts for the pickers of the stock forms, by SKU. */
export async function selectPartOptions(db: Conn) {
  return db
    .select({ id: parts.id, sku: parts.sku, name: parts.name, kind: parts.kind, unitOfMeasure: parts.unitOfMeasure, stickLengths: parts.stickLengths, lotTracked: parts.lotTracked })
    .from(parts)
    .where(eq(parts.active, true))
    .orderBy(asc(parts.sku))
}

/** Appends moves to the ledger (never updated or deleted) and returns them. */
export async function insertMoves(tx: Tx, rows: NewStockMoveRow[]) {
  if (rows.length === 0) return []
  return tx.insert(stockMoves).values(rows).returning()
}

