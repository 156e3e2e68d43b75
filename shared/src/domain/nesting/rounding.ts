import type { Highs } from 'highs'
import { greedyPlan } from './ffd'
import type { MasterLp } from './column-generation'
import type { CuttingProblem, Pattern, PatternSolution } from './problem'
import { normalizeSolution, patternColumn } from './problem'

/**
 * From the LP to whole sticks: rounding with a residual greedy, enumeration of every pattern that
 * can still appear in a better plan (reduced-cost fixing), and a MIP over the patterns with HiGHS.
 * @module
 */

/**
 * Rounds the LP down, then plans what is left with the greedy (best fit). A second try rounds
 * the columns with the largest LP values up while the demand allows it. Returns the better plan,
 * or null when the stock runs out.
 */
export function roundLp(problem: CuttingProblem, lp: MasterLp, costs: readonly number[]): PatternSolution | null {
  const tries: PatternSolution[] = []
  for (const mode of ['down', 'up'] as const) {
    const demand = problem.items.map((it) => it.demand)
    const avail = problem.bins.map((b) => b.available)
    const uses: { pattern: Pattern; count: number }[] = []
    const order = lp.pool.map((p, j) => ({ p, v: lp.values[j] ?? 0 })).filter((c) => c.v > 1e-9)
    order.sort((a, b) => b.v - a.v)
    for (const { p, v } of order) {
      let n = mode === 'down' ? Math.floor(v + 1e-9) : Math.ceil(v - 1e-9)
      // Never take more than the remaining demand allows (for the rounded-up try) or stock holds.
      n = Math.min(n, avail[p.bin] ?? 0)
      if (mode === 'up') {
        p.counts.forEach((c, i) => {
          if (c > 0) n = Math.min(n, Math.floor((demand[i] ?? 0) / c))
        })
      }
      if (n <= 0) continue
      uses.push({ pattern: p, count: n })
      avail[p.bin] = (avail[p.bin] ?? 0) - n
      p.counts.forEach((c, i) => (demand[i] = Math.max(0, (demand[i] ?? 0) - c * n)))
    }
    const rest = greedyPlan(problem, demand, avail)
    if (!rest) continue
    tries.push(normalizeSolution(problem, { uses: [...uses, ...rest.uses] }))
  }
  let best: PatternSolution | null = null
  let bestCost = Infinity
  for (const t of tries) {
    const c = weightedCost(t, costs)
    if (c < bestCost) {
      best = t
      bestCost = c
    }
  }
  return best
}

/** Σ costs[bin]·count of a solution. */
export function weightedCost(sol: PatternSolution, costs: readonly number[]): number {
  let s = 0
  for (const u of sol.uses) s += (costs[u.pattern.bin] ?? 0) * u.count
  return s
}

/** Patterns found by `enumeratePatterns`. */
export interface Enumeration {
  /** Maximal patterns within the limits. */
  patterns: Pattern[]
  /** False when the limit on the number of patterns stopped the enumeration. */
  complete: boolean
}

/**
 * Lists every maximal pattern (or, with `maximalOnly` false, every pattern) (no further piece fits) whose reduced cost under the LP duals is at
 * most `gap` and whose unused capacity is at most `wasteLimit[bin]`. With converged duals, a plan
 * costing at most z_LP + gap can only use such patterns (after extending each stick to a maximal
 * one), so a MIP over a complete enumeration is exact — the reduced-cost argument of
 * Nemhauser & Wolsey, "Integer and Combinatorial Optimization", 1988, §II.3.
 */
