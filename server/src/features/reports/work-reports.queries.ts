import { sql } from 'drizzle-orm'
import type { ReportRange, ThroughputReport, WipReport } from '@kitwright/shared/reports'
import { dayStart, inRange, rangeEnd, type Conn } from './report-sql'

/**
 * Units waiting at each bench: the cut bench (waiting to cut), the build bench (cut, building or in
 * rework) and the pack bench (built, or packed and not yet shipped). A unit is stuck when its status
 * has not changed for `stuckDays` days; the oldest unit is the one released first (its age counts
 * from its release).
 */
export async function selectWip(db: Conn, stuckDays: number): Promise<WipReport['rows']> {
  const result = await db.execute<WipReport['rows'][number]>(sql`
    with open as (
      select w.id, w.serial, w.status, w.created_at, w.updated_at, w.order_id,
        case when w.status = 'waiting_cut' then 'cut' when w.status in ('cut', 'building', 'rework') then 'build' else 'pack' end as bench
      from work_orders w
      where w.status in ('waiting_cut', 'cut', 'building', 'rework', 'built', 'packed')
    ),
    ranked as (
      select o.*, row_number() over (partition by o.bench order by o.created_at, o.serial) as rank from open o
    )
    select b.bench as "bench",
      count(r.id)::int as "units",
      count(r.id) filter (where r.status = 'rework')::int as "rework",
      count(r.id) filter (where r.updated_at < now() - make_interval(days => ${stuckDays}))::int as "stuck",
      max(r.serial) filter (where r.rank = 1) as "oldestSerial",
      max(o.number) filter (where r.rank = 1) as "oldestOrderNumber",
      to_char(max(r.created_at) filter (where r.rank = 1) at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS"Z"') as "oldestReleasedAt",
      (extract(epoch from now() - max(r.created_at) filter (where r.rank = 1)) / 86400.0)::float8 as "oldestAgeDays"
    from (values ('cut', 1), ('build', 2), ('pack', 3)) as b(bench, pos)
    left join ranked r on r.bench = b.bench
    left join orders o on o.id = r.order_id and r.rank = 1
    group by b.bench, b.pos
    order by b.pos
  `)
  return result.rows
}

/**
 * Units built and units shipped on each day of the range (UTC), every day listed. A unit is built
 * at its last standing step tick or leak test (a built unit takes no more of either), counted when
 * it is built, packed or shipped now; spare packs, which skip the benches, are not built here. Only
 * events from the range's first day on are read: a unit built in the range has its last event
 * there, and the latest of its events from that day on is that last event.
 * Shipped units are the work orders in the parcels of shipments shipped that day.
 */
export async function selectThroughput(db: Conn, range: ReportRange): Promise<ThroughputReport['rows']> {
  const result = await db.execute<ThroughputReport['rows'][number]>(sql`
    with days as (
      select d::date as day from generate_series(${range.from}::date::timestamp, ${range.to}::date::timestamp, interval '1 day') d
    ),
    shipped as (
      select (s.shipped_at at time zone 'UTC')::date as day, sum(cardinality(p.work_order_ids))::int as units
      from shipments s join parcels p on p.shipment_id = s.id
      where s.status = 'shipped' and ${inRange(sql`s.shipped_at`, range)}
      group by 1
    ),
    events as (
      select t.work_order_id, t.ticked_at as at from build_step_ticks t where t.undone_at is null and t.ticked_at >= ${dayStart(range.from)}
      union all
      select l.work_order_id, l.tested_at from leak_tests l where l.tested_at >= ${dayStart(range.from)}
    ),
    built as (
      select e.work_order_id, max(e.at) as built_at
      from events e join work_orders w on w.id = e.work_order_id
      where w.status in ('built', 'packed', 'shipped')
      group by e.work_order_id
    ),
    built_days as (
      select (b.built_at at time zone 'UTC')::date as day, count(*)::int as units
      from built b where b.built_at < ${rangeEnd(range)}
      group by 1
    )
    select to_char(d.day, 'YYYY-MM-DD') as "day", coalesce(b.units, 0) as "unitsBuilt", coalesce(s.units, 0) as "unitsShipped"
    from days d
    left join built_days b on b.day = d.day
    left join shipped s on s.day = d.day
    order by d.day
  `)
  return result.rows
}
