import { describe, expect, it } from 'vitest'
import { lengthUnitOf, outsideLimits, parseMeasurement } from './measurement'

describe('parseMeasurement', () => {
  it('reads fractions and mixed numbers as the shop writes them, in a step measured in inches', () => {
    expect(parseMeasurement('18 1/2', 'in')).toEqual({ ok: true, value: 18.5 })
    expect(parseMeasurement('18-1/2"', 'in')).toEqual({ ok: true, value: 18.5 })
    expect(parseMeasurement('18.5in', 'in')).toEqual({ ok: true, value: 18.5 })
    expect(parseMeasurement('3/8', 'in')).toEqual({ ok: true, value: 0.375 })
    expect(parseMeasurement('17 15/16', 'in')).toEqual({ ok: true, value: 17.9375 })
  })

  it('converts millimetres into a step measured in inches, and inches into one in millimetres', () => {
    // 1 in = 25.4 mm exactly (international yard and pound, 1959; NIST SP 811, B.8): 470 / 25.4 = 18.503937…
    expect(parseMeasurement('470 mm', 'in')).toEqual({ ok: true, value: 18.5039 })
    // 18-1/2 in × 25.4 = 469.9 mm
    expect(parseMeasurement('18 1/2 in', 'mm')).toEqual({ ok: true, value: 469.9 })
    expect(parseMeasurement('470', 'mm')).toEqual({ ok: true, value: 470 })
  })

  it('says what to fix when the text is no length', () => {
    const bad = parseMeasurement('about 18', 'in')
    expect(bad.ok).toBe(false)
    const fraction = parseMeasurement('18 1/2', 'mm')
    expect(fraction.ok || fraction.message).toMatch(/fraction/)
  })

  it('takes a plain decimal for a step that measures something other than a length', () => {
    expect(parseMeasurement('12.5', 'psi')).toEqual({ ok: true, value: 12.5 })
    const bad = parseMeasurement('12 1/2', 'psi')
    expect(bad.ok || bad.message).toMatch(/as a number in psi/)
    const comma = parseMeasurement('12,5', 'psi')
    expect(comma.ok || comma.message).toMatch(/point, not a comma/)
  })

  it('knows which units are lengths', () => {
    expect(lengthUnitOf('in')).toBe('in')
    expect(lengthUnitOf(' MM ')).toBe('mm')
    expect(lengthUnitOf('psi')).toBeNull()
    expect(lengthUnitOf(null)).toBeNull()
  })
})

describe('outsideLimits', () => {
  it('is outside only beyond a limit that is set; the limits themselves are inside', () => {
    expect(outsideLimits(18.5, 17.75, 18.25)).toBe(true)
    expect(outsideLimits(18.25, 17.75, 18.25)).toBe(false)
    expect(outsideLimits(17.7, 17.75, null)).toBe(true)
    expect(outsideLimits(99, null, null)).toBe(false)
  })
})
