import { simpleBounds } from './bounds'
import type { MasterLp } from './column-generation'
import { solveMasterLp } from './column-generation'
import { dive } from './dive'
import { reducePatterns } from './pattern-reduction'
import { greedyPlan } from './ffd'
import { loadHighs } from './highs-loader'
import type { CuttingProblem, PatternSolution } from './problem'
import { buildProblem, solutionCost, solutionOffcuts } from './problem'
import { enumeratePatterns, roundLp, searchExactCover, solvePatternMip, weightedCost } from './rounding'
import { NestingInputError } from './types'
import type {
  NestBounds,
  NestBoundSource,
  NestCut,
  NestInput,
  NestOptions,
  NestPattern,
  NestPlan,
  NestStick,
  NestStickSource,
  NestStockUse,
} from './types'

/** The shop default (a planner waits this long at most); "take longer" passes more. */
export const DEFAULT_TIME_LIMIT_MS = 2_000
/** Most patterns listed per enumeration; past it the MIP runs as a heuristic over what was found. */
const ENUMERATION_LIMIT = 40_000
/** Longest the pattern-reduction pass may take, whatever the time limit. */
const PATTERN_PASS_MAX_MS = 2_000
/** Same, for the quick search before any LP. */
const QUICK_ENUMERATION_LIMIT = 5_000

function gcd(a: number, b: number): number {
  while (b) [a, b] = [b, a % b]
  return a
}

/** Internal result of the search, before it is laid out as sticks. */
interface Search {
  solution: PatternSolution
  /** Proven lower bound on stock cost (input units). */
  costBound: number
  lp: MasterLp | null
  /** Divisor that turned stock costs into the LP's whole-number costs. */
  scale: number
  timedOut: boolean
  /** Distinct patterns before the reduction pass (unset when it did not run). */
  patternsBeforeReduction?: number
  /** Which bound `costBound` is. */
  source: NestBoundSource
  /** Work counts. */
  stats: { lpIterations: number; columns: number; diveSteps: number; solverUnavailable: string | null }
}

/**
 * Lexicographic plan order: stock cost, then more offcuts used, then fewer distinct patterns.
 * (The longest remnant, the last tie-break, is settled inside a plan by `normalizeSolution`, which
 * takes any extra pieces from the emptiest sticks.)
 */
function better(problem: CuttingProblem, a: PatternSolution, b: PatternSolution | null): boolean {
  if (!b) return true
  const ca = solutionCost(problem, a)
  const cb = solutionCost(problem, b)
  if (ca !== cb) return ca < cb
  const oa = solutionOffcuts(problem, a)
  const ob = solutionOffcuts(problem, b)
  if (oa !== ob) return oa > ob
  return a.uses.length < b.uses.length
}

type Highs = Awaited<ReturnType<typeof loadHighs>>

/**
 * The LP's costs per bin: stock costs divided by `g` (their greatest common divisor, so every plan
 * costs a whole number), each offcut a bonus below one unit in total, which makes "offcuts first"
 * the next tie-break.
 */
function binCosts(problem: CuttingProblem, g: number) {
  const offcutCount = problem.bins.reduce((s, b) => s + (b.kind === 'offcut' ? b.available : 0), 0)
  const bonus = offcutCount > 0 ? 0.5 / (offcutCount + 1) : 0
  const costs = problem.bins.map((b) => (b.kind === 'offcut' ? -bonus : b.cost / g))
  return { offcutCount, costs }
}

/** What the search phases share: the best plan so far and the proven bound, in scaled cost units. */
interface SearchState {
  problem: CuttingProblem
  incumbent: PatternSolution
  lowerBound: number
  source: NestBoundSource
  stats: Search['stats']
  g: number
  costs: number[]
  offcutCount: number
  single: CuttingProblem['bins'][number] | undefined
  totalWeight: number
  /** One kind of stick, unlimited and costed: plans are exact covers of a waste budget. */
  exactCover: boolean
  deadline: number
}

