import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import {
  CUBIC_INCHES_PER_US_GALLON,
  LITRES_PER_US_GALLON,
  capacity,
  checkEnclosure,
  depthForVolume,
  insideAtHeight,
  volumeAtDepth,
  type EnclosureShape,
  type VolumeUnit,
} from './reservoir'
import { inches, millimetres } from './units'

function volume(enclosure: EnclosureShape, depth: number, unit: VolumeUnit): number {
  const result = volumeAtDepth(enclosure, depth, unit)
  if (!result.ok) throw new Error(result.message)
  return result.volume
}

function depth(enclosure: EnclosureShape, vol: number, unit: VolumeUnit): number {
  const result = depthForVolume(enclosure, vol, unit)
  if (!result.ok) throw new Error(result.message)
  return result.depth
}

function inchBox(w: number, l: number, h: number): EnclosureShape {
  return {
    topInsideWidth: inches(w),
    topInsideLength: inches(l),
    bottomInsideWidth: inches(w),
    bottomInsideLength: inches(l),
    insideHeight: inches(h),
  }
}

// bottom 10 × 20 in, top 14 × 24 in, 12 in high: both sides taper by 4 in, so the shape is a frustum
// but not a similar one (10/14 ≠ 20/24).
const TAPERED: EnclosureShape = {
  bottomInsideWidth: inches(10),
  bottomInsideLength: inches(20),
  topInsideWidth: inches(14),
  topInsideLength: inches(24),
  insideHeight: inches(12),
}

describe('volume units', () => {
  it('uses 1 US gallon = 231 in³ exactly (NIST Handbook 44, Appendix C) and 1 in = 25.4 mm (1959)', () => {
    expect(CUBIC_INCHES_PER_US_GALLON).toBe(231)
    // 231 × 25.4³ mm³ = 3 785 411.784 mm³; 1 L = 1 dm³ = 10⁶ mm³ (SI)
    expect(LITRES_PER_US_GALLON).toBeCloseTo((231 * 25.4 ** 3) / 1e6, 12)
    expect(LITRES_PER_US_GALLON).toBe(3.785411784)
  })
})

describe('straight-sided box: volume = width × length × depth', () => {
  it('10 × 20 in box, 5 in deep: 1000 in³ = 1000/231 gal = 16.387064 L', () => {
    const box = inchBox(10, 20, 12)
    expect(volume(box, inches(5), 'gal')).toBeCloseTo(1000 / 231, 12)
    expect(volume(box, inches(5), 'L')).toBeCloseTo(16.387064, 12) // 1000 × 16.387064 cm³
  })

  it('300 × 400 mm box, 100 mm deep: 12 L exactly', () => {
    const box: EnclosureShape = {
      topInsideWidth: millimetres(300),
      topInsideLength: millimetres(400),
      bottomInsideWidth: millimetres(300),
      bottomInsideLength: millimetres(400),
      insideHeight: millimetres(250),
    }
    expect(volume(box, millimetres(100), 'L')).toBeCloseTo(12, 12)
    expect(depth(box, 12, 'L')).toBe(millimetres(100))
    expect(capacity(box, 'L')).toBeCloseTo(30, 12) // 300 × 400 × 250 mm³
  })
})

