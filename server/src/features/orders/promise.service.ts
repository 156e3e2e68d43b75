import { sql } from 'drizzle-orm'
import { promiseShipDate, type Bench, type PromiseResult } from '@kitwright/shared/domain/promise-date'
import { addWorkingDays, utcDay } from '@kitwright/shared/domain/working-days'
import type { Db, Tx } from '../../db/client'
import { OPEN_WORK_ORDER_STATUSES } from '../work-orders/shortages.queries'

type Conn = Db | Tx
const OPEN = sql.raw(OPEN_WORK_ORDER_STATUSES.map((s) => `'${s}'`).join(', '))
/** How far back the benches' history is read for their minutes per unit, and how many units it takes to trust it. */
const HISTORY_DAYS = 90
const MIN_SAMPLES = 5

/** A line of the incoming order: its kit (null when it maps to none) and how many. */
export interface PromiseLine {
  kitId: string | null
  quantity: number
}

export interface OrderPromise extends PromiseResult {
  leadTimeDays: number
  /** Where each bench's minutes per unit came from. */
  minutesPerUnit: Record<Bench, { minutes: number; measured: boolean }>
}

/**
 * The ship-by date for an order arriving now without one, from the queue (see domain/promise-date):
 * units ahead at each bench (open work orders, and every order received but not yet released), each
 * bench's minutes per unit (the median of its recent history when there is enough, else the shop's
 * setting), the working day from the settings, and the parts the order would find short (they come
 * after the supplier's lead time). Never sooner than the shop's minimum lead time.
 */
export async function promiseForOrder(db: Conn, lines: readonly PromiseLine[], placedAt: Date | string, now = new Date()): Promise<OrderPromise> {
  const [settings] = (await db.execute<{ leadTimeDays: number; startHour: number; hours: number; cut: number; build: number; pack: number }>(sql`
    select lead_time_days as "leadTimeDays", workday_start_hour_utc as "startHour", workday_hours as "hours",
      cut_minutes_per_unit as "cut", build_minutes_per_unit as "build", pack_minutes_per_unit as "pack"
    from shop_settings where id = 1`)).rows
  const s = settings ?? { leadTimeDays: 7, startHour: 8, hours: 8, cut: 15, build: 60, pack: 15 }
  const measured = await measuredMinutes(db, s.hours * 60)
  const minutesPerUnit = {
    cut: measured.cut ? { minutes: measured.cut, measured: true } : { minutes: s.cut, measured: false },
    build: measured.build ? { minutes: measured.build, measured: true } : { minutes: s.build, measured: false },
    pack: { minutes: s.pack, measured: false },
  }

  const ahead = (await db.execute<{ cut: number; build: number; pack: number }>(sql`
    with newest_revision as (
      select distinct on (kr.kit_id) kr.kit_id, kr.id as revision_id
      from kit_revisions kr where kr.status = 'released'
      order by kr.kit_id, kr.released_at desc nulls last, kr.created_at desc
    ),
    waiting as (
      -- Units of orders not yet released, at the revision a release would use; a revision with no cut parts skips cut and build.
      select l.quantity, exists (select 1 from cut_parts c where c.revision_id = nr.revision_id) as benches
      from orders o join order_lines l on l.order_id = o.id join newest_revision nr on nr.kit_id = l.kit_id
      where o.status = 'open'
    )
    select
      ((select count(*) from work_orders where status = 'waiting_cut') + coalesce((select sum(quantity) filter (where benches) from waiting), 0))::int as cut,
      ((select count(*) from work_orders where status in ('waiting_cut', 'cut', 'building', 'rework')) + coalesce((select sum(quantity) filter (where benches) from waiting), 0))::int as build,
      ((select count(*) from work_orders where status in (${OPEN})) + coalesce((select sum(quantity) from waiting), 0))::int as pack
  `)).rows[0] ?? { cut: 0, build: 0, pack: 0 }

  const own = await ownUnitsAndShortParts(db, lines, utcDay(now))
  const minimumDate = addWorkingDays(utcDay(placedAt), s.leadTimeDays)
  const result = promiseShipDate({
    now: now.toISOString(),
    dayStartHourUtc: s.startHour,
    hoursPerDay: s.hours,
    minutesPerUnit: { cut: minutesPerUnit.cut.minutes, build: minutesPerUnit.build.minutes, pack: minutesPerUnit.pack.minutes },
    unitsAhead: ahead,
    ownUnits: own.units,
    shortParts: own.shortParts,
    minimumDate,
    minimumWorkingDays: s.leadTimeDays,
  })
  return { ...result, leadTimeDays: s.leadTimeDays, minutesPerUnit }
}

