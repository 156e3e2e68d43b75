import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import {
  LENGTH_BASE_PER_FOOT,
  LENGTH_BASE_PER_INCH,
  LENGTH_BASE_PER_MM,
  MAX_LENGTH,
  formatLength,
  formatLengthForInput,
  inches,
  isLength,
  millimetres,
  parseLength,
  toInches,
  toMillimetres,
} from './units'

function parsed(text: string, unit: 'in' | 'mm' = 'in'): number {
  const result = parseLength(text, unit)
  if (!result.ok) throw new Error(`expected "${text}" to parse, got: ${result.message}`)
  return result.value
}

function refused(text: string, unit: 'in' | 'mm' = 'in'): string {
  const result = parseLength(text, unit)
  if (result.ok) throw new Error(`expected "${text}" to be refused, got ${result.value}`)
  return result.message
}

const SIXTEENTH = LENGTH_BASE_PER_INCH / 16
const THIRTY_SECOND = LENGTH_BASE_PER_INCH / 32

describe('base unit', () => {
  it('keeps 1 in = 25.4 mm exactly (international yard and pound agreement, 1959)', () => {
    // 25.4 × 1600 = 40 640, with no rounding anywhere
    expect(LENGTH_BASE_PER_INCH * 10).toBe(254 * LENGTH_BASE_PER_MM)
    expect(toMillimetres(LENGTH_BASE_PER_INCH)).toBe(25.4)
  })

  it('makes 1/64 in and 0.01 mm whole numbers', () => {
    expect(Number.isInteger(LENGTH_BASE_PER_INCH / 64)).toBe(true) // 635
    expect(Number.isInteger(LENGTH_BASE_PER_MM / 100)).toBe(true) // 16
    expect(LENGTH_BASE_PER_INCH / 64).toBe(635)
    expect(LENGTH_BASE_PER_MM / 100).toBe(16)
  })

  it('holds a 20 ft stick in a PostgreSQL integer column with room to spare', () => {
    const stick = 20 * LENGTH_BASE_PER_FOOT // 20 × 12 × 40 640 = 9 753 600
    expect(stick).toBe(9_753_600)
    expect(stick * 200).toBeLessThan(MAX_LENGTH) // even a bundle of 200 sticks
    expect(MAX_LENGTH).toBe(2 ** 31 - 1)
    expect(isLength(stick)).toBe(true)
    expect(isLength(0.5)).toBe(false)
    expect(isLength(2 ** 31)).toBe(false)
  })

  it('converts to and from decimal units', () => {
    expect(inches(0.84)).toBe(34138) // 0.84 × 40 640 = 34 137.6, nearest whole
    expect(millimetres(21.34)).toBe(34144) // 21.34 × 1600
    expect(toInches(inches(4.25))).toBe(4.25)
    expect(toMillimetres(millimetres(108.5))).toBe(108.5)
  })
})

