/** Money in the order's currency: 18900, 'USD' → "$189.00". */
export function formatMoney(cents: number, currency = 'USD'): string {
  return new Intl.NumberFormat('en-US', { style: 'currency', currency }).format(cents / 100)
}

// Dates are written one way everywhere (shared/src/dates.ts): "Mar 16, 2026" and "Mar 2, 2026, 9:15 AM".
export { formatDateTime, formatDay } from '@kitwright/shared/dates'
