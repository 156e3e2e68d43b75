/**
 * Lengths in Kitwright: one integer base unit, parsing of what shops type, and display.
 *
 * Choice of base unit (see also the constants below):
 * - 1 in = 25.4 mm exactly (international yard and pound agreement, 1959), so 1/64 in = 25.4/64 mm =
 *   127/320 mm. For 1/64 in to be a whole number of base units, the base unit must divide 1/320 mm;
 *   for 0.01 mm to be whole, it must divide 1/100 mm. The largest unit doing both is
 *   1/lcm(320, 100) mm = **1/1600 mm (0.625 µm)**.
 * - Then 1 mm = 1600, 0.01 mm = 16, 1 in = 40 640, 1/16 in = 2540, 1/64 in = 635, and a 20 ft stick is
 *   9 753 600: far inside a JavaScript safe integer (2^53) and a PostgreSQL `integer` (2^31 − 1 =
 *   2 147 483 647 ≈ 4 400 ft). Sums of many lengths stay exact as long as they stay below 2^53.
 * - Decimal inches beyond what a tape shows (0.840 in = 34 137.6) are rounded to the nearest base unit,
 *   an error under 0.32 µm, far below anything a shop can cut or measure.
 */

/** Base units in one millimetre: the base unit is 1/1600 mm (0.625 µm). */
export const LENGTH_BASE_PER_MM = 1600

/** Base units in one inch: 1 in = 25.4 mm exactly (international yard and pound agreement, 1959). */
export const LENGTH_BASE_PER_INCH = 40_640

/** Base units in one foot (12 in). */
export const LENGTH_BASE_PER_FOOT = 12 * LENGTH_BASE_PER_INCH

/** Largest length Kitwright accepts: it must fit a PostgreSQL `integer` column (2^31 − 1). */
export const MAX_LENGTH = 2_147_483_647

/**
 * A length as a whole number of base units (1/1600 mm). A plain number so that it crosses JSON, the
 * database and zod untouched; the name documents intent.
 */
export type Length = number

/** The two units a shop works in. */
export type LengthUnit = 'in' | 'mm'

/** The result of parsing: a length in base units, or a message that says what to fix. */
export type ParseLengthResult = { ok: true; value: Length } | { ok: false; message: string }

/** Options for {@link formatLength}. */
export interface FormatLengthOptions {
  /** Inches: the finest fraction shown, a power of two from 1 to 64 (default 16, i.e. 1/16 in). */
  denominator?: 1 | 2 | 4 | 8 | 16 | 32 | 64
  /** Inches: show feet and inches (`1' 2-1/2"`) for lengths of a foot or more (default false). */
  feet?: boolean
  /** Millimetres: digits after the decimal point (default 1). */
  decimals?: 0 | 1 | 2
  /** Prefix `≈` when the shown figure is not exactly the stored length (default false). */
  markRounded?: boolean
}

/** A length from inches, rounded to the nearest base unit (exact for fractions down to 1/64 in). */
export function inches(value: number): Length {
  return Math.round(value * LENGTH_BASE_PER_INCH)
}

/** A length from millimetres, rounded to the nearest base unit (exact down to 0.01 mm). */
export function millimetres(value: number): Length {
  return Math.round(value * LENGTH_BASE_PER_MM)
}

/** A length in (decimal) inches, for arithmetic that leaves the integer world (areas, volumes). */
export function toInches(value: Length): number {
  return value / LENGTH_BASE_PER_INCH
}

/** A length in (decimal) millimetres, for arithmetic that leaves the integer world (areas, volumes). */
export function toMillimetres(value: Length): number {
  return value / LENGTH_BASE_PER_MM
}

/** Whether a value is a usable length: a whole number of base units within ±{@link MAX_LENGTH}. */
export function isLength(value: unknown): value is Length {
  return typeof value === 'number' && Number.isInteger(value) && Math.abs(value) <= MAX_LENGTH
}

// ---------------------------------------------------------------------------------------------------
// Parsing

