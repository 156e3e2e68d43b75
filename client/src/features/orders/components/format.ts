/** Money in the order's currency: 18900, 'USD' → "$189.00". */
export function formatMoney(cents: number, currency = 'USD'): string {
  return new Intl.NumberFormat('en-US', { style: 'currency', currency }).format(cents / 100)
}

/** A moment as the shop reads it: "Mar 2, 2026, 9:15 AM" in the browser's time zone. */
export function formatDateTime(iso: string): string {
  return new Intl.DateTimeFormat('en-US', { dateStyle: 'medium', timeStyle: 'short' }).format(new Date(iso))
}

/** A calendar date (YYYY-MM-DD) as "Mar 16, 2026", without shifting it by the time zone. */
export function formatDay(day: string | null): string {
  if (!day) return '—'
  return new Intl.DateTimeFormat('en-US', { dateStyle: 'medium', timeZone: 'UTC' }).format(new Date(`${day}T00:00:00Z`))
}
