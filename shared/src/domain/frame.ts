/**
 * The frame calculator: derives the pipe cut list of a kit's spray manifold from the tote it sits in.
 *
 * The manifold is a rectangular loop of PVC pipe lying flat inside the tote, recessed below the rim:
 *
 * ```text
 *               back short side
 *        E───────────────────────────E        E  elbow (the four corners)
 *        │                           │        T  tee feeding a cross run
 *        T───────── cross run ───────T        R  riser tee (branch points down to the pump)
 *  left  │                           │ right
 *  long  T───────── cross run ───────T  long
 *  side  │                           │  side
 *        E─────────────R─────────────E
 *               front short side
 * ```
 *
 * Every length here is in the integer base unit of units.ts. Words used throughout:
 * - **centre-to-centre** (C): the distance between the centres of the two fittings a pipe joins, where
 *   the centre of a fitting is the point its branch centrelines meet.
 * - **socket depth** (s): how far the pipe enters a fitting's socket, from the socket mouth to the
 *   shoulder the pipe end stops against.
 * - **centre-to-socket-bottom** (e, the fitting's "take-off" for cutting): from the fitting's centre to
 *   that shoulder. The fitting's centre-to-face is e + s.
 *
 * A pipe between fittings a and b is cut to **C − e(a) − e(b)**: the pipe reaches from one socket
 * bottom to the other. Said the other way round, it is the pipe you can see between the two socket
 * mouths, C − (e(a) + s(a)) − (e(b) + s(b)), plus the two lengths hidden in the sockets, s(a) + s(b).
 * The visible part must not be negative, or the two fittings would run into each other.
 */
import { formatLength, inches, type Length, type LengthUnit } from './units'
import { insideAtHeight, type EnclosureShape } from './reservoir'

/** How a pipe seats in one kind of fitting (see the module comment for the words). */
export interface FittingAllowance {
  /** How far the pipe enters the socket: socket mouth to the shoulder the pipe end stops against. */
  socketDepth: Length
  /** From the fitting's centre (where its branch centrelines meet) to that shoulder. */
  centreToSocketBottom: Length
}

/** The fitting at the bottom of the riser that takes the pipe from the pump outlet. */
export interface PumpAdapter {
  /** How far the riser pipe enters the adapter's socket. */
  socketDepth: Length
  /**
   * Height of the adapter's socket bottom (where the riser pipe's lower end stops) above the pump
   * outlet height. Negative if the pipe end stops below it (for example pipe slid over the outlet).
   */
  socketBottomAboveOutlet: Length
}

/** Everything the frame calculator needs; all lengths in base units (units.ts). */
export interface FrameInputs {
  /** The tote's inside at the manifold's height: width (the shorter side) and length; and its height. */
  enclosure: {
    /** Inside width at the manifold's height (the shorter side). */
    insideWidth: Length
    /** Inside length at the manifold's height (the longer side). */
    insideLength: Length
    /** Inside height, floor to rim. */
    insideHeight: Length
  }
  /** From the rim down to the manifold's centreline. */
  recessBelowRim: Length
  /** Gap left between each wall and the outside of the pipe. Fitting hubs stand a little proud of the pipe. */
  wallClearance: Length
  /** Outside diameter of the pipe (see {@link PVC_SCHEDULE_40_OD}). */
  pipeOutsideDiameter: Length
  /** The 90° elbows at the four corners. */
  elbow: FittingAllowance
  /** The tees: cross-run tees and the riser tee (run and branch sockets alike). */
  tee: FittingAllowance
  /** The fitting layout. */
  layout: {
    /** Pipes spanning the short direction between tees evenly spaced along both long sides (0 or more). */
    crossRuns: number
    /** The side carrying the riser tee, centred on it: the left long side or the front short side. */
    riserSide: 'long' | 'short'
  }
  /** Sprayer holes, evenly spaced along each run (see {@link SprayerHole}). */
  sprayers: {
    /** Sprayers on each of the two long sides. */
    perLongSide: number
    /** Sprayers on each of the two short sides. */
    perShortSide: number
    /** Sprayers on each cross run. */
    perCrossRun: number
    /** The least distance from a hole's centre to the face (socket mouth) of any fitting. */
    minDistanceFromFitting: Length
  }
  /** The vertical pipe from the pump up to the riser tee. */
  riser: {
    /** Height of the pump's outlet above the tote floor, with the pump standing on the floor. */
    pumpOutletHeight: Length
    /** The adapter joining the riser pipe to the pump outlet. */
    pumpAdapter: PumpAdapter
  }
  /** Cut lengths are rounded to the nearest multiple of this (e.g. 1/16 in or 0.5 mm). */
  cutPrecision: Length
}