describe('parseLength', () => {
  it.each([
    // text, default unit, expected base units (worked by hand: inches × 40 640, mm × 1600)
    ['4 1/4', 'in', 172_720], // 4.25 × 40 640
    ['4-1/4"', 'in', 172_720],
    ['4-1/4"', 'mm', 172_720], // the inch mark wins over the default unit
    ['4 - 1/4 in', 'in', 172_720],
    ['4.25in', 'in', 172_720],
    ['4.25 in', 'mm', 172_720],
    ['4.25 inches', 'in', 172_720],
    ['4.25″', 'in', 172_720],
    ['4.25', 'in', 172_720],
    ['108 mm', 'in', 172_800], // 108 × 1600
    ['108mm', 'in', 172_800],
    ['108', 'mm', 172_800],
    ['108.25', 'mm', 173_200], // 108.25 × 1600
    ['10.8 cm', 'in', 172_800],
    ['0.01 mm', 'in', 16],
    ['10 ft', 'in', 4_876_800], // 120 × 40 640
    ["10'", 'mm', 4_876_800],
    ['10 feet', 'in', 4_876_800],
    ['3/8', 'in', 15_240], // 40 640 × 3 / 8
    ['3/8"', 'mm', 15_240],
    ['1/64"', 'in', 635],
    [`1' 2-1/2"`, 'in', 589_280], // 14.5 × 40 640
    [`1'2-1/2"`, 'in', 589_280],
    ['1ft 2.5in', 'in', 589_280],
    [`1' 2-1/2`, 'mm', 589_280], // a number after feet is inches
    [`1-1/2'`, 'in', 731_520], // 18 × 40 640
    ['.5"', 'in', 20_320],
    ['0', 'in', 0],
    ['  12"  ', 'in', 487_680],
    ['1/3"', 'in', 13_547], // 40 640 / 3 = 13 546.67, rounded to the nearest base unit
  ] as const)('reads %j (default %s) as %i base units', (text, unit, expected) => {
    expect(parsed(text, unit)).toBe(expected)
  })

  it.each([
    ['', /Enter a length/],
    ['   ', /Enter a length/],
    ['abc', /does not start with a number/],
    ['4 furlongs', /"furlongs" is not a unit.*use in, ", ft, ', mm or cm/],
    ['-3', /cannot be negative: remove the minus sign/],
    ['1,5 mm', /point, not a comma: "1\.5 mm"/],
    ['4 5/4', /fraction 5\/4 should be less than 1/],
    ['1/0', /divides by zero/],
    ['1 2', /only feet then inches can be combined/],
    [`2" 1'`, /only feet then inches can be combined/],
    [`1' 2 mm`, /only feet then inches can be combined/],
    ['1 2 3', /too many numbers/],
    ['3/8 mm', /Millimetres are written as decimals/],
    ['99999999 in', /too long: Kitwright stores lengths up to 4403'/],
    ['4.2.5', /Cannot read/],
  ])('refuses %j and says what to fix', (text, message) => {
    expect(refused(text)).toMatch(message)
  })

  it('refuses a bare fraction when the shop works in millimetres, and asks for the unit', () => {
    expect(refused('3/8', 'mm')).toMatch(/write "3\/8 in"/)
    expect(refused('4 1/4', 'mm')).toMatch(/write "4 1\/4 in"/)
  })

  it('never throws, and always explains a refusal', () => {
    fc.assert(
      fc.property(fc.string({ maxLength: 30 }), fc.constantFrom('in' as const, 'mm' as const), (text, unit) => {
        const result = parseLength(text, unit)
        if (result.ok) expect(isLength(result.value) && result.value >= 0).toBe(true)
        else expect(result.message.length).toBeGreaterThan(10)
      }),
    )
  })
})

describe('formatLength', () => {
  it.each([
    [172_720, '4-1/4"'],
    [487_680, '12"'],
    [20_320, '1/2"'],
    [0, '0"'],
    [2540, '1/16"'],
    [5080, '1/8"'], // 2/16 reduced
    [30_480, '3/4"'], // 12/16 reduced
    [34_138, '13/16"'], // 0.840 in: 13.44 sixteenths → 13
    [1269, '0"'], // just under 1/32 in rounds down
    [1270, '1/16"'], // exactly 1/32 in rounds up (half away from zero)
    [40_640 - 1270, '1"'], // 15.5 sixteenths rounds up into the next inch
    [-20_320, '-1/2"'],
  ])('shows %i base units as %s', (value, text) => {
    expect(formatLength(value, 'in')).toBe(text)
  })

  it('shows feet and inches when asked', () => {
    expect(formatLength(589_280, 'in', { feet: true })).toBe(`1' 2-1/2"`)
    expect(formatLength(9_753_600, 'in', { feet: true })).toBe(`20' 0"`)
    expect(formatLength(9_753_600, 'in')).toBe('240"')
    expect(formatLength(20_320, 'in', { feet: true })).toBe('1/2"')
  })

  it('rounds to a finer fraction when asked', () => {
    expect(formatLength(635, 'in', { denominator: 64 })).toBe('1/64"')
    expect(formatLength(34_138, 'in', { denominator: 64 })).toBe('27/32"') // 53.76/64 → 54/64
    expect(formatLength(172_720, 'in', { denominator: 2 })).toBe('4-1/2"') // 4.25 in = 8.5 halves → 9
    expect(formatLength(172_720, 'in', { denominator: 1 })).toBe('4"')
  })

  it('shows millimetres with one decimal, or as configured', () => {
    expect(formatLength(172_800, 'mm')).toBe('108.0 mm')
    expect(formatLength(173_200, 'mm', { decimals: 2 })).toBe('108.25 mm')
    expect(formatLength(173_200, 'mm', { decimals: 0 })).toBe('108 mm') // 108.25 → 108
    expect(formatLength(LENGTH_BASE_PER_INCH, 'mm')).toBe('25.4 mm')
  })

  it('marks rounded figures when asked', () => {
    expect(formatLength(34_138, 'in', { markRounded: true })).toBe('≈13/16"')
    expect(formatLength(172_720, 'in', { markRounded: true })).toBe('4-1/4"')
    expect(formatLength(34_138, 'mm', { markRounded: true })).toBe('≈21.3 mm')
  })
})

describe('round trips (property tests)', () => {
  const upTo20Feet = fc.integer({ min: 0, max: 20 * LENGTH_BASE_PER_FOOT })

  it('parse(format(v)) is within 1/32 in of v for inches', () => {
    fc.assert(
      fc.property(upTo20Feet, fc.boolean(), (value, feet) => {
        const back = parsed(formatLength(value, 'in', { feet }))
        expect(Math.abs(back - value)).toBeLessThanOrEqual(THIRTY_SECOND)
        expect(back % SIXTEENTH).toBe(0)
      }),
    )
  })

  it('parse(format(v)) is exact for millimetres at the shown precision', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 60_000 }), fc.constantFrom(0, 1, 2), (steps, decimals) => {
        const value = steps * (LENGTH_BASE_PER_MM / 10 ** decimals) // whole mm, 0.1 mm or 0.01 mm
        expect(parsed(formatLength(value, 'mm', { decimals: decimals as 0 | 1 | 2 }), 'in')).toBe(value)
      }),
    )
  })

  it('format(parse(x)) gives back a canonical inch text unchanged, whatever the shape typed', () => {
    const sixteenths = fc.record({
      whole: fc.integer({ min: 0, max: 240 }),
      den: fc.constantFrom(2, 4, 8, 16),
      odd: fc.nat({ max: 7 }),
    })
    fc.assert(
      fc.property(sixteenths, ({ whole, den, odd }) => {
        const num = (2 * odd + 1) % den // odd numerator below den: already reduced
        const fraction = num === 0 ? '' : `${num}/${den}`
        const canonical =
          fraction === '' ? `${whole}"` : whole === 0 ? `${fraction}"` : `${whole}-${fraction}"`
        expect(formatLength(parsed(canonical), 'in')).toBe(canonical)
        // the same length typed other ways formats the same
        const decimal = `${whole + num / den} in`
        expect(formatLength(parsed(decimal), 'in')).toBe(canonical)
        if (fraction !== '') expect(formatLength(parsed(`${whole} ${fraction}`), 'in')).toBe(canonical)
      }),
    )
  })

  it('format(parse(x)) gives back a canonical millimetre text unchanged', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 60_000 }), (tenths) => {
        const canonical = `${(tenths / 10).toFixed(1)} mm`
        expect(formatLength(parsed(canonical), 'mm')).toBe(canonical)
      }),
    )
  })
})

describe('formatLengthForInput', () => {
  it('gives back exactly the stored length, in both units (property)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 20_000_000 }), fc.constantFrom<'in' | 'mm'>('in', 'mm'), (value, unit) => {
        const parsed = parseLength(formatLengthForInput(value, unit), unit)
        expect(parsed).toEqual({ ok: true, value })
      }),
    )
  })

  it('writes 64ths as fractions and anything else as decimals', () => {
    // ASTM D1785: 1/2 in Schedule 40 PVC is 0.840 in outside; it is no whole number of 64ths.
    expect(formatLengthForInput(inches(0.84), 'in')).toBe('0.84 in')
    expect(formatLengthForInput(inches(4.25), 'in')).toBe('4-1/4"')
    expect(formatLengthForInput(inches(1 / 64), 'in')).toBe('1/64"')
    expect(formatLengthForInput(millimetres(108), 'mm')).toBe('108 mm')
  })
})
