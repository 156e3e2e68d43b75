import { formatDateTime } from '@kitwright/shared/dates'
/** A share (0–1) as a percentage for the screen, or a dash when there was nothing to count. */
export function percent(share: number | null, digits = 1): string {
  return share === null ? '—' : `${(share * 100).toFixed(digits)} %`
}

/** A number of days with one decimal, or a dash. */
export function days(value: number | null): string {
  return value === null ? '—' : `${value.toFixed(1)} days`
}

/** A calendar day (YYYY-MM-DD, UTC) as a short date, in UTC so it never shifts a day. */
export function shortDay(day: string): string {
  return new Intl.DateTimeFormat('en-US', { month: 'short', day: 'numeric', timeZone: 'UTC' }).format(new Date(`${day}T00:00:00Z`))
}

/** An instant as a date and time in UTC. */
export function utcStamp(iso: string): string {
  return `${formatDateTime(iso, 'UTC')} UTC`
}