/** One line of the cut list: `quantity` pieces of pipe cut to `length`. */
export interface FrameCutLine {
  /** Stable identifier of the line within a layout (`long:elbow-tee`, `cross`, `riser`, …), for overrides. */
  key: string
  /** What the cutter writes on the piece, e.g. "long side segment (elbow to tee)". */
  label: string
  /** Cut length, rounded to the inputs' cut precision. */
  length: Length
  /** How many pieces of this length and label. */
  quantity: number
  /** How the length was worked out, one human-readable line per step. */
  derivation: string[]
}

/** Where one sprayer hole goes. */
export interface SprayerHole {
  /** The run it is on: "left long side", "front short side", "cross run 2", … */
  run: string
  /** 1-based, counted from the run's datum. */
  number: number
  /** The point distances along this run are measured from, in words. */
  datum: string
  /** Distance along the run from the datum to the hole's centre. */
  fromDatum: Length
  /** Label of the cut piece the hole is drilled in (matches a {@link FrameCutLine} label). */
  piece: string
  /** The end of that piece the distance below is measured from: its fitting, and the datum it faces. */
  pieceEnd: string
  /** Distance from that end of the cut piece to the hole's centre, for marking before assembly. */
  fromPieceEnd: Length
}

/** Severity of a frame warning: `error` means the frame cannot be built as entered. */
export type FrameWarningSeverity = 'error' | 'caution'

/** A problem with the inputs or the result, with a message that says what to fix. */
export interface FrameWarning {
  /** Machine-readable kind. */
  code:
    | 'invalid_input'
    | 'too_small'
    | 'negative_length'
    | 'too_short_for_sockets'
    | 'riser_on_cross_tee'
    | 'hole_too_close_to_fitting'
    | 'short_piece'
  severity: FrameWarningSeverity
  message: string
}

/** Everything the frame calculator returns. */
export interface FrameResult {
  /** True when there is no warning of severity `error`. */
  ok: boolean
  /** The cut list (empty when the inputs cannot be read). */
  cutList: FrameCutLine[]
  /** Sum of length × quantity over the cut list. */
  totalCutLength: Length
  /** Number of pieces to cut. */
  pieceCount: number
  /** Lines that apply to the whole frame: centreline rectangle, manifold height, hole spacing. */
  derivation: string[]
  /** Every sprayer hole, run by run. */
  sprayerHoles: SprayerHole[]
  /** Problems found, errors first. */
  warnings: FrameWarning[]
  /** Safety cautions to show beside the cut list. */
  cautions: readonly string[]
}

/** Options for {@link computeFrame}. */
export interface ComputeFrameOptions {
  /** Unit of the derivation and warning texts (default inches). */
  unit?: LengthUnit
}

/**
 * Outside diameters of Schedule 40 PVC pipe by nominal size, in inches (ASTM D1785, table of
 * dimensions): 1/2 in → 0.840 in, 3/4 in → 1.050 in, 1 in → 1.315 in. Use {@link pvcSchedule40Od}
 * for the value in base units.
 */
export const PVC_SCHEDULE_40_OD = {
  '1/2': 0.84,
  '3/4': 1.05,
  '1': 1.315,
} as const

/** A nominal size listed in {@link PVC_SCHEDULE_40_OD}. */
export type PvcNominalSize = keyof typeof PVC_SCHEDULE_40_OD

/** Outside diameter of Schedule 40 PVC pipe of a nominal size, in base units. */
export function pvcSchedule40Od(nominal: PvcNominalSize): Length {
  return inches(PVC_SCHEDULE_40_OD[nominal])
}

/**
 * Pieces shorter than this get a caution to cut them from a longer, clamped piece: a short offcut
 * held by hand puts fingers near the blade (common practice in the trade, no published source).
 */
export const SHORT_PIECE_CAUTION_LENGTH: Length = inches(3)