const EXAMPLES = `e.g. 4-1/4", 4 1/4, 4.25 in, 1' 2-1/2", 10 ft or 108 mm`

type Unit = 'in' | 'ft' | 'mm' | 'cm'

const UNIT_WORDS: Record<string, Unit> = {
  '"': 'in',
  '″': 'in',
  '”': 'in',
  "''": 'in',
  in: 'in',
  inch: 'in',
  inches: 'in',
  "'": 'ft',
  '′': 'ft',
  '’': 'ft',
  ft: 'ft',
  foot: 'ft',
  feet: 'ft',
  mm: 'mm',
  cm: 'cm',
}

const BASE_PER_UNIT: Record<Unit, number> = {
  in: LENGTH_BASE_PER_INCH,
  ft: LENGTH_BASE_PER_FOOT,
  mm: LENGTH_BASE_PER_MM,
  cm: 10 * LENGTH_BASE_PER_MM,
}

/** A number as an exact fraction n/d (both whole, d > 0) so that parsing never goes through floats. */
interface Ratio {
  n: bigint
  d: bigint
}

interface Quantity {
  amount: Ratio
  unit: Unit | null
  /** Written as a fraction (3/8, 4-1/4): only inches and feet are measured that way. */
  fractional: boolean
  text: string
}

// A quantity: whole + fraction (4 1/4, 4-1/4), a fraction (3/8), or a decimal (4.25, .5, 4.),
// followed by an optional unit. Anchored at the current position by the sticky flag.
const NUMBER = String.raw`(?:(\d+)(?:\s+|\s*-\s*)(\d+)\s*\/\s*(\d+)|(\d+)\s*\/\s*(\d+)|(\d+(?:\.\d*)?|\.\d+))`
const UNIT = String.raw`\s*(inches|inch|in|feet|foot|ft|mm|cm|''|["″”'′’])?`
const QUANTITY = new RegExp(NUMBER + UNIT, 'iy')

function ratio(n: bigint, d: bigint): Ratio {
  return { n, d }
}

function decimalRatio(text: string): Ratio {
  const [whole = '', frac = ''] = text.split('.')
  return ratio(BigInt((whole || '0') + frac), 10n ** BigInt(frac.length))
}

/**
 * Parses a length as a shop types it and returns it in base units, or a message saying what to fix.
 *
 * Accepted: `4 1/4`, `4-1/4"`, `4.25in`, `4.25 in`, `3/8`, `108 mm`, `108mm`, `10.8 cm`, `10 ft`,
 * `10'`, `1' 2-1/2"`, `1ft 2in`. Inch and foot marks may be straight or typographic quotes. A number
 * with no unit is read in `defaultUnit`; a bare fraction (`3/8`) is always inches, and is refused
 * when the default unit is millimetres (say `3/8 in` then). Lengths may not be negative. Values are
 * rounded to the nearest base unit, which is exact for fractions down to 1/64 in and for 0.01 mm.
 */
