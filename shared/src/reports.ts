import { z } from 'zod'
import { ORDER_STATUSES } from './orders-status'

/**
 * The owner's reports. Every date in them is a calendar day in UTC (the shop sets no time zone of
 * its own yet), and every answer says so in `timeZone`, so the screen can too.
 */
export const REPORT_TIME_ZONE = 'UTC' as const

/** The longest range a report covers, in days (a year and a day, so a leap year fits). */
export const MAX_REPORT_DAYS = 366

/** How many days a report covers when no range is given: the last 30, today included. */
export const DEFAULT_REPORT_DAYS = 30

const IsoDay = z.iso.date('Use a date as YYYY-MM-DD')

/** A report's range of calendar days (UTC), both ends included; either end may be left out. */
export const ReportRangeQuerySchema = z
  .object({ from: IsoDay.optional(), to: IsoDay.optional() })
  .strict()
  .refine((q) => !q.from || !q.to || q.from <= q.to, { message: 'The range must start on or before its end', path: ['from'] })
/** A report's range of calendar days (UTC), both ends included; either end may be left out. */
export type ReportRangeQuery = z.infer<typeof ReportRangeQuerySchema>

/** A range with both ends set. */
export interface ReportRange {
  from: string
  to: string
}

function addDays(day: string, days: number): string {
  const d = new Date(`${day}T00:00:00Z`)
  d.setUTCDate(d.getUTCDate() + days)
  return d.toISOString().slice(0, 10)
}

/** Days from `from` to `to`, both included. */
export function daysInRange(range: ReportRange): number {
  return Math.round((Date.parse(`${range.to}T00:00:00Z`) - Date.parse(`${range.from}T00:00:00Z`)) / 86_400_000) + 1
}

/**
 * Fills in a range's missing ends: `to` defaults to `today` (or to `from` when that is later), and
 * `from` to 29 days before `to` (30 days in all). Returns a message instead when the range is
 * backwards or longer than {@link MAX_REPORT_DAYS}.
 */
export function resolveRange(q: ReportRangeQuery, today: string): { ok: true; range: ReportRange } | { ok: false; message: string } {
  const to = q.to ?? (q.from && q.from > today ? q.from : today)
  const from = q.from ?? addDays(to, -(DEFAULT_REPORT_DAYS - 1))
  if (from > to) return { ok: false, message: 'The range must start on or before its end' }
  const days = daysInRange({ from, to })
  if (days > MAX_REPORT_DAYS) return { ok: false, message: `Choose at most ${MAX_REPORT_DAYS} days (this range has ${days})` }
  return { ok: true, range: { from, to } }
}

/** The late-orders list's query: how many rows to send (the CSV export sends them all). */
export const LateOrdersQuerySchema = z
  .object({ limit: z.coerce.number().int('Use a whole number').min(1, 'Show at least 1 order').max(500, 'Show at most 500 orders; export the CSV for all').default(50) })
  .strict()
/** The late-orders list's query. */
export type LateOrdersQuery = z.infer<typeof LateOrdersQuerySchema>

/** The work-in-progress query: after how many days with no change a unit counts as stuck. */
export const WipQuerySchema = z
  .object({ stuckDays: z.coerce.number().int('Use a whole number of days').min(1, 'Use at least 1 day').max(60, 'Use at most 60 days').default(3) })
  .strict()
/** The work-in-progress query. */
export type WipQuery = z.infer<typeof WipQuerySchema>

const Stamp = z.object({ timeZone: z.literal(REPORT_TIME_ZONE), asOf: z.string() })
const Ranged = Stamp.extend({ from: z.string(), to: z.string() })
/** A share from 0 to 1, or null when there was nothing to divide by. */
const Share = z.number().min(0).max(1).nullable()

/** How many orders are in each state, in the states' own order. */
export const OrderStatesReportSchema = Stamp.extend({
  rows: z.array(z.object({ status: z.enum(ORDER_STATUSES), count: z.number().int() })),
  total: z.number().int(),
})
/** How many orders are in each state. */
export type OrderStatesReport = z.infer<typeof OrderStatesReportSchema>

