/**
 * Working days: Monday to Friday, counted on calendar dates (`YYYY-MM-DD`) read in UTC so a date never
 * shifts across a time zone. Public holidays are not known to Kitwright; the shop's lead time
 * absorbs them.
 */

const DAY_MS = 86_400_000

function parseDay(isoDate: string): number {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(isoDate)
  if (!m) throw new Error(`Not a calendar date (YYYY-MM-DD): ${isoDate}`)
  const ms = Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3]))
  if (new Date(ms).toISOString().slice(0, 10) !== isoDate) throw new Error(`No such date: ${isoDate}`)
  return ms
}

/** Whether the date is a working day (Monday to Friday). */
export function isWorkingDay(isoDate: string): boolean {
  const weekday = new Date(parseDay(isoDate)).getUTCDay()
  return weekday !== 0 && weekday !== 6
}

const isWeekend = (ms: number) => {
  const d = new Date(ms).getUTCDay()
  return d === 0 || d === 6
}

/**
 * The date `days` working days after `isoDate`, by the rule of the spreadsheet WORKDAY function with
 * no holidays: the working days strictly after the start are counted, so from a Friday, a Saturday or
 * a Sunday, 1 working day is the Monday after; and 0 days is the start itself, even on a weekend
 * (WORKDAY(start, 0) returns start). For "the start, or the next working day when it is a weekend
 * day", use {@link workingDayOnOrAfter}.
 */
export function addWorkingDays(isoDate: string, days: number): string {
  if (!Number.isInteger(days) || days < 0) throw new Error(`Working days must be a whole number of 0 or more, not ${days}`)
  let ms = parseDay(isoDate)
  let left = days
  while (left > 0) {
    ms += DAY_MS
    if (!isWeekend(ms)) left -= 1
  }
  return new Date(ms).toISOString().slice(0, 10)
}

/** The date itself when it is a working day, else the Monday after (nothing ships on a weekend). */
export function workingDayOnOrAfter(isoDate: string): string {
  let ms = parseDay(isoDate)
  while (isWeekend(ms)) ms += DAY_MS
  return new Date(ms).toISOString().slice(0, 10)
}

/** The calendar date (UTC) of an instant, `YYYY-MM-DD`. */
export function utcDay(instant: Date | string): string {
  return (instant instanceof Date ? instant : new Date(instant)).toISOString().slice(0, 10)
}