/** Safety cautions shown with every cut list; local codes and licensed practice come first. */
export const FRAME_CAUTIONS: readonly string[] = [
  'Wear eye protection when cutting, drilling and tapping PVC. Clamp the pipe; never hold a short piece by hand near a blade or bit.',
  'Deburr cut ends and clear swarf out of the pipe after drilling and tapping, or it will block the sprayers.',
  'Use primer and solvent cement only with good ventilation, gloves and no flames nearby, as their makers direct.',
  'The pump runs on mains power next to water: plug it into a ground-fault protected (GFCI/RCD) outlet and leave a drip loop in the cord. Local electrical codes and licensed practice take precedence over these notes.',
]

const MAX_CROSS_RUNS = 20
const MAX_SPRAYERS_PER_RUN = 50

type FittingKind = 'elbow' | 'tee' | 'riser tee'
const KIND_ORDER: Record<FittingKind, number> = { elbow: 0, tee: 1, 'riser tee': 2 }
const KIND_KEY: Record<FittingKind, string> = { elbow: 'elbow', tee: 'tee', 'riser tee': 'riser_tee' }

interface RunFitting {
  kind: FittingKind
  /** Position along the run as a fraction `step` of `steps` of the span (exact, so equal gaps match). */
  step: number
}

interface Run {
  name: string
  kind: 'long' | 'short' | 'cross'
  span: Length
  spanWords: string
  steps: number
  fittings: RunFitting[]
  sprayers: number
  datum: string
}

/**
 * Computes the manifold's cut list, the derivation of every length, the sprayer hole positions and
 * warnings. Pure: the same inputs always give the same result, and nothing is thrown for bad input —
 * problems come back as warnings that say what to fix.
 *
 * Layout: elbows at the four corners; `crossRuns` tees evenly spaced along both long sides at
 * k/(crossRuns + 1) of the centreline length, joined in pairs by cross-run pipes; the riser tee at
 * the middle of the left long side or of the front short side, its branch pointing down to the pump.
 * The centreline rectangle is the inside less, on each side, the wall clearance and half the pipe OD.
 */