/** Orders past their promised ship date and not shipped, oldest promise first. */
export const LateOrdersReportSchema = Stamp.extend({
  today: z.string(),
  total: z.number().int(),
  rows: z.array(
    z.object({
      orderId: z.string(),
      number: z.string(),
      customerName: z.string(),
      status: z.enum(ORDER_STATUSES),
      placedAt: z.string(),
      promisedShipDate: z.string(),
      daysLate: z.number().int(),
      units: z.number().int(),
      unitsShipped: z.number().int(),
    }),
  ),
})
/** Orders past their promised ship date and not shipped. */
export type LateOrdersReport = z.infer<typeof LateOrdersReportSchema>

/** The benches work waits at: the cut bench, the build bench (rework included) and the pack bench. */
export const WIP_BENCHES = ['cut', 'build', 'pack'] as const
/** The benches work waits at. */
export type WipBench = (typeof WIP_BENCHES)[number]

/** Units waiting at each bench, how many are stuck, and the oldest one. */
export const WipReportSchema = Stamp.extend({
  stuckDays: z.number().int(),
  rows: z.array(
    z.object({
      bench: z.enum(WIP_BENCHES),
      units: z.number().int(),
      rework: z.number().int(),
      stuck: z.number().int(),
      oldestSerial: z.string().nullable(),
      oldestOrderNumber: z.string().nullable(),
      /** When the oldest unit was released (its work order made). */
      oldestReleasedAt: z.string().nullable(),
      oldestAgeDays: z.number().nullable(),
    }),
  ),
})
/** Units waiting at each bench. */
export type WipReport = z.infer<typeof WipReportSchema>

/** Units built and units shipped per calendar day of the range. */
export const ThroughputReportSchema = Ranged.extend({
  rows: z.array(z.object({ day: z.string(), unitsBuilt: z.number().int(), unitsShipped: z.number().int() })),
  totals: z.object({ unitsBuilt: z.number().int(), unitsShipped: z.number().int() }),
})
/** Units built and shipped per day. */
export type ThroughputReport = z.infer<typeof ThroughputReportSchema>

const YieldFigures = z.object({
  /** Length of the pieces (base units). */
  pieceLength: z.number(),
  /** Length of pipe used up: sticks and offcuts taken, less remnants put back as offcuts (base units). */
  consumedLength: z.number(),
  yield: Share,
})

/** Planned against actual material yield of each cut run finished in the range. */
export const CutRunYieldReportSchema = Ranged.extend({
  rows: z.array(
    z.object({
      cutRunId: z.string(),
      number: z.string(),
      completedAt: z.string(),
      planned: YieldFigures,
      actual: YieldFigures,
      damagedSticks: z.number().int(),
      spoiledPieces: z.number().int(),
    }),
  ),
})
/** Planned against actual material yield per cut run. */
export type CutRunYieldReport = z.infer<typeof CutRunYieldReportSchema>

/** Material yield of the cut runs finished each week (weeks start on Monday, UTC). */
export const YieldOverTimeReportSchema = Ranged.extend({
  rows: z.array(
    z.object({
      weekStart: z.string(),
      runs: z.number().int(),
      plannedYield: Share,
      actualYield: Share,
      damagedSticks: z.number().int(),
      spoiledPieces: z.number().int(),
    }),
  ),
})
/** Material yield per week. */
export type YieldOverTimeReport = z.infer<typeof YieldOverTimeReportSchema>

/** Per kit revision: units whose first leak test (in the range) passed, over units tested. */
export const FirstPassYieldReportSchema = Ranged.extend({
  rows: z.array(
    z.object({
      kitRevisionId: z.string(),
      kitSku: z.string(),
      kitName: z.string(),
      revisionCode: z.string(),
      unitsTested: z.number().int(),
      passedFirst: z.number().int(),
      yield: Share,
    }),
  ),
})
/** First-pass leak test yield per kit revision. */
export type FirstPassYieldReport = z.infer<typeof FirstPassYieldReportSchema>

const LeadFigures = z.object({
  orders: z.number().int(),
  averageDays: z.number().nullable(),
  medianDays: z.number().nullable(),
  longestDays: z.number().nullable(),
})

/** Days from paid to shipped of the orders shipped in full in the range: overall and per week. */
export const LeadTimeReportSchema = Ranged.extend({
  overall: LeadFigures,
  rows: z.array(LeadFigures.extend({ weekStart: z.string() })),
})
/** Days from paid to shipped. */
export type LeadTimeReport = z.infer<typeof LeadTimeReportSchema>
