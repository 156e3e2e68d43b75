/**
 * Bounded knapsack, the pricing step of column generation: given a value per piece (the LP dual),
 * find the way to fill a stick that is worth the most.
 * @module
 */

/** One kind of piece offered to the knapsack. */
export interface KnapsackItem {
  /** Consumption weight (length + kerf). */
  weight: number
  /** Value of one piece (dual price). */
  value: number
  /** At most this many. */
  bound: number
}

/** Best filling of one capacity. */
export interface KnapsackResult {
  /** Pieces of each item, in input order. */
  counts: number[]
  /** Total value. */
  value: number
}

/** Results for each requested capacity, and whether they are proven best. */
export interface KnapsackAnswer {
  /** One result per requested capacity, in order. */
  results: KnapsackResult[]
  /** False when the search stopped at its node limit (the results are then only good ones). */
  exact: boolean
  /**
   * With `alternatives` asked for and the dynamic programme used: per capacity, for each piece
   * kind, the best filling that holds at least one piece of that kind (more columns per pricing
   * round from the same table, so column generation needs fewer rounds).
   */
  alternatives?: KnapsackResult[][]
}

function gcd(a: number, b: number): number {
  while (b) [a, b] = [b, a % b]
  return a
}

const DP_CELL_LIMIT = 24_000_000
const NODE_LIMIT = 400_000

/**
 * Solves max Σ value·x subject to Σ weight·x ≤ capacity, 0 ≤ x ≤ bound, Σ x ≤ maxCount, integer,
 * for several capacities at once. Uses dynamic programming over capacity with binary splitting of
 * the bounds (Martello & Toth 1990, §3.2) when the table is small and there is no piece limit,
 * and depth-first branch and bound with the Dantzig bound otherwise (§3.3).
 */
export function solveKnapsack(
  items: readonly KnapsackItem[],
  capacities: readonly number[],
  maxCount = Infinity,
  alternatives = false,
): KnapsackAnswer {
  const useful = items.map((it, i) => ({ ...it, i })).filter((it) => it.value > 1e-12 && it.bound > 0)
  const empty = (): KnapsackResult => ({ counts: new Array<number>(items.length).fill(0), value: 0 })
  if (useful.length === 0) return { results: capacities.map(empty), exact: true }
  let g = 0
  for (const it of useful) g = gcd(g, it.weight)
  const scaledCaps = capacities.map((c) => Math.floor(c / g))
  const maxCap = Math.max(...scaledCaps)
  let parts = 0
  for (const it of useful) parts += Math.ceil(Math.log2(it.bound + 1))
  if (maxCount === Infinity && parts * (maxCap + 1) <= DP_CELL_LIMIT) {
    return { ...dp(useful, g, scaledCaps, maxCap, items.length, alternatives), exact: true }
  }
  let exact = true
  const results = capacities.map((c) => {
    const r = branchAndBound(useful, c, maxCount, items.length)
    if (!r.exact) exact = false
    return r.result
  })
  return { results, exact }
}

