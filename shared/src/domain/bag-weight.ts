/**
 * Hardware bags counted by weight. Small parts (net cups, collars, fittings, sprayers) get a unit
 * weight from a counted sample weighed at the bench; a bag's expected weight and tolerance follow from
 * its contents; a bag outside tolerance is refused and the parts most likely missing or extra are
 * named. Weights are whole milligrams (mg) so that sums never drift; people see grams and ounces.
 */
import { GRAMS_PER_POUND } from './weights'

/**
 * Grams in one avoirdupois ounce, exactly: 1 oz = 1/16 lb = 28.349 523 125 g (NIST Handbook 44,
 * Appendix C; NIST SP 811, Appendix B.8).
 */
export const GRAMS_PER_OUNCE = 28.349523125

/** Milligrams in one gram. */
export const MG_PER_GRAM = 1000

/** Units a weight may be typed in. */
export const WEIGHT_UNITS = ['g', 'kg', 'lb', 'oz'] as const
/** A unit a weight may be typed in. */
export type WeightUnit = (typeof WEIGHT_UNITS)[number]

const GRAMS_PER: Record<WeightUnit, number> = { g: 1, kg: 1000, lb: GRAMS_PER_POUND, oz: GRAMS_PER_OUNCE }

/** Unit weights are kept to a hundredth of a gram (10 mg): finer than that a bench scale cannot tell. */
export const UNIT_WEIGHT_STEP_MG = 10

/** The answer of a parser: the weight in whole milligrams, or what to fix. */
export type ParseWeightResult = { ok: true; mg: number } | { ok: false; message: string }

const UNIT_WORDS: Record<string, WeightUnit> = {
  g: 'g',
  gram: 'g',
  grams: 'g',
  kg: 'kg',
  kilogram: 'kg',
  kilograms: 'kg',
  lb: 'lb',
  lbs: 'lb',
  pound: 'lb',
  pounds: 'lb',
  oz: 'oz',
  ounce: 'oz',
  ounces: 'oz',
}

/** Converts a value in a unit to milligrams (unrounded), with the NIST factors. */
export function toMilligrams(value: number, unit: WeightUnit): number {
  return value * GRAMS_PER[unit] * MG_PER_GRAM
}

/** Converts milligrams to a unit (unrounded), with the NIST factors. */
export function fromMilligrams(mg: number, unit: WeightUnit): number {
  return mg / MG_PER_GRAM / GRAMS_PER[unit]
}

/**
 * Reads a typed weight: `212.4 g`, `0.2124 kg`, `7.5 oz`, `0.47 lb`, `1 lb 2.5 oz`. A number with no
 * unit is refused (a scale may be set to grams or ounces; guessing would be wrong by 28 times).
 */
export function parseWeight(text: string): ParseWeightResult {
  const s = text.trim().toLowerCase().replace(',', '.')
  if (s === '') return { ok: false, message: 'Enter a weight with its unit, e.g. 212.4 g or 7.5 oz' }
  if (/^-/.test(s)) return { ok: false, message: 'A weight cannot be negative: enter what the scale shows, e.g. 212.4 g' }
  const parts = [...s.matchAll(/(\d+(?:\.\d*)?|\.\d+)\s*([a-z]*)/g)]
  const rest = s.replace(/(\d+(?:\.\d*)?|\.\d+)\s*([a-z]*)/g, '').trim()
  if (parts.length === 0 || rest !== '')
    return { ok: false, message: `"${text.trim()}" is not a weight: enter a number and its unit, e.g. 212.4 g or 1 lb 2.5 oz` }
  if (parts.length > 2) return { ok: false, message: `"${text.trim()}" has too many numbers: enter one weight, e.g. 212.4 g or 1 lb 2.5 oz` }
  let mg = 0
  const units: WeightUnit[] = []
  for (const [, num, word] of parts) {
    if (!word) return { ok: false, message: `Give the weight's unit: g, kg, lb or oz (e.g. ${num} g); a number alone could be grams or ounces` }
    const unit = UNIT_WORDS[word]
    if (!unit) return { ok: false, message: `"${word}" is not a unit of weight: use g, kg, lb or oz` }
    units.push(unit)
    mg += toMilligrams(Number(num), unit)
  }
  if (units.length === 2 && !(units[0] === 'lb' && units[1] === 'oz'))
    return { ok: false, message: 'Two numbers are read as pounds and ounces, e.g. 1 lb 2.5 oz' }
  const rounded = Math.round(mg)
  if (!Number.isSafeInteger(rounded) || rounded > 1_000_000_000)
    return { ok: false, message: 'That weight is too large for a bench scale: check the number and its unit' }
  return { ok: true, mg: rounded }
}

