import type { CuttingProblem, Pattern, PatternSolution } from './problem'
import { normalizeSolution, patternLoad } from './problem'

/**
 * First-fit decreasing for plain bin packing (one capacity, no piece limit): each item, longest
 * first, goes into the first open bin with room. Returns the bins as lists of weights.
 * Johnson (1973): FFD uses at most 11/9·OPT + 6/9 bins; it is the benchmark's baseline.
 */
export function firstFitDecreasing(weights: readonly number[], capacity: number, maxCount = Infinity): number[][] {
  const sorted = [...weights].sort((a, b) => b - a)
  const bins: number[][] = []
  const free: number[] = []
  for (const w of sorted) {
    let placed = false
    for (let b = 0; b < bins.length; b++) {
      const bin = bins[b]
      if (bin && (free[b] ?? 0) >= w && bin.length < maxCount) {
        bin.push(w)
        free[b] = (free[b] ?? 0) - w
        placed = true
        break
      }
    }
    if (!placed) {
      if (w > capacity) throw new Error(`item ${w} larger than capacity ${capacity}`)
      bins.push([w])
      free.push(capacity - w)
    }
  }
  return bins
}

interface OpenStick {
  bin: number
  counts: number[]
  free: number
  pieces: number
}

/**
 * Greedy plan for any model (several stick kinds, offcuts, availability, piece limit). Pieces go
 * longest first into the open stick where they leave the least room (best fit); a new stick is an
 * offcut when one fits (offcuts first), otherwise the stock option with the lowest cost per unit
 * of length that fits. Afterwards each stock stick moves to the cheapest stock option that still
 * holds its pieces. With `firstFit` the first open stick with room is used instead (FFD).
 * @returns an exact solution, or null when the available sticks run out
 */
export function greedyPlan(
  problem: CuttingProblem,
  demand: readonly number[] = problem.items.map((it) => it.demand),
  available: readonly number[] = problem.bins.map((b) => b.available),
  firstFit = false,
): PatternSolution | null {
  const m = problem.items.length
  const left = [...available]
  const open: OpenStick[] = []
  const stockOrder = problem.bins
    .map((b, i) => ({ b, i }))
    .sort((x, y) => {
      if (x.b.kind !== y.b.kind) return x.b.kind === 'offcut' ? -1 : 1
      if (x.b.kind === 'offcut') return x.b.capacity - y.b.capacity
      return x.b.cost / x.b.capacity - y.b.cost / y.b.capacity || y.b.capacity - x.b.capacity
    })
  for (let i = 0; i < m; i++) {
    const it = problem.items[i]
    if (!it) continue
    for (let k = 0; k < (demand[i] ?? 0); k++) {
      let target: OpenStick | undefined
      for (const s of open) {
        if (s.free < it.weight || s.pieces >= problem.maxCount) continue
        if (firstFit) {
          target = s
          break
        }
        if (!target || s.free < target.free) target = s
      }
      if (!target) {
        const pick = stockOrder.find(({ b, i: bi }) => (left[bi] ?? 0) > 0 && b.capacity >= it.weight)
        if (!pick) return null
        left[pick.i] = (left[pick.i] ?? 0) - 1
        target = { bin: pick.i, counts: new Array<number>(m).fill(0), free: pick.b.capacity, pieces: 0 }
        open.push(target)
      }
      target.counts[i] = (target.counts[i] ?? 0) + 1
      target.free -= it.weight
      target.pieces++
    }
  }
  // Move each stock stick to the cheapest stock option that holds it.
  for (const s of open) {
    const cur = problem.bins[s.bin]
    if (!cur || cur.kind !== 'stock') continue
    const load = patternLoad(problem, s.counts)
    let best = s.bin
    problem.bins.forEach((b, bi) => {
      const bestBin = problem.bins[best]
      if (b.kind === 'stock' && bestBin && b.capacity >= load && (left[bi] ?? 0) > 0 && b.cost < bestBin.cost) best = bi
    })
    if (best !== s.bin) {
      left[best] = (left[best] ?? 0) - 1
      left[s.bin] = (left[s.bin] ?? 0) + 1
      s.bin = best
    }
  }
  const uses = open.map((s) => ({ pattern: { bin: s.bin, counts: s.counts } satisfies Pattern, count: 1 }))
  return normalizeSolution({ ...problem, items: problem.items.map((it, i) => ({ ...it, demand: demand[i] ?? 0 })) }, { uses })
}
