import { gtin } from 'cdigit'
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { formatSscc, gs1CheckDigit, hasValidCheckDigit, sscc, ssccElementString, ssccProblem } from './gs1'

// The rule under test: GS1 General Specifications (the GS1 standard for identification keys and
// barcodes), section 7.9 "Check digit calculation" and its "standard check digit calculations for GS1
// data structures" (7.9.1). The section numbers are from memory of recent releases; the rule itself
// (weights 3, 1, 3, … from the rightmost digit, check digit = what brings the sum to a multiple of
// ten) is the one that document prints. Each figure below is also checked against cdigit 4.0.3
// (an independent open-source implementation of the same GS1 rule, its `gtin` algorithm).
describe('GS1 mod-10 check digit (GS1 General Specifications, 7.9 check digit calculation; section from memory)', () => {
  // 890400021003 → 7, worked by hand: from the right 3×3 + 0 + 0×3 + 1 + 2×3 + 0 + 0×3 + 0 + 4×3 + 0
  // + 9×3 + 8 = 63, next multiple of ten 70, check digit 7. 03600024145 → 7: the UPC-A example
  // widely reprinted in descriptions of the code (from memory), and by hand: 5×3 + 4 + 1×3 + 4 + 2×3
  // + 0 + 0×3 + 0 + 6×3 + 3 + 0×3 = 53 → 7.
  it('gives 7 for GTIN-13 890400021003 and 7 for UPC-A 03600024145 (worked by hand, and by cdigit)', () => {
    expect(gs1CheckDigit('890400021003')).toBe(7)
    expect(gs1CheckDigit('03600024145')).toBe(7)
    expect(gtin.compute('890400021003')).toBe('7')
    expect(gtin.compute('03600024145')).toBe('7')
    expect(hasValidCheckDigit('8904000210037')).toBe(true)
    expect(hasValidCheckDigit('036000241457')).toBe(true)
  })

  // SSCCs from the documentation of biip (jodal/biip, an open-source GS1 parser, src/biip/sscc.py):
  // 376130321109103420 (check digit 0) and 157035381410375177 (check digit 7).
  it('checks the SSCC examples of an independent GS1 library (biip), and agrees with cdigit on them', () => {
    expect(gs1CheckDigit('37613032110910342')).toBe(0)
    expect(gs1CheckDigit('15703538141037517')).toBe(7)
    expect(gtin.validate('376130321109103420')).toBe(true)
    expect(gtin.validate('157035381410375177')).toBe(true)
    expect(hasValidCheckDigit('376130321109103420')).toBe(true)
    expect(hasValidCheckDigit('157035381410375177')).toBe(true)
    expect(hasValidCheckDigit('157035381410375176')).toBe(false)
  })

  it('agrees with cdigit (independent implementation) on every GS1 key length: GTIN-8/12/13/14 and SSCC-18', () => {
    const body = (n: number) => fc.array(fc.integer({ min: 0, max: 9 }), { minLength: n, maxLength: n }).map((d) => d.join(''))
    fc.assert(
      fc.property(fc.constantFrom(7, 11, 12, 13, 17).chain(body), (digits) => {
        expect(String(gs1CheckDigit(digits))).toBe(gtin.compute(digits))
        const key = `${digits}${gs1CheckDigit(digits)}`
        expect(hasValidCheckDigit(key)).toBe(gtin.validate(key))
        // Any other last digit is refused by both.
        const wrong = `${digits}${(gs1CheckDigit(digits) + 1) % 10}`
        expect(hasValidCheckDigit(wrong)).toBe(false)
        expect(gtin.validate(wrong)).toBe(false)
      }),
    )
  })

  it('weights the rightmost digit 3 whatever the length (worked by hand: 1 → 3 → check 7; 10 → 1 + 0 → check 9)', () => {
    expect(gs1CheckDigit('1')).toBe(7)
    expect(gs1CheckDigit('10')).toBe(9)
    expect(gs1CheckDigit('0000')).toBe(0)
  })

  it('refuses anything but digits', () => {
    expect(() => gs1CheckDigit('12a4')).toThrow(/digits only/)
    expect(hasValidCheckDigit('x')).toBe(false)
  })
})

describe('SSCC-18 and its GS1-128 element string (GS1 General Specifications §2.2, §3.3.1)', () => {
  it('builds 157035381410375177 from extension 1, prefix 5703538, serial 141037517 (biip example, rebuilt)', () => {
    expect(sscc({ extensionDigit: 1, companyPrefix: '5703538', serialReference: 141037517 })).toBe('157035381410375177')
    expect(sscc({ extensionDigit: 3, companyPrefix: '761303', serialReference: 2110910342 })).toBe('376130321109103420')
  })

  it('zero-pads the serial reference to fill 18 digits', () => {
    const code = sscc({ extensionDigit: 0, companyPrefix: '0952718', serialReference: 42 })
    expect(code).toHaveLength(18)
    expect(code.slice(0, 17)).toBe('00952718000000042')
    expect(hasValidCheckDigit(code)).toBe(true)
    expect(ssccElementString(code)).toBe(`(00)${code}`)
    expect(formatSscc(code, 7)).toBe(`0 0952718 000000042 ${code.at(-1)}`)
  })

  it('says what is wrong with parts that make no SSCC', () => {
    expect(ssccProblem({ extensionDigit: 10, companyPrefix: '0952718', serialReference: 1 })).toMatch(/extension digit/)
    expect(ssccProblem({ extensionDigit: 0, companyPrefix: '123', serialReference: 1 })).toMatch(/4 to 12 digits/)
    expect(ssccProblem({ extensionDigit: 0, companyPrefix: '0952718', serialReference: 1_000_000_000 })).toMatch(/leaves 9 digits/)
    expect(() => sscc({ extensionDigit: 0, companyPrefix: '09527A8', serialReference: 1 })).toThrow(/Company Prefix/)
    expect(() => ssccElementString('157035381410375176')).toThrow(/check digit/)
  })
})
