/**
 * The reservoir calculator: how deep the water stands in a tote for a given volume, and the reverse.
 *
 * A tote's inside is modelled as a rectangular frustum: a flat rectangular floor, a rectangular rim,
 * and four planar walls tapering between them (width and length may taper by different amounts).
 * Rounded corners and ribs are ignored, so real totes hold a little less than these figures: fill to a
 * mark and check once per tote model.
 */
import { LENGTH_BASE_PER_MM, formatLength, type Length, type LengthUnit } from './units'

/** Cubic inches in one US liquid gallon, exactly (NIST Handbook 44, Appendix C). */
export const CUBIC_INCHES_PER_US_GALLON = 231

/** Cubic millimetres in one litre: 1 L = 1 dm³ (SI). */
export const CUBIC_MM_PER_LITRE = 1_000_000

/** Litres in one US gallon: 231 in³ × (25.4 mm)³ = 3 785 411.784 mm³ = 3.785411784 L, exactly. */
export const LITRES_PER_US_GALLON = 3.785411784

/** Volume units of the reservoir calculator: litres or US liquid gallons. */
export type VolumeUnit = 'L' | 'gal'

/**
 * The inside of a tote, all in base length units (see units.ts). Widths are the shorter horizontal
 * side, lengths the longer; "top" is at the rim, "bottom" on the floor.
 */
export interface EnclosureShape {
  /** Inside width at the rim. */
  topInsideWidth: Length
  /** Inside length at the rim. */
  topInsideLength: Length
  /** Inside width on the floor. */
  bottomInsideWidth: Length
  /** Inside length on the floor. */
  bottomInsideLength: Length
  /** Inside height, floor to rim. */
  insideHeight: Length
}

/** A computed volume, or a message that says what to fix in the inputs. */
export type VolumeResult = { ok: true; volume: number } | { ok: false; message: string }

/** A computed water depth in base length units, or a message that says what to fix in the inputs. */
export type DepthResult = { ok: true; depth: Length } | { ok: false; message: string }

/**
 * Checks an enclosure shape and returns one message per problem (empty when it is usable).
 * Every dimension must be a whole, positive number of base units.
 */
export function checkEnclosure(enclosure: EnclosureShape): string[] {
  const problems: string[] = []
  const named: [keyof EnclosureShape, string][] = [
    ['topInsideWidth', 'inside width at the rim'],
    ['topInsideLength', 'inside length at the rim'],
    ['bottomInsideWidth', 'inside width on the floor'],
    ['bottomInsideLength', 'inside length on the floor'],
    ['insideHeight', 'inside height'],
  ]
  for (const [key, words] of named) {
    const value = enclosure[key]
    if (!Number.isSafeInteger(value) || value <= 0) {
      problems.push(`Enter the tote's ${words}: it must be a length greater than zero.`)
    }
  }
  return problems
}

/**
 * The tote's inside width and length at a height above the floor, by straight-line taper between the
 * floor and the rim (rounded to the nearest base unit). Used to find the room at the manifold's height.
 */
export function insideAtHeight(
  enclosure: EnclosureShape,
  heightAboveFloor: Length,
): { insideWidth: Length; insideLength: Length } {
  const t = heightAboveFloor / enclosure.insideHeight
  return {
    insideWidth: Math.round(lerp(enclosure.bottomInsideWidth, enclosure.topInsideWidth, t)),
    insideLength: Math.round(lerp(enclosure.bottomInsideLength, enclosure.topInsideLength, t)),
  }
}

/**
 * The volume of water standing `depth` deep in the tote, in `unit`.
 *
 * The water is itself a frustum from the floor to the water line, and its cross-section area A(z) is
 * a quadratic in the height z, so the prismoidal formula V = h/6 · (A(0) + 4·A(h/2) + A(h)) is exact
 * for it (prismoidal formula, exact for a frustum with planar faces — standard geometry).
 */