describe('tapered tote (frustum)', () => {
  it('matches the hand-worked prismoidal figures', () => {
    // Full: A(0) = 10 × 20 = 200, A(6) = 12 × 22 = 264, A(12) = 14 × 24 = 336 in²
    //   V = 12/6 × (200 + 4 × 264 + 336) = 2 × 1592 = 3184 in³
    expect(volume(TAPERED, inches(12), 'gal')).toBeCloseTo(3184 / 231, 10)
    // 6 in deep: A(0) = 200, A(3) = 11 × 21 = 231, A(6) = 264 in²
    //   V = 6/6 × (200 + 4 × 231 + 264) = 1388 in³ ≈ 6.009 gal
    expect(volume(TAPERED, inches(6), 'gal')).toBeCloseTo(1388 / 231, 10)
    expect(capacity(TAPERED, 'L')).toBeCloseTo((3184 * 16.387064) / 1000, 9)
  })

  it('agrees with the frustum-of-a-pyramid formula V = h/3 · (A1 + A2 + √(A1·A2)) for a similar frustum (standard geometry)', () => {
    // bottom 10 × 20, top 15 × 30, 10 in high: A1 = 200, A2 = 450, √(A1·A2) = 300
    // V = 10/3 × 950 = 3166.67 in³
    const similar: EnclosureShape = {
      bottomInsideWidth: inches(10),
      bottomInsideLength: inches(20),
      topInsideWidth: inches(15),
      topInsideLength: inches(30),
      insideHeight: inches(10),
    }
    expect(volume(similar, inches(10), 'gal') * 231).toBeCloseTo((10 / 3) * 950, 8)
  })

  it('agrees with a slice-by-slice sum (independent numerical check)', () => {
    // midpoint rule with 20 000 slices of the 12 in tote, 9 in deep
    const slices = 20_000
    const h = 9
    let sum = 0
    for (let i = 0; i < slices; i++) {
      const z = ((i + 0.5) * h) / slices
      sum += (10 + (4 * z) / 12) * (20 + (4 * z) / 12) * (h / slices)
    }
    expect(volume(TAPERED, inches(h), 'gal') * 231).toBeCloseTo(sum, 4)
  })

  it('finds the depth for a volume: 1388 in³ stands 6 in deep', () => {
    expect(depth(TAPERED, 1388 / 231, 'gal')).toBe(inches(6))
    expect(depth(TAPERED, 0, 'gal')).toBe(0)
    expect(depth(TAPERED, 3184 / 231, 'gal')).toBe(inches(12))
  })

  it('gives the inside at a height by straight taper', () => {
    expect(insideAtHeight(TAPERED, inches(6))).toEqual({ insideWidth: inches(12), insideLength: inches(22) })
    expect(insideAtHeight(TAPERED, inches(10))).toEqual({
      insideWidth: inches(10 + 40 / 12),
      insideLength: inches(20 + 40 / 12),
    })
  })
})

describe('round trip depth ↔ volume (property test)', () => {
  it('depthForVolume(volumeAtDepth(d)) is within one base unit of d', () => {
    const side = fc.integer({ min: inches(4), max: inches(40) })
    fc.assert(
      fc.property(
        side,
        side,
        side,
        side,
        fc.integer({ min: inches(2), max: inches(30) }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.constantFrom('L' as const, 'gal' as const),
        (a, b, c, d, height, fraction, unit) => {
          const enclosure: EnclosureShape = {
            topInsideWidth: Math.min(a, b),
            topInsideLength: Math.max(a, b),
            bottomInsideWidth: Math.min(c, d),
            bottomInsideLength: Math.max(c, d),
            insideHeight: height,
          }
          const d0 = Math.round(height * fraction)
          const back = depth(enclosure, volume(enclosure, d0, unit), unit)
          expect(Math.abs(back - d0)).toBeLessThanOrEqual(1)
        },
      ),
    )
  })
})

describe('bad input', () => {
  it('says what to fix', () => {
    expect(depthForVolume(TAPERED, 20, 'gal')).toEqual({
      ok: false,
      message: '20 gal is more than the tote holds to the rim (13.8 gal): enter a smaller volume.',
    })
    expect(depthForVolume(TAPERED, -1, 'L')).toMatchObject({ ok: false, message: /zero or more litres/ })
    expect(depthForVolume(TAPERED, Number.NaN, 'gal')).toMatchObject({ ok: false })
    expect(volumeAtDepth(TAPERED, inches(13), 'gal')).toMatchObject({
      ok: false,
      message: /13" is more than the tote's inside height \(12"\)/,
    })
    expect(volumeAtDepth(TAPERED, -1, 'gal')).toMatchObject({ ok: false, message: /zero or more/ })
    expect(checkEnclosure({ ...TAPERED, insideHeight: 0, bottomInsideWidth: -5 })).toEqual([
      "Enter the tote's inside width on the floor: it must be a length greater than zero.",
      "Enter the tote's inside height: it must be a length greater than zero.",
    ])
    expect(volumeAtDepth({ ...TAPERED, topInsideWidth: 1.5 }, 0, 'L')).toMatchObject({
      ok: false,
      message: /inside width at the rim/,
    })
  })
})
