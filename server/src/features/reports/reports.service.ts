import { sql } from 'drizzle-orm'
import { z } from 'zod'
import { toInches, toMillimetres, type LengthUnit } from '@kitwright/shared/domain/units'
import { ORDER_STATUS_LABELS } from '@kitwright/shared/status-words'
import {
  LateOrdersQuerySchema,
  REPORT_TIME_ZONE,
  ReportRangeQuerySchema,
  resolveRange,
  WipQuerySchema,
  type ReportRange,
  type ReportRangeQuery,
} from '@kitwright/shared/reports'
import { ShortagesQuerySchema } from '@kitwright/shared/work-orders'
import type { Db } from '../../db/client'
import { BadRequest } from '../../lib/http-errors'
import { selectShortages } from '../work-orders/shortages.queries'
import { selectLateOrders, selectLeadTimes, selectOrderStates } from './order-reports.queries'
import { todayUtc } from './report-sql'
import { daysCell, percentCell, type CsvTable } from './reports.csv'
import { selectThroughput, selectWip } from './work-reports.queries'
import { selectCutRunYield, selectFirstPassYield, selectYieldOverTime } from './yield-reports.queries'

/** What every report answers with: its time zone and when it was read. */
interface Context {
  today: string
  asOf: string
  /** The CSV export wants every row, not a screenful. */
  forExport: boolean
}

/**
 * One report: its path under /api/reports, its query, the JSON it answers, and the same numbers
 * as a CSV table. `json: false` when the JSON already has a home elsewhere (shortages).
 */
interface ReportDefinition<Q, R> {
  path: string
  query: z.ZodType<Q>
  json: boolean
  run(db: Db, q: Q, ctx: Context): Promise<R>
  csv(result: R, unit: LengthUnit): CsvTable
}

/** A report ready to mount: its raw query parsed (a ZodError becomes a 400), run, and tabled. */
export interface Report {
  path: string
  json: boolean
  answer(db: Db, rawQuery: unknown, ctx: Context): Promise<{ result: unknown; table(unit: LengthUnit): CsvTable }>
}

function define<Q, R>(d: ReportDefinition<Q, R>): Report {
  return {
    path: d.path,
    json: d.json,
    async answer(db, rawQuery, ctx) {
      const result = await d.run(db, d.query.parse(rawQuery), ctx)
      return { result, table: (unit) => d.csv(result, unit) }
    },
  }
}

function rangeOf(q: ReportRangeQuery, today: string): ReportRange {
  const resolved = resolveRange(q, today)
  if (!resolved.ok) throw new BadRequest(resolved.message, { from: resolved.message })
  return resolved.range
}

const stamp = (ctx: Context) => ({ timeZone: REPORT_TIME_ZONE, asOf: ctx.asOf })

function lengthCell(value: number, unit: LengthUnit): number {
  return unit === 'in' ? Math.round(toInches(value) * 1000) / 1000 : Math.round(toMillimetres(value) * 10) / 10
}

/** The shop's display unit for lengths in exports (inches until the shop has settings). */
export async function exportUnit(db: Db): Promise<LengthUnit> {
  const result = await db.execute<{ unit: LengthUnit }>(sql`select display_unit as unit from shop_settings where id = 1`)
  return result.rows[0]?.unit ?? 'in'
}

export const orderStatesReport = define({
  path: 'order-states',
  query: z.object({}).strict(),
  json: true,
  async run(db, _q, ctx) {
    const rows = await selectOrderStates(db)
    return { ...stamp(ctx), rows, total: rows.reduce((s, r) => s + r.count, 0) }
  },
  // The state in words as on screen, its code beside for a program reading the file.
  csv: (r) => ({ header: ['Order state', 'Orders', 'State code'], rows: r.rows.map((x) => [ORDER_STATUS_LABELS[x.status], x.count, x.status]) }),
})

export const lateOrdersReport = define({
  path: 'late-orders',
  query: LateOrdersQuerySchema,
  json: true,
  async run(db, q, ctx) {
    return { ...stamp(ctx), today: ctx.today, ...(await selectLateOrders(db, ctx.today, ctx.forExport ? null : q.limit)) }
  },
  csv: (r) => ({
    header: ['Order', 'Customer', 'State', 'Placed (UTC)', 'Promised ship date', 'Days late', 'Units', 'Units shipped', 'State code'],
    rows: r.rows.map((x) => [
      x.number,
      x.customerName,
      ORDER_STATUS_LABELS[x.status],
      x.placedAt,
      x.promisedShipDate,
      x.daysLate,
      x.units,
      x.unitsShipped,
      x.status,
    ]),
  }),
})

const BENCH_NAMES = { cut: 'Cut bench (waiting to cut)', build: 'Build bench (cut, building, rework)', pack: 'Pack bench (built or packed)' } as const

export const wipReport = define({
  path: 'work-in-progress',
  query: WipQuerySchema,
  json: true,
  async run(db, q, ctx) {
    return { ...stamp(ctx), stuckDays: q.stuckDays, rows: await selectWip(db, q.stuckDays) }
  },
  csv: (r) => ({
    header: ['Bench', 'Units', 'In rework', `Stuck (no change for ${r.stuckDays}+ days)`, 'Oldest unit', 'Its order', 'Released (UTC)', 'Age (days)'],
    rows: r.rows.map((x) => [
      BENCH_NAMES[x.bench],
      x.units,
      x.rework,
      x.stuck,
      x.oldestSerial,
      x.oldestOrderNumber,
      x.oldestReleasedAt,
      daysCell(x.oldestAgeDays),
    ]),
  }),
})