export function enumeratePatterns(
  problem: CuttingProblem,
  lp: MasterLp,
  costs: readonly number[],
  gap: number,
  wasteLimit: readonly number[],
  limit: number,
  deadline: number,
  maximalOnly = true,
): Enumeration {
  const items = problem.items
  const m = items.length
  const pi = lp.itemDuals
  const suffixRatio = new Float64Array(m + 1)
  const suffixValue = new Float64Array(m + 1)
  const suffixWeight = new Float64Array(m + 1)
  for (let i = m - 1; i >= 0; i--) {
    const it = items[i]
    if (!it) continue
    suffixRatio[i] = Math.max(suffixRatio[i + 1] ?? 0, (pi[i] ?? 0) / it.weight)
    suffixValue[i] = (suffixValue[i + 1] ?? 0) + (pi[i] ?? 0) * it.demand
    suffixWeight[i] = (suffixWeight[i + 1] ?? 0) + it.weight * it.demand
  }
  const patterns: Pattern[] = []
  let complete = true
  let steps = 0
  const counts = new Array<number>(m).fill(0)
  for (let bi = 0; bi < problem.bins.length && complete; bi++) {
    const bin = problem.bins[bi]
    if (!bin) continue
    const need = (costs[bi] ?? 0) - (lp.binDuals[bi] ?? 0) - gap - 1e-7
    const cap = bin.capacity
    const minLoad = cap - (wasteLimit[bi] ?? Infinity)
    const dfs = (i: number, load: number, pieces: number, val: number): void => {
      if (!complete) return
      if ((++steps & 0xfff) === 0 && Date.now() > deadline) {
        complete = false
        return
      }
      const room = cap - load
      if (i === m) {
        if (val < need || load < minLoad || pieces === 0) return
        if (maximalOnly && pieces < problem.maxCount) {
          for (let j = 0; j < m; j++) {
            const it = items[j]
            if (it && (counts[j] ?? 0) < it.demand && it.weight <= room) return
          }
        }
        if (patterns.length >= limit) {
          complete = false
          return
        }
        patterns.push({ bin: bi, counts: [...counts] })
        return
      }
      const slots = problem.maxCount - pieces
      if (val + Math.min(room * (suffixRatio[i] ?? 0), suffixValue[i] ?? 0) < need) return
      if (load + (suffixWeight[i] ?? 0) < minLoad) return
      const it = items[i]
      if (!it) return
      const most = Math.min(it.demand, Math.floor(room / it.weight), slots)
      for (let t = most; t >= 0; t--) {
        counts[i] = t
        dfs(i + 1, load + t * it.weight, pieces + t, val + t * (pi[i] ?? 0))
        if (!complete) break
      }
      counts[i] = 0
    }
    dfs(0, 0, 0, 0)
  }
  return { patterns, complete }
}

/** Result of the MIP over a set of patterns. */
export interface PatternMip {
  /** Best plan found (null when none). */
  solution: PatternSolution | null
  /** True when HiGHS proved the plan best over the given patterns. */
  optimal: boolean
  /** True when HiGHS proved there is no plan over the given patterns. */
  infeasible: boolean
}

/**
 * Solves min Σ cost·x over the given patterns with x integer, each piece length covered and each
 * stick kind's availability kept, with HiGHS branch and cut. The incumbent, when given, is
 * added to the patterns and handed to HiGHS as a starting solution.
 */
export function solvePatternMip(
  highs: Highs,
  problem: CuttingProblem,
  costs: readonly number[],
  patterns: readonly Pattern[],
  incumbent: PatternSolution | null,
  deadline: number,
): PatternMip {
  const m = problem.items.length
  const cols: Pattern[] = []
  const index = new Map<string, number>()
  const add = (p: Pattern): number => {
    const key = `${p.bin}:${p.counts.join(',')}`
    const found = index.get(key)
    if (found !== undefined) return found
    index.set(key, cols.length)
    cols.push(p)
    return cols.length - 1
  }
  const start: number[] = []
  if (incumbent) for (const u of incumbent.uses) start[add(u.pattern)] = u.count
  for (const p of patterns) add(p)
  const seconds = (deadline - Date.now()) / 1000
  if (seconds <= 0.01) return { solution: incumbent, optimal: false, infeasible: false }
  const model = highs.createModel()
  try {
    const inf = highs.infinity
    for (const it of problem.items) model.addRow(it.demand, inf, { indices: [], values: [] })
    const binRow: number[] = []
    let rows = m
    problem.bins.forEach((b, bi) => {
      if (b.available !== Infinity) {
        model.addRow(-inf, b.available, { indices: [], values: [] })
        binRow[bi] = rows++
      } else binRow[bi] = -1
    })
    cols.forEach((p, j) => {
      model.addCol(costs[p.bin] ?? 0, 0, inf, patternColumn(p, binRow))
      model.changeColIntegrality(j, highs.constants.variableType.integer)
    })
    model.options.set({ output_flag: false, time_limit: seconds, mip_rel_gap: 0, mip_abs_gap: 1e-6 })
    if (incumbent) model.setSolution({ colValue: cols.map((_, j) => start[j] ?? 0) })
    model.run()
    const status = model.getModelStatus()
    const S = highs.constants.modelStatus
    if (status === S.infeasible) return { solution: incumbent, optimal: false, infeasible: true }
    if (status !== S.optimal && status !== S.timeLimit && status !== S.interrupted && status !== S.solutionLimit) {
      return { solution: incumbent, optimal: false, infeasible: false }
    }
    const x = model.getSolution().colValue
    const uses: { pattern: Pattern; count: number }[] = []
    cols.forEach((p, j) => {
      const n = Math.round(x[j] ?? 0)
      if (n > 0) uses.push({ pattern: p, count: n })
    })
    if (uses.length === 0) return { solution: incumbent, optimal: false, infeasible: false }
    let sol: PatternSolution
    try {
      sol = normalizeSolution(problem, { uses })
    } catch {
      // A time-limited MIP may stop without a feasible point; keep the incumbent then.
      return { solution: incumbent, optimal: false, infeasible: false }
    }
    const better = !incumbent || weightedCost(sol, costs) <= weightedCost(incumbent, costs) + 1e-9
    return { solution: better ? sol : incumbent, optimal: status === S.optimal, infeasible: false }
  } finally {
    model.dispose()
  }
}

