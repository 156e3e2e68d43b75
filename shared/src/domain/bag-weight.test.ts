import { describe, expect, it } from 'vitest'
import {
  bagExpectation,
  explainDifference,
  formatOunces,
  formatWeightBoth,
  fromMilligrams,
  GRAMS_PER_OUNCE,
  judgeBag,
  parseWeight,
  readScaleLine,
  sampleUnitWeight,
  spreadFromSingles,
  toMilligrams,
  type BagLine,
} from './bag-weight'
import { GRAMS_PER_POUND } from './weights'

// The spare cups-and-collars pack, with hand-chosen weights (the demo's figures, invented):
// 12 net cups at 6.10 g ± 0.08 g, 12 collars at 4.25 g ± 0.05 g, the zip bag at 3.20 g ± 0.10 g.
const PACK: BagLine[] = [
  { partId: 'cup', sku: 'CUP', name: '2 in net cup', quantity: 12, unitMg: 6100, spreadMg: 80 },
  { partId: 'collar', sku: 'COLLAR', name: '2 in foam collar', quantity: 12, unitMg: 4250, spreadMg: 50 },
  { partId: 'bag', sku: 'BAG', name: 'zip bag', quantity: 1, unitMg: 3200, spreadMg: 100, isBag: true },
]

describe('units of weight (NIST Handbook 44, Appendix C; NIST SP 811, Appendix B.8)', () => {
  it('takes 1 lb = 453.59237 g and 1 oz = 28.349523125 g exactly, 16 oz to the pound', () => {
    expect(GRAMS_PER_POUND).toBe(453.59237)
    expect(GRAMS_PER_OUNCE).toBe(28.349523125)
    expect(16 * GRAMS_PER_OUNCE).toBe(GRAMS_PER_POUND)
    expect(toMilligrams(1, 'lb')).toBeCloseTo(453_592.37, 6)
    expect(toMilligrams(1, 'oz')).toBeCloseTo(28_349.523125, 6)
    // NIST SP 811, B.8: 1 g = 0.035 273 96 oz (avoirdupois).
    expect(fromMilligrams(1000, 'oz')).toBeCloseTo(0.03527396, 8)
    // NIST Handbook 44, Appendix C: 1 kg = 2.204 622 6 lb.
    expect(fromMilligrams(1_000_000, 'lb')).toBeCloseTo(2.2046226, 7)
  })

  it('reads typed weights in g, kg, lb, oz and lb + oz, to the milligram', () => {
    expect(parseWeight('212.4 g')).toEqual({ ok: true, mg: 212_400 })
    expect(parseWeight('212.4g')).toEqual({ ok: true, mg: 212_400 })
    expect(parseWeight('0.2124 kg')).toEqual({ ok: true, mg: 212_400 })
    // 2 oz = 56.699 046 25 g → 56 699 mg (worked by hand from 28.349 523 125 g/oz).
    expect(parseWeight('2 oz')).toEqual({ ok: true, mg: 56_699 })
    // 1 lb 2.5 oz = 453.592 37 + 70.873 807 8 = 524.466 177 8 g → 524 466 mg.
    expect(parseWeight('1 lb 2.5 oz')).toEqual({ ok: true, mg: 524_466 })
    expect(parseWeight('0.5 lbs')).toEqual({ ok: true, mg: 226_796 })
  })

  it('refuses a number with no unit, a negative weight and words that are no weight, saying what to fix', () => {
    const noUnit = parseWeight('212.4')
    expect(noUnit.ok).toBe(false)
    if (!noUnit.ok) expect(noUnit.message).toMatch(/unit: g, kg, lb or oz/)
    const negative = parseWeight('-3 g')
    expect(negative.ok).toBe(false)
    if (!negative.ok) expect(negative.message).toMatch(/cannot be negative/)
    expect(parseWeight('').ok).toBe(false)
    expect(parseWeight('heavy').ok).toBe(false)
    expect(parseWeight('5 stone').ok).toBe(false)
    expect(parseWeight('2 oz 1 lb').ok).toBe(false)
  })

  it('shows grams beside ounces, and pounds and ounces from a pound up', () => {
    // 127.40 g ÷ 28.349 523 125 = 4.4939 oz (worked by hand).
    expect(formatWeightBoth(127_400)).toBe('127.40 g (4.49 oz)')
    // 524.466 g = 18.5 oz = 1 lb 2.50 oz.
    expect(formatOunces(524_466)).toBe('1 lb 2.50 oz')
  })

  it("reads a serial scale's line and whether it is steady", () => {
    expect(readScaleLine('ST,GS,+  212.4 g\r')).toEqual({ mg: 212_400, stable: true })
    expect(readScaleLine('US,GS,+  212.1 g')).toEqual({ mg: 212_100, stable: false })
    expect(readScaleLine('   0.468 lb')).toEqual({ mg: Math.round(0.468 * 453_592.37), stable: true })
    expect(readScaleLine('OK')).toBeNull()
  })
})

