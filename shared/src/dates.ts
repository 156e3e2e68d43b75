/**
 * Kitwright's one way of writing dates, for screens, PDFs, e-mails and CSV files alike:
 * `Dec 3, 2026` for a day, `Dec 3, 2026, 4:05 PM` for a moment. Written in US English, as the rest
 * of Kitwright's words are.
 */

const DAY = new Intl.DateTimeFormat('en-US', { month: 'short', day: 'numeric', year: 'numeric', timeZone: 'UTC' })
const DAY_WITH_WEEKDAY = new Intl.DateTimeFormat('en-US', { weekday: 'long', month: 'short', day: 'numeric', year: 'numeric', timeZone: 'UTC' })

/** A calendar date (`YYYY-MM-DD`) as `Dec 3, 2026`, read in UTC so it never shifts a day; null as a dash. */
export function formatDay(day: string | null): string {
  if (!day) return '—'
  return DAY.format(new Date(`${day.slice(0, 10)}T00:00:00Z`))
}

/** A calendar date (`YYYY-MM-DD`) with its weekday, as a letter writes it: `Thursday, Dec 3, 2026`. */
export function formatDayWithWeekday(day: string): string {
  return DAY_WITH_WEEKDAY.format(new Date(`${day.slice(0, 10)}T00:00:00Z`))
}

/** The day of a moment (ISO 8601) as `Dec 3, 2026`, in `timeZone` or the showing machine's own. */
export function formatDateOf(iso: string | Date, timeZone?: string): string {
  const at = typeof iso === 'string' ? new Date(iso) : iso
  return new Intl.DateTimeFormat('en-US', { month: 'short', day: 'numeric', year: 'numeric', ...(timeZone ? { timeZone } : {}) }).format(at)
}

/**
 * A moment (ISO 8601) as `Dec 3, 2026, 4:05 PM`, in `timeZone` (an IANA name, e.g. `UTC`) or, left
 * out, the time zone of the machine showing it (the browser's, on a screen). Null as a dash.
 */
export function formatDateTime(iso: string | Date | null, timeZone?: string): string {
  if (!iso) return '—'
  const at = typeof iso === 'string' ? new Date(iso) : iso
  const day = new Intl.DateTimeFormat('en-US', { month: 'short', day: 'numeric', year: 'numeric', ...(timeZone ? { timeZone } : {}) }).format(at)
  // Newer ICU puts a narrow no-break space before AM/PM; a plain space reads the same and survives CSV files and e-mail.
  const time = new Intl.DateTimeFormat('en-US', { hour: 'numeric', minute: '2-digit', ...(timeZone ? { timeZone } : {}) }).format(at).replace(/\u202f/g, ' ')
  return `${day}, ${time}`
}