export function volumeAtDepth(enclosure: EnclosureShape, depth: Length, unit: VolumeUnit): VolumeResult {
  const problems = checkEnclosure(enclosure)
  if (problems.length > 0) return { ok: false, message: problems.join(' ') }
  if (!Number.isSafeInteger(depth) || depth < 0) {
    return { ok: false, message: 'Enter a water depth of zero or more.' }
  }
  if (depth > enclosure.insideHeight) {
    return {
      ok: false,
      message: `A depth of ${show(depth, unit)} is more than the tote's inside height (${show(enclosure.insideHeight, unit)}): enter a smaller depth.`,
    }
  }
  return { ok: true, volume: fromCubicMm(cubicMmAtDepth(enclosure, depth), unit) }
}

/** The tote's volume filled to the rim, in `unit` (the enclosure must pass {@link checkEnclosure}). */
export function capacity(enclosure: EnclosureShape, unit: VolumeUnit): number {
  return fromCubicMm(cubicMmAtDepth(enclosure, enclosure.insideHeight), unit)
}

/**
 * The water depth (base length units, nearest whole unit) that holds `volume` in `unit`.
 *
 * Volume grows strictly with depth, so bisection between the floor and the rim finds the depth to
 * well under one base unit; the result is then rounded.
 */
export function depthForVolume(enclosure: EnclosureShape, volume: number, unit: VolumeUnit): DepthResult {
  const problems = checkEnclosure(enclosure)
  if (problems.length > 0) return { ok: false, message: problems.join(' ') }
  if (!Number.isFinite(volume) || volume < 0) {
    return { ok: false, message: `Enter a water volume of zero or more ${unit === 'L' ? 'litres' : 'US gallons'}.` }
  }
  const target = toCubicMm(volume, unit)
  const full = cubicMmAtDepth(enclosure, enclosure.insideHeight)
  if (target > full * (1 + 1e-12)) {
    const fullShown = fromCubicMm(full, unit).toFixed(1)
    return {
      ok: false,
      message: `${volume} ${unit === 'L' ? 'L' : 'gal'} is more than the tote holds to the rim (${fullShown} ${unit === 'L' ? 'L' : 'gal'}): enter a smaller volume.`,
    }
  }
  let low = 0
  let high = enclosure.insideHeight
  while (high - low > 1e-3) {
    const mid = (low + high) / 2
    if (cubicMmAtDepth(enclosure, mid) < target) low = mid
    else high = mid
  }
  return { ok: true, depth: Math.round((low + high) / 2) }
}

// Volume in mm³ for a (possibly fractional) depth in base units.
function cubicMmAtDepth(enclosure: EnclosureShape, depth: number): number {
  const h = depth / LENGTH_BASE_PER_MM
  const area = (z: number) => {
    const t = z / (enclosure.insideHeight / LENGTH_BASE_PER_MM)
    const w = lerp(enclosure.bottomInsideWidth, enclosure.topInsideWidth, t) / LENGTH_BASE_PER_MM
    const l = lerp(enclosure.bottomInsideLength, enclosure.topInsideLength, t) / LENGTH_BASE_PER_MM
    return w * l
  }
  return (h / 6) * (area(0) + 4 * area(h / 2) + area(h))
}

const CUBIC_MM_PER_CUBIC_INCH = 25.4 ** 3 // 16 387.064 mm³ (1 in = 25.4 mm exactly)

function fromCubicMm(cubicMm: number, unit: VolumeUnit): number {
  return unit === 'L' ? cubicMm / CUBIC_MM_PER_LITRE : cubicMm / CUBIC_MM_PER_CUBIC_INCH / CUBIC_INCHES_PER_US_GALLON
}

function toCubicMm(volume: number, unit: VolumeUnit): number {
  return unit === 'L' ? volume * CUBIC_MM_PER_LITRE : volume * CUBIC_INCHES_PER_US_GALLON * CUBIC_MM_PER_CUBIC_INCH
}

function lerp(a: number, b: number, t: number): number {
  return a + (b - a) * t
}

function show(length: Length, unit: VolumeUnit): string {
  const lengthUnit: LengthUnit = unit === 'L' ? 'mm' : 'in'
  return formatLength(length, lengthUnit)
}
