/** Money in cents as people read it, in the order's currency: 18900, 'USD' → "$189.00". */
export function formatMoney(cents: number, currency = 'USD'): string {
  return new Intl.NumberFormat('en-US', { style: 'currency', currency }).format(cents / 100)
}

/** Dollars as typed into a price box ("189", "$189.5", "189.00") as cents; NaN when unreadable, so a schema says what to fix. */
export function dollarsToCents(text: unknown): number {
  if (typeof text === 'number') return text
  const m = /^\s*\$?\s*(\d{1,7})(?:\.(\d{1,2}))?\s*$/.exec(String(text ?? ''))
  return m ? Number(m[1]) * 100 + Number((m[2] ?? '').padEnd(2, '0')) : Number.NaN
}
