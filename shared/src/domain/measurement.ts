import { parseLength, toInches, toMillimetres, type LengthUnit } from './units'

/** The length units a build step may measure in, as a planner writes them on the step. */
const LENGTH_UNITS: Record<string, LengthUnit> = { in: 'in', inch: 'in', inches: 'in', '"': 'in', mm: 'mm' }

/** The length unit of a step's measurement unit (`in`, `mm`…), or null when it measures something else (psi, N·m). */
export function lengthUnitOf(unit: string | null): LengthUnit | null {
  return unit === null ? null : (LENGTH_UNITS[unit.trim().toLowerCase()] ?? null)
}

/** A measurement read: its value in the step's unit, or what to fix. */
export type ParseMeasurementResult = { ok: true; value: number } | { ok: false; message: string }

/**
 * Reads a measurement as the bench types it, into the step's unit. For a length step it takes what
 * the shop writes everywhere else (`18 1/2`, `18-1/2"`, `18.5 in`, `470 mm`, through
 * {@link parseLength}) and converts it to the step's unit, rounded to 4 decimals (1/16 in is 0.0625).
 * For any other unit it takes a plain decimal number (`12.5`).
 */
export function parseMeasurement(text: string, unit: string | null): ParseMeasurementResult {
  const input = text.trim()
  const lengthUnit = lengthUnitOf(unit)
  if (lengthUnit) {
    const parsed = parseLength(input, lengthUnit)
    if (!parsed.ok) return parsed
    const value = lengthUnit === 'in' ? toInches(parsed.value) : toMillimetres(parsed.value)
    return { ok: true, value: Math.round(value * 10_000) / 10_000 }
  }
  if (!/^-?(\d+(\.\d*)?|\.\d+)$/.test(input)) {
    if (/\d,\d/.test(input)) return { ok: false, message: `Write decimals with a point, not a comma: "${input.replace(',', '.')}".` }
    return { ok: false, message: `Enter the measurement as a number${unit ? ` in ${unit}` : ''}, e.g. 12.5` }
  }
  return { ok: true, value: Number(input) }
}

/** Whether a measurement lies outside its limits (either limit may be missing). */
export function outsideLimits(value: number, min: number | null, max: number | null): boolean {
  return (min !== null && value < min) || (max !== null && value > max)
}
