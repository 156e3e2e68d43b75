/** A moment as the bench reads it: "1 Dec, 14:05". */
export function formatWhen(iso: string): string {
  return new Date(iso).toLocaleString(undefined, { day: 'numeric', month: 'short', hour: '2-digit', minute: '2-digit' })
}

/** A step's limits: "17.75 – 18.25 in", "at least 2 mm", or "" when it has none. */
export function formatLimits(min: number | null, max: number | null, unit: string | null): string {
  const u = unit ? ` ${unit}` : ''
  if (min !== null && max !== null) return `${min} – ${max}${u}`
  if (min !== null) return `at least ${min}${u}`
  if (max !== null) return `at most ${max}${u}`
  return ''
}

/** Millilitres as litres for people: "30 L", "2.5 L". */
export function formatLitres(ml: number): string {
  return `${Number((ml / 1000).toFixed(2))} L`
}
