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
  /** Ordered − received on open purchase orders (sent or partly received). */
  onOrder: number
  /** Those purchase orders: number, expected date and what is still to come of this part. */
  onOrderPurchaseOrders: { number: string; expectedDate: string | null; outstanding: number }[]
  workOrderCount: number
  /** Open orders (released or not yet) that need the part, oldest need first. */
  orderNumbers: string[]
  /** The earliest ship date among them (a work order's due date, or an unreleased order's promise). */
  neededBy: string | null
  cutLength: string | null
  stickLength: number | null
  supplier: string | null
  supplierId: string | null
  leadTimeDays: number | null
  reorderPoint: number
  reorderQuantity: number
  belowReorderPoint: boolean
  suggestedOrder: number
}

/** Work orders still to be packed: they still need their parts. */
export const OPEN_WORK_ORDER_STATUSES = ['waiting_cut', 'cut', 'building', 'rework', 'built'] as const
const OPEN = sql.raw(OPEN_WORK_ORDER_STATUSES.map((s) => `'${s}'`).join(', '))

/**
 * Every part the open demand needs, in one statement. Open demand is the open work orders of
 * released orders, and the orders received but not yet released (on hold or not, paid or not):
 * each of their lines at the kit's newest released revision, as a release would make it.
 * Hardware and packaging: BOM × units, less what the work orders consumed; reserved = the work
 * orders' reservations; available = on hand − every reservation. Pipe (reserved only when a cut run
 * is published): the cut parts of units not yet cut, each piece plus one kerf, over the longest
 * stick the part comes in, rounded up to whole sticks; offcuts in stock are not counted (an estimate
 * that errs towards buying). On order = ordered − received on open purchase orders (sent or partly
 * received; a line closed short expects nothing more). short = needed − reserved − available − on
 * order, when above zero. A part whose free stock is at or below its reorder point is listed too,
 * needed or not; it is below the point when free stock plus what is on order is at or below it. The
 * suggested order is the shortfall, or the reorder quantity when that is more (or when below the
 * reorder point).
 */
