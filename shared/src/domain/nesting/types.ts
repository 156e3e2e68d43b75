/**
 * Public types of Kitwright's nesting engine (one-dimensional cutting stock).
 *
 * Every length is an integer in one base unit chosen by the caller (the engine never converts
 * units). Costs are non-negative integers in one money unit (for example cents); by default a
 * stock option costs its length, so "least cost" then means "least stock length bought".
 *
 * How a stick is consumed (common practice at a chop saw, stated here so the plan can be checked):
 * - A new stick from stock first loses `endTrim` at its start: the squaring cut, including that
 *   cut's own saw width.
 * - An existing offcut loses no trim: its end is already square from the cut that made it.
 * - Each piece then takes its length plus one `kerf` for the cut that frees it, except the last
 *   piece on a stick when the remaining material is shorter than a kerf (the saw runs off the end,
 *   so no full kerf is lost there).
 * - So a stick of length L with pieces p1..pn is feasible when
 *   `trim + (p1 + … + pn) + kerf·(n − 1) <= L`, and its remnant is
 *   `max(0, L − trim − (p1 + … + pn) − kerf·n)`.
 * @module
 */

/** One ordered cut part: a length, how many, and opaque references back to where it came from. */
export interface NestPiece {
  /** Finished piece length, integer base units, > 0. */
  length: number
  /** How many pieces of this length for these references, integer >= 1. */
  quantity: number
  /** Opaque reference to the work order this piece is for (returned unchanged on each cut). */
  workOrderRef?: string
  /** Opaque reference to the cut part this piece is (returned unchanged on each cut). */
  cutPartRef?: string
}

/** One stock option: sticks of one length that can be bought or taken from the rack. */
export interface NestStockOption {
  /** Opaque id returned on the sticks cut from this option. */
  id?: string
  /** Stick length, integer base units, > 0. */
  length: number
  /** Cost of one stick, non-negative integer (default: the stick length). */
  cost?: number
  /** How many sticks are available; omit for unlimited. */
  available?: number
}

/** An existing offcut in stock, used before new sticks when it does not raise the cost. */
export interface NestOffcut {
  /** Opaque id of the offcut (for example its rack label). */
  id: string
  /** Offcut length, integer base units, > 0. */
  length: number
}

/** Everything the engine needs to plan one cut run. */
export interface NestInput {
  /** Pieces to cut. */
  pieces: NestPiece[]
  /** Stock options (at least one, unless the offcuts alone hold every piece). */
  stock: NestStockOption[]
  /** Existing offcuts in stock (no end trim is taken from them). */
  offcuts?: NestOffcut[]
  /** Material lost per cut (saw width), integer >= 0. Default 0. */
  kerf?: number
  /** Material lost squaring the start of each new stick from stock, integer >= 0. Default 0. */
  endTrim?: number
  /**
   * Shortest remnant the shop keeps as an offcut, integer >= 1. Remnants at or above it are flagged
   * `remnantIsOffcut`. Omit to keep no remnant.
   */
  minOffcutLength?: number
  /** Most pieces cut from one stick (for example a saw-stop or handling limit), integer >= 1. */
  maxPiecesPerStick?: number
}

/** Options of one run of the engine. */
export interface NestOptions {
  /**
   * Wall-clock limit in milliseconds (default 2 000, the shop default). When it runs out the best
   * plan found so far is returned with `status: 'time-limit'` and the best bound proven by then.
   */
  timeLimitMs?: number
  /**
   * After the stick count (cost) is settled, spend part of what is left of the time limit on
   * fewer distinct patterns (saw set-ups) at the same cost. Default true.
   */
  reducePatterns?: boolean
  /**
   * `'optimize'` (default): column generation, then a search over patterns. `'ffd'`: first-fit
   * decreasing only (the benchmark's baseline; also used on its own for tiny cases).
   */
  method?: 'optimize' | 'ffd'
}

/** Where a stick comes from. */
export type NestStickSource =
  | { kind: 'stock'; stockIndex: number; stockId?: string }
  | { kind: 'offcut'; offcutId: string }

/** One cut on a stick, in cutting order. */
export interface NestCut {
  /** Piece length. */
  length: number
  /** Distance from the stick's start to the start of this piece (after trim and earlier kerfs). */
  offset: number
  /** Index of the piece in `NestInput.pieces`. */
  pieceIndex: number
  /** Copied from the piece. */
  workOrderRef?: string
  /** Copied from the piece. */
  cutPartRef?: string
}

/** One stick of the plan. */
export interface NestStick {
  /** Where the stick comes from. */
  source: NestStickSource
  /** Stick length before any cut. */
  length: number
  /** Trim taken at the start (0 for offcuts). */
  trim: number
  /** Cuts in order: longest first. */
  cuts: NestCut[]
  /** Length lost to the saw on this stick (kerfs, not counting trim). */
  kerfLoss: number
  /** What is left after the last cut (and its kerf). */
  remnant: number
  /** True when the remnant is at or above `minOffcutLength` and goes back to stock. */
  remnantIsOffcut: boolean
  /** Index into `NestPlan.patterns`. */
  patternIndex: number
}