function dp(
  useful: readonly (KnapsackItem & { i: number })[],
  g: number,
  caps: readonly number[],
  maxCap: number,
  n: number,
  alternatives: boolean,
): { results: KnapsackResult[]; alternatives?: KnapsackResult[][] } {
  const split: { i: number; mult: number; w: number; v: number }[] = []
  for (const it of useful) {
    let left = it.bound
    let mult = 1
    while (left > 0) {
      const take = Math.min(mult, left)
      split.push({ i: it.i, mult: take, w: (it.weight / g) * take, v: it.value * take })
      left -= take
      mult *= 2
    }
  }
  const W = maxCap + 1
  const f = new Float64Array(W)
  const choice = new Uint8Array(split.length * W)
  for (let k = 0; k < split.length; k++) {
    const s = split[k]
    if (!s) continue
    const base = k * W
    const w = s.w
    const v = s.v
    for (let c = maxCap; c >= w; c--) {
      const cand = f[c - w]! + v
      if (cand > f[c]! + 1e-12) {
        f[c] = cand
        choice[base + c] = 1
      }
    }
  }
  const rebuild = (cap: number): number[] => {
    const counts = new Array<number>(n).fill(0)
    let c = cap
    for (let k = split.length - 1; k >= 0; k--) {
      const s = split[k]
      if (s && choice[k * W + c]) {
        counts[s.i] = (counts[s.i] ?? 0) + s.mult
        c -= s.w
      }
    }
    return counts
  }
  const valueOf = (counts: readonly number[]): number => {
    let value = 0
    for (const it of useful) value += (counts[it.i] ?? 0) * it.value
    return value
  }
  const results = caps.map((cap) => {
    const counts = rebuild(cap)
    return { counts, value: valueOf(counts) }
  })
  if (!alternatives) return { results }
  const alts = caps.map((cap) => {
    const out: KnapsackResult[] = []
    for (const it of useful) {
      const w = it.weight / g
      if (w > cap) continue
      const counts = rebuild(cap - w)
      if ((counts[it.i] ?? 0) >= it.bound) continue
      counts[it.i] = (counts[it.i] ?? 0) + 1
      out.push({ counts, value: valueOf(counts) })
    }
    return out
  })
  return { results, alternatives: alts }
}

function branchAndBound(
  useful: readonly (KnapsackItem & { i: number })[],
  capacity: number,
  maxCount: number,
  n: number,
): { result: KnapsackResult; exact: boolean } {
  const its = useful.filter((it) => it.weight <= capacity).sort((a, b) => b.value / b.weight - a.value / a.weight)
  const k = its.length
  const x = new Array<number>(k).fill(0)
  let bestVal = 0
  let best = new Array<number>(k).fill(0)
  let nodes = 0
  let exact = true
  // Greedy start.
  {
    let cap = capacity
    let cnt = 0
    let val = 0
    its.forEach((it, j) => {
      const take = Math.min(it.bound, Math.floor(cap / it.weight), maxCount - cnt)
      x[j] = take
      cap -= take * it.weight
      cnt += take
      val += take * it.value
    })
    bestVal = val
    best = [...x]
    x.fill(0)
  }
  const maxValFrom = new Float64Array(k + 1)
  for (let j = k - 1; j >= 0; j--) maxValFrom[j] = Math.max(maxValFrom[j + 1] ?? 0, its[j]?.value ?? 0)
  const bound = (j: number, cap: number, slots: number): number => {
    let b = 0
    let c = cap
    for (let t = j; t < k && c > 0; t++) {
      const it = its[t]
      if (!it) break
      const full = Math.min(it.bound, Math.floor(c / it.weight))
      if (full < it.bound && c - full * it.weight < it.weight) {
        b += full * it.value + ((c - full * it.weight) / it.weight) * it.value
        c = 0
        break
      }
      b += full * it.value
      c -= full * it.weight
    }
    if (slots !== Infinity) b = Math.min(b, slots * (maxValFrom[j] ?? 0))
    return b
  }
  const dfs = (j: number, cap: number, slots: number, val: number): void => {
    if (val > bestVal + 1e-12) {
      bestVal = val
      best = [...x]
    }
    if (j >= k || cap <= 0 || slots <= 0) return
    if (++nodes > NODE_LIMIT) {
      exact = false
      return
    }
    if (val + bound(j, cap, slots) <= bestVal + 1e-12) return
    const it = its[j]
    if (!it) return
    const most = Math.min(it.bound, Math.floor(cap / it.weight), slots)
    for (let t = most; t >= 0; t--) {
      x[j] = t
      dfs(j + 1, cap - t * it.weight, slots - t, val + t * it.value)
      if (!exact) break
    }
    x[j] = 0
  }
  dfs(0, capacity, maxCount, 0)
  const counts = new Array<number>(n).fill(0)
  its.forEach((it, j) => (counts[it.i] = best[j] ?? 0))
  return { result: { counts, value: bestVal }, exact }
}
