import { describe, expect, it } from 'vitest'
import { nest } from './nest'
import { chvatal1983, n1c1w4a, t60_00, u120_08 } from './fixtures/published-instances'
import type { PublishedInstance } from './fixtures/published-instances'
import { NestingInputError } from './types'
import type { NestInput } from './types'

// Every call passes its time limit: these tests check plans, not speed (the benchmark measures the
// default limit), so a busy machine must not change their outcome.
const LIMIT = { timeLimitMs: 60_000 }

function fromInstance(inst: PublishedInstance): NestInput {
  const demand = new Map<number, number>()
  for (const x of inst.items) demand.set(x, (demand.get(x) ?? 0) + 1)
  return { pieces: [...demand].map(([length, quantity]) => ({ length, quantity })), stock: [{ length: inst.capacity }] }
}

describe('nest on published instances (reaches the proven optimum)', { timeout: 120_000 }, () => {
  // Falkenauer 1996, J. Heuristics 2(1), 'uniform' u120_08 as distributed in Beasley's OR-Library
  // (binpack1.txt); optimum 50 per the BPPLIB table (the file header's 51 is not optimal).
  it('Falkenauer u120_08: 50 sticks', async () => {
    const plan = await nest(fromInstance(u120_08), LIMIT)
    expect(plan.sticks).toHaveLength(50)
    expect(plan.status).toBe('optimal')
    expect(plan.bounds.sticks).toBe(50)
  })

  // Falkenauer 1996 'triplets' t60_00 (OR-Library binpack5.txt, sizes ×10): 20 sticks, each
  // filled exactly by three pieces.
  it('Falkenauer t60_00: 20 exactly filled sticks', async () => {
    const plan = await nest(fromInstance(t60_00), LIMIT)
    expect(plan.sticks).toHaveLength(20)
    expect(plan.sticks.every((s) => s.remnant === 0 && s.cuts.length === 3)).toBe(true)
  })

  // Scholl, Klein & Jürgens 1997, Computers & OR 24(7): N1C1W4_A, optimum 35 (BPPLIB table).
  it('Scholl N1C1W4_A: 35 sticks', async () => {
    const plan = await nest(fromInstance(n1c1w4a), LIMIT)
    expect(plan.sticks).toHaveLength(n1c1w4a.optimum)
  })

  // Chvátal 1983, Linear Programming, ch. 13: LP relaxation 452.25, so 453 raws at best.
  it('Chvátal paper rolls: LP bound 452.25 and a 453-raw plan', async () => {
    const plan = await nest({ pieces: chvatal1983.itemTypes.map((t) => ({ ...t })), stock: [{ length: 100, cost: 1 }] }, LIMIT)
    expect(plan.sticks).toHaveLength(chvatal1983.optimum)
    expect(plan.bounds.lpCost).toBeCloseTo(chvatal1983.lpRelaxation, 6)
    expect(plan.bounds.sticks).toBe(453)
    // The bound reported is the LP bound rounded up, and says so.
    expect(plan.bounds.lpConverged).toBe(true)
    expect(plan.bounds.source).toBe('lp')
  })
})