/**
 * A line a serial bench scale sends, read for its weight. Scales differ; most print the weight and its
 * unit at the end of a line (`ST,GS,+  212.4 g`, `  0.468 lb`), and mark a moving reading with `US`
 * (unstable). Returns null for a line without a weight.
 */
export function readScaleLine(line: string): { mg: number; stable: boolean } | null {
  const m = /([+-]?\s*\d+(?:\.\d+)?)\s*(g|kg|lb|oz)\b/i.exec(line)
  if (!m) return null
  const value = Number(m[1]!.replace(/\s+/g, ''))
  if (!Number.isFinite(value) || value < 0) return null
  return { mg: Math.round(toMilligrams(value, m[2]!.toLowerCase() as WeightUnit)), stable: !/\bUS\b/.test(line) }
}

/** Grams with a fixed number of decimals: `4.25 g`. */
export function formatGrams(mg: number, decimals = 2): string {
  return `${(mg / MG_PER_GRAM).toFixed(decimals)} g`
}

/** Ounces, or pounds and ounces from one pound up: `4.49 oz`, `1 lb 2.50 oz`. */
export function formatOunces(mg: number): string {
  const oz = fromMilligrams(mg, 'oz')
  if (oz < 16) return `${oz.toFixed(2)} oz`
  const lb = Math.floor(oz / 16)
  return `${lb} lb ${(oz - lb * 16).toFixed(2)} oz`
}

/** A weight as people at the bench read it, in both systems: `127.40 g (4.49 oz)`. */
export function formatWeightBoth(mg: number, decimals = 2): string {
  return `${formatGrams(mg, decimals)} (${formatOunces(mg)})`
}

/** Rounds milligrams to the kept step of a unit weight (half up). */
export function keepUnitWeight(mg: number): number {
  return Math.round(mg / UNIT_WEIGHT_STEP_MG) * UNIT_WEIGHT_STEP_MG
}

/** A unit weight from a counted sample, with the division shown. */
export interface SampledUnitWeight {
  /** The unrounded weight of one piece, in grams. */
  exactGrams: number
  /** The kept unit weight, in milligrams (a multiple of 10 mg). */
  unitMg: number
  /** The division in words: `50 × 2 in foam collar weigh 212.4 g → 4.248 g each, kept as 4.25 g`. */
  words: string
}

/**
 * Divides a counted sample's weight by its count. `sampleMg` is what the scale showed, `count` how
 * many pieces were on it; throws with what to fix for a count below 1 or a weight of zero.
 */
export function sampleUnitWeight(count: number, sampleMg: number, name = 'pieces'): SampledUnitWeight {
  if (!Number.isSafeInteger(count) || count < 1) throw new Error('Count at least 1 piece onto the scale')
  if (!Number.isSafeInteger(sampleMg) || sampleMg <= 0) throw new Error('The sample must weigh more than 0 g')
  const exactGrams = sampleMg / count / MG_PER_GRAM
  const unitMg = keepUnitWeight(sampleMg / count)
  if (unitMg <= 0) throw new Error(`${count} pieces weighing ${formatGrams(sampleMg, 1)} is less than 0.01 g each: weigh a larger count`)
  const exact = Number(exactGrams.toFixed(4)).toString()
  const rounded = Number(exact) === unitMg / MG_PER_GRAM ? '' : `, kept as ${formatGrams(unitMg)}`
  return { exactGrams, unitMg, words: `${count} × ${name} weigh ${trimGrams(sampleMg)} → ${exact} g each${rounded}` }
}

/** Grams with only the decimals they need (212.4 g, 212 g, 0.005 g). */
function trimGrams(mg: number): string {
  return `${Number((mg / MG_PER_GRAM).toFixed(3))} g`
}

/**
 * The spread of a part from a few pieces weighed one by one: the largest distance of any of them from
 * the unit weight, in mg. With fewer than two pieces there is no spread to see.
 */
export function spreadFromSingles(unitMg: number, singlesMg: readonly number[]): number {
  if (singlesMg.length < 2) throw new Error('Weigh at least 2 pieces one by one to see their spread')
  return Math.max(...singlesMg.map((w) => Math.abs(w - unitMg)))
}

