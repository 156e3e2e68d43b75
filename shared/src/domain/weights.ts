/**
 * Parcel weights: dimensional (volumetric) weight from a box's size and the carrier's divisor, and the
 * billable weight, the larger of the actual and the dimensional. Weights are whole grams; lengths are
 * in the base unit of units.ts.
 */
import { LENGTH_BASE_PER_INCH, LENGTH_BASE_PER_MM, type Length } from './units'

/**
 * Grams in one avoirdupois pound, exactly: 1 lb = 0.453 592 37 kg (the international yard and pound
 * agreement of 1959; NIST Handbook 44, Appendix C).
 */
export const GRAMS_PER_POUND = 453.59237

/**
 * A common carrier divisor for inches and pounds: 139 in³ per lb. From memory of published carrier
 * rate guides, not from a standard; the shop sets its own carrier's figure.
 */
export const COMMON_DIVISOR_IN3_PER_LB = 139

/**
 * A common divisor for centimetres and kilograms: 5000 cm³ per kg. From memory of published carrier
 * rate guides, not from a standard; the shop sets its own carrier's figure.
 */
export const COMMON_DIVISOR_CM3_PER_KG = 5000

/** How the shop's divisor is expressed: cubic inches per pound, or cubic centimetres per kilogram. */
export const DIM_WEIGHT_SYSTEMS = ['in3_per_lb', 'cm3_per_kg'] as const
/** How the shop's divisor is expressed. */
export type DimWeightSystem = (typeof DIM_WEIGHT_SYSTEMS)[number]

/** A carrier's dimensional-weight divisor: volume per unit of weight. */
export interface DimDivisor {
  value: number
  system: DimWeightSystem
}

/** A box's outside size in base length units. */
export interface BoxSize {
  length: Length
  width: Length
  height: Length
}

/** Converts grams to pounds (1 lb = 453.59237 g exactly). */
export function gramsToPounds(grams: number): number {
  return grams / GRAMS_PER_POUND
}

/** Converts pounds to grams (1 lb = 453.59237 g exactly). */
export function poundsToGrams(pounds: number): number {
  return pounds * GRAMS_PER_POUND
}

/** What is wrong with a box size or divisor, in words a person can fix, or null. */
export function dimWeightProblem(box: BoxSize, divisor: DimDivisor): string | null {
  for (const [key, words] of [['length', 'length'], ['width', 'width'], ['height', 'height']] as const) {
    if (!Number.isSafeInteger(box[key]) || box[key] <= 0) return `Enter the box's ${words}: it must be greater than zero`
  }
  if (!Number.isFinite(divisor.value) || divisor.value <= 0) return 'The dimensional-weight divisor must be greater than zero'
  return null
}

/**
 * Dimensional weight in grams (unrounded): L × W × H ÷ divisor. With `in3_per_lb` the volume is taken
 * in cubic inches and the result in pounds, with `cm3_per_kg` in cubic centimetres and kilograms; both
 * are then converted to grams. Carriers often round the sides and the result up to whole units first:
 * that is the carrier's rule to apply, not done here.
 */
export function dimensionalWeightGrams(box: BoxSize, divisor: DimDivisor): number {
  const problem = dimWeightProblem(box, divisor)
  if (problem) throw new Error(problem)
  if (divisor.system === 'in3_per_lb') {
    const cubicInches = (box.length / LENGTH_BASE_PER_INCH) * (box.width / LENGTH_BASE_PER_INCH) * (box.height / LENGTH_BASE_PER_INCH)
    return poundsToGrams(cubicInches / divisor.value)
  }
  const perCm = LENGTH_BASE_PER_MM * 10
  const cubicCm = (box.length / perCm) * (box.width / perCm) * (box.height / perCm)
  return (cubicCm / divisor.value) * 1000
}

/** A parcel's weights in whole grams: actual, dimensional (rounded up) and billable (the larger). */
export interface ParcelWeights {
  actualGrams: number
  dimensionalGrams: number
  billableGrams: number
}

/**
 * The weights a carrier bills on: the dimensional weight rounded up to a whole gram, and the
 * billable weight, the larger of it and the actual weight.
 */
export function parcelWeights(actualGrams: number, box: BoxSize, divisor: DimDivisor): ParcelWeights {
  if (!Number.isSafeInteger(actualGrams) || actualGrams <= 0) throw new Error('The parcel weight must be a whole number of grams above zero')
  const dimensionalGrams = Math.ceil(dimensionalWeightGrams(box, divisor) - 1e-9)
  return { actualGrams, dimensionalGrams, billableGrams: Math.max(actualGrams, dimensionalGrams) }
}

/** A weight for people: `5.64 kg (12.43 lb)`, in the order the shop's unit suggests. */
export function formatWeight(grams: number, unit: 'in' | 'mm'): string {
  const kg = `${(grams / 1000).toFixed(2)} kg`
  const lb = `${gramsToPounds(grams).toFixed(2)} lb`
  return unit === 'in' ? `${lb} (${kg})` : `${kg} (${lb})`
}