describe('nest on hand-worked cases', () => {
  it('kerf and end trim: offsets, kerf loss and remnant', async () => {
    // Stick 1000, trim 10, kerf 5, three pieces of 300:
    // 10 + 3·300 + 2·5 = 920 <= 1000, so one stick. Offsets 10, 10+305 = 315, 315+305 = 620.
    // The third cut also takes a kerf (80 is left after the piece): remnant 1000−10−900−15 = 75.
    const plan = await nest({ pieces: [{ length: 300, quantity: 3 }], stock: [{ length: 1000 }], kerf: 5, endTrim: 10 }, LIMIT)
    expect(plan.sticks).toHaveLength(1)
    const s = plan.sticks[0]
    expect(s?.cuts.map((c) => c.offset)).toEqual([10, 315, 620])
    expect(s?.kerfLoss).toBe(15)
    expect(s?.remnant).toBe(75)
    expect(plan.totals.trimLoss).toBe(10)
  })

  it('the last piece may end exactly at the end of the stick (no kerf after it)', async () => {
    // Trim 10, kerf 6: 10 + 492 + 6 + 492 = 1000 fits exactly, remnant 0, kerf loss 6.
    const fits = await nest({ pieces: [{ length: 492, quantity: 2 }], stock: [{ length: 1000 }], kerf: 6, endTrim: 10 }, LIMIT)
    expect(fits.sticks).toHaveLength(1)
    expect(fits.sticks[0]?.remnant).toBe(0)
    expect(fits.sticks[0]?.kerfLoss).toBe(6)
    // 10 + 493 + 6 + 493 = 1002 > 1000: two sticks.
    const over = await nest({ pieces: [{ length: 493, quantity: 2 }], stock: [{ length: 1000 }], kerf: 6, endTrim: 10 }, LIMIT)
    expect(over.sticks).toHaveLength(2)
  })

  it('two stick lengths: picks the cheaper mix', async () => {
    // Four pieces of 60. A 100 stick holds one, a 130 stick holds two.
    // Costs 100 and 120: 2×130 = 240 beats 130+2×100 = 320 and 4×100 = 400.
    const a = await nest({ pieces: [{ length: 60, quantity: 4 }], stock: [{ id: 'short', length: 100, cost: 100 }, { id: 'long', length: 130, cost: 120 }] }, LIMIT)
    expect(a.totals.stockCost).toBe(240)
    expect(a.totals.stock.map((u) => u.count)).toEqual([0, 2])
    // Costs 100 and 210: 4×100 = 400 beats 210+200 = 410 and 2×210 = 420.
    const b = await nest({ pieces: [{ length: 60, quantity: 4 }], stock: [{ length: 100, cost: 100 }, { length: 130, cost: 210 }] }, LIMIT)
    expect(b.totals.stockCost).toBe(400)
    expect(b.totals.stock.map((u) => u.count)).toEqual([4, 0])
  })

  it('respects how many sticks are available', async () => {
    // Two pieces of 100. One 100 stick (cost 100) is on hand; a 200 stick costs 300.
    // 100 + 200 sticks = 400, one 200 stick with both = 300: the 200 stick alone.
    const plan = await nest({ pieces: [{ length: 100, quantity: 2 }], stock: [{ length: 100, cost: 100, available: 1 }, { length: 200, cost: 300 }] }, LIMIT)
    expect(plan.totals.stockCost).toBe(300)
    expect(plan.totals.stock.map((u) => u.count)).toEqual([0, 1])
  })

  it('an offcut that saves a stick is used, and remnants at the minimum go back to stock', async () => {
    // Stock 1000, offcut R-7 of 250, pieces 3×300 and 1×200 (1100 in all, no kerf).
    // Without the offcut two sticks are needed; with it: 200 on R-7 (remnant 50) and 900 on one
    // stick (remnant 100, kept as the minimum offcut is 100).
    const plan = await nest({
      pieces: [{ length: 300, quantity: 3, workOrderRef: 'WO-1' }, { length: 200, quantity: 1, workOrderRef: 'WO-2' }],
      stock: [{ length: 1000 }],
      offcuts: [{ id: 'R-7', length: 250 }],
      minOffcutLength: 100,
    }, LIMIT)
    expect(plan.totals.stockCost).toBe(1000)
    expect(plan.totals.offcutsUsed).toBe(1)
    const onOffcut = plan.sticks.find((s) => s.source.kind === 'offcut')
    expect(onOffcut?.source).toEqual({ kind: 'offcut', offcutId: 'R-7' })
    expect(onOffcut?.trim).toBe(0)
    expect(onOffcut?.cuts.map((c) => [c.length, c.workOrderRef])).toEqual([[200, 'WO-2']])
    expect(onOffcut?.remnant).toBe(50)
    expect(onOffcut?.remnantIsOffcut).toBe(false)
    const stick = plan.sticks.find((s) => s.source.kind === 'stock')
    expect(stick?.remnant).toBe(100)
    expect(stick?.remnantIsOffcut).toBe(true)
    expect(plan.totals.offcutsMade).toBe(1)
  })

  it('offcuts first when the cost is the same either way', async () => {
    // Pieces 3×300 and 1×50 on stock 1000 need one stick whatever happens (950 <= 1000).
    // Offcut R-9 of 60 holds the 50, so it is used and the stick keeps a 100 remnant.
    const plan = await nest({ pieces: [{ length: 300, quantity: 3 }, { length: 50, quantity: 1 }], stock: [{ length: 1000 }], offcuts: [{ id: 'R-9', length: 60 }] }, LIMIT)
    expect(plan.totals.stockCost).toBe(1000)
    expect(plan.totals.offcutsUsed).toBe(1)
    expect(plan.sticks.find((s) => s.source.kind === 'stock')?.remnant).toBe(100)
  })

  it('limits pieces per stick', async () => {
    // Six 100s would fit one 1000 stick, but at most 4 per stick: ceil(6/4) = 2 sticks.
    const plan = await nest({ pieces: [{ length: 100, quantity: 6 }], stock: [{ length: 1000 }], maxPiecesPerStick: 4 }, LIMIT)
    expect(plan.sticks).toHaveLength(2)
    expect(Math.max(...plan.sticks.map((s) => s.cuts.length))).toBeLessThanOrEqual(4)
  })

  it('groups identical sticks into patterns and lists cuts longest first', async () => {
    // Pieces 6×50 and 6×40 on 90 sticks: six sticks of 50+40, one pattern repeated 6 times.
    const plan = await nest({ pieces: [{ length: 40, quantity: 6 }, { length: 50, quantity: 6 }], stock: [{ length: 90 }] }, LIMIT)
    expect(plan.patterns).toHaveLength(1)
    expect(plan.patterns[0]).toMatchObject({ cuts: [50, 40], count: 6, remnant: 0 })
  })

  it('returns a valid plan when the time limit is tiny', async () => {
    const plan = await nest(fromInstance(u120_08), { timeLimitMs: 1 })
    expect(plan.sticks.flatMap((s) => s.cuts)).toHaveLength(120)
    expect(plan.sticks.length).toBeGreaterThanOrEqual(50)
  })
})

