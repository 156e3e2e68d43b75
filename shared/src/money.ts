/** Money in cents as people read it, in the order's currency: 18900, 'USD' → "$189.00". */
export function formatMoney(cents: number, currency = 'USD'): string {
  return new Intl.NumberFormat('en-US', { style: 'currency', currency }).format(cents / 100)
}