export function computeFrame(inputs: FrameInputs, options: ComputeFrameOptions = {}): FrameResult {
  const unit = options.unit ?? 'in'
  const show = (value: number) => formatLength(Math.round(value), unit, { markRounded: true })

  const invalid = checkInputs(inputs, unit)
  if (invalid.length > 0) return emptyResult(invalid)

  const { enclosure, elbow, tee, riser } = inputs
  const warnings: FrameWarning[] = []
  const derivation: string[] = []

  const edge = inputs.wallClearance + inputs.pipeOutsideDiameter / 2
  const width = enclosure.insideWidth - 2 * inputs.wallClearance - inputs.pipeOutsideDiameter
  const length = enclosure.insideLength - 2 * inputs.wallClearance - inputs.pipeOutsideDiameter
  const manifoldHeight = enclosure.insideHeight - inputs.recessBelowRim
  const halfOd = `half pipe OD ${show(inputs.pipeOutsideDiameter / 2)}`
  derivation.push(
    `centreline width = inside width ${show(enclosure.insideWidth)} − 2 × (wall clearance ${show(inputs.wallClearance)} + ${halfOd}) = ${show(width)}`,
    `centreline length = inside length ${show(enclosure.insideLength)} − 2 × (wall clearance ${show(inputs.wallClearance)} + ${halfOd}) = ${show(length)}`,
    `manifold centreline height = inside height ${show(enclosure.insideHeight)} − recess below rim ${show(inputs.recessBelowRim)} = ${show(manifoldHeight)}`,
  )
  if (width <= 0) {
    warnings.push({
      code: 'too_small',
      severity: 'error',
      message: `The tote is too narrow: the wall clearance and pipe take ${show(2 * edge)} of its ${show(enclosure.insideWidth)} inside width. Check the inside width, or reduce the clearance.`,
    })
    return { ...emptyResult(warnings), derivation }
  }

  const runs = buildRuns(inputs, width, length, warnings)
  const allowance = (kind: FittingKind) => (kind === 'elbow' ? elbow : tee)
  const precisionWords = `nearest ${formatLength(inputs.cutPrecision, unit, { denominator: 64, decimals: 2 })}`
  const roundCut = (value: number) => Math.round(value / inputs.cutPrecision) * inputs.cutPrecision

  // Pieces, grouped by key: equal keys come out at equal lengths by construction (exact steps).
  const lines = new Map<string, FrameCutLine>()
  const addPiece = (key: string, label: string, cut: number, steps: () => string[]) => {
    const line = lines.get(key)
    if (line) line.quantity += 1
    else lines.set(key, { key, label, length: cut, quantity: 1, derivation: steps() })
  }

  for (const run of runs) {
    for (let i = 0; i + 1 < run.fittings.length; i++) {
      const [a, b] = orderPair(run.fittings[i], run.fittings[i + 1])
      const centreToCentre = (run.span * Math.abs(run.fittings[i + 1]!.step - run.fittings[i]!.step)) / run.steps
      const ea = allowance(a.kind).centreToSocketBottom
      const eb = allowance(b.kind).centreToSocketBottom
      const raw = centreToCentre - ea - eb
      const cut = roundCut(raw)
      const label = run.kind === 'cross' ? 'cross run' : `${run.kind} side segment (${a.kind} to ${b.kind})`
      const key = run.kind === 'cross' ? 'cross' : `${run.kind}:${KIND_KEY[a.kind]}-${KIND_KEY[b.kind]}`
      const sa = allowance(a.kind).socketDepth
      const sb = allowance(b.kind).socketDepth
      if (!lines.has(key)) {
        checkPiece(label, raw, cut, sa + sb, warnings, show)
      }
      addPiece(key, label, cut, () => {
        const fraction = fractionWords(Math.abs(run.fittings[i + 1]!.step - run.fittings[i]!.step), run.steps)
        const steps = [
          fraction === ''
            ? `centre-to-centre = ${run.spanWords} ${show(run.span)}`
            : `centre-to-centre = ${run.spanWords} ${show(run.span)}${fraction} = ${show(centreToCentre)}`,
          `cut = centre-to-centre ${show(centreToCentre)} − ${takeOffWords(a.kind, b.kind, ea, eb, show)} = ${show(raw)}`,
        ]
        if (cut !== Math.round(raw)) steps.push(`rounded to the ${precisionWords}: ${show(cut)}`)
        steps.push(exposedWords(cut, a.kind, sa, b.kind, sb, show))
        return steps
      })
    }
  }

  // The riser: from the pump adapter's socket bottom up to the riser tee's branch socket bottom.
  const top = manifoldHeight - tee.centreToSocketBottom
  const bottom = riser.pumpOutletHeight + riser.pumpAdapter.socketBottomAboveOutlet
  const riserRaw = top - bottom
  const riserCut = roundCut(riserRaw)
  checkPiece('riser', riserRaw, riserCut, tee.socketDepth + riser.pumpAdapter.socketDepth, warnings, show)
  const riserSteps = [
    `top end = manifold centreline height ${show(manifoldHeight)} − tee centre-to-socket-bottom ${show(tee.centreToSocketBottom)} = ${show(top)}`,
    `bottom end = pump outlet height ${show(riser.pumpOutletHeight)} + adapter socket bottom above the outlet ${show(riser.pumpAdapter.socketBottomAboveOutlet)} = ${show(bottom)}`,
    `cut = top end ${show(top)} − bottom end ${show(bottom)} = ${show(riserRaw)}`,
  ]
  if (riserCut !== Math.round(riserRaw)) riserSteps.push(`rounded to the ${precisionWords}: ${show(riserCut)}`)
  riserSteps.push(
    `check: exposed pipe = cut ${show(riserCut)} − tee socket ${show(tee.socketDepth)} − adapter socket ${show(riser.pumpAdapter.socketDepth)} = ${show(riserCut - tee.socketDepth - riser.pumpAdapter.socketDepth)} (must not be negative)`,
  )
  lines.set('riser', { key: 'riser', label: 'riser', length: riserCut, quantity: 1, derivation: riserSteps })

  const cutList = [...lines.values()]
  for (const line of cutList) {
    if (line.length > 0 && line.length < SHORT_PIECE_CAUTION_LENGTH) {
      warnings.push({
        code: 'short_piece',
        severity: 'caution',
        message: `The ${line.label} is only ${show(line.length)}: cut it from a longer piece held in a clamp, or with a ratchet pipe cutter, and keep fingers clear of the blade.`,
      })
    }
  }

  const sprayerHoles = placeHoles(runs, inputs, derivation, warnings, show)
  warnings.sort((a, b) => (a.severity === b.severity ? 0 : a.severity === 'error' ? -1 : 1))
  return {
    ok: !warnings.some((w) => w.severity === 'error'),
    cutList,
    totalCutLength: cutList.reduce((sum, line) => sum + line.length * line.quantity, 0),
    pieceCount: cutList.reduce((sum, line) => sum + line.quantity, 0),
    derivation,
    sprayerHoles,
    warnings,
    cautions: FRAME_CAUTIONS,
  }
}

