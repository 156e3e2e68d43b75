import { sql } from 'drizzle-orm'
import type { LateOrdersReport, LeadTimeReport, OrderStatesReport, ReportRange } from '@kitwright/shared/reports'
import { inRange, utcWeek, type Conn } from './report-sql'

/** How many orders are in each state, every state listed (zero included) in the enum's order. */
export async function selectOrderStates(db: Conn): Promise<OrderStatesReport['rows']> {
  const result = await db.execute<OrderStatesReport['rows'][number]>(sql`
    select s.status::text as "status", count(o.id)::int as "count"
    from unnest(enum_range(null::order_status)) with ordinality as s(status, pos)
    left join orders o on o.status = s.status
    group by s.status, s.pos
    order by s.pos
  `)
  return result.rows
}

type LateRow = LateOrdersReport['rows'][number] & { total: number }

/**
 * Orders whose promised ship date is before `today` (UTC) and that are neither shipped nor
 * cancelled (a partly shipped order is still late), oldest promise first; `total` counts them all
 * whatever the limit. Units are the order's kit units; shipped units are its shipped work orders.
 */
export async function selectLateOrders(db: Conn, today: string, limit: number | null): Promise<{ total: number; rows: LateOrdersReport['rows'] }> {
  const result = await db.execute<LateRow>(sql`
    with late as (
      select o.id, o.number, o.customer_name, o.status, o.placed_at, o.promised_ship_date
      from orders o
      where o.promised_ship_date < ${today}::date and o.status not in ('shipped', 'cancelled')
    ),
    units as (
      select l.order_id, sum(l.quantity)::int as n from order_lines l where l.order_id in (select id from late) group by l.order_id
    ),
    shipped as (
      select w.order_id, count(*)::int as n from work_orders w where w.order_id in (select id from late) and w.status = 'shipped' group by w.order_id
    )
    select l.id as "orderId", l.number, l.customer_name as "customerName", l.status,
      to_char(l.placed_at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS"Z"') as "placedAt",
      to_char(l.promised_ship_date, 'YYYY-MM-DD') as "promisedShipDate",
      (${today}::date - l.promised_ship_date)::int as "daysLate",
      coalesce(u.n, 0) as "units", coalesce(s.n, 0) as "unitsShipped",
      count(*) over ()::int as "total"
    from late l
    left join units u on u.order_id = l.id
    left join shipped s on s.order_id = l.id
    order by l.promised_ship_date, l.placed_at, l.number
    ${limit === null ? sql`` : sql`limit ${limit}`}
  `)
  const total = result.rows[0]?.total ?? 0
  return { total, rows: result.rows.map(({ total: _total, ...row }) => row) }
}

type LeadRow = LeadTimeReport['rows'][number] & { weekStart: string | null }

/**
 * Days from paid to shipped for orders shipped in full within the range. Paid is the store's
 * payment event when the order came in unpaid and was paid later, else the time it was placed.
 * One row per week (Monday start, UTC) of the ship date, every week of the range listed, and an
 * overall row (ROLLUP's grand total).
 */
export async function selectLeadTimes(db: Conn, range: ReportRange): Promise<Pick<LeadTimeReport, 'overall' | 'rows'>> {
  const result = await db.execute<LeadRow>(sql`
    with shipped as (
      select o.id, o.shipped_at,
        extract(epoch from o.shipped_at - coalesce(p.paid_at, o.placed_at)) / 86400.0 as days
      from orders o
      left join (
        select e.order_id, min(e.created_at) as paid_at from order_events e where e.kind = 'payment' group by e.order_id
      ) p on p.order_id = o.id
      where o.status = 'shipped' and ${inRange(sql`o.shipped_at`, range)}
    ),
    per_week as (
      select ${utcWeek(sql`s.shipped_at`)} as week, count(*)::int as orders,
        avg(s.days)::float8 as average, percentile_cont(0.5) within group (order by s.days)::float8 as median, max(s.days)::float8 as longest
      from shipped s
      group by rollup (1)
    ),
    weeks as (
      select w::date as week
      from generate_series(date_trunc('week', ${range.from}::date::timestamp), ${range.to}::date::timestamp, interval '1 week') w
    )
    select to_char(w.week, 'YYYY-MM-DD') as "weekStart", coalesce(p.orders, 0) as "orders",
      p.average as "averageDays", p.median as "medianDays", p.longest as "longestDays"
    from weeks w left join per_week p on p.week = w.week
    union all
    select null, coalesce(max(p.orders), 0), max(p.average), max(p.median), max(p.longest)
    from per_week p where p.week is null
    order by 1 nulls last
  `)
  const overall = result.rows.find((r) => r.weekStart === null)
  const rows = result.rows.filter((r): r is LeadRow & { weekStart: string } => r.weekStart !== null)
  const figures = (r: LeadRow | undefined) => ({ orders: r?.orders ?? 0, averageDays: r?.averageDays ?? null, medianDays: r?.medianDays ?? null, longestDays: r?.longestDays ?? null })
  return { overall: figures(overall), rows: rows.map((r) => ({ weekStart: r.weekStart, ...figures(r) })) }
}
