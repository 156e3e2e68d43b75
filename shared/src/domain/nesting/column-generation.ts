import type { Highs, Solution } from 'highs'
import { solveKnapsack } from './knapsack'
import type { CuttingProblem, Pattern } from './problem'
import { patternColumn, patternLoad } from './problem'

/**
 * Column generation for the cutting-stock LP (Gilmore & Gomory, Operations Research 9, 1961):
 *   min Σ cost_j·x_j  s.t.  Σ a_ij·x_j ≥ demand_i (each piece length),
 *                           Σ_{j on stick kind b} x_j ≤ available_b (limited kinds), x ≥ 0.
 * The restricted master is kept in one persistent HiGHS model and re-solved warm after new columns
 * are added; the pricing step is a bounded knapsack per stick kind (see `knapsack.ts`).
 * @module
 */

/** The LP at the end of column generation. */
export interface MasterLp {
  /** Value of the last restricted master LP (in `costs` units): the LP optimum when `converged`. */
  value: number
  /**
   * Dual price of each piece length (≥ 0): the master's duals when `converged`, otherwise the
   * best Lagrangian prices found (scaled so no pattern has a negative reduced cost under them).
   */
  itemDuals: number[]
  /** Dual price of each stick kind's availability row (≤ 0; 0 for unlimited kinds). */
  binDuals: number[]
  /** Every column generated so far. */
  pool: Pattern[]
  /** LP value of each pool column. */
  values: number[]
  /** True when pricing proved no column can improve the LP (so `value` is a lower bound). */
  converged: boolean
  /**
   * True when `dualBound` is a proven lower bound: the LP converged, or exact pricing gave a
   * Lagrangian (Farley) bound under `itemDuals`/`binDuals`.
   */
  bounded: boolean
  /** The lower bound implied by the duals (π·d + μ·u): the LP value when converged. */
  dualBound: number
  /**
   * True when the LP converged, or column generation stopped early because the Lagrangian bound
   * rounded up met the master's value rounded up: either way ceil(LP value) = ceil(`dualBound`).
   */
  roundedUp: boolean
  /** Pricing rounds (each one re-solve of the master). */
  iterations: number
}

/** Options of column generation (the defaults are what the benchmark kept). */
export interface ColumnGenerationOptions {
  /** Weight of the stability centre in the smoothed duals (Wentges 1997); 0 turns smoothing off. */
  smoothing?: number
  /** Most columns added per stick kind and round (several from one pricing table). */
  columnsPerRound?: number
  /**
   * Stop as soon as the Lagrangian bound rounded up meets the master's value rounded up (the
   * rounded-up LP bound is then known); needs whole-number costs.
   */
  earlyStop?: boolean
}

/**
 * Runs column generation to optimality or until `deadline` (ms since epoch).
 *
 * Each round re-solves the restricted master, then prices with a knapsack per stick kind at
 * smoothed duals (a mix of the best duals so far and the master's, after Wentges, "Weighted
 * Dantzig–Wolfe decomposition", ITOR 4(2), 1997; on a mispricing the round prices again at the
 * master's own duals). Exact pricing gives a Lagrangian bound (Farley, "A note on bounding a class
 * of linear programming problems", Operations Research 38(5), 1990: scaling the prices by
 * min cost/value makes them dual feasible). Several columns with negative reduced cost come from
 * one dynamic-programming table per round.
 * @param costs objective coefficient per stick kind (scaled stock cost; may differ from `bin.cost`)
 * @param start initial columns (for example the patterns of a greedy plan)
 */
export function solveMasterLp(
  highs: Highs,
  problem: CuttingProblem,
  costs: readonly number[],
  start: readonly Pattern[],
  deadline: number,
  options: ColumnGenerationOptions = {},
): MasterLp {
  const master = createMaster(highs, problem, costs, start, options)
  try {
    return master.solve(deadline)
  } finally {
    master.dispose()
  }
}

/** A restricted master kept alive between solves, so a dive can change the demand and re-solve warm. */
export interface Master {
  /** Column generation on the current demand until it converges, stops early, or `deadline`. */
  solve(deadline: number): MasterLp
  /** Sets what is still to cut of each piece length and how many sticks of each kind are left. */
  setResidual(demand: readonly number[], available: readonly number[]): void
  /** Frees the solver model. */
  dispose(): void
}