describe('nest rejects bad input with the field to fix', () => {
  const cases: [string, NestInput, string][] = [
    ['piece longer than any stick', { pieces: [{ length: 1200, quantity: 1 }], stock: [{ length: 1000 }] }, 'pieces.0.length'],
    ['zero quantity', { pieces: [{ length: 10, quantity: 0 }], stock: [{ length: 1000 }] }, 'pieces.0.quantity'],
    ['fractional length', { pieces: [{ length: 10.5, quantity: 1 }], stock: [{ length: 1000 }] }, 'pieces.0.length'],
    ['no stock', { pieces: [{ length: 10, quantity: 1 }], stock: [] }, 'stock'],
    ['trim longer than the stick', { pieces: [{ length: 10, quantity: 1 }], stock: [{ length: 50 }], endTrim: 60 }, 'stock.0.length'],
    ['not enough stock', { pieces: [{ length: 60, quantity: 3 }], stock: [{ length: 100, available: 2 }] }, 'stock'],
    ['negative kerf', { pieces: [{ length: 10, quantity: 1 }], stock: [{ length: 100 }], kerf: -1 }, 'kerf'],
    ['duplicate offcut id', { pieces: [{ length: 10, quantity: 1 }], stock: [{ length: 100 }], offcuts: [{ id: 'A', length: 50 }, { id: 'A', length: 40 }] }, 'offcuts.1.id'],
  ]
  for (const [what, input, field] of cases) {
    it(what, async () => {
      const err = await nest(input, LIMIT).catch((e: unknown) => e)
      expect(err).toBeInstanceOf(NestingInputError)
      expect((err as NestingInputError).field).toBe(field)
      expect((err as NestingInputError).message.length).toBeGreaterThan(10)
    })
  }
})