export const shortagesReport = define({
  path: 'shortages',
  query: ShortagesQuerySchema,
  json: false,
  run: (db, q) => selectShortages(db, q),
  csv: (rows) => ({
    header: ['SKU', 'Part', 'Unit', 'Needed', 'Reserved', 'Free in stock', 'Short', 'Work orders', 'Supplier', 'Lead time (days)', 'Reorder quantity'],
    rows: rows.map((x) => [
      x.sku,
      x.name,
      x.kind === 'stock_length' ? 'sticks' : x.unitOfMeasure,
      x.needed,
      x.reserved,
      x.available,
      x.short,
      x.workOrderCount,
      x.supplier,
      x.leadTimeDays,
      x.reorderQuantity,
    ]),
  }),
})

export const throughputReport = define({
  path: 'throughput',
  query: ReportRangeQuerySchema,
  json: true,
  async run(db, q, ctx) {
    const range = rangeOf(q, ctx.today)
    const rows = await selectThroughput(db, range)
    const totals = { unitsBuilt: rows.reduce((s, r) => s + r.unitsBuilt, 0), unitsShipped: rows.reduce((s, r) => s + r.unitsShipped, 0) }
    return { ...stamp(ctx), ...range, rows, totals }
  },
  csv: (r) => ({ header: ['Day (UTC)', 'Units built', 'Units shipped'], rows: r.rows.map((x) => [x.day, x.unitsBuilt, x.unitsShipped]) }),
})

export const cutRunYieldReport = define({
  path: 'cut-run-yield',
  query: ReportRangeQuerySchema,
  json: true,
  async run(db, q, ctx) {
    const range = rangeOf(q, ctx.today)
    return { ...stamp(ctx), ...range, rows: await selectCutRunYield(db, range) }
  },
  csv: (r, unit) => ({
    header: [
      'Cut run',
      'Finished (UTC)',
      `Planned pieces (${unit})`,
      `Planned consumed (${unit})`,
      'Planned yield (%)',
      `Actual pieces (${unit})`,
      `Actual consumed (${unit})`,
      'Actual yield (%)',
      'Damaged sticks',
      'Pieces cut again',
    ],
    rows: r.rows.map((x) => [
      x.number,
      x.completedAt,
      lengthCell(x.planned.pieceLength, unit),
      lengthCell(x.planned.consumedLength, unit),
      percentCell(x.planned.yield),
      lengthCell(x.actual.pieceLength, unit),
      lengthCell(x.actual.consumedLength, unit),
      percentCell(x.actual.yield),
      x.damagedSticks,
      x.spoiledPieces,
    ]),
  }),
})

export const yieldOverTimeReport = define({
  path: 'yield-over-time',
  query: ReportRangeQuerySchema,
  json: true,
  async run(db, q, ctx) {
    const range = rangeOf(q, ctx.today)
    return { ...stamp(ctx), ...range, rows: await selectYieldOverTime(db, range) }
  },
  csv: (r) => ({
    header: ['Week starting (Monday, UTC)', 'Cut runs finished', 'Planned yield (%)', 'Actual yield (%)', 'Damaged sticks', 'Pieces cut again'],
    rows: r.rows.map((x) => [x.weekStart, x.runs, percentCell(x.plannedYield), percentCell(x.actualYield), x.damagedSticks, x.spoiledPieces]),
  }),
})

export const firstPassYieldReport = define({
  path: 'first-pass-yield',
  query: ReportRangeQuerySchema,
  json: true,
  async run(db, q, ctx) {
    const range = rangeOf(q, ctx.today)
    return { ...stamp(ctx), ...range, rows: await selectFirstPassYield(db, range) }
  },
  csv: (r) => ({
    header: ['Kit', 'Kit name', 'Revision', 'Units tested', 'Passed first test', 'First-pass yield (%)'],
    rows: r.rows.map((x) => [x.kitSku, x.kitName, x.revisionCode, x.unitsTested, x.passedFirst, percentCell(x.yield)]),
  }),
})

export const leadTimeReport = define({
  path: 'lead-time',
  query: ReportRangeQuerySchema,
  json: true,
  async run(db, q, ctx) {
    const range = rangeOf(q, ctx.today)
    return { ...stamp(ctx), ...range, ...(await selectLeadTimes(db, range)) }
  },
  csv: (r) => ({
    header: ['Week starting (Monday, UTC)', 'Orders shipped', 'Average days paid to shipped', 'Median days', 'Longest days'],
    rows: [
      ...r.rows.map((x) => [x.weekStart, x.orders, daysCell(x.averageDays), daysCell(x.medianDays), daysCell(x.longestDays)]),
      ['All weeks', r.overall.orders, daysCell(r.overall.averageDays), daysCell(r.overall.medianDays), daysCell(r.overall.longestDays)],
    ],
  }),
})

/** Every report, in the order the home page shows them. */
export const REPORTS: readonly Report[] = [
  orderStatesReport,
  lateOrdersReport,
  wipReport,
  shortagesReport,
  throughputReport,
  cutRunYieldReport,
  yieldOverTimeReport,
  firstPassYieldReport,
  leadTimeReport,
]

/** The context a report runs in, read once per request. */
export function reportContext(forExport: boolean, now = new Date()): Context {
  return { today: todayUtc(now), asOf: now.toISOString(), forExport }
}
