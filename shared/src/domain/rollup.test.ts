import { describe, expect, it } from 'vitest'
import { rollUp, type RollupPart } from './rollup'
import { inches } from './units'

const pipe: RollupPart = { sku: 'PIPE', kind: 'stock_length', unitCostCents: 600, weightGrams: 1600, stickLengths: [inches(120), inches(240)] }
const elbow: RollupPart = { sku: 'ELB', kind: 'hardware', unitCostCents: 45, weightGrams: 12, stickLengths: [] }

describe('rollUp (hand-worked)', () => {
  it('adds hardware at unit cost and prorates pipe over its shortest stick, kerf included', () => {
    // 4 elbows: 4 × 45 = 180 ¢, 4 × 12 = 48 g.
    // 10 pieces of 11-7/8 in with 1/8 in kerf use 10 × 12 in = 120 in of pipe.
    // Cost and weight are per shortest stick (120 in: 600 ¢, 1600 g) → 120/120 of it: 600 ¢ and 1600 g.
    const r = rollUp({
      bomLines: [{ part: elbow, quantity: 4 }],
      cutParts: [{ part: pipe, length: inches(11 + 7 / 8), quantity: 10 }],
      kerf: inches(1 / 8),
    })
    expect(r.costCents).toBe(780)
    expect(r.weightGrams).toBe(1648)
    expect(r.cutLength).toBe(inches(118.75))
    expect(r.stickLengthUsed).toBe(inches(120))
    expect(r.pieceCount).toBe(10)
    expect(r.problems).toEqual([])
  })

  it('says which pipe it could not roll up rather than guessing', () => {
    const r = rollUp({ bomLines: [], cutParts: [{ part: { ...pipe, stickLengths: [] }, length: inches(10), quantity: 1 }], kerf: 0 })
    expect(r.costCents).toBe(0)
    expect(r.problems[0]).toMatch(/PIPE has no stick length/)
  })
})