export async function selectShortages(db: Conn, q: ShortagesQuery): Promise<ShortageRecord[]> {
  const onlyShort = q.only === 'short' ? sql`where r."short" > 0 or r."belowReorderPoint"` : sql``
  const result = await db.execute<ShortageRecord>(sql`
    with newest_revision as (
      select distinct on (kr.kit_id) kr.kit_id, kr.id as revision_id
      from kit_revisions kr where kr.status = 'released'
      order by kr.kit_id, kr.released_at desc nulls last, kr.created_at desc
    ),
    -- One row per unit of demand: a work order still to be packed, or a line of an order still to be released.
    demand as (
      select w.id as unit_id, w.kit_revision_id as revision_id, 1 as units, w.status::text as status, w.order_id, w.due_date as needed_by
      from work_orders w where w.status in (${OPEN})
      union all
      select l.id, nr.revision_id, l.quantity, 'unreleased', o.id, o.promised_ship_date
      from orders o join order_lines l on l.order_id = o.id join newest_revision nr on nr.kit_id = l.kit_id
      where o.status = 'open'
    ),
    settings as (
      select coalesce((select kerf from shop_settings where id = 1), 0) as kerf
    ),
    bom_need as (
      select b.part_id, sum(b.quantity * d.units)::bigint as needed,
        count(distinct d.unit_id) filter (where d.status <> 'unreleased')::int as wo_count,
        array_agg(distinct d.order_id) as order_ids, min(d.needed_by) as needed_by
      from demand d join bom_lines b on b.revision_id = d.revision_id
      group by b.part_id
    ),
    pipe_need as (
      select c.part_id, sum((c.length + s.kerf)::bigint * c.quantity * d.units) as cut_length,
        count(distinct d.unit_id) filter (where d.status <> 'unreleased')::int as wo_count,
        array_agg(distinct d.order_id) as order_ids, min(d.needed_by) as needed_by
      from demand d join cut_parts c on c.revision_id = d.revision_id cross join settings s
      where d.status in ('waiting_cut', 'unreleased')
      group by c.part_id
    ),
    wo_moves as (
      select m.part_id,
        coalesce(sum(m.quantity) filter (where m.kind in ('reserve', 'release')), 0) as reserved,
        coalesce(-sum(m.quantity) filter (where m.kind = 'consume'), 0) as consumed
      from stock_moves m join work_orders w on w.id = m.work_order_id and w.status in (${OPEN})
      group by m.part_id
    ),
    on_order as (
      select l.part_id, sum(l.quantity - l.received)::int as on_order,
        jsonb_agg(jsonb_build_object('number', po.number, 'expectedDate', to_char(po.expected_date, 'YYYY-MM-DD'), 'outstanding', l.quantity - l.received)
          order by po.expected_date nulls last, po.number) as pos
      from purchase_order_lines l join purchase_orders po on po.id = l.purchase_order_id
      where po.status in ('sent', 'partly_received') and l.closed_short_reason is null and l.quantity > l.received
      group by l.part_id
    ),
    balances as (
      select m.part_id,
        coalesce(sum(m.quantity) filter (where m.kind in ('receive', 'adjust', 'consume', 'offcut_in', 'offcut_out', 'ship') and m.offcut_id is null), 0) as on_hand,
        coalesce(sum(m.quantity) filter (where m.kind in ('reserve', 'release')), 0) as reserved
      from stock_moves m
      group by m.part_id
    ),
    rows as (
      select p.id as "partId", p.sku, p.name, p.kind, p.unit_of_measure as "unitOfMeasure",
        case when p.kind = 'stock_length'
          then coalesce(ceil(coalesce(pn.cut_length, 0)::numeric / nullif((select max(l) from unnest(p.stick_lengths) l), 0)), 0)::int
          else greatest(coalesce(bn.needed, 0) - coalesce(wm.consumed, 0), 0)::int
        end as "needed",
        coalesce(wm.reserved, 0)::int as "reserved",
        greatest(coalesce(bal.on_hand, 0) - coalesce(bal.reserved, 0), 0)::int as "available",
        coalesce(bn.wo_count, pn.wo_count, 0)::int as "workOrderCount",
        coalesce(
          (select array_agg(o.number order by o.promised_ship_date nulls last, o.placed_at) from orders o where o.id = any(coalesce(bn.order_ids, pn.order_ids))),
          '{}'
        ) as "orderNumbers",
        to_char(coalesce(bn.needed_by, pn.needed_by), 'YYYY-MM-DD') as "neededBy",
        pn.cut_length::text as "cutLength",
        case when p.kind = 'stock_length' then (select max(l) from unnest(p.stick_lengths) l) end as "stickLength",
        coalesce(oo.on_order, 0)::int as "onOrder", coalesce(oo.pos, '[]'::jsonb) as "onOrderPurchaseOrders",
        coalesce(sup.name, p.supplier) as "supplier", p.supplier_id as "supplierId",
        coalesce(sup.lead_time_days, p.lead_time_days) as "leadTimeDays", p.reorder_point as "reorderPoint", p.reorder_quantity as "reorderQuantity"
      from parts p
      left join bom_need bn on bn.part_id = p.id
      left join pipe_need pn on pn.part_id = p.id
      left join wo_moves wm on wm.part_id = p.id
      left join balances bal on bal.part_id = p.id
      left join on_order oo on oo.part_id = p.id
      left join suppliers sup on sup.id = p.supplier_id
      where p.active and (bn.part_id is not null or pn.part_id is not null
        or (p.reorder_point > 0 and coalesce(bal.on_hand, 0) - coalesce(bal.reserved, 0) <= p.reorder_point))
    )
    select r.*, (case when r."short" > 0 or r."belowReorderPoint" then greatest(r."short", r."reorderQuantity") else 0 end)::int as "suggestedOrder"
    from (
      select *, greatest(coalesce("needed", 0) - "reserved" - "available" - "onOrder", 0)::int as "short",
        ("reorderPoint" > 0 and "available" + "onOrder" <= "reorderPoint") as "belowReorderPoint"
      from rows
    ) r
    ${onlyShort}
    order by r."short" desc, r."neededBy" asc nulls last, r.sku asc
  `)
  return result.rows
}

/** How much open demand there is: work orders still to be packed, and orders still to be released. */
export async function countOpenDemand(db: Conn): Promise<{ openWorkOrders: number; unreleasedOrders: number }> {
  const result = await db.execute<{ openWorkOrders: number; unreleasedOrders: number }>(sql`
    select (select count(*) from work_orders where status in (${OPEN}))::int as "openWorkOrders",
      (select count(*) from orders where status = 'open')::int as "unreleasedOrders"`)
  return result.rows[0] ?? { openWorkOrders: 0, unreleasedOrders: 0 }
}