export function parseLength(text: string, defaultUnit: LengthUnit): ParseLengthResult {
  const input = text.trim()
  if (input === '') return fail(`Enter a length, ${EXAMPLES}.`)
  if (/^[-−–]/.test(input)) return fail(`A length cannot be negative: remove the minus sign from "${input}".`)
  if (/\d,\d/.test(input)) {
    return fail(`Write decimals with a point, not a comma: "${input.replace(',', '.')}" instead of "${input}".`)
  }

  const parts: Quantity[] = []
  let at = 0
  while (at < input.length) {
    while (at < input.length && /\s/.test(input.charAt(at))) at++
    if (at >= input.length) break
    QUANTITY.lastIndex = at
    const m = QUANTITY.exec(input)
    if (!m) return fail(unreadable(input, at))
    const [whole, mixedNum, mixedDen, num, den, decimal, unitWord] = m.slice(1)
    let amount: Ratio
    let fractional = false
    if (whole !== undefined && mixedNum !== undefined && mixedDen !== undefined) {
      const d = BigInt(mixedDen)
      const n = BigInt(mixedNum)
      if (d === 0n) return fail(`The fraction ${mixedNum}/${mixedDen} divides by zero: fix its bottom number.`)
      if (n >= d) {
        return fail(
          `In "${m[0].trim()}" the fraction ${mixedNum}/${mixedDen} should be less than 1: write it like 4-1/4".`,
        )
      }
      amount = ratio(BigInt(whole) * d + n, d)
      fractional = true
    } else if (num !== undefined && den !== undefined) {
      if (BigInt(den) === 0n) return fail(`The fraction ${num}/${den} divides by zero: fix its bottom number.`)
      amount = ratio(BigInt(num), BigInt(den))
      fractional = true
    } else {
      amount = decimalRatio(decimal ?? '0')
    }
    const unit = unitWord === undefined ? null : (UNIT_WORDS[unitWord.toLowerCase()] ?? null)
    parts.push({ amount, unit, fractional, text: m[0].trim() })
    at = QUANTITY.lastIndex
    // A number with no unit must be followed by a space or the end ("4.2.5" is not two numbers).
    if (unit === null && at < input.length && !/\s$/.test(m[0]) && !/\s/.test(input.charAt(at))) {
      return fail(unreadable(input, at))
    }
  }

  const first = parts[0]
  if (first === undefined) return fail(`Enter a length, ${EXAMPLES}.`)
  if (parts.length > 2) return fail(`"${input}" has too many numbers: write one length, ${EXAMPLES}.`)

  let total: Ratio
  if (parts.length === 2) {
    // Only feet followed by inches may be combined: 1' 2-1/2", 1 ft 2 in, 1' 2.
    const second = parts[1]
    if (second === undefined || first.unit !== 'ft' || (second.unit !== 'in' && second.unit !== null)) {
      return fail(
        `"${input}" has two numbers; only feet then inches can be combined (like 1' 2-1/2"). ` +
          `Write one length, ${EXAMPLES}.`,
      )
    }
    const ft = first.amount
    const inch = second.amount
    // feet × 12 + inches, as one fraction of inches
    total = ratio(ft.n * 12n * inch.d + inch.n * ft.d, ft.d * inch.d)
    return toBase(total, 'in', input)
  }

  let unit: Unit
  if (first.unit !== null) {
    unit = first.unit
  } else if (first.fractional) {
    if (defaultUnit === 'mm') {
      return fail(
        `"${input}" is a fraction, which only makes sense in inches: write "${input} in", or give millimetres as a decimal (108.5 mm).`,
      )
    }
    unit = 'in'
  } else {
    unit = defaultUnit
  }
  if (first.fractional && (unit === 'mm' || unit === 'cm')) {
    return fail(`Millimetres are written as decimals, not fractions: write "${first.text}" like 108.5 mm.`)
  }
  return toBase(first.amount, unit, input)
}

function toBase(amount: Ratio, unit: Unit, input: string): ParseLengthResult {
  // value = amount × base-per-unit, rounded half up to the nearest base unit (all non-negative here)
  const scaled = amount.n * BigInt(BASE_PER_UNIT[unit])
  const rounded = (2n * scaled + amount.d) / (2n * amount.d)
  if (rounded > BigInt(MAX_LENGTH)) {
    const limit = formatLength(MAX_LENGTH, unit === 'mm' || unit === 'cm' ? 'mm' : 'in', { feet: true, decimals: 0 })
    return fail(`"${input}" is too long: Kitwright stores lengths up to ${limit}.`)
  }
  return { ok: true, value: Number(rounded) }
}

function unreadable(input: string, at: number): string {
  const rest = input.slice(at)
  if (/^[a-z]/i.test(rest)) {
    const word = /^[a-z.]+/i.exec(rest)?.[0] ?? rest
    if (at === 0) return `"${input}" does not start with a number: write a length, ${EXAMPLES}.`
    return `"${word}" is not a unit Kitwright knows: use in, ", ft, ', mm or cm (${EXAMPLES}).`
  }
  return `Cannot read "${rest}" in "${input}": write a length, ${EXAMPLES}.`
}

