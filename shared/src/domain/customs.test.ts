import { describe, expect, it } from 'vitest'
import { apportionCents, chooseCustomsForm, declareContents, type DeclaredUnit } from './customs'

describe('apportionCents', () => {
  // Largest remainder (Hare quota) worked example, votes 47 000 / 16 000 / 15 800 / 12 000 / 6 100 / 3 100
  // for 10 seats → 5, 2, 1, 1, 1, 0 (Wikipedia, "Largest remainder method", example; recalled from memory).
  it('follows the largest remainder method', () => {
    expect(apportionCents(10, [47_000, 16_000, 15_800, 12_000, 6_100, 3_100])).toEqual([5, 2, 1, 1, 1, 0])
  })
  it('adds up exactly and splits evenly when every weight is zero', () => {
    expect(apportionCents(100, [0, 0, 0])).toEqual([34, 33, 33])
    const shares = apportionCents(18_900, [2_450, 1_480, 89, 65 * 12, 348])
    expect(shares.reduce((a, b) => a + b, 0)).toBe(18_900)
  })
})

const part = (sku: string, hs: string | null, origin: string | null) => ({ sku, name: `Part ${sku}`, customsDescription: null, hsCode: hs, originCountry: origin })

describe('declareContents', () => {
  it('splits each unit price over its parts by cost, sums lines per part, and lists what is missing', () => {
    const units: DeclaredUnit[] = [
      {
        serial: 'U-1',
        priceCents: 10_000,
        contents: [{ part: part('A', '841370', 'CN'), quantity: 1, netGrams: 1200, costCents: 3000 }, { part: part('B', '391740', null), quantity: 4, netGrams: 44.4, costCents: 1000 }],
      },
      { serial: 'U-2', priceCents: 0, contents: [{ part: part('B', '391740', null), quantity: 2, netGrams: 22.2, costCents: 500 }] },
    ]
    const d = declareContents(units)
    // U-1: 10 000 × 3000/4000 = 7500 to A, 2500 to B; U-2 has no price: at cost, 500 to B.
    expect(d.lines).toEqual([
      { sku: 'A', description: 'Part A', quantity: 1, netGrams: 1200, valueCents: 7500, hsCode: '841370', originCountry: 'CN' },
      { sku: 'B', description: 'Part B', quantity: 6, netGrams: 67, valueCents: 3000, hsCode: '391740', originCountry: null },
    ])
    expect(d.totalValueCents).toBe(10_500)
    expect(d.totalNetGrams).toBe(1267)
    expect(d.valuedAtCost).toEqual(['U-2'])
    expect(d.missing).toEqual([{ sku: 'B', name: 'Part B', fields: ['country of origin'] }])
  })
})

describe('chooseCustomsForm', () => {
  // UPU Convention Regulations: CN 22 up to 300 SDR. 300 SDR × 1.30 USD (from memory, rounded down) = 390.00 USD.
  it('uses a CN 22 up to 300 SDR and a CN 23 above, and a CN 23 for a currency it has no rate for', () => {
    expect(chooseCustomsForm(39_000, 'USD')).toEqual({ form: 'CN 22', limitCents: 39_000 })
    expect(chooseCustomsForm(39_001, 'usd')).toEqual({ form: 'CN 23', limitCents: 39_000 })
    expect(chooseCustomsForm(100, 'JPY')).toEqual({ form: 'CN 23', limitCents: null })
  })
})
