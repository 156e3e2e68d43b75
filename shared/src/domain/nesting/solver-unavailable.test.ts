import { describe, expect, it, vi } from 'vitest'
import { nest } from './nest'
import { u120_08 } from './fixtures/published-instances'

// The LP solver (HiGHS, WebAssembly) failing to load, as on a machine where its file is missing:
// the engine must still give a valid plan, say why it has no proof, and never claim one.
vi.mock('highs', () => ({ default: () => Promise.reject(new Error('highs.wasm could not be read')) }))

describe('nest without its LP solver', () => {
  it('keeps the greedy plan, marks it unproven, and says why', async () => {
    // Falkenauer u120_08 (OR-Library binpack1.txt): first-fit does not reach its optimum of 50, so the
    // engine needs the solver to do better or to prove anything.
    const demand = new Map<number, number>()
    for (const x of u120_08.items) demand.set(x, (demand.get(x) ?? 0) + 1)
    const plan = await nest({ pieces: [...demand].map(([length, quantity]) => ({ length, quantity })), stock: [{ length: u120_08.capacity }] }, { timeLimitMs: 10_000 })
    expect(plan.stats.solverUnavailable).toContain('highs.wasm could not be read')
    expect(plan.status).not.toBe('optimal')
    expect(plan.sticks.length).toBeGreaterThan(50)
    // Every piece is cut exactly once, and no stick is overfilled.
    const cut = plan.sticks.flatMap((s) => s.cuts.map((c) => c.length)).sort((a, b) => a - b)
    expect(cut).toEqual([...u120_08.items].sort((a, b) => a - b))
    for (const s of plan.sticks) expect(s.cuts.reduce((t, c) => t + c.length, 0)).toBeLessThanOrEqual(u120_08.capacity)
  })
})
