import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { greedyPlan } from './ffd'
import { loadHighs } from './highs-loader'
import { reducePatterns } from './pattern-reduction'
import { buildProblem, patternLoad, patternPieces, solutionCost, solutionSticks } from './problem'
import type { Pattern } from './problem'
import { enumeratePatterns } from './rounding'
import type { NestInput } from './types'

// Random cut runs with few lengths in large quantities (where patterns repeat, so there is
// something to reduce), one or two stock options and sometimes a piece limit.
const inputArb: fc.Arbitrary<NestInput> = fc
  .record({
    pieces: fc.array(fc.record({ length: fc.integer({ min: 10, max: 140 }), quantity: fc.integer({ min: 1, max: 12 }) }), { minLength: 1, maxLength: 5 }),
    stock: fc.array(fc.record({ length: fc.integer({ min: 150, max: 400 }), cost: fc.integer({ min: 1, max: 500 }) }), { minLength: 1, maxLength: 2 }),
    kerf: fc.integer({ min: 0, max: 4 }),
    maxPiecesPerStick: fc.option(fc.integer({ min: 2, max: 6 }), { nil: undefined }),
  })
  .map((r) => {
    const input: NestInput = { pieces: r.pieces, stock: r.stock, kerf: r.kerf }
    if (r.maxPiecesPerStick !== undefined) input.maxPiecesPerStick = r.maxPiecesPerStick
    return input
  })

describe('reducePatterns (fast-check)', () => {
  it('never adds a stick nor cost, cuts every piece exactly once, and never adds a pattern', async () => {
    const highs = await loadHighs()
    await fc.assert(
      fc.asyncProperty(inputArb, async (input) => {
        const problem = buildProblem(input)
        const plan = greedyPlan(problem)
        // Every stock option here is unlimited and holds every piece, so a greedy plan always exists.
        if (!plan) throw new Error('no greedy plan for a run every stick can hold')
        const costs = problem.bins.map((b) => b.cost)
        // Every pattern (not only maximal ones) with any reduced cost, as other patterns at hand.
        const zero = {
          value: 0,
          itemDuals: problem.items.map(() => 0),
          binDuals: problem.bins.map(() => 0),
          pool: [],
          values: [],
          converged: true,
          bounded: true,
          dualBound: 0,
          roundedUp: true,
          iterations: 0,
        }
        const pool: Pattern[] = enumeratePatterns(
          problem,
          zero,
          costs,
          Infinity,
          problem.bins.map(() => Infinity),
          500,
          Date.now() + 1000,
          false,
        ).patterns
        const out = reducePatterns(highs, problem, costs, plan, pool, Date.now() + 2000)
        expect(solutionSticks(out)).toBeLessThanOrEqual(solutionSticks(plan))
        expect(solutionCost(problem, out)).toBeLessThanOrEqual(solutionCost(problem, plan))
        expect(out.uses.length).toBeLessThanOrEqual(plan.uses.length)
        // Every piece cut exactly once; every stick within its length and piece limit; stock kept.
        const cut = problem.items.map(() => 0)
        const used = problem.bins.map(() => 0)
        for (const u of out.uses) {
          expect(u.count).toBeGreaterThan(0)
          expect(patternLoad(problem, u.pattern.counts)).toBeLessThanOrEqual(problem.bins[u.pattern.bin]?.capacity ?? 0)
          expect(patternPieces(u.pattern.counts)).toBeLessThanOrEqual(problem.maxCount)
          u.pattern.counts.forEach((c, i) => (cut[i] = (cut[i] ?? 0) + c * u.count))
          used[u.pattern.bin] = (used[u.pattern.bin] ?? 0) + u.count
        }
        expect(cut).toEqual(problem.items.map((it) => it.demand))
        problem.bins.forEach((b, i) => expect(used[i] ?? 0).toBeLessThanOrEqual(b.available))
      }),
      { numRuns: 60, seed: 1717 },
    )
  }, 120_000)

  it('merges a hand-worked plan into one pattern', async () => {
    // Stick 100, pieces 4×50 and 4×30 (no kerf). Two sticks of 50+50, one of 30+30+30 and one
    // of 30: 4 sticks in 3 patterns. Four sticks of 50+30 (80 <= 100) cut the same pieces with
    // the same 4 sticks in 1 pattern.
    const highs = await loadHighs()
    const problem = buildProblem({
      pieces: [
        { length: 50, quantity: 4 },
        { length: 30, quantity: 4 },
      ],
      stock: [{ length: 100 }],
    })
    const plan = {
      uses: [
        { pattern: { bin: 0, counts: [2, 0] }, count: 2 },
        { pattern: { bin: 0, counts: [0, 3] }, count: 1 },
        { pattern: { bin: 0, counts: [0, 1] }, count: 1 },
      ],
    }
    const out = reducePatterns(highs, problem, [100], plan, [{ bin: 0, counts: [1, 1] }], Date.now() + 5000)
    expect(out.uses).toEqual([{ pattern: { bin: 0, counts: [1, 1] }, count: 4 }])
  })
})