function buildRuns(
  inputs: FrameInputs,
  width: Length,
  length: Length,
  warnings: FrameWarning[],
): Run[] {
  const n = inputs.layout.crossRuns
  const riserOnLong = inputs.layout.riserSide === 'long'
  // Long sides are divided into 2(n + 1) steps: cross tees at even steps 2k, the riser tee at step n + 1.
  const longSteps = 2 * (n + 1)
  const crossTees: RunFitting[] = Array.from({ length: n }, (_, k) => ({ kind: 'tee', step: 2 * (k + 1) }))
  const longSide = (name: string, withRiser: boolean): Run => {
    const fittings: RunFitting[] = [{ kind: 'elbow', step: 0 }, ...crossTees, { kind: 'elbow', step: longSteps }]
    if (withRiser) {
      if (n % 2 === 1) {
        warnings.push({
          code: 'riser_on_cross_tee',
          severity: 'error',
          message: `The riser tee would sit where the middle cross-run tee is, at the centre of the long side. Use an even number of cross runs, or put the riser on a short side.`,
        })
      } else {
        fittings.push({ kind: 'riser tee', step: n + 1 })
        fittings.sort((a, b) => a.step - b.step)
      }
    }
    return {
      name,
      kind: 'long',
      span: length,
      spanWords: 'centreline length',
      steps: longSteps,
      fittings,
      sprayers: inputs.sprayers.perLongSide,
      datum: 'the centre of the front corner elbow',
    }
  }
  const shortSide = (name: string, withRiser: boolean): Run => ({
    name,
    kind: 'short',
    span: width,
    spanWords: 'centreline width',
    steps: 2,
    fittings: withRiser
      ? [
          { kind: 'elbow', step: 0 },
          { kind: 'riser tee', step: 1 },
          { kind: 'elbow', step: 2 },
        ]
      : [
          { kind: 'elbow', step: 0 },
          { kind: 'elbow', step: 2 },
        ],
    sprayers: inputs.sprayers.perShortSide,
    datum: 'the centre of the left corner elbow',
  })
  const runs: Run[] = [
    longSide('left long side', riserOnLong),
    longSide('right long side', false),
    shortSide('front short side', !riserOnLong),
    shortSide('back short side', false),
  ]
  for (let k = 1; k <= n; k++) {
    runs.push({
      name: `cross run ${k}`,
      kind: 'cross',
      span: width,
      spanWords: 'centreline width',
      steps: 1,
      fittings: [
        { kind: 'tee', step: 0 },
        { kind: 'tee', step: 1 },
      ],
      sprayers: inputs.sprayers.perCrossRun,
      datum: 'the centre of its tee on the left long side',
    })
  }
  return runs
}