describe('unit weight from a counted sample', () => {
  it('divides and shows the rounding: 50 collars weigh 212.4 g → 4.248 g each, kept as 4.25 g', () => {
    const s = sampleUnitWeight(50, 212_400, '2 in foam collar')
    expect(s.exactGrams).toBeCloseTo(4.248, 9)
    expect(s.unitMg).toBe(4250)
    expect(s.words).toBe('50 × 2 in foam collar weigh 212.4 g → 4.248 g each, kept as 4.25 g')
  })

  it('says nothing of rounding when the division comes out even: 20 cups weigh 122 g → 6.1 g each', () => {
    const s = sampleUnitWeight(20, 122_000, '2 in net cup')
    expect(s.unitMg).toBe(6100)
    expect(s.words).toBe('20 × 2 in net cup weigh 122 g → 6.1 g each')
  })

  it('refuses a count of 0 and a sample of no weight', () => {
    expect(() => sampleUnitWeight(0, 212_400)).toThrow(/at least 1/)
    expect(() => sampleUnitWeight(50, 0)).toThrow(/more than 0 g/)
  })

  it('takes the spread as the farthest single piece from the unit weight', () => {
    // Singles 4.21, 4.30, 4.24 g around 4.25 g: farthest is 4.30, 0.05 g away.
    expect(spreadFromSingles(4250, [4210, 4300, 4240])).toBe(50)
    expect(() => spreadFromSingles(4250, [4250])).toThrow(/at least 2/)
  })
})

describe("a bag's expected weight and tolerance (hand-worked)", () => {
  it('sums the contents and takes the larger of the summed spread and half the lightest part', () => {
    const e = bagExpectation(PACK)
    // 12 × 6.10 + 12 × 4.25 + 3.20 = 73.20 + 51.00 + 3.20 = 127.40 g.
    expect(e.expectedMg).toBe(127_400)
    // 12 × 0.08 + 12 × 0.05 + 0.10 = 1.66 g; half the lightest part (collar 4.25 g) = 2.125 g; the larger is 2.125 g.
    expect(e.summedSpreadMg).toBe(1660)
    expect(e.floorMg).toBe(2125)
    expect(e.toleranceMg).toBe(2125)
    expect(e.missingPartCouldPass).toBe(false)
    expect(e.reasoning.join('\n')).toContain('Floor: half the lightest part, 2 in foam collar 4.25 g ÷ 2 = ±2.13 g')
  })

  it('warns when the spreads are so wide that a missing part could pass', () => {
    const loose = PACK.map((l) => (l.sku === 'COLLAR' ? { ...l, spreadMg: 400 } : l))
    // 0.96 + 12 × 0.40 + 0.10 = 5.86 g ≥ 4.25 g.
    const e = bagExpectation(loose)
    expect(e.toleranceMg).toBe(5860)
    expect(e.missingPartCouldPass).toBe(true)
    expect(e.reasoning.at(-1)).toMatch(/one missing could pass/)
  })

  it('refuses a bag whose part has no unit weight yet', () => {
    expect(() => bagExpectation([{ ...PACK[0]!, unitMg: 0 }])).toThrow(/no unit weight yet/)
  })
})