function searchState(problem: CuttingProblem, incumbent: PatternSolution, simpleCost: number, source: NestBoundSource, stats: Search['stats'], deadline: number): SearchState {
  let g = 0
  for (const b of problem.bins) if (b.kind === 'stock') g = gcd(g, b.cost)
  if (g === 0) g = 1
  const { offcutCount, costs } = binCosts(problem, g)
  const single = problem.bins.length === 1 ? problem.bins[0] : undefined
  const totalWeight = problem.items.reduce((s, it) => s + it.weight * it.demand, 0)
  const exactCover = single !== undefined && single.kind === 'stock' && single.available === Infinity && (costs[0] ?? 0) > 0
  return { problem, incumbent, lowerBound: Math.ceil(simpleCost / g - 1e-9), source, stats, g, costs, offcutCount, single, totalWeight, exactCover, deadline }
}

const scaledCost = (st: SearchState, s: PatternSolution): number => solutionCost(st.problem, s) / st.g

/** Keeps `candidate` when it beats the best plan so far. */
function improve(st: SearchState, candidate: PatternSolution | null | undefined): boolean {
  if (!candidate || !better(st.problem, candidate, st.incumbent)) return false
  st.incumbent = candidate
  return true
}

function finish(st: SearchState, lp: MasterLp | null, timedOut: boolean): Search {
  return { solution: st.incumbent, costBound: st.lowerBound * st.g, lp, scale: st.g, timedOut, source: st.source, stats: st.stats }
}

async function search(problem: CuttingProblem, options: NestOptions, deadline: number): Promise<Search> {
  const sb = simpleBounds(problem)
  const source: NestBoundSource = sb.martelloTothSticks > sb.continuousSticks ? 'martello-toth' : 'continuous'
  const stats = { lpIterations: 0, columns: 0, diveSteps: 0, solverUnavailable: null as string | null }
  const candidates = [greedyPlan(problem, undefined, undefined, true), greedyPlan(problem)]
  let incumbent: PatternSolution | null = null
  for (const c of candidates) if (c && better(problem, c, incumbent)) incumbent = c
  if (!incumbent) {
    throw new NestingInputError('stock', 'Not enough stock to cut every piece: add sticks or mark a stock option unlimited.')
  }
  if (options.method === 'ffd') {
    const ffd = candidates[0] ?? incumbent
    return { solution: ffd, costBound: sb.cost, lp: null, scale: 1, timedOut: false, source, stats }
  }
  if (solutionCost(problem, incumbent) <= sb.cost && problem.bins.every((b) => b.kind === 'stock')) {
    return { solution: incumbent, costBound: sb.cost, lp: null, scale: 1, timedOut: false, source, stats }
  }

  const st = searchState(problem, incumbent, sb.cost, source, stats, deadline)
  if (exactCoverBeforeLp(st)) return finish(st, null, false)
  let highs: Highs
  try {
    highs = await loadHighs()
  } catch (err) {
    // Without the solver the greedy plan is still a valid plan; the plan says why it has no proof.
    stats.solverUnavailable = err instanceof Error ? err.message : String(err)
    return finish(st, null, false)
  }
  const lp = lpAndDive(highs, st)
  const timedOut = closeGap(highs, st, lp)
  return finish(st, lp, timedOut)
}

/**
 * Before any LP: the continuous bound's prices (a piece is worth its share of a stick) are dual
 * feasible, so under them a pattern's reduced cost is its unused length / capacity. When few
 * patterns waste no more than the bound allows, an exact-cover search settles the run. True when
 * the best plan meets the bound; a cover search that proves none there raises the bound.
 */