/** Identical sticks grouped so the cutter repeats one set-up. */
export interface NestPattern {
  /** Where the sticks come from ('offcut' patterns always have count 1 per offcut id). */
  source: NestStickSource
  /** Stick length. */
  length: number
  /** Piece lengths in cutting order. */
  cuts: number[]
  /** How many sticks are cut this way. */
  count: number
  /** Remnant of each such stick. */
  remnant: number
  /** Whether that remnant goes back to stock. */
  remnantIsOffcut: boolean
}

/** Sticks used from one stock option. */
export interface NestStockUse {
  /** Index in `NestInput.stock`. */
  stockIndex: number
  /** Its id, when given. */
  stockId?: string
  /** Stick length. */
  length: number
  /** Sticks used. */
  count: number
  /** count × cost. */
  cost: number
}

/** Totals of a plan. All lengths in base units. */
export interface NestTotals {
  /** Sticks used per stock option (options with zero sticks are listed too). */
  stock: NestStockUse[]
  /** Total cost of new sticks. */
  stockCost: number
  /** New sticks plus offcuts used. */
  sticksUsed: number
  /** Existing offcuts used. */
  offcutsUsed: number
  /** Remnants that go back to stock as offcuts. */
  offcutsMade: number
  /** Sum of the lengths of every stick and offcut used. */
  lengthUsed: number
  /** Sum of the piece lengths cut. */
  pieceLength: number
  /** Lost to kerf. */
  kerfLoss: number
  /** Lost to end trim. */
  trimLoss: number
  /** Remnants kept as offcuts. */
  offcutLength: number
  /** Remnants too short to keep. */
  scrapLength: number
  /** Everything not cut into pieces nor kept: kerf + trim + scrap. */
  waste: number
  /** waste / lengthUsed × 100 (0 when nothing is used). */
  wastePercent: number
}

/**
 * Which bound `NestBounds.cost` / `NestBounds.sticks` is:
 * - `continuous`: total length ÷ stick length (and the cheapest-capacity cost bound);
 * - `martello-toth`: the L2 bound (one stick kind);
 * - `lp`: the LP relaxation rounded up: solved to the end (`lpConverged`), or stopped once a
 *   Lagrangian bound rounded up met the master's value rounded up, which fixes the same number;
 * - `lagrangian`: a Lagrangian (Farley) bound from exact pricing, when the LP had not converged
 *   by the time limit (weaker than the rounded-up LP bound, but proven);
 * - `search`: a complete search proved no cheaper plan exists (above the rounded-up LP bound).
 */
export type NestBoundSource = 'continuous' | 'martello-toth' | 'lp' | 'lagrangian' | 'search'

/** Lower bounds proven for the instance; a plan can never beat them. */
export interface NestBounds {
  /** Continuous bound on sticks: fewest sticks whose usable lengths could hold all the pieces. */
  continuousSticks: number
  /**
   * Martello–Toth L2 bound on sticks (single stock length, no offcuts; otherwise equal to the
   * continuous bound).
   */
  martelloTothSticks: number
  /** Value of the linear relaxation of the cutting-stock model (cost), when it was solved to the end. */
  lpCost: number | null
  /** Best proven lower bound on stock cost. */
  cost: number
  /** Best proven lower bound on sticks used (stock plus offcuts). */
  sticks: number
  /** Which bound `cost` (and, with one stick kind, `sticks`) is. */
  source: NestBoundSource
  /** True when column generation solved the LP relaxation to the end (then `lpCost` is its value). */
  lpConverged: boolean
}

/** Counts of the work done (they do not depend on the machine's speed or load). */
export interface NestStats {
  /** Rounds of column generation (master re-solves), dives included. */
  lpIterations: number
  /** Columns (patterns) generated for the master. */
  columns: number
  /** Columns fixed by diving. */
  diveSteps: number
  /** Distinct patterns before the pattern-reduction pass (equal to the plan's when it found nothing). */
  patternsBeforeReduction: number
  /** Why the LP solver could not be loaded, when it could not: the plan is then the greedy one, without proof. */
  solverUnavailable: string | null
}

/** A complete cut plan. */
export interface NestPlan {
  /** 'optimal': the cost equals a proven bound; 'feasible': no proof; 'time-limit': stopped early. */
  status: 'optimal' | 'feasible' | 'time-limit'
  /** Every stick, grouped by pattern (patterns in plan order, longest pieces first). */
  sticks: NestStick[]
  /** Distinct set-ups with repeat counts. */
  patterns: NestPattern[]
  /** Totals. */
  totals: NestTotals
  /** Lower bounds. */
  bounds: NestBounds
  /** (stockCost − bounds.cost) / stockCost, 0 when the cost is 0 or proven. */
  gap: number
  /** Wall-clock seconds spent. */
  seconds: number
  /** Counts of the work done. */
  stats: NestStats
}

/** Thrown for input that cannot be planned; `field` names what to fix (e.g. `pieces.3.length`). */
export class NestingInputError extends Error {
  /** Path of the offending field. */
  readonly field: string
  /**
   * @param field path of the offending field, e.g. `stock.0.length`
   * @param message what is wrong and how to fix it
   */
  constructor(field: string, message: string) {
    super(message)
    this.name = 'NestingInputError'
    this.field = field
  }
}
