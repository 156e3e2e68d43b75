import { describe, expect, it } from 'vitest'
import { countryName, formatHsCode, HsCodeSchema, isCountryCode, OriginCountrySchema } from './customs'

describe('HS codes', () => {
  it('takes 6 to 10 digits with dots and spaces, and refuses anything else', () => {
    expect(HsCodeSchema.parse(' 8413.70 ')).toBe('841370')
    expect(HsCodeSchema.parse('3917 23 00 00')).toBe('3917230000')
    for (const bad of ['8413', '8413.7', '84137000001', '8413.7A', '']) expect(HsCodeSchema.safeParse(bad).success).toBe(false)
  })
  it('prints the subheading with its dot', () => {
    expect(formatHsCode('841370')).toBe('8413.70')
    expect(formatHsCode('3923100000')).toBe('3923.10.0000')
  })
})

describe('countries of origin', () => {
  // ISO 3166-1: CA Canada, US United States of America, CN China are assigned; ZZ is user-assigned
  // (ISO 3166-1, "user-assigned code elements" AA, QM–QZ, XA–XZ, ZZ); XK is not an ISO code.
  it('takes assigned alpha-2 codes in any case and refuses user-assigned ones', () => {
    expect(OriginCountrySchema.parse('ca')).toBe('CA')
    expect(isCountryCode('US')).toBe(true)
    expect(isCountryCode('CN')).toBe(true)
    for (const bad of ['ZZ', 'XK', 'AA', 'USA', 'U']) expect(OriginCountrySchema.safeParse(bad).success).toBe(false)
    expect(OriginCountrySchema.safeParse('ZZ').error?.issues[0]?.message).toMatch(/"ZZ" is not an ISO 3166-1 country code/)
  })
  it('names a country in English', () => {
    expect(countryName('CA')).toBe('Canada')
  })
})