function exactCoverBeforeLp(st: SearchState): boolean {
  const single = st.single
  if (!st.exactCover || !single) return false
  const C = single.capacity
  const cheap: MasterLp = {
    value: st.totalWeight / C,
    itemDuals: st.problem.items.map((it) => it.weight / C),
    binDuals: [0],
    pool: [],
    values: [],
    converged: true,
    bounded: true,
    dualBound: st.totalWeight / C,
    roundedUp: true,
    iterations: 0,
  }
  const target = st.lowerBound
  const slack = target * C - st.totalWeight
  const quick = Math.min(st.deadline, Date.now() + 250)
  const all = enumeratePatterns(st.problem, cheap, st.costs, target - cheap.dualBound, [slack], QUICK_ENUMERATION_LIMIT, quick, false)
  if (!all.complete) return false
  const cover = searchExactCover(st.problem, cheap, st.costs, all.patterns, target, quick)
  improve(st, cover.solution)
  if (scaledCost(st, st.incumbent) <= st.lowerBound) return true
  if (cover.exhausted) {
    st.lowerBound = target + 1
    st.source = 'search'
  }
  return false
}

/** The LP relaxation by column generation (its bound, its rounding), then a dive for a plan at the bound. */
function lpAndDive(highs: Highs, st: SearchState): MasterLp {
  const lp = solveMasterLp(highs, st.problem, st.costs, st.incumbent.uses.map((u) => u.pattern), st.deadline)
  st.stats.lpIterations += lp.iterations
  st.stats.columns += lp.pool.length
  if (lp.bounded) {
    const fromLp = Math.ceil(lp.dualBound - 1e-6)
    if (fromLp >= st.lowerBound) {
      st.lowerBound = fromLp
      st.source = lp.roundedUp ? 'lp' : 'lagrangian'
    }
  }
  improve(st, roundLp(st.problem, lp, st.costs))
  // Dive for a plan at the lower bound; when the dive proves nothing there, one stick above it.
  for (let goal = st.lowerBound; lp.bounded && goal < scaledCost(st, st.incumbent) && goal <= st.lowerBound + 1 && Date.now() < st.deadline; goal++) {
    const integral = st.costs.every((c) => Number.isInteger(c))
    const dived = dive(highs, st.problem, st.costs, lp, integral ? goal : weightedCost(st.incumbent, st.costs) - 1, st.deadline, st.stats)
    if (improve(st, dived)) break
    if (!integral) break
  }
  return lp
}

/**
 * Closes the gap between the best plan and the bound; true when the time limit stopped it. First
 * hunt for a plan at the lower bound (few patterns to list). With one kind of stick, a failed
 * exhaustive hunt raises the bound by one stick and repeats. Otherwise the next round lists every
 * pattern of any plan no dearer than the best one found, so the MIP's optimum over them is the
 * optimum (and, thanks to the offcut bonus, uses the most offcuts at that cost).
 */
function closeGap(highs: Highs, st: SearchState, lp: MasterLp): boolean {
  const { problem, costs, deadline, exactCover, single } = st
  let aimAtBound = true
  while (lp.bounded) {
    const current = scaledCost(st, st.incumbent)
    if (current <= st.lowerBound && st.offcutCount === 0) break
    if (Date.now() > deadline) return true
    const target = aimAtBound && current > st.lowerBound ? st.lowerBound : current
    const gap = target - lp.dualBound
    const wasteLimit = problem.bins.map(() => Infinity)
    if (exactCover) wasteLimit[0] = Math.floor(target / (costs[0] ?? 1) + 1e-9) * (single?.capacity ?? 0) - st.totalWeight
    if (exactCover) {
      // One kind of stick: search exact covers over every pattern that fits the budgets.
      const all = enumeratePatterns(problem, lp, costs, gap, wasteLimit, ENUMERATION_LIMIT, deadline, false)
      if (all.complete) {
        const share = Date.now() + Math.max(50, (deadline - Date.now()) / 2)
        const cover = searchExactCover(problem, lp, costs, all.patterns, target, Math.min(deadline, share))
        improve(st, cover.solution)
        if (scaledCost(st, st.incumbent) <= target) break
        if (cover.exhausted) {
          // Every plan at the target would be an exact cover of this pool: there is none.
          st.lowerBound = target + 1
          st.source = 'search'
          continue
        }
      }
    }
    const en = enumeratePatterns(problem, lp, costs, gap, wasteLimit, ENUMERATION_LIMIT, deadline)
    const pool = en.complete ? en.patterns : [...lp.pool, ...en.patterns]
    const mip = solvePatternMip(highs, problem, costs, pool, st.incumbent, deadline)
    improve(st, mip.solution)
    if (!en.complete || !mip.optimal) return Date.now() > deadline
    if (target === current) {
      // The pool held every pattern of every plan no dearer than the incumbent: it is optimal.
      if (scaledCost(st, st.incumbent) > st.lowerBound) st.source = 'search'
      st.lowerBound = Math.max(st.lowerBound, scaledCost(st, st.incumbent))
      break
    }
    if (scaledCost(st, st.incumbent) <= target) break
    // Complete enumeration, proven MIP optimum above the target: no plan costs `target`.
    st.lowerBound = target + 1
    st.source = 'search'
    if (!exactCover) aimAtBound = false
  }
  return false
}

