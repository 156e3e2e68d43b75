/** Cents as dollars for display and for editing: 348 → "$3.48" / "3.48". */
export function formatDollars(cents: number | null): string {
  return cents === null ? '—' : `$${(cents / 100).toFixed(2)}`
}
export function centsToText(cents: number): string {
  return (cents / 100).toFixed(2)
}
