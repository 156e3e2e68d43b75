import type { Highs } from 'highs'
import { createMaster, type MasterLp } from './column-generation'
import { greedyPlan } from './ffd'
import type { CuttingProblem, Pattern, PatternSolution } from './problem'
import { normalizeSolution } from './problem'
import { enumeratePatterns, searchExactCover, solvePatternMip, weightedCost } from './rounding'

/**
 * Diving: fix columns of the LP one at a time and re-solve what is left by column generation
 * (Vanderbeck, "Computational study of a column generation algorithm for bin packing and cutting
 * stock problems", Math. Programming 86, 1999, §4; Sadykov et al., "Primal heuristics for
 * branch-and-price", INFORMS J. Computing 31(2), 2019). Each step takes the columns the LP already
 * uses whole, or else one stick of the column with the largest LP value; the master stays warm
 * and only its demand rows change. The dive gives up as soon as the LP of what is left, plus what
 * is fixed, cannot beat `incumbentCost`.
 * @param goal most the plan may cost (in `costs` units, whole numbers): usually the lower bound
 * @returns a plan costing at most `goal`, or null
 */
export function dive(
  highs: Highs,
  problem: CuttingProblem,
  costs: readonly number[],
  first: MasterLp,
  goal: number,
  deadline: number,
  stats: { lpIterations: number; columns: number; diveSteps: number },
  maxDiscrepancy = DISCREPANCIES,
): PatternSolution | null {
  const m = problem.items.length
  const integral = costs.every((c) => Number.isInteger(c))
  const demand = problem.items.map((it) => it.demand)
  const available = problem.bins.map((b) => b.available)
  const uses: { pattern: Pattern; count: number }[] = []
  let fixedCost = 0
  let found: PatternSolution | null = null
  const master = createMaster(highs, problem, costs, first.pool)
  const costOf = (sol: PatternSolution): number => sol.uses.reduce((s, u) => s + (costs[u.pattern.bin] ?? 0) * u.count, 0)
  // Plans costing at most `goal` are wanted: a branch whose bound exceeds it is dropped.
  const incumbentCost = goal + 1
  const apply = (p: Pattern, n: number): void => {
    for (let i = 0; i < m; i++) demand[i] = (demand[i] ?? 0) - (p.counts[i] ?? 0) * n
    available[p.bin] = (available[p.bin] ?? 0) - n
    fixedCost += (costs[p.bin] ?? 0) * n
  }
  const fits = (p: Pattern, n: number): number => {
    let take = Math.min(n, available[p.bin] ?? 0)
    for (let i = 0; i < m; i++) if ((p.counts[i] ?? 0) > 0) take = Math.min(take, Math.floor((demand[i] ?? 0) / (p.counts[i] ?? 1)))
    return take
  }
  /** One level of the dive: true when the search should stop (a plan was found or time ran out). */
  const step = (lp: MasterLp, discrepancies: number): boolean => {
    if (Date.now() > deadline) return true
    if (lp.bounded && Math.ceil(fixedCost + lp.dualBound - 1e-6) >= incumbentCost) return false
    if (!demand.some((d) => d > 0)) {
      const plan = normalizeSolution(problem, { uses: [...uses] })
      if (costOf(plan) < incumbentCost - 1e-9) found = plan
      return found !== null
    }
    const left = demand.reduce((a, b) => a + b, 0)
    if (left <= EXACT_RESIDUAL_PIECES && lp.bounded && integral) {
      // Small residual: settle it exactly, over every pattern that can appear in a plan that
      // still beats the incumbent.
      const target = incumbentCost - 1 - fixedCost
      const sub: CuttingProblem = {
        ...problem,
        items: problem.items.map((it, i) => ({ ...it, demand: demand[i] ?? 0 })),
        bins: problem.bins.map((b, bi) => ({ ...b, available: available[bi] ?? 0 })),
      }
      const exact = settleResidual(highs, sub, costs, lp, target, Math.min(deadline, Date.now() + RESIDUAL_MS))
      if (exact.solution) {
        const plan = normalizeSolution(problem, { uses: [...uses, ...exact.solution.uses] })
        if (costOf(plan) < incumbentCost - 1e-9) found = plan
        return found !== null
      }
      if (exact.none) return false
    }
    const cols = lp.pool
      .map((p, j) => ({ p: trim(p, demand), v: lp.values[j] ?? 0 }))
      .filter((c) => c.v > 1e-6 && c.p.counts.some((x) => x > 0))
      .sort((a, b) => b.v - a.v)
    if (cols.length === 0) {
      // Nothing left in the LP's support: finish greedily.
      const rest = greedyPlan(problem, demand, available)
      if (rest) {
        const plan = normalizeSolution(problem, { uses: [...uses, ...rest.uses] })
        if (costOf(plan) < incumbentCost - 1e-9) found = plan
      }
      return found !== null
    }
    // Children: first every column the LP uses whole (as many times as whole), then single
    // sticks of the columns with the largest values, one discrepancy each.
    const whole = cols.filter((c) => c.v >= 1 - 1e-6).map((c) => ({ p: c.p, n: Math.floor(c.v + 1e-6) }))
    const children: { p: Pattern; n: number }[][] = []
    if (whole.length > 0) children.push(whole)
    for (const c of cols.slice(0, discrepancies + 1)) children.push([{ p: c.p, n: 1 }])
    let tried = 0
    for (const child of children) {
      if (tried > discrepancies) break
      const done: { p: Pattern; n: number }[] = []
      for (const { p, n } of child) {
        const take = fits(p, n)
        if (take <= 0) continue
        apply(p, take)
        uses.push({ pattern: p, count: take })
        done.push({ p, n: take })
      }
      if (done.length === 0) continue
      stats.diveSteps += done.reduce((s, d) => s + d.n, 0)
      master.setResidual(demand, available)
      const next = demand.some((d) => d > 0) ? master.solve(deadline) : lp
      if (next !== lp) stats.lpIterations += next.iterations
      const stop = step(next, discrepancies - tried)
      if (stop) return true
      for (const { p, n } of done.reverse()) {
        apply(p, -n)
        uses.pop()
      }
      master.setResidual(demand, available)
      tried++
    }
    return false
  }
  try {
    step(first, maxDiscrepancy)
  } finally {
    master.dispose()
  }
  return found
}