/**
 * Plans a cut run: which sticks and offcuts to cut, and how.
 *
 * Method: greedy plans (first fit and best fit, longest pieces first) give a first plan and are
 * kept when they meet a lower bound (tiny and easy runs end here). Otherwise column generation
 * (Gilmore & Gomory 1961) solves the LP relaxation with HiGHS, pricing by bounded knapsack; the LP
 * is rounded with a residual greedy; then every pattern that could still appear in a cheaper plan
 * is listed by reduced cost and a HiGHS MIP over them finds the best plan, raising the bound when
 * it proves none cheaper exists.
 *
 * Objective, in order: least stock cost; more existing offcuts used; fewer distinct patterns; the
 * longest remnant. Cost is always optimised; the tie-breaks are honoured among the plans found.
 *
 * @param input pieces, stock options, offcuts, kerf, trim, minimum offcut, piece limit
 * @param options time limit (default 2 s) and method
 * @returns the plan; when the time limit is reached, the best plan found so far
 * @throws NestingInputError when the input is invalid or the stock cannot hold the pieces
 */
export async function nest(input: NestInput, options: NestOptions = {}): Promise<NestPlan> {
  const started = Date.now()
  const problem = buildProblem(input)
  const limit = options.timeLimitMs ?? DEFAULT_TIME_LIMIT_MS
  if (!(limit > 0)) throw new NestingInputError('timeLimitMs', 'The time limit must be a positive number of milliseconds.')
  const deadline = started + limit
  const found = await search(problem, options, deadline)
  if (options.reducePatterns !== false && options.method !== 'ffd') await fewerPatterns(problem, found, deadline, limit)
  return layOut(input, problem, found, (Date.now() - started) / 1000)
}

/**
 * Second pass, once the cost is proven best: fewer distinct patterns (saw set-ups) at the same
 * cost and stick count, over the patterns column generation produced (a short column generation
 * runs for them when the plan needed none), in at most half of the time left, a quarter of the
 * time limit, or {@link PATTERN_PASS_MAX_MS}, whichever is least.
 */
async function fewerPatterns(problem: CuttingProblem, found: Search, deadline: number, limit: number): Promise<void> {
  const sol = found.solution
  if (sol.uses.length <= 1 || solutionCost(problem, sol) > found.costBound) return
  const stockUses = sol.uses.filter((u) => problem.bins[u.pattern.bin]?.kind === 'stock').length
  if (stockUses <= 1) return
  let highs
  try {
    highs = await loadHighs()
  } catch (err) {
    // Without the solver the plan stays as it is (still proven best in cost).
    found.stats.solverUnavailable = err instanceof Error ? err.message : String(err)
    return
  }
  const until = Math.min(deadline, Date.now() + Math.min((deadline - Date.now()) / 2, Math.max(50, limit / 4), PATTERN_PASS_MAX_MS))
  const g = found.scale
  // Same weights as the search: each offcut used earns a bonus below one unit in total, so the
  // pass may not trade an offcut for a new stick.
  const { costs } = binCosts(problem, g)
  let pool = found.lp?.pool ?? []
  if (pool.length === 0) {
    const lp = solveMasterLp(highs, problem, costs, sol.uses.map((u) => u.pattern), Math.min(until, Date.now() + (until - Date.now()) / 2))
    found.stats.lpIterations += lp.iterations
    pool = lp.pool
  }
  const before = found.solution.uses.length
  const reduced = reducePatterns(highs, problem, costs, sol, pool, until)
  if (reduced !== sol) {
    found.patternsBeforeReduction = before
    found.solution = reduced
  }
}