/**
 * Minutes per unit from the benches' recent history, or null where there is too little of it.
 * Build: per unit, first step tick to last (spans longer than a working day are left out: the unit
 * waited overnight). Cut: per published run, first piece cut to last, over the units in it. The
 * median, so one slow day does not move every promise. The pack bench keeps no start time, so its
 * figure is always the setting.
 */
async function measuredMinutes(db: Conn, dayMinutes: number): Promise<{ cut: number | null; build: number | null }> {
  const [row] = (await db.execute<{ build: number | null; buildSamples: number; cut: number | null; cutSamples: number }>(sql`
    with build_spans as (
      select extract(epoch from max(t.ticked_at) - min(t.ticked_at)) / 60 as minutes
      from build_step_ticks t
      where t.undone_at is null and t.ticked_at > now() - make_interval(days => ${HISTORY_DAYS})
      group by t.work_order_id
      having count(*) > 1
    ),
    cut_spans as (
      select extract(epoch from max(c.cut_at) - min(c.cut_at)) / 60 / count(distinct c.work_order_id) as minutes
      from cut_run_cuts c
      where c.cut_at > now() - make_interval(days => ${HISTORY_DAYS})
      group by c.cut_run_id
      having count(*) > 1
    )
    select
      (select percentile_cont(0.5) within group (order by minutes) from build_spans where minutes > 0 and minutes <= ${dayMinutes}) as build,
      (select count(*) from build_spans where minutes > 0 and minutes <= ${dayMinutes})::int as "buildSamples",
      (select percentile_cont(0.5) within group (order by minutes) from cut_spans where minutes > 0 and minutes <= ${dayMinutes}) as cut,
      (select count(*) from cut_spans where minutes > 0 and minutes <= ${dayMinutes})::int as "cutSamples"
  `)).rows
  const pick = (v: number | null, n: number) => (v !== null && n >= MIN_SAMPLES ? Math.max(1, Math.round(Number(v))) : null)
  return { build: pick(row?.build ?? null, row?.buildSamples ?? 0), cut: pick(row?.cut ?? null, row?.cutSamples ?? 0) }
}

/**
 * The order's own units per bench, and the hardware it would find short: what its units need beyond
 * what is left free once every open order ahead has its share. Such a part comes the supplier's lead
 * time after today (or the shop's, when the part has none on record). Pipe is left out: it is
 * planned by the stick with offcuts, and a short stick shows on the shortages page.
 */
