import { sql } from 'drizzle-orm'
import type { ShortagesQuery } from '@kitwright/shared/work-orders'
import type { Db, Tx } from '../../db/client'

type Conn = Db | Tx

/** A shortages row as the query returns it. */
export interface ShortageRecord extends Record<string, unknown> {
  partId: string
  sku: string
  name: string
  kind: 'stock_length' | 'hardware' | 'packaging'
  unitOfMeasure: string
  needed: number
  reserved: number
  available: number
  short: number
  workOrderCount: number
  cutLength: string | null
  stickLength: number | null
  supplier: string | null
  leadTimeDays: number | null
  reorderQuantity: number
  suggestedOrder: number
}

/** Work orders still to be packed: they still need their parts. */
export const OPEN_WORK_ORDER_STATUSES = ['waiting_cut', 'cut', 'building', 'rework', 'built'] as const
const OPEN = sql.raw(OPEN_WORK_ORDER_STATUSES.map((s) => `'${s}'`).join(', '))

/**
 * Every part the open work orders need, in one statement. Hardware and packaging: the BOM × units
 * of open work orders, less what those work orders consumed; reserved = their reservations;
 * available = on hand − every reservation. Pipe (reserved only when a cut run is published): the
 * cut parts of work orders still waiting for cutting, each piece plus one kerf, over the longest
 * stick the part comes in, rounded up to whole sticks; offcuts in stock are not counted (an estimate
 * that errs towards buying). short = needed − reserved − available, when above zero; the suggested
 * order is the shortfall, or the part's reorder quantity when that is more.
 */
export async function selectShortages(db: Conn, q: ShortagesQuery): Promise<ShortageRecord[]> {
  const onlyShort = q.only === 'short' ? sql`where r."short" > 0` : sql``
  const result = await db.execute<ShortageRecord>(sql`
    with open_wo as (
      select w.id, w.kit_revision_id, w.status from work_orders w where w.status in (${OPEN})
    ),
    settings as (
      select coalesce((select kerf from shop_settings where id = 1), 0) as kerf
    ),
    bom_need as (
      select b.part_id, sum(b.quantity)::bigint as needed, count(distinct w.id)::int as wo_count
      from open_wo w join bom_lines b on b.revision_id = w.kit_revision_id
      group by b.part_id
    ),
    pipe_need as (
      select c.part_id, sum((c.length + s.kerf)::bigint * c.quantity) as cut_length, count(distinct w.id)::int as wo_count
      from open_wo w join cut_parts c on c.revision_id = w.kit_revision_id cross join settings s
      where w.status = 'waiting_cut'
      group by c.part_id
    ),
    wo_moves as (
      select m.part_id,
        coalesce(sum(m.quantity) filter (where m.kind in ('reserve', 'release')), 0) as reserved,
        coalesce(-sum(m.quantity) filter (where m.kind = 'consume'), 0) as consumed
      from stock_moves m join open_wo w on w.id = m.work_order_id
      group by m.part_id
    ),
    balances as (
      select m.part_id,
        coalesce(sum(m.quantity) filter (where m.kind in ('receive', 'adjust', 'consume', 'offcut_in', 'offcut_out', 'ship') and m.offcut_id is null), 0) as on_hand,
        coalesce(sum(m.quantity) filter (where m.kind in ('reserve', 'release')), 0) as reserved
      from stock_moves m
      where m.part_id in (select part_id from bom_need union select part_id from pipe_need)
      group by m.part_id
    ),
    rows as (
      select p.id as "partId", p.sku, p.name, p.kind, p.unit_of_measure as "unitOfMeasure",
        case when p.kind = 'stock_length'
          then ceil(coalesce(pn.cut_length, 0)::numeric / nullif((select max(l) from unnest(p.stick_lengths) l), 0))::int
          else greatest(coalesce(bn.needed, 0) - coalesce(wm.consumed, 0), 0)::int
        end as "needed",
        coalesce(wm.reserved, 0)::int as "reserved",
        greatest(coalesce(bal.on_hand, 0) - coalesce(bal.reserved, 0), 0)::int as "available",
        coalesce(bn.wo_count, pn.wo_count, 0)::int as "workOrderCount",
        pn.cut_length::text as "cutLength",
        case when p.kind = 'stock_length' then (select max(l) from unnest(p.stick_lengths) l) end as "stickLength",
        p.supplier, p.lead_time_days as "leadTimeDays", p.reorder_quantity as "reorderQuantity"
      from parts p
      left join bom_need bn on bn.part_id = p.id
      left join pipe_need pn on pn.part_id = p.id
      left join wo_moves wm on wm.part_id = p.id
      left join balances bal on bal.part_id = p.id
      where bn.part_id is not null or pn.part_id is not null
    )
    select r.*, (case when r."short" > 0 then greatest(r."short", r."reorderQuantity") else 0 end)::int as "suggestedOrder"
    from (select *, greatest(coalesce("needed", 0) - "reserved" - "available", 0)::int as "short" from rows) r
    ${onlyShort}
    order by r."short" desc, r.sku asc
  `)
  return result.rows
}

export async function countOpenWorkOrders(db: Conn): Promise<number> {
  const result = await db.execute<{ n: number }>(sql`select count(*)::int as n from work_orders where status in (${OPEN})`)
  return result.rows[0]?.n ?? 0
}
