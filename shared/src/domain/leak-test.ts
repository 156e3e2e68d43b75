/**
 * The leak test rule of the build bench: a unit is pressurised, held, and read again. It passes when
 * the start pressure is inside the protocol's range, the drop over the hold is at most the allowed
 * drop, the hold lasted at least the protocol's minutes, and no leak was seen anywhere.
 *
 * Pressures are whole pascals, as the revision's protocol stores them. Gauges read psi or kPa.
 */
import { PASCALS_PER_PSI } from '../kits'

/** Where a leak can show on a grow tote: at a sprayer, the drain grommet, a riser joint, the cord hole. */
export const LEAK_PLACES = ['sprayer', 'drain_grommet', 'riser_joint', 'cord_hole', 'other'] as const
/** A place a leak was seen. */
export type LeakPlace = (typeof LEAK_PLACES)[number]

/** Words for each leak place, for screens and the build record. */
export const LEAK_PLACE_LABELS: Record<LeakPlace, string> = {
  sprayer: 'Sprayer',
  drain_grommet: 'Drain grommet',
  riser_joint: 'Riser joint',
  cord_hole: 'Cord hole',
  other: 'Other',
}

/** Units a gauge reading may be entered in. */
export const PRESSURE_UNITS = ['psi', 'kPa'] as const
/** A unit a gauge reading may be entered in. */
export type PressureUnit = (typeof PRESSURE_UNITS)[number]

/** A gauge reading in `unit`, as whole pascals (1 psi = 6 894.757 Pa, NIST SP 811 B.8; 1 kPa = 1000 Pa). */
export function toPascals(value: number, unit: PressureUnit): number {
  return Math.round(unit === 'psi' ? value * PASCALS_PER_PSI : value * 1000)
}

/** Pascals in `unit`, unrounded. */
export function fromPascals(pa: number, unit: PressureUnit): number {
  return unit === 'psi' ? pa / PASCALS_PER_PSI : pa / 1000
}

/** Pascals as a gauge would show them: `14.50 psi` or `100.0 kPa`. */
export function formatPressure(pa: number, unit: PressureUnit): string {
  const value = fromPascals(pa, unit)
  return unit === 'psi' ? `${value.toFixed(2)} psi` : `${value.toFixed(1)} kPa`
}

/** The protocol a reading is judged by (the revision's leak test columns). */
export interface LeakTestRule {
  minPressurePa: number
  maxPressurePa: number
  holdMinutes: number
  maxDropPa: number
}

/** What the assembler read and saw. */
export interface LeakTestReading {
  startPressurePa: number
  endPressurePa: number
  holdMinutes: number
  leaks: readonly LeakPlace[]
}

/** The verdict: passed or not, the drop over the hold, and one plain sentence per failed check. */
export interface LeakTestVerdict {
  passed: boolean
  dropPa: number
  reasons: string[]
}

/**
 * Judges a reading by the protocol. A pressure that rose over the hold (warm water, a settling
 * gauge) is a drop of zero or less and passes the drop check. `unit` only shapes the messages.
 */
export function judgeLeakTest(rule: LeakTestRule, reading: LeakTestReading, unit: PressureUnit = 'psi'): LeakTestVerdict {
  const p = (pa: number) => formatPressure(pa, unit)
  const reasons: string[] = []
  const dropPa = reading.startPressurePa - reading.endPressurePa
  if (reading.startPressurePa < rule.minPressurePa) {
    reasons.push(`Start pressure ${p(reading.startPressurePa)} is below the protocol's ${p(rule.minPressurePa)}`)
  } else if (reading.startPressurePa > rule.maxPressurePa) {
    reasons.push(`Start pressure ${p(reading.startPressurePa)} is above the protocol's ${p(rule.maxPressurePa)}`)
  }
  if (dropPa > rule.maxDropPa) reasons.push(`Pressure dropped ${p(dropPa)}, more than the allowed ${p(rule.maxDropPa)}`)
  if (reading.holdMinutes < rule.holdMinutes) {
    reasons.push(`Held ${reading.holdMinutes} min; the protocol asks for at least ${rule.holdMinutes} min`)
  }
  const places = [...new Set(reading.leaks)]
  if (places.length > 0) reasons.push(`Leak seen at: ${places.map((l) => LEAK_PLACE_LABELS[l].toLowerCase()).join(', ')}`)
  return { passed: reasons.length === 0, dropPa, reasons }
}

/**
 * First-pass yield: the share of tested units whose first leak test passed. `firstAttempts` holds
 * one entry per unit, the outcome of its attempt 1. Null when no unit was tested.
 */
export function firstPassYield(firstAttempts: readonly boolean[]): number | null {
  if (firstAttempts.length === 0) return null
  return firstAttempts.filter(Boolean).length / firstAttempts.length
}
