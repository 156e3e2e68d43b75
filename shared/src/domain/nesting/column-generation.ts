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
  /** Optimal LP value (in `costs` units) when `converged`. */
  value: number
  /** Dual price of each piece length (≥ 0). */
  itemDuals: number[]
  /** Dual price of each stick kind's availability row (≤ 0; 0 for unlimited kinds). */
  binDuals: number[]
  /** Every column generated so far. */
  pool: Pattern[]
  /** LP value of each pool column. */
  values: number[]
  /** True when pricing proved no column can improve the LP (so `value` is a lower bound). */
  converged: boolean
  /** Value of the lower bound implied by the duals (π·d + μ·u), valid when `converged`. */
  dualBound: number
}

/**
 * Runs column generation to optimality or until `deadline` (ms since epoch).
 * @param costs objective coefficient per stick kind (scaled stock cost; may differ from `bin.cost`)
 * @param start initial columns (for example the patterns of a greedy plan)
 */
export function solveMasterLp(
  highs: Highs,
  problem: CuttingProblem,
  costs: readonly number[],
  start: readonly Pattern[],
  deadline: number,
): MasterLp {
  const m = problem.items.length
  const nb = problem.bins.length
  const model = highs.createModel()
  try {
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
    let itemDuals = new Array<number>(m).fill(0)
    let binDuals = new Array<number>(nb).fill(0)
    let value = Infinity
    let converged = false
    const maxCaps = problem.bins.map((b) => b.capacity)
    let sol: Solution | null = null
    for (let iter = 0; iter < 5000; iter++) {
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
      const answer = solveKnapsack(
        problem.items.map((it, i) => ({ weight: it.weight, value: itemDuals[i] ?? 0, bound: it.demand })),
        maxCaps,
        problem.maxCount,
      )
      let added = 0
      answer.results.forEach((r, bi) => {
        const rc = (costs[bi] ?? 0) - r.value - (binDuals[bi] ?? 0)
        const scale = Math.max(1, Math.abs(costs[bi] ?? 0))
        if (rc < -1e-9 * scale && r.value > 0 && patternLoad(problem, r.counts) <= (maxCaps[bi] ?? 0)) {
          if (addColumn({ bin: bi, counts: r.counts })) added++
        }
      })
      if (added === 0) {
        converged = answer.exact
        break
      }
      if (Date.now() > deadline) break
    }
    // Columns added after the last solve have LP value 0 (the stored solution predates them).
    const last = sol
    if (!last) throw new Error('nesting: LP master was never solved')
    const values = pool.map((_, j) => last.colValue[m + j] ?? 0)
    let dualBound = 0
    problem.items.forEach((it, i) => (dualBound += it.demand * (itemDuals[i] ?? 0)))
    problem.bins.forEach((b, bi) => {
      if (b.available !== Infinity) dualBound += b.available * (binDuals[bi] ?? 0)
    })
    // If an artificial column is still in use, the demand cannot be met even fractionally.
    let artificial = 0
    for (let i = 0; i < m; i++) artificial += last.colValue[i] ?? 0
    if (converged && artificial > 1e-6) {
      throw new Error('nesting: not enough stock to cut every piece')
    }
    return { value, itemDuals, binDuals, pool, values, converged, dualBound }
  } finally {
    model.dispose()
  }
}
