import { NestingInputError } from './types'
import type { NestInput } from './types'

/**
 * The cutting-stock model the solvers work on, in "consumption" units: a piece of length p takes
 * `p + kerf` and a stick of length L holds `L − trim + kerf` (see the module notes in `types.ts`).
 * Item types are the distinct piece lengths, sorted longest first.
 */
export interface CuttingProblem {
  /** Distinct piece lengths, longest first. */
  items: ItemType[]
  /** Kinds of stick: stock options and groups of equal offcuts. */
  bins: BinType[]
  /** Most pieces on one stick (Infinity when unlimited). */
  maxCount: number
  /** Saw width. */
  kerf: number
}

/** One distinct piece length and how many are needed. */
export interface ItemType {
  /** Piece length. */
  length: number
  /** length + kerf. */
  weight: number
  /** Pieces needed. */
  demand: number
}

/** One kind of stick. */
export interface BinType {
  /** Where it comes from. */
  kind: 'stock' | 'offcut'
  /** Stick length. */
  length: number
  /** Trim at the start (0 for offcuts). */
  trim: number
  /** length − trim + kerf. */
  capacity: number
  /** Cost of one stick as given (integer, offcuts 0). */
  cost: number
  /** How many are available (Infinity when unlimited). */
  available: number
  /** Index in `NestInput.stock` (stock only). */
  stockIndex: number
  /** Offcut ids of this length (offcut only), in input order. */
  offcutIds: string[]
}

/** A way to cut one stick: which bin type and how many pieces of each item type. */
export interface Pattern {
  /** Index into `CuttingProblem.bins`. */
  bin: number
  /** counts[i] pieces of item type i. */
  counts: number[]
}

/** An integer solution: patterns with repeat counts. */
export interface PatternSolution {
  /** Patterns used, each with how many times. */
  uses: { pattern: Pattern; count: number }[]
}

function checkInt(value: unknown, field: string, min: number, what: string): number {
  if (typeof value !== 'number' || !Number.isInteger(value) || value < min) {
    throw new NestingInputError(field, `${what} must be a whole number of base units, at least ${min} (got ${String(value)}).`)
  }
  if (value > 1e12) throw new NestingInputError(field, `${what} is too large (${value}); use a coarser base unit.`)
  return value
}

/**
 * Validates the input and builds the internal model.
 * @throws NestingInputError naming the field to fix
 */
export function buildProblem(input: NestInput): CuttingProblem {
  const kerf = input.kerf === undefined ? 0 : checkInt(input.kerf, 'kerf', 0, 'Kerf')
  const trim = input.endTrim === undefined ? 0 : checkInt(input.endTrim, 'endTrim', 0, 'End trim')
  const maxCount =
    input.maxPiecesPerStick === undefined
      ? Infinity
      : checkInt(input.maxPiecesPerStick, 'maxPiecesPerStick', 1, 'Most pieces per stick')
  if (input.minOffcutLength !== undefined) checkInt(input.minOffcutLength, 'minOffcutLength', 1, 'Minimum offcut length')
  if (!Array.isArray(input.pieces) || input.pieces.length === 0) {
    throw new NestingInputError('pieces', 'Add at least one piece to cut.')
  }
  const stock = Array.isArray(input.stock) ? input.stock : []
  const offcuts = input.offcuts ?? []
  const demand = new Map<number, number>()
  input.pieces.forEach((p, i) => {
    const len = checkInt(p.length, `pieces.${i}.length`, 1, 'Piece length')
    const qty = checkInt(p.quantity, `pieces.${i}.quantity`, 1, 'Piece quantity')
    demand.set(len, (demand.get(len) ?? 0) + qty)
  })
  const bins: BinType[] = []
  stock.forEach((s, i) => {
    const length = checkInt(s.length, `stock.${i}.length`, 1, 'Stick length')
    const cost = s.cost === undefined ? length : checkInt(s.cost, `stock.${i}.cost`, 0, 'Stick cost')
    const available = s.available === undefined ? Infinity : checkInt(s.available, `stock.${i}.available`, 0, 'Sticks available')
    if (length <= trim) {
      throw new NestingInputError(`stock.${i}.length`, `Stick length ${length} is not longer than the end trim ${trim}.`)
    }
    if (available > 0) {
      bins.push({ kind: 'stock', length, trim, capacity: length - trim + kerf, cost, available, stockIndex: i, offcutIds: [] })
    }
  })
  const offcutByLength = new Map<number, string[]>()
  const seenIds = new Set<string>()
  offcuts.forEach((o, i) => {
    if (typeof o.id !== 'string' || o.id === '') throw new NestingInputError(`offcuts.${i}.id`, 'Each offcut needs an id.')
    if (seenIds.has(o.id)) throw new NestingInputError(`offcuts.${i}.id`, `Offcut id "${o.id}" is listed twice.`)
    seenIds.add(o.id)
    const length = checkInt(o.length, `offcuts.${i}.length`, 1, 'Offcut length')
    const ids = offcutByLength.get(length) ?? []
    ids.push(o.id)
    offcutByLength.set(length, ids)
  })
  for (const [length, ids] of [...offcutByLength].sort((a, b) => b[0] - a[0])) {
    bins.push({ kind: 'offcut', length, trim: 0, capacity: length + kerf, cost: 0, available: ids.length, stockIndex: -1, offcutIds: ids })
  }
  if (bins.length === 0) throw new NestingInputError('stock', 'Add at least one stock option (or offcuts) to cut from.')
  const items = [...demand]
    .sort((a, b) => b[0] - a[0])
    .map(([length, d]) => ({ length, weight: length + kerf, demand: d }))
  const maxCap = Math.max(...bins.map((b) => b.capacity))
  const longest = items[0]
  if (longest && longest.weight > maxCap) {
    const idx = input.pieces.findIndex((p) => p.length === longest.length)
    throw new NestingInputError(
      `pieces.${idx}.length`,
      `Piece length ${longest.length} does not fit on any stick or offcut (longest usable length is ${maxCap - kerf} after trim).`,
    )
  }
  // Enough material at all? (A finer check happens in the solver; this catches the obvious case.)
  const unlimited = bins.some((b) => b.available === Infinity)
  if (!unlimited) {
    const room = bins.reduce((s, b) => s + b.capacity * b.available, 0)
    const need = items.reduce((s, it) => s + it.weight * it.demand, 0)
    if (room < need) {
      throw new NestingInputError('stock', `Not enough stock: the pieces need ${need} (with kerf) but the sticks and offcuts hold ${room}. Add sticks or mark an option unlimited.`)
    }
  }
  return { items, bins, maxCount, kerf }
}

