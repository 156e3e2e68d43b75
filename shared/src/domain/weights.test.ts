import { describe, expect, it } from 'vitest'
import { inches, millimetres } from './units'
import { COMMON_DIVISOR_CM3_PER_KG, COMMON_DIVISOR_IN3_PER_LB, dimensionalWeightGrams, formatWeight, GRAMS_PER_POUND, gramsToPounds, parcelWeights, poundsToGrams } from './weights'

const IN_LB = { value: COMMON_DIVISOR_IN3_PER_LB, system: 'in3_per_lb' } as const
const CM_KG = { value: COMMON_DIVISOR_CM3_PER_KG, system: 'cm3_per_kg' } as const

describe('pounds and grams', () => {
  // NIST Handbook 44, Appendix C (and the international yard and pound agreement of 1959): 1 lb = 0.453 592 37 kg exactly.
  it('takes 1 lb as 453.59237 g exactly', () => {
    expect(GRAMS_PER_POUND).toBe(453.59237)
    expect(poundsToGrams(1)).toBe(453.59237)
    expect(poundsToGrams(100)).toBeCloseTo(45_359.237, 9)
    // NIST Handbook 44, Appendix C: 1 kg = 2.204 622 6 lb.
    expect(gramsToPounds(1000)).toBeCloseTo(2.2046226, 7)
  })
})

describe('dimensional weight = L × W × H ÷ divisor', () => {
  // 139 in³/lb: a common carrier divisor (from memory of published rate guides).
  // Worked by hand: 12 × 12 × 12 in = 1728 in³; 1728 / 139 = 12.431 65 lb; × 453.592 37 = 5638.90 g.
  it('gives 12.43 lb for a 12 in cube at 139 in³/lb', () => {
    const g = dimensionalWeightGrams({ length: inches(12), width: inches(12), height: inches(12) }, IN_LB)
    expect(gramsToPounds(g)).toBeCloseTo(1728 / 139, 9)
    expect(g).toBeCloseTo(5638.9, 1)
  })

  // 5000 cm³/kg: a common metric divisor (from memory). Worked by hand: 40 × 30 × 20 cm = 24 000 cm³; / 5000 = 4.8 kg.
  it('gives 4.8 kg for a 400 × 300 × 200 mm box at 5000 cm³/kg', () => {
    expect(dimensionalWeightGrams({ length: millimetres(400), width: millimetres(300), height: millimetres(200) }, CM_KG)).toBeCloseTo(4800, 9)
  })

  it('says what to fix for a box with no size or a zero divisor', () => {
    expect(() => dimensionalWeightGrams({ length: 0, width: inches(1), height: inches(1) }, IN_LB)).toThrow(/length/)
    expect(() => dimensionalWeightGrams({ length: inches(1), width: inches(1), height: inches(1) }, { value: 0, system: 'in3_per_lb' })).toThrow(/divisor/)
  })
})

describe('billable weight = the larger of actual and dimensional', () => {
  // The demo's large carton, 31 × 21 × 16 in = 10 416 in³; / 139 = 74.935 25 lb; × 453.592 37 = 33 990.06 g, rounded up to 33 991 g (worked by hand).
  const large = { length: inches(31), width: inches(21), height: inches(16) }
  it('bills a light, bulky parcel on its dimensional weight', () => {
    expect(parcelWeights(9_500, large, IN_LB)).toEqual({ actualGrams: 9_500, dimensionalGrams: 33_991, billableGrams: 33_991 })
  })
  it('bills a dense parcel on its actual weight', () => {
    expect(parcelWeights(40_000, large, IN_LB)).toEqual({ actualGrams: 40_000, dimensionalGrams: 33_991, billableGrams: 40_000 })
  })
  it('refuses a parcel of no weight', () => {
    expect(() => parcelWeights(0, large, IN_LB)).toThrow(/above zero/)
  })
  it('shows weights in the shop unit first', () => {
    expect(formatWeight(453.59237 * 2, 'in')).toBe('2.00 lb (0.91 kg)')
    expect(formatWeight(1500, 'mm')).toBe('1.50 kg (3.31 lb)')
  })
})