function fail(message: string): ParseLengthResult {
  return { ok: false, message }
}

// ---------------------------------------------------------------------------------------------------
// Formatting

function gcd(a: number, b: number): number {
  let x = Math.abs(a)
  let y = Math.abs(b)
  while (y !== 0) [x, y] = [y, x % y]
  return x
}

/**
 * Formats a length for people. Inches are shown as a whole number and a reduced fraction rounded to
 * the nearest 1/16 in (or `opts.denominator`), halves rounding away from zero: `4-1/4"`, `12"`,
 * `1/2"`, `0"`; with `opts.feet`, `1' 2-1/2"`. Millimetres are shown with one decimal (or
 * `opts.decimals`): `108.0 mm`. Negative lengths (which show up in warnings) carry a leading `-`.
 * The output of this function is always accepted by {@link parseLength}, apart from the sign.
 */
export function formatLength(value: Length, unit: LengthUnit, opts: FormatLengthOptions = {}): string {
  const sign = value < 0 ? '-' : ''
  const magnitude = Math.abs(value)
  let text: string
  let exact: boolean
  if (unit === 'mm') {
    const decimals = opts.decimals ?? 1
    const step = LENGTH_BASE_PER_MM / 10 ** decimals // 1600, 160 or 16 base units: always whole
    const steps = Math.round(magnitude / step)
    exact = steps * step === magnitude
    text = `${(steps / 10 ** decimals).toFixed(decimals)} mm`
  } else {
    const denominator = opts.denominator ?? 16
    const step = LENGTH_BASE_PER_INCH / denominator // 40640 / 64 = 635: always whole
    const steps = Math.round(magnitude / step)
    exact = steps * step === magnitude
    const wholeInches = Math.floor(steps / denominator)
    const num = steps % denominator
    const fraction = num === 0 ? '' : `${num / gcd(num, denominator)}/${denominator / gcd(num, denominator)}`
    let feetPart = ''
    let inchPart = wholeInches
    if (opts.feet && wholeInches >= 12) {
      feetPart = `${Math.floor(wholeInches / 12)}' `
      inchPart = wholeInches % 12
    }
    let inchText: string
    if (fraction === '') inchText = `${inchPart}"`
    else if (inchPart === 0) inchText = `${fraction}"`
    else inchText = `${inchPart}-${fraction}"`
    text = feetPart + inchText
  }
  const shownSign = text.match(/^0(\.0+)? mm$|^0"$/) ? '' : sign
  return (opts.markRounded && !exact ? '≈' : '') + shownSign + text
}

/**
 * Formats a length for an input field or a file so that parsing it back gives exactly the same
 * length: whole feet from 5 ft up as feet (`10 ft`, how sticks are bought), a whole number of 64ths
 * of an inch as a fraction (`4-1/4"`), otherwise decimal inches with the fewest decimals that read
 * back exactly (`0.84 in`); millimetres likewise (`108 mm`, `21.336 mm`). Five decimals are finer
 * than the base unit in either unit, so the loop always ends with an exact text.
 */
export function formatLengthForInput(value: Length, unit: LengthUnit): string {
  if (unit === 'in' && value >= 5 * LENGTH_BASE_PER_FOOT && value % LENGTH_BASE_PER_FOOT === 0) return `${value / LENGTH_BASE_PER_FOOT} ft`
  if (unit === 'in' && value % (LENGTH_BASE_PER_INCH / 64) === 0) return formatLength(value, 'in', { denominator: 64 })
  const perUnit = unit === 'mm' ? LENGTH_BASE_PER_MM : LENGTH_BASE_PER_INCH
  // The fewest decimals that still read back as this very length.
  for (let decimals = 0; decimals < 5; decimals++) {
    const text = (value / perUnit).toFixed(decimals)
    if (Math.round(Number(text) * perUnit) === value) return `${Number(text)} ${unit}`
  }
  return `${Number((value / perUnit).toFixed(5))} ${unit}`
}