function placeHoles(
  runs: Run[],
  inputs: FrameInputs,
  derivation: string[],
  warnings: FrameWarning[],
  show: (value: number) => string,
): SprayerHole[] {
  const holes: SprayerHole[] = []
  const face = (kind: FittingKind) => {
    const a = kind === 'elbow' ? inputs.elbow : inputs.tee
    return a.centreToSocketBottom + a.socketDepth
  }
  const described = new Set<string>()
  for (const run of runs) {
    if (run.sprayers === 0) continue
    const spacing = run.span / run.sprayers
    const positions = Array.from({ length: run.sprayers }, (_, i) => Math.round((i + 0.5) * spacing))
    const kindKey = run.kind
    if (!described.has(kindKey)) {
      described.add(kindKey)
      const runWords = run.kind === 'cross' ? 'each cross run' : `each ${run.kind} side`
      derivation.push(
        `sprayer holes on ${runWords}: ${run.sprayers} evenly spaced, every ${run.spanWords} ${show(run.span)} ÷ ${run.sprayers} = ${show(spacing)}, the first half a space (${show(spacing / 2)}) from ${run.datum}: ${positions.map(show).join(', ')}`,
      )
    }
    const crowded: number[] = []
    positions.forEach((position, index) => {
      const at = (f: RunFitting) => (run.span * f.step) / run.steps
      for (const f of run.fittings) {
        if (Math.abs(position - at(f)) < face(f.kind) + inputs.sprayers.minDistanceFromFitting) {
          crowded.push(index + 1)
          break
        }
      }
      let i = 0
      while (i + 2 < run.fittings.length && at(run.fittings[i + 1]!) <= position) i++
      const start = run.fittings[i]!
      const [a, b] = orderPair(start, run.fittings[i + 1])
      const label = run.kind === 'cross' ? 'cross run' : `${run.kind} side segment (${a.kind} to ${b.kind})`
      const startAllowance = start.kind === 'elbow' ? inputs.elbow : inputs.tee
      holes.push({
        run: run.name,
        number: index + 1,
        datum: run.datum,
        fromDatum: position,
        piece: label,
        pieceEnd: `${start.kind} end, toward ${run.datum}`,
        fromPieceEnd: Math.round(position - at(start) - startAllowance.centreToSocketBottom),
      })
    })
    if (crowded.length > 0) {
      warnings.push({
        code: 'hole_too_close_to_fitting',
        severity: 'error',
        message: `On the ${run.name}, sprayer hole${crowded.length > 1 ? 's' : ''} ${crowded.join(', ')} would be within ${show(inputs.sprayers.minDistanceFromFitting)} of a fitting's socket mouth (or inside the fitting). Change the number of sprayers on this run or the number of cross runs.`,
      })
    }
  }
  return holes
}

function checkPiece(
  label: string,
  raw: number,
  cut: Length,
  sockets: Length,
  warnings: FrameWarning[],
  show: (value: number) => string,
): void {
  if (raw <= 0) {
    warnings.push({
      code: 'negative_length',
      severity: 'error',
      message: `The ${label} comes out at ${show(raw)}: the fittings need more room than the layout leaves. Use fewer cross runs, a larger tote, less wall clearance, or (for the riser) a lower pump or a higher manifold.`,
    })
  } else if (cut < sockets) {
    warnings.push({
      code: 'too_short_for_sockets',
      severity: 'error',
      message: `The ${label} is ${show(cut)}, shorter than its two sockets take (${show(sockets)}): the fittings would run into each other. Use fewer cross runs, a larger tote, or (for the riser) a lower pump or a higher manifold.`,
    })
  }
}

function orderPair(a: RunFitting | undefined, b: RunFitting | undefined): [RunFitting, RunFitting] {
  if (!a || !b) throw new Error('frame: a run needs at least two fittings')
  return KIND_ORDER[a.kind] <= KIND_ORDER[b.kind] ? [a, b] : [b, a]
}

function fractionWords(part: number, whole: number): string {
  const g = gcd(part, whole)
  const num = part / g
  const den = whole / g
  if (den === 1) return num === 1 ? '' : ` × ${num}`
  return num === 1 ? ` ÷ ${den}` : ` × ${num} ÷ ${den}`
}

function takeOffWords(a: FittingKind, b: FittingKind, ea: Length, eb: Length, show: (v: number) => string): string {
  const name = (kind: FittingKind) => (kind === 'riser tee' ? 'tee' : kind)
  if (name(a) === name(b)) return `2 × ${name(a)} centre-to-socket-bottom ${show(ea)}`
  return `${name(a)} centre-to-socket-bottom ${show(ea)} − ${name(b)} centre-to-socket-bottom ${show(eb)}`
}

function exposedWords(
  cut: Length,
  a: FittingKind,
  sa: Length,
  b: FittingKind,
  sb: Length,
  show: (v: number) => string,
): string {
  const name = (kind: FittingKind) => (kind === 'riser tee' ? 'tee' : kind)
  const sockets =
    name(a) === name(b)
      ? `2 × ${name(a)} socket ${show(sa)}`
      : `${name(a)} socket ${show(sa)} − ${name(b)} socket ${show(sb)}`
  return `check: exposed pipe = cut ${show(cut)} − ${sockets} = ${show(cut - sa - sb)} (must not be negative)`
}

function gcd(a: number, b: number): number {
  let x = a
  let y = b
  while (y !== 0) [x, y] = [y, x % y]
  return x
}