/** One line of a bag's contents. `spreadMg` is how far one piece may be from `unitMg` (±). */
export interface BagLine {
  partId: string
  sku: string
  name: string
  quantity: number
  unitMg: number
  spreadMg: number
  /** The bag itself (film, zip): weighed with the contents, never named as missing or extra. */
  isBag?: boolean
}

/** What a bag should weigh and how far it may be off, with the reasoning in lines for the screen. */
export interface BagExpectation {
  expectedMg: number
  toleranceMg: number
  summedSpreadMg: number
  floorMg: number
  /** The lightest part that could be missing (not the bag itself), or null for a bag of nothing. */
  lightest: { sku: string; name: string; unitMg: number } | null
  /** True when one missing lightest part would still pass: the spreads are too wide for this bag. */
  missingPartCouldPass: boolean
  reasoning: string[]
}

/**
 * Expected weight = Σ quantity × unit weight. Tolerance = the larger of the summed spread
 * (Σ quantity × spread, every piece at its worst) and a floor of half the lightest part's weight, so
 * that scale noise never refuses a good bag and one missing part is still caught while the summed
 * spread stays below that part's weight.
 */
export function bagExpectation(lines: readonly BagLine[]): BagExpectation {
  const problem = bagLinesProblem(lines)
  if (problem) throw new Error(problem)
  const expectedMg = lines.reduce((s, l) => s + l.quantity * l.unitMg, 0)
  const summedSpreadMg = lines.reduce((s, l) => s + l.quantity * l.spreadMg, 0)
  const parts = lines.filter((l) => !l.isBag)
  const lightestLine = parts.length ? parts.reduce((a, b) => (b.unitMg < a.unitMg ? b : a)) : null
  const floorMg = lightestLine ? Math.ceil(lightestLine.unitMg / 2) : 0
  const toleranceMg = Math.max(summedSpreadMg, floorMg)
  const missingPartCouldPass = lightestLine !== null && toleranceMg >= lightestLine.unitMg
  const reasoning = [
    `Expected: ${lines.map((l) => `${l.quantity} × ${formatGrams(l.unitMg)} (${l.name})`).join(' + ')} = ${formatWeightBoth(expectedMg)}`,
    `Summed spread: ${lines.map((l) => `${l.quantity} × ±${formatGrams(l.spreadMg)}`).join(' + ')} = ±${formatGrams(summedSpreadMg)}`,
    lightestLine
      ? `Floor: half the lightest part, ${lightestLine.name} ${formatGrams(lightestLine.unitMg)} ÷ 2 = ±${formatGrams(floorMg)}`
      : 'Floor: none (the bag holds no parts)',
    `Tolerance: the larger, ±${formatGrams(toleranceMg)}; a bag from ${formatGrams(expectedMg - toleranceMg)} to ${formatGrams(expectedMg + toleranceMg)} passes`,
  ]
  if (missingPartCouldPass && lightestLine) {
    reasoning.push(
      `Caution: the tolerance is not below one ${lightestLine.name} (${formatGrams(lightestLine.unitMg)}), so one missing could pass; weigh the spreads again or split the bag`,
    )
  }
  return {
    expectedMg,
    toleranceMg,
    summedSpreadMg,
    floorMg,
    lightest: lightestLine && { sku: lightestLine.sku, name: lightestLine.name, unitMg: lightestLine.unitMg },
    missingPartCouldPass,
    reasoning,
  }
}

/** What is wrong with a bag's lines, in words, or null. */
export function bagLinesProblem(lines: readonly BagLine[]): string | null {
  if (lines.length === 0) return 'The bag has no contents to weigh'
  for (const l of lines) {
    if (!Number.isSafeInteger(l.quantity) || l.quantity < 1) return `${l.name}: the quantity must be a whole number of at least 1`
    if (!Number.isSafeInteger(l.unitMg) || l.unitMg <= 0) return `${l.name} has no unit weight yet: weigh a counted sample first`
    if (!Number.isSafeInteger(l.spreadMg) || l.spreadMg < 0) return `${l.name}: the spread cannot be negative`
  }
  return null
}

/** One part of an explanation: `count` pieces missing (negative) or extra (positive). */
export interface ExplainedPart {
  sku: string
  name: string
  count: number
  mg: number
}

/** A combination of missing and extra parts and how much of the difference it leaves unexplained. */
export interface Explanation {
  parts: ExplainedPart[]
  /** The difference left after the combination (measured − expected − Σ count × unit weight), in mg. */
  residualMg: number
  words: string
}

