import { addWorkingDays, isWorkingDay, workingDayOnOrAfter } from './working-days'

/**
 * The ship-by date to promise a new order, from the work ahead of it. Each bench (cut, build, pack)
 * works through its queue in order, one unit after another, for the shop's working hours on working
 * days (Monday to Friday, UTC like the rest of Kitwright's dates). The order's units reach a bench
 * when the bench before has done them and the bench has done every unit ahead of them; the first
 * bench cannot start them before their short parts arrive. The date is the working day the pack
 * bench finishes them, and never sooner than the shop's minimum lead time.
 *
 * Time is counted in working minutes from the start of today's working day (or of the next working
 * day, when today is not one), so every date step is a whole number of working days.
 */

export const BENCHES = ['cut', 'build', 'pack'] as const
export type Bench = (typeof BENCHES)[number]

export interface PromiseInput {
  /** Now, as an instant (ISO 8601). */
  now: string
  /** The working day starts at this hour (UTC) and lasts this many hours. */
  dayStartHourUtc: number
  hoursPerDay: number
  /** Minutes one unit takes at each bench (measured, or the shop's setting). */
  minutesPerUnit: Record<Bench, number>
  /** Units already in the shop that still have to pass each bench before this order's. */
  unitsAhead: Record<Bench, number>
  /** This order's units that pass each bench (a spare-parts pack skips cut and build). */
  ownUnits: Record<Bench, number>
  /** Parts the order's units need that are not free today, with the day enough will be in (YYYY-MM-DD). */
  shortParts: { name: string; arrives: string; how: string }[]
  /** Never sooner than this day (YYYY-MM-DD): the shop's minimum lead time after the day the order was placed. */
  minimumDate: string
  /** That lead time, in working days, for the words. */
  minimumWorkingDays: number
}

export interface PromiseResult {
  /** The promised ship-by date, YYYY-MM-DD. */
  date: string
  /** Why, most binding first, in the shop's words. */
  reasons: string[]
}

const MINUTE_MS = 60_000

function dayOf(ms: number) {
  return new Date(ms).toISOString().slice(0, 10)
}

/** Working days from `from` to `to` (both working days, `to` ≥ `from`): 0 for the same day. */
function workingDaysBetween(from: string, to: string): number {
  let n = 0
  let d = from
  while (d < to) {
    d = addWorkingDays(d, 1)
    n += 1
  }
  return n
}

export function promiseShipDate(input: PromiseInput): PromiseResult {
  const dayMinutes = Math.round(input.hoursPerDay * 60)
  if (!(dayMinutes > 0 && dayMinutes <= 24 * 60)) throw new Error(`A working day must last more than 0 and at most 24 hours, not ${input.hoursPerDay}`)
  const nowMs = Date.parse(input.now)
  const today = dayOf(nowMs)
  // Day 0 of the count: today when it is a working day, else the next working day (from its start).
  const day0 = workingDayOnOrAfter(today)
  const startOfDay0 = Date.parse(`${day0}T00:00:00Z`) + input.dayStartHourUtc * 60 * MINUTE_MS
  const t0 = day0 === today ? Math.min(dayMinutes, Math.max(0, Math.round((nowMs - startOfDay0) / MINUTE_MS))) : 0

  const dateAt = (w: number) => addWorkingDays(day0, Math.max(0, Math.ceil(w / dayMinutes) - 1))
  // The start of a day's work, in working minutes (a weekend day counts as the Monday after).
  const minutesTo = (day: string) => {
    const working = workingDayOnOrAfter(day)
    return working <= day0 ? 0 : workingDaysBetween(day0, working) * dayMinutes
  }

  const reasons: { weight: number; words: string }[] = []
  // The first bench starts the order's units once the last short part is in.
  const latestPart = [...input.shortParts].sort((a, b) => (a.arrives < b.arrives ? 1 : -1))[0]
  let ready = t0
  if (latestPart) {
    ready = Math.max(t0, minutesTo(latestPart.arrives))
    reasons.push({ weight: ready - t0, words: `waits for ${latestPart.name} due ${latestPart.arrives} (${latestPart.how})` })
  }
  let done = ready
  for (const bench of BENCHES) {
    const m = input.minutesPerUnit[bench]
    if (input.ownUnits[bench] === 0) continue
    const queueClears = t0 + input.unitsAhead[bench] * m
    if (input.unitsAhead[bench] > 0) {
      const days = Math.ceil((input.unitsAhead[bench] * m) / dayMinutes)
      reasons.push({
        weight: queueClears - done,
        words: `${bench} bench has ${input.unitsAhead[bench]} unit${input.unitsAhead[bench] === 1 ? '' : 's'} ahead (about ${days} working day${days === 1 ? '' : 's'})`,
      })
    }
    done = Math.max(done, queueClears) + input.ownUnits[bench] * m
  }
  let date = dateAt(done)
  const floor = input.minimumDate
  if (floor > date) {
    date = floor
    reasons.push({
      weight: Number.MAX_SAFE_INTEGER,
      words: `the shop's minimum lead time of ${input.minimumWorkingDays} working day${input.minimumWorkingDays === 1 ? '' : 's'}`,
    })
  }
  if (!isWorkingDay(date)) date = workingDayOnOrAfter(date)
  return { date, reasons: reasons.sort((a, b) => b.weight - a.weight).map((r) => r.words) }
}