function emptyResult(warnings: FrameWarning[]): FrameResult {
  return {
    ok: false,
    cutList: [],
    totalCutLength: 0,
    pieceCount: 0,
    derivation: [],
    sprayerHoles: [],
    warnings,
    cautions: FRAME_CAUTIONS,
  }
}

function checkInputs(inputs: FrameInputs, unit: LengthUnit): FrameWarning[] {
  const problems: string[] = []
  const length = (value: Length, words: string, rule: 'positive' | 'zero_or_more' | 'any') => {
    if (!Number.isSafeInteger(value)) {
      problems.push(`Enter the ${words} as a length.`)
    } else if (rule === 'positive' && value <= 0) {
      problems.push(`The ${words} must be greater than zero.`)
    } else if (rule === 'zero_or_more' && value < 0) {
      problems.push(`The ${words} cannot be negative.`)
    }
  }
  const count = (value: number, words: string, max: number) => {
    if (!Number.isInteger(value) || value < 0 || value > max) {
      problems.push(`The ${words} must be a whole number from 0 to ${max}.`)
    }
  }
  const { enclosure, elbow, tee, layout, sprayers, riser } = inputs
  length(enclosure.insideWidth, 'inside width', 'positive')
  length(enclosure.insideLength, 'inside length', 'positive')
  length(enclosure.insideHeight, 'inside height', 'positive')
  length(inputs.recessBelowRim, 'recess below the rim', 'zero_or_more')
  length(inputs.wallClearance, 'wall clearance', 'zero_or_more')
  length(inputs.pipeOutsideDiameter, 'pipe outside diameter', 'positive')
  length(elbow.socketDepth, 'elbow socket depth', 'positive')
  length(elbow.centreToSocketBottom, 'elbow centre-to-socket-bottom', 'zero_or_more')
  length(tee.socketDepth, 'tee socket depth', 'positive')
  length(tee.centreToSocketBottom, 'tee centre-to-socket-bottom', 'zero_or_more')
  length(sprayers.minDistanceFromFitting, 'least distance from a sprayer hole to a fitting', 'zero_or_more')
  length(riser.pumpOutletHeight, 'pump outlet height', 'zero_or_more')
  length(riser.pumpAdapter.socketDepth, 'pump adapter socket depth', 'positive')
  length(riser.pumpAdapter.socketBottomAboveOutlet, 'height of the pump adapter socket bottom above the outlet', 'any')
  length(inputs.cutPrecision, 'cut precision', 'positive')
  count(layout.crossRuns, 'number of cross runs', MAX_CROSS_RUNS)
  count(sprayers.perLongSide, 'number of sprayers per long side', MAX_SPRAYERS_PER_RUN)
  count(sprayers.perShortSide, 'number of sprayers per short side', MAX_SPRAYERS_PER_RUN)
  count(sprayers.perCrossRun, 'number of sprayers per cross run', MAX_SPRAYERS_PER_RUN)
  if (layout.riserSide !== 'long' && layout.riserSide !== 'short') {
    problems.push('Choose the side that carries the riser tee: a long side or a short side.')
  }
  if (problems.length === 0) {
    const show = (v: Length) => formatLength(v, unit, { markRounded: true })
    if (enclosure.insideWidth > enclosure.insideLength) {
      problems.push(
        `The inside width (${show(enclosure.insideWidth)}) is more than the inside length (${show(enclosure.insideLength)}): enter the shorter side as the width.`,
      )
    }
    if (inputs.recessBelowRim >= enclosure.insideHeight) {
      problems.push(
        `The recess below the rim (${show(inputs.recessBelowRim)}) must be less than the inside height (${show(enclosure.insideHeight)}).`,
      )
    }
  }
  return problems.map((message) => ({ code: 'invalid_input', severity: 'error', message }))
}

// ---------------------------------------------------------------------------------------------------
// Demo catalog inputs: invented totes and kits of our own scenario, for the demo only. Tote sizes
// are not any maker's product. Fitting figures: see DEMO_HALF_INCH_FITTINGS.

/**
 * 1/2 in Schedule 40 slip fittings as used in the demo kits. Socket depth 3/4 in: common practice in
 * the trade for 1/2 in slip fittings, no published source. Centre-to-socket-bottom 1/2 in: typical
 * of 1/2 in slip elbows and tees, from memory — a shop should measure the fittings it buys.
 */