/** Wrong turns a dive may take before it gives up (limited discrepancy search). */
const DISCREPANCIES = 1
/** A residual of at most this many pieces is settled exactly. */
const EXACT_RESIDUAL_PIECES = 45
/** Most time one exact residual step may take. */
const RESIDUAL_MS = 300

/**
 * Exact step on a residual: lists every pattern whose reduced cost fits the budget
 * `target − LP bound` (and, with one stick kind, whose waste fits the waste budget), then searches
 * exact covers (one stick kind) or solves the MIP over them.
 * @returns a plan costing at most `target`; or `none` when it proved there is none
 */
export function settleResidual(
  highs: Highs,
  sub: CuttingProblem,
  costs: readonly number[],
  lp: MasterLp,
  target: number,
  deadline: number,
): { solution: PatternSolution | null; none: boolean } {
  if (target < 0 || Math.ceil(lp.dualBound - 1e-6) > target) return { solution: null, none: true }
  const single = sub.bins.length === 1 ? sub.bins[0] : undefined
  const total = sub.items.reduce((s, it) => s + it.weight * it.demand, 0)
  const wasteLimit = sub.bins.map(() => Infinity)
  const exactCover = single !== undefined && single.kind === 'stock' && (costs[0] ?? 0) > 0
  if (exactCover && single) wasteLimit[0] = Math.floor(target / (costs[0] ?? 1) + 1e-9) * single.capacity - total
  if (exactCover) {
    const all = enumeratePatterns(sub, lp, costs, target - lp.dualBound, wasteLimit, 20_000, deadline, false)
    if (!all.complete) return { solution: null, none: false }
    const cover = searchExactCover(sub, lp, costs, all.patterns, target, deadline)
    return { solution: cover.solution, none: cover.exhausted }
  }
  const en = enumeratePatterns(sub, lp, costs, target - lp.dualBound, wasteLimit, 20_000, deadline)
  if (!en.complete) return { solution: null, none: false }
  const mip = solvePatternMip(highs, sub, costs, en.patterns, null, deadline)
  if (mip.solution && weightedCost(mip.solution, costs) <= target + 1e-9) return { solution: mip.solution, none: false }
  return { solution: null, none: mip.infeasible || mip.optimal }
}

function trim(p: Pattern, demand: readonly number[]): Pattern {
  return { bin: p.bin, counts: p.counts.map((c, i) => Math.min(c, demand[i] ?? 0)) }
}