/** How many pieces of one part an explanation may add or take away, and how many in all. */
const MAX_PER_PART = 3
const MAX_PIECES = 4

/** The finest step a bench scale for bags commonly reads (0.1 g): common practice, not a standard. */
export const SCALE_STEP_MG = 100

/**
 * The combinations of the bag's parts whose weights best explain a difference (measured − expected):
 * those that leave no more than `windowMg` unexplained (the parts' own summed spread, or one scale
 * step if that is larger). The simplest explanation is the likeliest — one collar missing, not two
 * cups missing and two collars extra — so the fewest pieces come first, then the smallest residual,
 * and only explanations as simple as the best are returned beside it. None means no count of the
 * bag's own parts explains it (a wrong part or something foreign in the bag). Missing counts never
 * exceed what the bag should hold.
 */
export function explainDifference(lines: readonly BagLine[], differenceMg: number, windowMg: number, limit = 3): Explanation[] {
  const parts = lines.filter((l) => !l.isBag)
  const found: { counts: number[]; residual: number; pieces: number }[] = []
  const counts = parts.map(() => 0)
  const walk = (i: number, explained: number, pieces: number) => {
    if (i === parts.length) {
      if (pieces === 0) return
      const residual = differenceMg - explained
      if (Math.abs(residual) <= windowMg) found.push({ counts: [...counts], residual, pieces })
      return
    }
    const p = parts[i]!
    const least = -Math.min(p.quantity, MAX_PER_PART)
    for (let c = least; c <= MAX_PER_PART; c++) {
      if (pieces + Math.abs(c) > MAX_PIECES) continue
      counts[i] = c
      walk(i + 1, explained + c * p.unitMg, pieces + Math.abs(c))
    }
    counts[i] = 0
  }
  walk(0, 0, 0)
  found.sort((a, b) => a.pieces - b.pieces || Math.abs(a.residual) - Math.abs(b.residual))
  const simplest = found[0]?.pieces
  return found
    .filter((f) => f.pieces === simplest)
    .slice(0, limit)
    .map((f) => {
      const named = f.counts.flatMap((c, i) => (c === 0 ? [] : [{ sku: parts[i]!.sku, name: parts[i]!.name, count: c, mg: c * parts[i]!.unitMg }]))
      const words = named
        .map((n) => `${Math.abs(n.count)} × ${n.name} ${n.count < 0 ? 'missing' : 'extra'} (${n.count < 0 ? '−' : '+'}${formatGrams(Math.abs(n.mg))})`)
        .join(', ')
      return { parts: named, residualMg: f.residual, words }
    })
}

/** The bench's verdict on one weighed bag. */
export interface BagVerdict {
  accepted: boolean
  differenceMg: number
  /** Best explanations of a refused bag (empty when accepted, or when nothing explains it). */
  explanations: Explanation[]
  /** The verdict in one sentence for the screen and the record. */
  words: string
}

/** Accepts a bag within tolerance; refuses one outside it and names the likely missing or extra parts. */
export function judgeBag(lines: readonly BagLine[], expectation: BagExpectation, measuredMg: number): BagVerdict {
  if (!Number.isSafeInteger(measuredMg) || measuredMg < 0) throw new Error('A weight cannot be negative')
  const differenceMg = measuredMg - expectation.expectedMg
  const signed = `${differenceMg < 0 ? '−' : '+'}${formatGrams(Math.abs(differenceMg))}`
  if (Math.abs(differenceMg) <= expectation.toleranceMg) {
    return {
      accepted: true,
      differenceMg,
      explanations: [],
      words: `Accepted: ${formatGrams(measuredMg)} is ${signed} from ${formatGrams(expectation.expectedMg)}, within ±${formatGrams(expectation.toleranceMg)}`,
    }
  }
  const explanations = explainDifference(lines, differenceMg, Math.max(expectation.summedSpreadMg, SCALE_STEP_MG))
  const head = `Refused: ${formatGrams(measuredMg)} is ${signed} from ${formatGrams(expectation.expectedMg)}, outside ±${formatGrams(expectation.toleranceMg)}`
  const why = explanations[0]
    ? `. Likely ${explanations[0].words}${
        explanations.length > 1
          ? `; or ${explanations
              .slice(1)
              .map((e) => e.words)
              .join('; or ')}`
          : ''
      }`
    : ". No count of this bag's parts explains it: look for a wrong part or something else in the bag"
  return { accepted: false, differenceMg, explanations, words: head + why }
}
