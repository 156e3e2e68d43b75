import type { Highs } from 'highs'
import type { CuttingProblem, Pattern, PatternSolution } from './problem'
import { normalizeSolution, patternColumn, solutionCost, solutionSticks } from './problem'

/**
 * Fewer saw set-ups at the same cost: the pattern-minimisation step of cutting stock
 * (Vanderbeck, "Exact algorithm for minimising the number of setups in the one-dimensional
 * cutting stock problem", Operations Research 48(6), 2000, states the model): over the plan's own
 * patterns and the other patterns at hand, a HiGHS MIP chooses how many sticks to cut with each so
 * that every piece is cut exactly once, no stick kind runs out, the cost does not rise and the
 * stick count does not rise, and the number of distinct patterns is least. The plan it starts from
 * is a feasible answer, so the result is never worse than the input.
 * @param costs objective weights per stick kind (the plan may not cost more under them)
 * @param pool other patterns that may be used
 * @returns the plan with the fewest patterns found by `deadline` (the input when none is fewer)
 */
export function reducePatterns(
  highs: Highs,
  problem: CuttingProblem,
  costs: readonly number[],
  plan: PatternSolution,
  pool: readonly Pattern[],
  deadline: number,
): PatternSolution {
  const seconds = (deadline - Date.now()) / 1000
  if (seconds <= 0.02 || plan.uses.length <= 1) return plan
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
  const start = new Map<number, number>()
  for (const u of plan.uses) start.set(add(u.pattern), u.count)
  // Only patterns that cut no more of a length than is ordered can appear in an exact plan.
  for (const p of pool) if (p.counts.every((c, i) => c <= (problem.items[i]?.demand ?? 0))) add(p)
  if (cols.length > MAX_COLUMNS) cols.length = Math.max(plan.uses.length, MAX_COLUMNS)
  const sticks = solutionSticks(plan)
  let cost = 0
  for (const u of plan.uses) cost += (costs[u.pattern.bin] ?? 0) * u.count
  const model = highs.createModel()
  try {
    const inf = highs.infinity
    for (const it of problem.items) model.addRow(it.demand, it.demand, { indices: [], values: [] })
    const binRow: number[] = []
    let rows = m
    problem.bins.forEach((b, bi) => {
      if (b.available !== Infinity) {
        model.addRow(-inf, b.available, { indices: [], values: [] })
        binRow[bi] = rows++
      } else binRow[bi] = -1
    })
    const costRow = rows++
    model.addRow(-inf, cost + 1e-6, { indices: [], values: [] })
    const stickRow = rows++
    model.addRow(-inf, sticks, { indices: [], values: [] })
    const n = cols.length
    // Columns 0..n-1: sticks cut with each pattern; n..2n-1: whether the pattern is used.
    cols.forEach((p) => {
      const col = patternColumn(p, binRow)
      col.indices.push(costRow, stickRow)
      col.values.push(costs[p.bin] ?? 0, 1)
      const most = Math.min(sticks, ...p.counts.flatMap((c, i) => (c > 0 ? [Math.floor((problem.items[i]?.demand ?? 0) / c)] : [])))
      model.addCol(0, 0, most, col)
    })
    for (let j = 0; j < n; j++) model.addCol(1, 0, 1, { indices: [], values: [] })
    // Link: x_j − most_j · y_j ≤ 0.
    cols.forEach((p, j) => {
      const most = Math.min(sticks, ...p.counts.flatMap((c, i) => (c > 0 ? [Math.floor((problem.items[i]?.demand ?? 0) / c)] : [])))
      model.addRow(-inf, 0, { indices: [j, n + j], values: [1, -most] })
    })
    for (let j = 0; j < 2 * n; j++) model.changeColIntegrality(j, highs.constants.variableType.integer)
    model.options.set({ output_flag: false, time_limit: seconds, mip_rel_gap: 0 })
    model.setSolution({ colValue: [...cols.map((_, j) => start.get(j) ?? 0), ...cols.map((_, j) => (start.has(j) ? 1 : 0))] })
    model.run()
    const S = highs.constants.modelStatus
    const status = model.getModelStatus()
    if (status !== S.optimal && status !== S.timeLimit && status !== S.interrupted && status !== S.solutionLimit) return plan
    const x = model.getSolution().colValue
    const uses: { pattern: Pattern; count: number }[] = []
    cols.forEach((p, j) => {
      const k = Math.round(x[j] ?? 0)
      if (k > 0) uses.push({ pattern: p, count: k })
    })
    if (uses.length === 0 || uses.length >= plan.uses.length) return plan
    let next: PatternSolution
    try {
      next = normalizeSolution(problem, { uses })
    } catch {
      // A solver answer that does not cut every piece exactly is not used.
      return plan
    }
    const ok =
      next.uses.length < plan.uses.length &&
      solutionSticks(next) <= sticks &&
      solutionCost(problem, next) <= solutionCost(problem, plan) &&
      next.uses.reduce((s, u) => s + (costs[u.pattern.bin] ?? 0) * u.count, 0) <= cost + 1e-6
    return ok ? next : plan
  } finally {
    model.dispose()
  }
}

/** Most candidate patterns handed to the MIP (the plan's own always included). */
const MAX_COLUMNS = 3000
