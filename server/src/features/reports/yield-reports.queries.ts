import { sql, type SQL } from 'drizzle-orm'
import type { CutRunYieldReport, FirstPassYieldReport, ReportRange, YieldOverTimeReport } from '@kitwright/shared/reports'
import { inRange, utcWeek, type Conn } from './report-sql'

/**
 * The cut runs finished (status done) in the range, each with its planned and actual lengths.
 * Material yield = piece length ÷ pipe consumed, where consumed is the length of every stick and
 * offcut taken from the rack less the remnants put back on it as offcuts (they are used again, so
 * they are not lost). Planned figures are the published plan's totals. Actual figures count a
 * damaged (miscut) stick's whole length as consumed and only the pieces that came off it whole;
 * pieces spoiled with it were cut again on other sticks (`spoiledPieces`).
 */
function finishedRuns(range: ReportRange): SQL {
  return sql`
    runs as (
      select r.id, r.number, r.completed_at, r.piece_length::float8 as planned_pieces,
        (r.length_used - r.offcut_length)::float8 as planned_consumed
      from cut_runs r
      where r.status = 'done' and ${inRange(sql`r.completed_at`, range)}
    ),
    sticks as (
      select s.cut_run_id,
        sum(s.length - case when s.status = 'done' and s.offcut_id is not null then s.remnant else 0 end)::float8 as consumed,
        count(*) filter (where s.status = 'damaged')::int as damaged
      from cut_run_sticks s
      where s.cut_run_id in (select id from runs) and s.status in ('done', 'damaged')
      group by s.cut_run_id
    ),
    cuts as (
      select c.cut_run_id,
        coalesce(sum(c.length) filter (where c.status = 'cut'), 0)::float8 as pieces,
        count(*) filter (where c.status = 'replanned' and c.cut_at is not null)::int as spoiled
      from cut_run_cuts c
      where c.cut_run_id in (select id from runs)
      group by c.cut_run_id
    ),
    run_yield as (
      select r.id, r.number, r.completed_at, r.planned_pieces, r.planned_consumed,
        coalesce(c.pieces, 0) as actual_pieces, coalesce(s.consumed, 0) as actual_consumed,
        coalesce(s.damaged, 0) as damaged, coalesce(c.spoiled, 0) as spoiled
      from runs r left join sticks s on s.cut_run_id = r.id left join cuts c on c.cut_run_id = r.id
    )`
}

interface RunYieldRecord extends Record<string, unknown> {
  cutRunId: string
  number: string
  completedAt: string
  plannedPieces: number
  plannedConsumed: number
  actualPieces: number
  actualConsumed: number
  damagedSticks: number
  spoiledPieces: number
}

const share = (part: number, whole: number) => (whole > 0 ? part / whole : null)

/** Planned against actual yield of each cut run finished in the range, newest first. */
export async function selectCutRunYield(db: Conn, range: ReportRange): Promise<CutRunYieldReport['rows']> {
  const result = await db.execute<RunYieldRecord>(sql`
    with ${finishedRuns(range)}
    select id as "cutRunId", number, to_char(completed_at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS"Z"') as "completedAt",
      planned_pieces as "plannedPieces", planned_consumed as "plannedConsumed",
      actual_pieces as "actualPieces", actual_consumed as "actualConsumed",
      damaged as "damagedSticks", spoiled as "spoiledPieces"
    from run_yield
    order by completed_at desc, number desc
  `)
  return result.rows.map((r) => ({
    cutRunId: r.cutRunId,
    number: r.number,
    completedAt: r.completedAt,
    planned: { pieceLength: r.plannedPieces, consumedLength: r.plannedConsumed, yield: share(r.plannedPieces, r.plannedConsumed) },
    actual: { pieceLength: r.actualPieces, consumedLength: r.actualConsumed, yield: share(r.actualPieces, r.actualConsumed) },
    damagedSticks: r.damagedSticks,
    spoiledPieces: r.spoiledPieces,
  }))
}

/**
 * Yield of the runs finished each week (Monday start, UTC), every week of the range listed: the
 * sum of pieces over the sum of pipe consumed (a long run weighs more than a short one).
 */
export async function selectYieldOverTime(db: Conn, range: ReportRange): Promise<YieldOverTimeReport['rows']> {
  const result = await db.execute<YieldOverTimeReport['rows'][number]>(sql`
    with ${finishedRuns(range)},
    per_week as (
      select ${utcWeek(sql`completed_at`)} as week, count(*)::int as runs,
        sum(planned_pieces) / nullif(sum(planned_consumed), 0) as planned,
        sum(actual_pieces) / nullif(sum(actual_consumed), 0) as actual,
        sum(damaged)::int as damaged, sum(spoiled)::int as spoiled
      from run_yield group by 1
    ),
    weeks as (
      select w::date as week from generate_series(date_trunc('week', ${range.from}::date::timestamp), ${range.to}::date::timestamp, interval '1 week') w
    )
    select to_char(w.week, 'YYYY-MM-DD') as "weekStart", coalesce(p.runs, 0) as "runs",
      p.planned::float8 as "plannedYield", p.actual::float8 as "actualYield",
      coalesce(p.damaged, 0) as "damagedSticks", coalesce(p.spoiled, 0) as "spoiledPieces"
    from weeks w left join per_week p on p.week = w.week
    order by w.week
  `)
  return result.rows
}

/**
 * Per kit revision, the units whose first leak test (attempt 1) falls in the range: how many, and
 * how many passed it. A retest after rework never counts towards the first pass.
 */
export async function selectFirstPassYield(db: Conn, range: ReportRange): Promise<FirstPassYieldReport['rows']> {
  const result = await db.execute<Omit<FirstPassYieldReport['rows'][number], 'yield'>>(sql`
    select r.id as "kitRevisionId", k.sku as "kitSku", k.name as "kitName", r.code as "revisionCode",
      count(*)::int as "unitsTested", count(*) filter (where t.passed)::int as "passedFirst"
    from leak_tests t
    join work_orders w on w.id = t.work_order_id
    join kit_revisions r on r.id = w.kit_revision_id
    join kits k on k.id = r.kit_id
    where t.attempt = 1 and ${inRange(sql`t.tested_at`, range)}
    group by r.id, k.sku, k.name, r.code
    order by k.sku, r.code
  `)
  return result.rows.map((r) => ({ ...r, yield: share(r.passedFirst, r.unitsTested) }))
}
