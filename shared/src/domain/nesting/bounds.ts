import type { CuttingProblem } from './problem'

/**
 * Continuous bound L1 for bin packing: ceil(sum of weights / capacity).
 * Martello & Toth, "Knapsack Problems", Wiley 1990, §8.3.
 */
export function continuousBound(weights: readonly number[], capacity: number): number {
  let sum = 0
  for (const w of weights) sum += w
  return Math.ceil(sum / capacity)
}

/**
 * Martello–Toth bound L2 for bin packing with one capacity (Martello & Toth 1990, §8.3.1):
 * max over α in [0, C/2] of |J1| + |J2| + max(0, ceil((Σ J3 − (|J2|·C − Σ J2)) / C)), with
 * J1 = {w > C − α}, J2 = {C/2 < w ≤ C − α}, J3 = {α ≤ w ≤ C/2}. It dominates L1.
 */
export function martelloTothL2(weights: readonly number[], capacity: number): number {
  const C = capacity
  const w = [...weights].sort((a, b) => a - b)
  const candidates = new Set<number>([0])
  for (const x of w) if (2 * x <= C) candidates.add(x)
  let best = continuousBound(w, C)
  for (const alpha of candidates) {
    let n1 = 0
    let n2 = 0
    let s2 = 0
    let s3 = 0
    for (const x of w) {
      if (x > C - alpha) n1++
      else if (2 * x > C) {
        n2++
        s2 += x
      } else if (x >= alpha) s3 += x
    }
    const extra = Math.max(0, Math.ceil((s3 - (n2 * C - s2)) / C))
    best = Math.max(best, n1 + n2 + extra)
  }
  return best
}

/** Bounds on the model computed without any LP. */
export interface SimpleBounds {
  /** Fewest sticks whose capacities could hold the total weight. */
  continuousSticks: number
  /** L2 when there is one bin type; else the continuous bound. */
  martelloTothSticks: number
  /** Least cost of enough capacity bought fractionally, rounded up. */
  cost: number
}

/**
 * Lower bounds on sticks and cost that need no LP: the continuous bound (taking the largest
 * sticks first, offcuts included), Martello–Toth L2 when there is a single kind of stick, a
 * piece-count bound when sticks hold a limited number of pieces, and the cost of the cheapest
 * capacity per unit bought fractionally.
 */
export function simpleBounds(problem: CuttingProblem): SimpleBounds {
  const total = problem.items.reduce((s, it) => s + it.weight * it.demand, 0)
  const pieces = problem.items.reduce((s, it) => s + it.demand, 0)
  // Sticks: largest capacities first.
  const caps = [...problem.bins].sort((a, b) => b.capacity - a.capacity)
  let sticks = 0
  let held = 0
  for (const b of caps) {
    if (held >= total) break
    if (b.available === Infinity) {
      sticks += Math.ceil((total - held) / b.capacity)
      held = total
      break
    }
    const need = Math.min(b.available, Math.ceil((total - held) / b.capacity))
    sticks += need
    held += need * b.capacity
  }
  if (problem.maxCount !== Infinity) sticks = Math.max(sticks, Math.ceil(pieces / problem.maxCount))
  let l2 = sticks
  const only = problem.bins[0]
  if (problem.bins.length === 1 && only) {
    const weights: number[] = []
    for (const it of problem.items) for (let k = 0; k < it.demand; k++) weights.push(it.weight)
    l2 = Math.max(sticks, martelloTothL2(weights, only.capacity))
  }
  // Cost: cheapest capacity first (fractional), offcuts are free.
  const byRate = [...problem.bins].sort((a, b) => a.cost / a.capacity - b.cost / b.capacity)
  let cost = 0
  let covered = 0
  for (const b of byRate) {
    if (covered >= total) break
    const take = Math.min(b.available * b.capacity, total - covered)
    cost += (take / b.capacity) * b.cost
    covered += take
  }
  let costBound = Math.ceil(cost - 1e-9)
  if (problem.bins.length === 1 && only) costBound = Math.max(costBound, l2 * only.cost)
  return { continuousSticks: sticks, martelloTothSticks: l2, cost: costBound }
}