/** Builds the restricted master over the starting columns (see {@link solveMasterLp}). */
export function createMaster(
  highs: Highs,
  problem: CuttingProblem,
  costs: readonly number[],
  start: readonly Pattern[],
  options: ColumnGenerationOptions = {},
): Master {
  const alpha = options.smoothing ?? 0.5
  const perRound = options.columnsPerRound ?? 20
  const integral = costs.every((c) => Number.isInteger(c))
  const earlyStop = (options.earlyStop ?? true) && integral
  const m = problem.items.length
  const nb = problem.bins.length
  const demand = problem.items.map((it) => it.demand)
  const available = problem.bins.map((b) => b.available)
  const model = highs.createModel()
  model.options.set({ output_flag: false })
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
  // Artificial columns keep the master feasible; their price exceeds any stick's share.
  const big = 10 * Math.max(1, ...costs.map(Math.abs)) + 1
  for (let i = 0; i < m; i++) model.addCol(big, 0, inf, { indices: [i], values: [1] })
  const pool: Pattern[] = []
  const seen = new Set<string>()
  const addColumn = (p: Pattern): boolean => {
    const key = `${p.bin}:${p.counts.join(',')}`
    if (seen.has(key)) return false
    seen.add(key)
    pool.push(p)
    model.addCol(costs[p.bin] ?? 0, 0, inf, patternColumn(p, binRow))
    return true
  }
  for (const p of start) addColumn(p)
  // A few simple columns: as many of one length as fit, on every stick kind.
  problem.bins.forEach((b, bi) => {
    problem.items.forEach((it, i) => {
      const counts = new Array<number>(m).fill(0)
      counts[i] = Math.min(it.demand, Math.floor(b.capacity / it.weight), problem.maxCount)
      if ((counts[i] ?? 0) > 0) addColumn({ bin: bi, counts })
    })
  })
  const maxCaps = problem.bins.map((b) => b.capacity)
  const valueAt = (pi: readonly number[], counts: readonly number[]): number => {
    let v = 0
    for (let i = 0; i < m; i++) v += (counts[i] ?? 0) * (pi[i] ?? 0)
    return v
  }

  const solve = (deadline: number): MasterLp => {
    let itemDuals = new Array<number>(m).fill(0)
    let binDuals = new Array<number>(nb).fill(0)
    let value = Infinity
    let converged = false
    // Best Lagrangian bound so far, its (dual feasible) prices, and the prices it came from.
    let bestBound = -Infinity
    let boundItem: number[] | null = null
    let boundBin: number[] | null = null
    let centre: number[] | null = null
    let centreBin: number[] | null = null
    let sol: Solution | null = null
    let iterations = 0
    let stoppedEarly = false
    /** Prices at `pi`/`mu`; updates the Lagrangian bound; returns candidate patterns. */
    const price = (pi: readonly number[], mu: readonly number[]): { cands: Pattern[]; exact: boolean } => {
      const answer = solveKnapsack(
        problem.items.map((it, i) => ({ weight: it.weight, value: pi[i] ?? 0, bound: demand[i] ?? 0 })),
        maxCaps,
        problem.maxCount,
        perRound > 1,
      )
      if (answer.exact) {
        // Farley scaling: θ = min over unlimited kinds of cost / best value, at most 1.
        let theta = 1
        problem.bins.forEach((_, bi) => {
          const v = answer.results[bi]?.value ?? 0
          if (available[bi] === Infinity && v > 1e-12) theta = Math.min(theta, (costs[bi] ?? 0) / v)
        })
        if (theta > 0) {
          let bound = 0
          demand.forEach((d, i) => (bound += d * theta * (pi[i] ?? 0)))
          const muBound = problem.bins.map((_, bi) => {
            if (available[bi] === Infinity) return 0
            return Math.min(0, (costs[bi] ?? 0) - theta * (answer.results[bi]?.value ?? 0))
          })
          available.forEach((a, bi) => {
            if (a !== Infinity) bound += a * (muBound[bi] ?? 0)
          })
          if (bound > bestBound + 1e-9) {
            bestBound = bound
            boundItem = pi.map((x) => theta * x)
            boundBin = muBound
            centre = [...pi]
            centreBin = [...mu]
          }
        }
      }
      const cands: Pattern[] = []
      answer.results.forEach((r, bi) => {
        const list = [r, ...(answer.alternatives?.[bi] ?? [])]
        for (const c of list) if (c.value > 0 && patternLoad(problem, c.counts) <= (maxCaps[bi] ?? 0)) cands.push({ bin: bi, counts: c.counts })
      })
      return { cands, exact: answer.exact }
    }
    /** Adds the candidates with negative reduced cost under the master's duals, best first. */
    const addNegative = (cands: readonly Pattern[]): number => {
      const scored = cands
        .map((p) => ({ p, rc: (costs[p.bin] ?? 0) - (binDuals[p.bin] ?? 0) - valueAt(itemDuals, p.counts) }))
        .filter((c) => c.rc < -1e-9 * Math.max(1, Math.abs(costs[c.p.bin] ?? 0)))
        .sort((a, b) => a.rc - b.rc)
      const perBin = problem.bins.map(() => 0)
      let added = 0
      for (const { p } of scored) {
        if ((perBin[p.bin] ?? 0) >= perRound) continue
        if (addColumn(p)) {
          perBin[p.bin] = (perBin[p.bin] ?? 0) + 1
          added++
        }
      }
      return added
    }
    for (let iter = 0; iter < 5000; iter++) {
      iterations++
      model.run()
      if (model.getModelStatus() !== highs.constants.modelStatus.optimal) {
        throw new Error(`nesting: LP master ended with HiGHS status ${model.getModelStatus()}`)
      }
      value = model.getObjectiveValue()
      const now = model.getSolution()
      sol = now
      itemDuals = Array.from(now.rowDual.subarray(0, m), (d) => Math.max(0, d))
      binDuals = problem.bins.map((_, bi) => {
        const r = binRow[bi] ?? -1
        return r >= 0 ? Math.min(0, now.rowDual[r] ?? 0) : 0
      })
      let added = 0
      let exact = true
      const c0 = centre as number[] | null
      const cb0 = centreBin as number[] | null
      if (alpha > 0 && c0 && cb0) {
        const pi = itemDuals.map((d, i) => alpha * (c0[i] ?? 0) + (1 - alpha) * d)
        const mu = binDuals.map((d, bi) => alpha * (cb0[bi] ?? 0) + (1 - alpha) * d)
        const got = price(pi, mu)
        exact = got.exact
        added = addNegative(got.cands)
      }
      if (added === 0) {
        // No smoothing yet, or a mispricing: price at the master's own duals.
        const got = price(itemDuals, binDuals)
        exact = got.exact
        added = addNegative(got.cands)
        if (added === 0) {
          converged = exact
          break
        }
      }
      if (earlyStop && bestBound > -Infinity && Math.ceil(bestBound - 1e-6) >= Math.ceil(value - 1e-6)) {
        stoppedEarly = true
        break
      }
      if (Date.now() > deadline) break
    }
    // Columns added after the last solve have LP value 0 (the stored solution predates them).
    const last = sol
    if (!last) throw new Error('nesting: LP master was never solved')
    const values = pool.map((_, j) => last.colValue[m + j] ?? 0)
    // If an artificial column is still in use, the demand cannot be met even fractionally.
    let artificial = 0
    for (let i = 0; i < m; i++) artificial += last.colValue[i] ?? 0
    if (converged && artificial > 1e-6) {
      throw new Error('nesting: not enough stock to cut every piece')
    }
    const common = { value, pool: [...pool], values, converged, iterations }
    if (converged) {
      let dualBound = 0
      demand.forEach((d, i) => (dualBound += d * (itemDuals[i] ?? 0)))
      available.forEach((a, bi) => {
        if (a !== Infinity) dualBound += a * (binDuals[bi] ?? 0)
      })
      return { ...common, itemDuals, binDuals, bounded: true, dualBound, roundedUp: true }
    }
    const bi0 = boundItem as number[] | null
    const bb0 = boundBin as number[] | null
    if (bi0 && bb0) return { ...common, itemDuals: bi0, binDuals: bb0, bounded: true, dualBound: bestBound, roundedUp: stoppedEarly }
    return { ...common, itemDuals, binDuals, bounded: false, dualBound: -Infinity, roundedUp: false }
  }

  return {
    solve,
    setResidual(nextDemand, nextAvailable) {
      nextDemand.forEach((d, i) => {
        if (d !== demand[i]) model.changeRowBounds(i, d, inf)
        demand[i] = d
      })
      nextAvailable.forEach((a, bi) => {
        const r = binRow[bi] ?? -1
        if (r >= 0 && a !== available[bi]) model.changeRowBounds(r, -inf, a)
        available[bi] = a
      })
    },
    dispose() {
      model.dispose()
    },
  }
}