/**
 * Depth-first search for a plan of exactly `target` sticks of the single stick kind, every piece
 * cut exactly once, over `pool` (every pattern that can appear in such a plan). Each level opens
 * the stick that holds the longest piece still to cut. Two budgets prune it: the reduced costs of
 * the chosen patterns may add up to at most target − z_LP (the argument of `enumeratePatterns`),
 * and their unused lengths to at most target·capacity − total weight. Residual demands that
 * failed are remembered.
 * @returns the plan, or null when none exists in the pool (`exhausted`) or time ran out
 */
export function searchExactCover(
  problem: CuttingProblem,
  lp: MasterLp,
  costs: readonly number[],
  pool: readonly Pattern[],
  target: number,
  deadline: number,
): { solution: PatternSolution | null; exhausted: boolean } {
  const m = problem.items.length
  const bin = problem.bins[0]
  if (!bin || problem.bins.length !== 1) return { solution: null, exhausted: false }
  const cost = costs[0] ?? 1
  const sticks = Math.round(target / cost)
  const rcOf = (p: Pattern): number => {
    let v = 0
    p.counts.forEach((c, i) => (v += c * (lp.itemDuals[i] ?? 0)))
    return cost - (lp.binDuals[0] ?? 0) - v
  }
  const byFirst: { p: Pattern; rc: number; waste: number }[][] = Array.from({ length: m }, () => [])
  for (const p of pool) {
    const first = p.counts.findIndex((c) => c > 0)
    if (first < 0) continue
    let load = 0
    p.counts.forEach((c, i) => (load += c * (problem.items[i]?.weight ?? 0)))
    byFirst[first]?.push({ p, rc: Math.max(0, rcOf(p)), waste: bin.capacity - load })
  }
  for (const list of byFirst) list.sort((a, b) => a.rc - b.rc || a.waste - b.waste)
  const total = problem.items.reduce((s, it) => s + it.weight * it.demand, 0)
  const demand = problem.items.map((it) => it.demand)
  const chosen: Pattern[] = []
  const failed = new Map<string, number>()
  let steps = 0
  let timedOut = false
  const dfs = (rcLeft: number, wasteLeft: number): boolean => {
    const first = demand.findIndex((d) => d > 0)
    if (first < 0) return true
    if (chosen.length >= sticks) return false
    if ((++steps & 0x3ff) === 0 && Date.now() > deadline) {
      timedOut = true
      return false
    }
    const key = `${chosen.length}|${demand.join(',')}`
    const seen = failed.get(key)
    if (seen !== undefined && seen >= rcLeft - 1e-9) return false
    for (const cand of byFirst[first] ?? []) {
      if (cand.rc > rcLeft + 1e-7) break
      if (cand.waste > wasteLeft) continue
      const counts = cand.p.counts
      let fits = true
      for (let i = first; i < m; i++) {
        if ((counts[i] ?? 0) > (demand[i] ?? 0)) {
          fits = false
          break
        }
      }
      if (!fits) continue
      for (let i = first; i < m; i++) demand[i] = (demand[i] ?? 0) - (counts[i] ?? 0)
      chosen.push(cand.p)
      if (dfs(rcLeft - cand.rc, wasteLeft - cand.waste)) return true
      chosen.pop()
      for (let i = first; i < m; i++) demand[i] = (demand[i] ?? 0) + (counts[i] ?? 0)
      if (timedOut) return false
    }
    failed.set(key, rcLeft)
    return false
  }
  const found = dfs(target - lp.dualBound, sticks * bin.capacity - total)
  if (!found) return { solution: null, exhausted: !timedOut }
  return { solution: normalizeSolution(problem, { uses: chosen.map((p) => ({ pattern: p, count: 1 })) }), exhausted: false }
}
