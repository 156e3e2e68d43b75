import { describe, expect, it } from 'vitest'
import { continuousBound, martelloTothL2 } from './bounds'
import { n1c1w4a, t60_00, u120_08 } from './fixtures/published-instances'

describe('continuousBound and martelloTothL2', () => {
  it('L2 beats L1 when long pieces cannot share a stick (worked by hand)', () => {
    // Sticks of 10, pieces 7,7,7,4,4,4. L1 = ceil(33/10) = 4. With α = 4 the three 7s are in
    // J1 (7 > 10 − 4) and need a stick each; the 4s (sum 12) cannot join them and need
    // ceil(12/10) = 2 more: L2 = 5, which is also the optimum (7 | 7 | 7 | 4+4 | 4).
    const items = [7, 7, 7, 4, 4, 4]
    expect(continuousBound(items, 10)).toBe(4)
    expect(martelloTothL2(items, 10)).toBe(5)
  })

  it('never exceeds the proven optimum of published instances', () => {
    // Falkenauer 1996 (OR-Library binpack1/binpack5) and Scholl, Klein & Jürgens 1997 instances,
    // optima from the BPPLIB table (Delorme, Iori & Martello 2018).
    for (const inst of [u120_08, t60_00, n1c1w4a]) {
      const l1 = continuousBound(inst.items, inst.capacity)
      const l2 = martelloTothL2(inst.items, inst.capacity)
      expect(l2).toBeGreaterThanOrEqual(l1)
      expect(l2).toBeLessThanOrEqual(inst.optimum)
    }
  })
})