async function ownUnitsAndShortParts(db: Conn, lines: readonly PromiseLine[], today: string) {
  const kitIds = [...new Set(lines.flatMap((l) => (l.kitId ? [l.kitId] : [])))]
  const units: Record<Bench, number> = { cut: 0, build: 0, pack: 0 }
  const shortParts: { name: string; arrives: string; how: string }[] = []
  for (const l of lines) if (!l.kitId) units.pack += l.quantity // maps to no kit yet: it still has to be packed
  if (kitIds.length === 0) return { units, shortParts }

  const idList = sql.join(kitIds.map((id) => sql`${id}::uuid`), sql`, `)
  const revisions = (await db.execute<{ kitId: string; revisionId: string; benches: boolean }>(sql`
    select distinct on (kr.kit_id) kr.kit_id as "kitId", kr.id as "revisionId",
      exists (select 1 from cut_parts c where c.revision_id = kr.id) as benches
    from kit_revisions kr where kr.status = 'released' and kr.kit_id in (${idList})
    order by kr.kit_id, kr.released_at desc nulls last, kr.created_at desc`)).rows
  const byKit = new Map(revisions.map((r) => [r.kitId, r]))
  const need = new Map<string, number>()
  for (const l of lines) {
    if (!l.kitId) continue
    const rev = byKit.get(l.kitId)
    if (!rev || rev.benches) {
      units.cut += l.quantity
      units.build += l.quantity
    }
    units.pack += l.quantity
    if (rev) need.set(rev.revisionId, (need.get(rev.revisionId) ?? 0) + l.quantity)
  }
  if (need.size === 0) return { units, shortParts }

  const values = sql.join([...need.entries()].map(([rev, qty]) => sql`(${rev}::uuid, ${qty}::int)`), sql`, `)
  const rows = (await db.execute<{ name: string; own: number; spare: number; leadTimeDays: number | null; shopLeadTime: number }>(sql`
    with own as (
      select b.part_id, sum(b.quantity * n.qty)::int as own
      from (values ${values}) as n(revision_id, qty) join bom_lines b on b.revision_id = n.revision_id
      group by b.part_id
    ),
    demand as (
      -- What every open order ahead still needs of these parts, as the shortages page counts it.
      select b.part_id, sum(b.quantity)::int as needed
      from work_orders w join bom_lines b on b.revision_id = w.kit_revision_id
      where w.status in (${OPEN}) and b.part_id in (select part_id from own)
      group by b.part_id
    ),
    waiting as (
      select b.part_id, sum(b.quantity * l.quantity)::int as needed
      from orders o join order_lines l on l.order_id = o.id
      join lateral (select kr.id from kit_revisions kr where kr.kit_id = l.kit_id and kr.status = 'released' order by kr.released_at desc nulls last, kr.created_at desc limit 1) r on true
      join bom_lines b on b.revision_id = r.id
      where o.status = 'open' and b.part_id in (select part_id from own)
      group by b.part_id
    ),
    moves as (
      select m.part_id,
        coalesce(sum(m.quantity) filter (where m.kind in ('receive', 'adjust', 'consume', 'offcut_in', 'offcut_out', 'ship') and m.offcut_id is null), 0) as on_hand,
        coalesce(-sum(m.quantity) filter (where m.kind = 'consume' and w.status in (${OPEN})), 0) as consumed_ahead
      from stock_moves m left join work_orders w on w.id = m.work_order_id
      where m.part_id in (select part_id from own)
      group by m.part_id
    )
    select p.name, own.own,
      (coalesce(mv.on_hand, 0) - greatest(coalesce(d.needed, 0) - coalesce(mv.consumed_ahead, 0), 0) - coalesce(wt.needed, 0))::int as spare,
      p.lead_time_days as "leadTimeDays", (select lead_time_days from shop_settings where id = 1) as "shopLeadTime"
    from own join parts p on p.id = own.part_id
    left join demand d on d.part_id = own.part_id
    left join waiting wt on wt.part_id = own.part_id
    left join moves mv on mv.part_id = own.part_id
    where p.kind <> 'stock_length'
  `)).rows
  for (const r of rows) {
    if (r.own <= Math.max(0, r.spare)) continue
    const days = r.leadTimeDays ?? r.shopLeadTime ?? 7
    const arrives = new Date(Date.parse(`${today}T00:00:00Z`) + days * 86_400_000).toISOString().slice(0, 10)
    shortParts.push({ name: r.name, arrives, how: r.leadTimeDays !== null ? `the supplier's lead time of ${days} days` : `no lead time on record; the shop's ${days} days assumed` })
  }
  return { units, shortParts }
}
