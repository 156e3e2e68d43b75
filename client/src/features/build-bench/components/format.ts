import { formatDateTime } from '@kitwright/shared/dates'

/** A moment as the bench reads it, the one way Kitwright writes dates: "Dec 1, 2026, 2:05 PM". */
export function formatWhen(iso: string): string {
  return formatDateTime(iso)
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