describe('the verdict on a weighed bag', () => {
  const e = bagExpectation(PACK)

  it('detects one missing collar and names it: 123.2 g is −4.20 g', () => {
    const v = judgeBag(PACK, e, 123_200)
    expect(v.accepted).toBe(false)
    expect(v.differenceMg).toBe(-4200)
    expect(v.explanations[0]!.parts).toEqual([{ sku: 'COLLAR', name: '2 in foam collar', count: -1, mg: -4250 }])
    // −4.20 − (−4.25) = +0.05 g left over.
    expect(v.explanations[0]!.residualMg).toBe(50)
    // Only the collar: a missing net cup (−6.10 g) leaves 1.90 g unexplained, more than the 1.66 g summed spread.
    expect(v.words).toBe('Refused: 123.20 g is −4.20 g from 127.40 g, outside ±2.13 g. Likely 1 × 2 in foam collar missing (−4.25 g)')
  })

  it('names equally simple explanations side by side, and no more complicated ones', () => {
    // Two parts of the same weight cannot be told apart on a scale: both are named, and nothing of 3 pieces.
    const twins: BagLine[] = [
      { partId: 'a', sku: 'A', name: 'part A', quantity: 4, unitMg: 5000, spreadMg: 20 },
      { partId: 'b', sku: 'B', name: 'part B', quantity: 4, unitMg: 5000, spreadMg: 20 },
    ]
    const found = explainDifference(twins, -5000, 160)
    expect(found.map((f) => f.words)).toEqual(['1 × part A missing (−5.00 g)', '1 × part B missing (−5.00 g)'])
  })

  it('accepts a bag within tolerance: 128.3 g is +0.90 g', () => {
    const v = judgeBag(PACK, e, 128_300)
    expect(v.accepted).toBe(true)
    expect(v.explanations).toEqual([])
    expect(v.words).toBe('Accepted: 128.30 g is +0.90 g from 127.40 g, within ±2.13 g')
  })

  it('names an extra net cup: 133.4 g is +6.00 g', () => {
    const v = judgeBag(PACK, e, 133_400)
    expect(v.accepted).toBe(false)
    expect(v.explanations[0]!.parts).toEqual([{ sku: 'CUP', name: '2 in net cup', count: 1, mg: 6100 }])
    expect(v.words).toContain('Likely 1 × 2 in net cup extra (+6.10 g)')
  })

  it('names a combination: two collars missing and one net cup extra is −2.40 g', () => {
    // −2 × 4.25 + 6.10 = −2.40 g (worked by hand). One collar missing with one cup extra (+1.85 g) would
    // pass a ±2.125 g tolerance: weighing cannot see a swap of similar weights.
    const found = explainDifference(PACK, -2400, 100)
    expect(found[0]!.parts).toEqual([
      { sku: 'CUP', name: '2 in net cup', count: 1, mg: 6100 },
      { sku: 'COLLAR', name: '2 in foam collar', count: -2, mg: -8500 },
    ])
  })

  it('says nothing explains a difference no count of the parts makes', () => {
    // +40 g: more than any 4 pieces of the pack (4 × 6.10 = 24.4 g).
    const v = judgeBag(PACK, e, 167_400)
    expect(v.accepted).toBe(false)
    expect(v.explanations).toEqual([])
    expect(v.words).toMatch(/No count of this bag's parts explains it/)
  })

  it('never names more missing than the bag holds', () => {
    const one: BagLine[] = [{ partId: 'g', sku: 'GROMMET', name: 'grommet', quantity: 1, unitMg: 5000, spreadMg: 100 }]
    const found = explainDifference(one, -10_000, 500)
    expect(found).toEqual([])
  })
})