/** Total consumption weight of a pattern. */
export function patternLoad(problem: CuttingProblem, counts: readonly number[]): number {
  let s = 0
  for (let i = 0; i < counts.length; i++) s += (counts[i] ?? 0) * (problem.items[i]?.weight ?? 0)
  return s
}

/** Pieces on a pattern. */
export function patternPieces(counts: readonly number[]): number {
  let s = 0
  for (const c of counts) s += c
  return s
}

/** Cost of a solution (stock cost as given; offcuts free). */
export function solutionCost(problem: CuttingProblem, sol: PatternSolution): number {
  let s = 0
  for (const u of sol.uses) s += (problem.bins[u.pattern.bin]?.cost ?? 0) * u.count
  return s
}

/** Sticks in a solution. */
export function solutionSticks(sol: PatternSolution): number {
  let s = 0
  for (const u of sol.uses) s += u.count
  return s
}

/** Offcuts used by a solution. */
export function solutionOffcuts(problem: CuttingProblem, sol: PatternSolution): number {
  let s = 0
  for (const u of sol.uses) if (problem.bins[u.pattern.bin]?.kind === 'offcut') s += u.count
  return s
}

/**
 * Trims over-production (a covering solution may hold extra pieces) and checks the solution:
 * every demand met exactly, every pattern within capacity and piece limit, availability kept.
 * Returns a new exact solution with equal patterns merged.
 * @throws Error when the solution does not cover the demand (a solver bug)
 */
export function normalizeSolution(problem: CuttingProblem, sol: PatternSolution): PatternSolution {
  const m = problem.items.length
  const excess = problem.items.map((it) => -it.demand)
  const sticks: Pattern[] = []
  for (const u of sol.uses) {
    for (let k = 0; k < u.count; k++) sticks.push({ bin: u.pattern.bin, counts: [...u.pattern.counts] })
    for (let i = 0; i < m; i++) excess[i] = (excess[i] ?? 0) + (u.pattern.counts[i] ?? 0) * u.count
  }
  for (let i = 0; i < m; i++) {
    if ((excess[i] ?? 0) < 0) throw new Error(`nesting: plan misses ${-(excess[i] ?? 0)} piece(s) of length ${problem.items[i]?.length}`)
  }
  // Remove extra pieces from new sticks before offcuts (offcuts first), and from the emptiest
  // sticks first: their remnants grow, and a stick may empty out altogether.
  const isOffcut = (s: Pattern): number => (problem.bins[s.bin]?.kind === 'offcut' ? 1 : 0)
  for (let i = 0; i < m; i++) {
    let extra = excess[i] ?? 0
    if (extra === 0) continue
    const holders = sticks.filter((s) => (s.counts[i] ?? 0) > 0)
    holders.sort((a, b) => isOffcut(a) - isOffcut(b) || patternLoad(problem, a.counts) - patternLoad(problem, b.counts))
    for (const s of holders) {
      while (extra > 0 && (s.counts[i] ?? 0) > 0) {
        s.counts[i] = (s.counts[i] ?? 0) - 1
        extra--
      }
      if (extra === 0) break
    }
  }
  const kept = sticks.filter((s) => patternPieces(s.counts) > 0)
  const merged = new Map<string, { pattern: Pattern; count: number }>()
  const used = problem.bins.map(() => 0)
  for (const s of kept) {
    const bin = problem.bins[s.bin]
    if (!bin) throw new Error('nesting: unknown stick kind')
    if (patternLoad(problem, s.counts) > bin.capacity) throw new Error('nesting: stick over length')
    if (patternPieces(s.counts) > problem.maxCount) throw new Error('nesting: too many pieces on a stick')
    used[s.bin] = (used[s.bin] ?? 0) + 1
    const key = `${s.bin}:${s.counts.join(',')}`
    const e = merged.get(key)
    if (e) e.count++
    else merged.set(key, { pattern: s, count: 1 })
  }
  problem.bins.forEach((b, i) => {
    if ((used[i] ?? 0) > b.available) throw new Error('nesting: more sticks used than available')
  })
  return { uses: [...merged.values()] }
}

/**
 * A pattern as a column of the master problem: how many of each piece it cuts (one row per piece
 * type) and, when its stock has a limited count, a 1 in that stock's availability row.
 */
export function patternColumn(p: Pattern, binRow: readonly number[]): { indices: number[]; values: number[] } {
  const indices: number[] = []
  const values: number[] = []
  p.counts.forEach((c, i) => {
    if (c > 0) {
      indices.push(i)
      values.push(c)
    }
  })
  const r = binRow[p.bin] ?? -1
  if (r >= 0) {
    indices.push(r)
    values.push(1)
  }
  return { indices, values }
}
