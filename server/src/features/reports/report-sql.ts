import { sql, type SQL } from 'drizzle-orm'
import type { ReportRange } from '@kitwright/shared/reports'
import type { Db, Tx } from '../../db/client'

export type Conn = Db | Tx

/** Today's calendar day in UTC, the reports' time zone. */
export function todayUtc(now = new Date()): string {
  return now.toISOString().slice(0, 10)
}

/** The first instant of `day` (UTC) as a timestamptz. */
export function dayStart(day: string): SQL {
  return sql`((${day}::date)::timestamp at time zone 'UTC')`
}

/** The first instant after the range's last day (UTC): ranges are [start, end). */
export function rangeEnd(range: ReportRange): SQL {
  return sql`((${range.to}::date + 1)::timestamp at time zone 'UTC')`
}

/** `column` falls within the range's days (UTC). */
export function inRange(column: SQL, range: ReportRange): SQL {
  return sql`(${column} >= ${dayStart(range.from)} and ${column} < ${rangeEnd(range)})`
}

/** The Monday that starts the (UTC) week of a timestamptz, as a date. */
export function utcWeek(column: SQL): SQL {
  return sql`date_trunc('week', ${column} at time zone 'UTC')::date`
}