/** Queues of input piece indexes per length, so each cut carries its references. */
function pieceQueues(input: NestInput): Map<number, number[]> {
  const queues = new Map<number, number[]>()
  input.pieces.forEach((p, idx) => {
    const q = queues.get(p.length) ?? []
    for (let k = 0; k < p.quantity; k++) q.push(idx)
    queues.set(p.length, q)
  })
  return queues
}

/** The plan's pattern uses in cutting order: offcuts first, then by stock option, the most-repeated and longest first. */
function usesInCuttingOrder(problem: CuttingProblem, found: Search) {
  return [...found.solution.uses].sort((a, b) => {
    const ba = problem.bins[a.pattern.bin]
    const bb = problem.bins[b.pattern.bin]
    if (ba?.kind !== bb?.kind) return ba?.kind === 'offcut' ? -1 : 1
    return (ba?.stockIndex ?? 0) - (bb?.stockIndex ?? 0) || b.count - a.count || (bb?.length ?? 0) - (ba?.length ?? 0)
  })
}

type PatternUse = Search['solution']['uses'][number]

/** Adds one pattern use's sticks (and its pattern, or one pattern per offcut) to the plan, taking pieces from the queues. */
function layOutUse(input: NestInput, problem: CuttingProblem, use: PatternUse, queues: Map<number, number[]>, offcutIds: string[][], sticks: NestStick[], patterns: NestPattern[]) {
  const kerf = problem.kerf
  const bin = problem.bins[use.pattern.bin]
  if (!bin) return
  const lengths: number[] = []
  use.pattern.counts.forEach((c, i) => {
    const it = problem.items[i]
    if (it) for (let k = 0; k < c; k++) lengths.push(it.length)
  })
  lengths.sort((a, b) => b - a)
  const pieceSum = lengths.reduce((s, x) => s + x, 0)
  const remnant = Math.max(0, bin.length - bin.trim - pieceSum - kerf * lengths.length)
  const kerfLoss = bin.length - bin.trim - pieceSum - remnant
  const remnantIsOffcut = input.minOffcutLength !== undefined && remnant >= input.minOffcutLength
  const stockId = bin.kind === 'stock' ? input.stock[bin.stockIndex]?.id : undefined
  const stockSource: NestStickSource =
    stockId === undefined ? { kind: 'stock', stockIndex: bin.stockIndex } : { kind: 'stock', stockIndex: bin.stockIndex, stockId }
  const makeStick = (source: NestStickSource, patternIndex: number): NestStick => {
    let offset = bin.trim
    const cuts: NestCut[] = lengths.map((len) => {
      const pieceIndex = queues.get(len)?.shift()
      if (pieceIndex === undefined) throw new Error('nesting: a plan cuts more pieces than ordered')
      const piece = input.pieces[pieceIndex]
      const cut: NestCut = { length: len, offset, pieceIndex }
      if (piece?.workOrderRef !== undefined) cut.workOrderRef = piece.workOrderRef
      if (piece?.cutPartRef !== undefined) cut.cutPartRef = piece.cutPartRef
      offset += len + kerf
      return cut
    })
    return { source, length: bin.length, trim: bin.trim, cuts, kerfLoss, remnant, remnantIsOffcut, patternIndex }
  }
  if (bin.kind === 'stock') {
    const patternIndex = patterns.length
    patterns.push({ source: stockSource, length: bin.length, cuts: lengths, count: use.count, remnant, remnantIsOffcut })
    for (let k = 0; k < use.count; k++) sticks.push(makeStick(stockSource, patternIndex))
  } else {
    for (let k = 0; k < use.count; k++) {
      const id = offcutIds[use.pattern.bin]?.shift()
      if (id === undefined) throw new Error('nesting: more offcuts used than exist')
      const source: NestStickSource = { kind: 'offcut', offcutId: id }
      const patternIndex = patterns.length
      patterns.push({ source, length: bin.length, cuts: lengths, count: 1, remnant, remnantIsOffcut })
      sticks.push(makeStick(source, patternIndex))
    }
  }
}