export const DEMO_HALF_INCH_FITTINGS: { elbow: FittingAllowance; tee: FittingAllowance } = {
  elbow: { socketDepth: inches(0.75), centreToSocketBottom: inches(0.5) },
  tee: { socketDepth: inches(0.75), centreToSocketBottom: inches(0.5) },
}

/** Demo 12-site tote, revision A: inside 16-1/2 × 24 in at the rim, 13 × 20-1/2 in on the floor, 14 in deep. Invented. */
export const DEMO_TOTE_12_REV_A_ENCLOSURE: EnclosureShape = {
  topInsideWidth: inches(16.5),
  topInsideLength: inches(24),
  bottomInsideWidth: inches(13),
  bottomInsideLength: inches(20.5),
  insideHeight: inches(14),
}

/** Demo 12-site tote, revision B: the supplier's replacement tote, 1 in wider. Invented. */
export const DEMO_TOTE_12_REV_B_ENCLOSURE: EnclosureShape = {
  topInsideWidth: inches(17.5),
  topInsideLength: inches(24),
  bottomInsideWidth: inches(14),
  bottomInsideLength: inches(20.5),
  insideHeight: inches(14),
}

/** Demo compact 6-site tote: inside 12-1/2 × 17 in at the rim, 10 × 14-1/2 in on the floor, 10 in deep. Invented. */
export const DEMO_COMPACT_6_ENCLOSURE: EnclosureShape = {
  topInsideWidth: inches(12.5),
  topInsideLength: inches(17),
  bottomInsideWidth: inches(10),
  bottomInsideLength: inches(14.5),
  insideHeight: inches(10),
}

/** Manifold recess below the rim in the demo kits: about 2 in is common practice (no published source). */
export const DEMO_RECESS_BELOW_RIM: Length = inches(2)

function demoFrame(
  enclosure: EnclosureShape,
  layout: FrameInputs['layout'],
  sprayers: Omit<FrameInputs['sprayers'], 'minDistanceFromFitting'>,
  pumpOutletHeight: Length,
): FrameInputs {
  const manifoldHeight = enclosure.insideHeight - DEMO_RECESS_BELOW_RIM
  const inside = insideAtHeight(enclosure, manifoldHeight)
  return {
    enclosure: { ...inside, insideHeight: enclosure.insideHeight },
    recessBelowRim: DEMO_RECESS_BELOW_RIM,
    wallClearance: inches(0.5),
    pipeOutsideDiameter: pvcSchedule40Od('1/2'),
    ...DEMO_HALF_INCH_FITTINGS,
    layout,
    sprayers: { ...sprayers, minDistanceFromFitting: inches(0.5) },
    riser: {
      pumpOutletHeight,
      pumpAdapter: { socketDepth: inches(0.75), socketBottomAboveOutlet: inches(0.5) },
    },
    cutPrecision: inches(1 / 16),
  }
}

/**
 * Demo 12-site tote kit, revision A (invented): 1/2 in Schedule 40 PVC, perimeter loop with four
 * cross runs of three sprayers each under the lid's four columns of three net cups, the riser centred
 * on the front short side, a pump whose outlet stands 4-1/2 in above the floor.
 */
export const DEMO_TOTE_12_REV_A_FRAME: FrameInputs = demoFrame(
  DEMO_TOTE_12_REV_A_ENCLOSURE,
  { crossRuns: 4, riserSide: 'short' },
  { perLongSide: 0, perShortSide: 0, perCrossRun: 3 },
  inches(4.5),
)

/** Demo 12-site tote kit, revision B (invented): the same kit in the 1 in wider tote. */
export const DEMO_TOTE_12_REV_B_FRAME: FrameInputs = demoFrame(
  DEMO_TOTE_12_REV_B_ENCLOSURE,
  { crossRuns: 4, riserSide: 'short' },
  { perLongSide: 0, perShortSide: 0, perCrossRun: 3 },
  inches(4.5),
)

/**
 * Demo compact 6-site kit (invented): perimeter loop with one cross run; two sprayers on each long
 * side and two on the cross run; riser centred on the front short side; a smaller pump (outlet 3-1/2 in).
 */
export const DEMO_COMPACT_6_FRAME: FrameInputs = demoFrame(
  DEMO_COMPACT_6_ENCLOSURE,
  { crossRuns: 1, riserSide: 'short' },
  { perLongSide: 2, perShortSide: 0, perCrossRun: 2 },
  inches(3.5),
)
