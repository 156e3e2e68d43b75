import { describe, expect, it } from 'vitest'
import { PASCALS_PER_PSI } from '../kits'
import { firstPassYield, formatPressure, fromPascals, judgeLeakTest, toPascals, type LeakTestRule } from './leak-test'

// The demo manifolds' protocol (server/src/seeds/kits.ts): 10 to 20 psi, hold 10 min, drop at most 0.5 psi.
// Worked by hand: 10 × 6894.757293 = 68 947.57 → 68 948 Pa; 20 × … = 137 895.15 → 137 895 Pa; 0.5 × … = 3447.38 → 3447 Pa.
const RULE: LeakTestRule = { minPressurePa: 68_948, maxPressurePa: 137_895, holdMinutes: 10, maxDropPa: 3447 }

describe('pressure units', () => {
  it('converts psi by NIST SP 811 Appendix B.8: 1 psi = 6.894757 kPa', () => {
    // NIST SP 811 (2008), B.8, "pound-force per square inch (psi) → kilopascal (kPa): 6.894 757 E+00".
    expect(PASCALS_PER_PSI / 1000).toBeCloseTo(6.894757, 6)
    expect(toPascals(1000, 'psi')).toBe(6_894_757)
    expect(toPascals(1, 'psi')).toBe(6895)
    expect(fromPascals(6_894_757, 'psi')).toBeCloseTo(1000, 3)
  })

  it('takes kPa as 1000 Pa (SI) and shows 100 kPa as 14.50 psi', () => {
    expect(toPascals(100, 'kPa')).toBe(100_000)
    expect(toPascals(96.5, 'kPa')).toBe(96_500)
    // 100 000 / 6894.757 = 14.5038 psi (NIST SP 811 B.8, inverted).
    expect(formatPressure(100_000, 'psi')).toBe('14.50 psi')
    expect(formatPressure(100_000, 'kPa')).toBe('100.0 kPa')
  })

  it('rounds readings to whole pascals: 15 psi = 103 421 Pa, 14.6 psi = 100 663 Pa', () => {
    // 15 × 6894.757293 = 103 421.36; 14.6 × 6894.757293 = 100 663.46 (worked by hand).
    expect(toPascals(15, 'psi')).toBe(103_421)
    expect(toPascals(14.6, 'psi')).toBe(100_663)
  })
})

describe('judging a leak test by the protocol', () => {
  const reading = (startPsi: number, endPsi: number, extra: Partial<{ holdMinutes: number; leaks: ('sprayer' | 'cord_hole' | 'drain_grommet')[] }> = {}) => ({
    startPressurePa: toPascals(startPsi, 'psi'),
    endPressurePa: toPascals(endPsi, 'psi'),
    holdMinutes: extra.holdMinutes ?? 10,
    leaks: extra.leaks ?? [],
  })

  it('passes 15 psi falling to 14.6 psi over 10 min with no leaks (drop 0.4 psi = 2758 Pa ≤ 3447 Pa)', () => {
    const v = judgeLeakTest(RULE, reading(15, 14.6))
    expect(v).toEqual({ passed: true, dropPa: 2758, reasons: [] })
  })

  it('fails 15 psi falling to 14.4 psi: a drop of 0.60 psi is over the allowed 0.50 psi', () => {
    // 14.4 × 6894.757293 = 99 284.51 → 99 285 Pa; 103 421 − 99 285 = 4136 Pa = 0.5999 psi.
    const v = judgeLeakTest(RULE, reading(15, 14.4))
    expect(v.passed).toBe(false)
    expect(v.dropPa).toBe(4136)
    expect(v.reasons).toEqual(['Pressure dropped 0.60 psi, more than the allowed 0.50 psi'])
  })

  it('treats the limits as inclusive: start exactly at the minimum and a drop exactly at the maximum pass', () => {
    expect(judgeLeakTest(RULE, { startPressurePa: 68_948, endPressurePa: 68_948 - 3447, holdMinutes: 10, leaks: [] }).passed).toBe(true)
    expect(judgeLeakTest(RULE, { startPressurePa: 137_895, endPressurePa: 137_895, holdMinutes: 10, leaks: [] }).passed).toBe(true)
    expect(judgeLeakTest(RULE, { startPressurePa: 68_947, endPressurePa: 68_947, holdMinutes: 10, leaks: [] }).reasons).toEqual([
      "Start pressure 10.00 psi is below the protocol's 10.00 psi",
    ])
    expect(judgeLeakTest(RULE, { startPressurePa: 100_000, endPressurePa: 100_000 - 3448, holdMinutes: 10, leaks: [] }).passed).toBe(false)
  })

  it('fails a start above the range (25 psi against at most 20 psi)', () => {
    const v = judgeLeakTest(RULE, reading(25, 25))
    expect(v.reasons).toEqual(["Start pressure 25.00 psi is above the protocol's 20.00 psi"])
  })

  it('fails a hold shorter than the protocol asks', () => {
    expect(judgeLeakTest(RULE, reading(15, 15, { holdMinutes: 9 })).reasons).toEqual(['Held 9 min; the protocol asks for at least 10 min'])
    expect(judgeLeakTest(RULE, reading(15, 15, { holdMinutes: 30 })).passed).toBe(true)
  })

  it('fails any leak seen, even with the gauge steady, and names each place once', () => {
    const v = judgeLeakTest(RULE, reading(15, 15, { leaks: ['sprayer', 'cord_hole', 'sprayer'] }))
    expect(v.passed).toBe(false)
    expect(v.reasons).toEqual(['Leak seen at: sprayer, cord hole'])
  })

  it('gives every failed check, in the unit the gauge was read in', () => {
    const v = judgeLeakTest(RULE, { startPressurePa: 60_000, endPressurePa: 55_000, holdMinutes: 5, leaks: ['drain_grommet'] }, 'kPa')
    expect(v.reasons).toEqual([
      "Start pressure 60.0 kPa is below the protocol's 68.9 kPa",
      'Pressure dropped 5.0 kPa, more than the allowed 3.4 kPa',
      'Held 5 min; the protocol asks for at least 10 min',
      'Leak seen at: drain grommet',
    ])
  })

  it('judges kPa readings the same way: 100 → 97 kPa passes (3000 Pa), 100 → 96.5 kPa fails (3500 Pa)', () => {
    const kpa = (start: number, end: number) => ({ startPressurePa: toPascals(start, 'kPa'), endPressurePa: toPascals(end, 'kPa'), holdMinutes: 10, leaks: [] })
    expect(judgeLeakTest(RULE, kpa(100, 97))).toEqual({ passed: true, dropPa: 3000, reasons: [] })
    expect(judgeLeakTest(RULE, kpa(100, 96.5)).passed).toBe(false)
  })

  it('passes a pressure that rose over the hold (negative drop)', () => {
    expect(judgeLeakTest(RULE, reading(15, 15.2))).toMatchObject({ passed: true, dropPa: -1379 })
  })
})

describe('first-pass yield', () => {
  it('is the share of units whose first test passed', () => {
    expect(firstPassYield([true, false, true, true])).toBe(0.75)
    expect(firstPassYield([false])).toBe(0)
    expect(firstPassYield([])).toBeNull()
  })
})