/** Sticks used, lengths and waste of the laid-out plan. */
function planTotals(input: NestInput, sticks: NestStick[]): NestPlan['totals'] {
  const stockUse: NestStockUse[] = input.stock.map((s, i) => {
    const count = sticks.filter((t) => t.source.kind === 'stock' && t.source.stockIndex === i).length
    const use: NestStockUse = { stockIndex: i, length: s.length, count, cost: count * (s.cost ?? s.length) }
    if (s.id !== undefined) use.stockId = s.id
    return use
  })
  const lengthUsed = sticks.reduce((s, t) => s + t.length, 0)
  const kerfLoss = sticks.reduce((s, t) => s + t.kerfLoss, 0)
  const trimLoss = sticks.reduce((s, t) => s + t.trim, 0)
  const scrapLength = sticks.reduce((s, t) => s + (t.remnantIsOffcut ? 0 : t.remnant), 0)
  const waste = kerfLoss + trimLoss + scrapLength
  return {
    stock: stockUse,
    stockCost: stockUse.reduce((s, u) => s + u.cost, 0),
    sticksUsed: sticks.length,
    offcutsUsed: sticks.filter((t) => t.source.kind === 'offcut').length,
    offcutsMade: sticks.filter((t) => t.remnantIsOffcut).length,
    lengthUsed,
    pieceLength: sticks.reduce((s, t) => s + t.cuts.reduce((a, c) => a + c.length, 0), 0),
    kerfLoss,
    trimLoss,
    offcutLength: sticks.reduce((s, t) => s + (t.remnantIsOffcut ? t.remnant : 0), 0),
    scrapLength,
    waste,
    wastePercent: lengthUsed > 0 ? (waste / lengthUsed) * 100 : 0,
  }
}

/** The lower bounds the plan is measured against, and which proof gave the cost bound. */
function planBounds(problem: CuttingProblem, found: Search): NestBounds {
  const sb = simpleBounds(problem)
  const single = problem.bins.length === 1 ? problem.bins[0] : undefined
  let stickBound = Math.max(sb.continuousSticks, sb.martelloTothSticks)
  if (single && single.cost > 0) stickBound = Math.max(stickBound, Math.ceil(found.costBound / single.cost - 1e-9))
  const lpCost = found.lp?.converged ? found.lp.dualBound * found.scale : null
  return {
    continuousSticks: sb.continuousSticks,
    martelloTothSticks: sb.martelloTothSticks,
    lpCost,
    cost: found.costBound,
    sticks: stickBound,
    source: found.source,
    lpConverged: found.lp?.converged ?? false,
  }
}

/** The found plan as sticks with their cuts in order, its patterns, totals and bounds. */
function layOut(input: NestInput, problem: CuttingProblem, found: Search, seconds: number): NestPlan {
  const queues = pieceQueues(input)
  const offcutIds = problem.bins.map((b) => [...b.offcutIds])
  const sticks: NestStick[] = []
  const patterns: NestPattern[] = []
  for (const use of usesInCuttingOrder(problem, found)) layOutUse(input, problem, use, queues, offcutIds, sticks, patterns)
  for (const [len, q] of queues) if (q.length > 0) throw new Error(`nesting: ${q.length} piece(s) of ${len} left uncut`)

  const totals = planTotals(input, sticks)
  const proven = totals.stockCost <= found.costBound
  return {
    status: proven ? 'optimal' : found.timedOut ? 'time-limit' : 'feasible',
    sticks,
    patterns,
    totals,
    bounds: planBounds(problem, found),
    gap: totals.stockCost > 0 && !proven ? (totals.stockCost - found.costBound) / totals.stockCost : 0,
    seconds,
    stats: { ...found.stats, patternsBeforeReduction: found.patternsBeforeReduction ?? patterns.length },
  }
}
