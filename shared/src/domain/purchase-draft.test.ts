import { describe, expect, it } from 'vitest'
import { draftLines, movingAverageCost, roundUpToPack, unitPriceFor } from './purchase-draft'

// Worked by hand. Price breaks and pack rounding are common practice in buying from distributors.
describe('purchase drafts', () => {
  const breaks = [
    { minQuantity: 1, unitPriceCents: 1200 },
    { minQuantity: 10, unitPriceCents: 1000 },
    { minQuantity: 50, unitPriceCents: 850 },
  ]
  it('prices by the break at or below the quantity', () => {
    expect(unitPriceFor(breaks, 1)).toBe(1200)
    expect(unitPriceFor(breaks, 9)).toBe(1200)
    expect(unitPriceFor(breaks, 10)).toBe(1000)
    expect(unitPriceFor(breaks, 49)).toBe(1000)
    expect(unitPriceFor(breaks, 50)).toBe(850)
  })
  it('rounds up to whole packs', () => {
    expect(roundUpToPack(7, 6)).toBe(12) // 7 / 6 = 1.17 → 2 packs of 6
    expect(roundUpToPack(12, 6)).toBe(12)
    expect(roundUpToPack(1, 1)).toBe(1)
  })
  it('adds the cheapest packs until the minimum order is reached', () => {
    // Pumps: 3 short, packs of 1 at $12.00 → 3 × 1200 = 3600.
    // Cups: 7 short, packs of 6 at $0.50 → 12 × 50 = 600. Total 4200, the minimum is 5000.
    // Next pack of cups costs 6 × 50 = 300, of pumps 1200: cups are added until 5000 is reached:
    // 4200 + 300 = 4500, + 300 = 4800, + 300 = 5100 → cups 12 + 18 = 30.
    const lines = draftLines(
      [
        { partId: 'pump', suggested: 3, packSize: 1, priceBreaks: breaks },
        { partId: 'cup', suggested: 7, packSize: 6, priceBreaks: [{ minQuantity: 1, unitPriceCents: 50 }] },
      ],
      5000,
    )
    expect(lines).toEqual([
      { partId: 'pump', quantity: 3, unitPriceCents: 1200 },
      { partId: 'cup', quantity: 30, unitPriceCents: 50 },
    ])
  })
  it('re-prices a line that crosses a break', () => {
    // 9 pumps at 1200 = 10800; the minimum 11000 needs one more: 10 at the 10+ break = 10000,
    // which is less than 11000, so one more: 11 × 1000 = 11000.
    expect(draftLines([{ partId: 'pump', suggested: 9, packSize: 1, priceBreaks: breaks }], 11000)).toEqual([{ partId: 'pump', quantity: 11, unitPriceCents: 1000 }])
  })
  it('keeps a moving weighted average of what was paid', () => {
    // 10 on hand at $4.00 and 30 received at $5.00: (10 × 400 + 30 × 500) / 40 = 19000 / 40 = 475.
    expect(movingAverageCost(10, 400, 30, 500)).toBe(475)
    // 3 at 1000 and 4 at 1250: (3000 + 5000) / 7 = 1142.86 → 1143.
    expect(movingAverageCost(3, 1000, 4, 1250)).toBe(1143)
    // Nothing (or less than nothing) on hand: the price paid.
    expect(movingAverageCost(0, 999, 5, 300)).toBe(300)
    expect(movingAverageCost(-2, 999, 5, 300)).toBe(300)
  })
})
