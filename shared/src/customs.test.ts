import { describe, expect, it } from 'vitest'
import { countryCodeSchema, countryName, formatHsCode, HsCodeSchema, isCountryCode, OriginCountrySchema } from './customs'
import { CountryCodeSchema } from './orders'
import { ShipFromAddressSchema } from './settings'

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

describe('country codes on addresses (ship-to, ship-from)', () => {
  // ISO 3166-1 alpha-2, as listed by i18n-iso-countries: GB United Kingdom is assigned, ZZ is user-assigned.
  it('takes assigned codes in any case and refuses ZZ, saying what to enter', () => {
    const schema = countryCodeSchema('the country it ships to')
    expect(schema.parse(' gb ')).toBe('GB')
    const zz = schema.safeParse('ZZ')
    expect(zz.error?.issues.map((i) => i.message)).toEqual([
      '"ZZ" is not an ISO 3166-1 country code; use the two letters of the country it ships to, e.g. US, CA, GB',
    ])
    expect(schema.safeParse('USA').error?.issues.map((i) => i.message)).toEqual([
      'Use the two-letter country code (ISO 3166-1 alpha-2), e.g. US, CA, GB',
    ])
    expect(schema.safeParse('').error?.issues[0]?.message).toBe('Enter the two-letter country code, e.g. US')
  })

  it('guards the order ship-to and the shop ship-from schemas', () => {
    expect(CountryCodeSchema.safeParse('ZZ').success).toBe(false)
    expect(CountryCodeSchema.parse('ca')).toBe('CA')
    const shipFrom = { name: 'Mistwell Tote Works', line1: '1 Mill Lane', city: 'Riverton', postalCode: '00000', country: 'ZZ' }
    const parsed = ShipFromAddressSchema.safeParse(shipFrom)
    expect(parsed.error?.issues[0]?.path).toEqual(['country'])
    expect(parsed.error?.issues[0]?.message).toMatch(/^"ZZ" is not an ISO 3166-1 country code; use the two letters of the country the shop ships from/)
  })
})
