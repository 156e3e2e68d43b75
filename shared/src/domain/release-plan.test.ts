import { describe, expect, it } from 'vitest'
import { compareReleasePriority, planRelease, type ReleaseCandidate } from './release-plan'

// Hand-worked examples (invented demo orders). The rule — rush first, then the oldest promise — is
// the shop's own policy, stated in DESIGN and the issue; the arithmetic is in the comments.

const pump = { partId: 'pump', sku: 'MW-PUMP', name: 'Pump' }
const cup = { partId: 'cup', sku: 'MW-CUP', name: 'Net cup' }

function order(number: string, over: Partial<ReleaseCandidate>): ReleaseCandidate {
  return { orderId: number, number, priority: 'normal', promisedShipDate: '2026-12-10', placedAt: '2026-11-20T10:00:00Z', blocked: null, needs: [], ...over }
}

describe('planRelease', () => {
  it('gives scarce stock to rush first, then the oldest promise, whatever order the orders were ticked in', () => {
    // 2 pumps free. Ticked in this order: a new order (Dec 20), a late one (Nov 28), a rush (Dec 15).
    const plan = planRelease(
      [
        order('1010', { promisedShipDate: '2026-12-20', needs: [{ ...pump, quantity: 1 }] }),
        order('1002', { promisedShipDate: '2026-11-28', needs: [{ ...pump, quantity: 1 }] }),
        order('1007', { promisedShipDate: '2026-12-15', priority: 'rush', needs: [{ ...pump, quantity: 1 }] }),
      ],
      new Map([['pump', 2]]),
      { allowShort: false },
    )
    // Turn 1: rush 1007 takes 1 (2 → 1). Turn 2: late 1002 takes 1 (1 → 0). Turn 3: 1010 finds 0 free: refused.
    expect(plan.map((p) => [p.number, p.turn, p.outcome])).toEqual([
      ['1007', 1, 'release'],
      ['1002', 2, 'release'],
      ['1010', 3, 'refuse'],
    ])
    expect(plan[2]!.reason).toBe('Not enough stock: MW-PUMP Pump: needs 1, 0 free')
    expect(plan[2]!.parts[0]).toMatchObject({ needed: 1, freeBefore: 0, takes: 0, short: 1 })
  })

  it('a refused order leaves its stock to the orders after it', () => {
    // 3 cups free. 1001 (oldest) needs 4 → refused, takes nothing; 1002 needs 3 → gets all 3.
    const plan = planRelease(
      [order('1001', { promisedShipDate: '2026-12-01', needs: [{ ...cup, quantity: 4 }] }), order('1002', { promisedShipDate: '2026-12-02', needs: [{ ...cup, quantity: 3 }] })],
      new Map([['cup', 3]]),
      { allowShort: false },
    )
    expect(plan.map((p) => p.outcome)).toEqual(['refuse', 'release'])
    expect(plan[1]!.parts[0]).toMatchObject({ freeBefore: 3, takes: 3, short: 0 })
  })

  it('released short, each order takes what is free in its turn and the rest is short', () => {
    // 3 cups free; 1001 needs 2 (takes 2, 1 left), 1002 needs 2 (takes 1, short 1), 1003 needs 1 (0 free, short 1).
    const plan = planRelease(
      [
        order('1003', { promisedShipDate: '2026-12-03', needs: [{ ...cup, quantity: 1 }] }),
        order('1001', { promisedShipDate: '2026-12-01', needs: [{ ...cup, quantity: 2 }] }),
        order('1002', { promisedShipDate: '2026-12-02', needs: [{ ...cup, quantity: 2 }] }),
      ],
      new Map([['cup', 3]]),
      { allowShort: true },
    )
    expect(plan.map((p) => [p.number, p.outcome, p.parts[0]!.takes, p.parts[0]!.short])).toEqual([
      ['1001', 'release', 2, 0],
      ['1002', 'release_short', 1, 1],
      ['1003', 'release_short', 0, 1],
    ])
  })

  it('a blocked order (on hold, unpaid…) is refused with its reason and takes nothing', () => {
    const plan = planRelease(
      [order('1001', { blocked: 'Order 1001 is on hold: customer changing address', needs: [{ ...pump, quantity: 1 }] }), order('1002', { needs: [{ ...pump, quantity: 1 }] })],
      new Map([['pump', 1]]),
      { allowShort: true },
    )
    expect(plan.map((p) => [p.number, p.outcome])).toEqual([
      ['1001', 'refuse'],
      ['1002', 'release'],
    ])
    expect(plan[0]!.reason).toContain('on hold')
  })
})

describe('compareReleasePriority', () => {
  it('puts an order with no promise after those with one, and breaks ties by the oldest placed', () => {
    const a = { number: 'A', priority: 'normal' as const, promisedShipDate: null, placedAt: '2026-11-01T00:00:00Z' }
    const b = { number: 'B', priority: 'normal' as const, promisedShipDate: '2026-12-31', placedAt: '2026-11-30T00:00:00Z' }
    const c = { number: 'C', priority: 'normal' as const, promisedShipDate: '2026-12-31', placedAt: '2026-11-02T00:00:00Z' }
    expect([a, b, c].sort(compareReleasePriority).map((x) => x.number)).toEqual(['C', 'B', 'A'])
  })
})
