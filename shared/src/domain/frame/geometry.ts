/**
 * The frame's geometry: the centreline rectangle inside the tote, and the runs of pipe with their
 * fittings along it.
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
 *   (The fitting tables of ASTM D2749 / D2466 letter these C for the socket depth s and G for e; the
 *   letters here are the calculator's own, see fittings.ts.)
 *
 * A pipe between fittings a and b is cut to **C − e(a) − e(b)**: the pipe reaches from one socket
 * bottom to the other. Said the other way round, it is the pipe you can see between the two socket
 * mouths, C − (e(a) + s(a)) − (e(b) + s(b)), plus the two lengths hidden in the sockets, s(a) + s(b).
 * The visible part must not be negative, or the two fittings would run into each other.
 */
import type { Length, LengthUnit } from '../units'
import { formatLength } from '../units'
import type { FrameInputs, FrameWarning } from './types'

/** The kinds of fitting along a run; the riser tee is a tee whose branch points down to the pump. */
export type FittingKind = 'elbow' | 'tee' | 'riser tee'
const KIND_ORDER: Record<FittingKind, number> = { elbow: 0, tee: 1, 'riser tee': 2 }
/** The fitting kinds as they appear in cut line keys. */
export const KIND_KEY: Record<FittingKind, string> = { elbow: 'elbow', tee: 'tee', 'riser tee': 'riser_tee' }

/** A fitting on a run. */
export interface RunFitting {
  kind: FittingKind
  /** Position along the run as a fraction `step` of `steps` of the span (exact, so equal gaps match). */
  step: number
}

/** One straight run of pipe between corner fittings (a side) or between two tees (a cross run). */
export interface Run {
  name: string
  kind: 'long' | 'short' | 'cross'
  span: Length
  spanWords: string
  steps: number
  fittings: RunFitting[]
  sprayers: number
  datum: string
}

/** The centreline rectangle and the manifold's height, with the lines that derive them. */
export interface Centreline {
  /** Wall clearance plus half the pipe OD: from the inside wall to the centreline. */
  edge: Length
  width: Length
  length: Length
  manifoldHeight: Length
  derivation: string[]
}

/** A length written for the derivation, marked when rounded. */
export function lengthWriter(unit: LengthUnit): (value: number) => string {
  return (value: number) => formatLength(Math.round(value), unit, { markRounded: true })
}

/** The centreline rectangle: the inside less, on each side, the wall clearance and half the pipe OD. */
export function centreline(inputs: FrameInputs, show: (value: number) => string): Centreline {
  const { enclosure } = inputs
  const edge = inputs.wallClearance + inputs.pipeOutsideDiameter / 2
  const width = enclosure.insideWidth - 2 * inputs.wallClearance - inputs.pipeOutsideDiameter
  const length = enclosure.insideLength - 2 * inputs.wallClearance - inputs.pipeOutsideDiameter
  const manifoldHeight = enclosure.insideHeight - inputs.recessBelowRim
  const halfOd = `half pipe OD ${show(inputs.pipeOutsideDiameter / 2)}`
  const clearance = `wall clearance ${show(inputs.wallClearance)}`
  return {
    edge,
    width,
    length,
    manifoldHeight,
    derivation: [
      `centreline width = inside width ${show(enclosure.insideWidth)} − 2 × (${clearance} + ${halfOd}) = ${show(width)}`,
      `centreline length = inside length ${show(enclosure.insideLength)} − 2 × (${clearance} + ${halfOd}) = ${show(length)}`,
      `manifold centreline height = inside height ${show(enclosure.insideHeight)} − recess below rim ${show(inputs.recessBelowRim)} = ${show(manifoldHeight)}`,
    ],
  }
}

/** The error for a tote too narrow to hold the clearance and the pipe. */
export function tooNarrowWarning(inputs: FrameInputs, edge: Length, show: (value: number) => string): FrameWarning {
  return {
    code: 'too_small',
    severity: 'error',
    message: `The tote is too narrow: the wall clearance and pipe take ${show(2 * edge)} of its ${show(inputs.enclosure.insideWidth)} inside width. Check the inside width, or reduce the clearance.`,
  }
}

/**
 * The runs of the layout: elbows at the four corners; `crossRuns` tees evenly spaced along both long
 * sides at k/(crossRuns + 1) of the centreline length, joined in pairs by cross runs; the riser tee at
 * the middle of the left long side or of the front short side.
 */
export function buildRuns(inputs: FrameInputs, width: Length, length: Length, warnings: FrameWarning[]): Run[] {
  const riserOnLong = inputs.layout.riserSide === 'long'
  const runs: Run[] = [
    longSideRun('left long side', inputs, length, riserOnLong, warnings),
    longSideRun('right long side', inputs, length, false, warnings),
    shortSideRun('front short side', inputs, width, !riserOnLong),
    shortSideRun('back short side', inputs, width, false),
  ]
  for (let k = 1; k <= inputs.layout.crossRuns; k++) runs.push(crossRun(k, inputs, width))
  return runs
}

/** A long side: elbows at its ends, the cross-run tees, and the riser tee in the middle when it carries it. */
function longSideRun(name: string, inputs: FrameInputs, length: Length, withRiser: boolean, warnings: FrameWarning[]): Run {
  const n = inputs.layout.crossRuns
  // Long sides are divided into 2(n + 1) steps: cross tees at even steps 2k, the riser tee at step n + 1.
  const longSteps = 2 * (n + 1)
  const crossTees: RunFitting[] = Array.from({ length: n }, (_, k) => ({ kind: 'tee', step: 2 * (k + 1) }))
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

/** A short side: elbows at its ends, and the riser tee in the middle when it carries it. */
function shortSideRun(name: string, inputs: FrameInputs, width: Length, withRiser: boolean): Run {
  const ends: RunFitting[] = [
    { kind: 'elbow', step: 0 },
    { kind: 'elbow', step: 2 },
  ]
  return {
    name,
    kind: 'short',
    span: width,
    spanWords: 'centreline width',
    steps: 2,
    fittings: withRiser ? [ends[0]!, { kind: 'riser tee', step: 1 }, ends[1]!] : ends,
    sprayers: inputs.sprayers.perShortSide,
    datum: 'the centre of the left corner elbow',
  }
}

/** Cross run `k` (1-based): a pipe across the width between the k-th tees of the two long sides. */
function crossRun(k: number, inputs: FrameInputs, width: Length): Run {
  return {
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
  }
}

/** The pair's fittings in a fixed order (elbow, tee, riser tee), so equal pieces get equal keys. */
export function orderPair(a: RunFitting | undefined, b: RunFitting | undefined): [RunFitting, RunFitting] {
  if (!a || !b) throw new Error('frame: a run needs at least two fittings')
  return KIND_ORDER[a.kind] <= KIND_ORDER[b.kind] ? [a, b] : [b, a]
}

/** " ÷ 3", " × 2 ÷ 5" or "": the fraction `part`/`whole` of a span, in words. */
export function fractionWords(part: number, whole: number): string {
  const g = gcd(part, whole)
  const num = part / g
  const den = whole / g
  if (den === 1) return num === 1 ? '' : ` × ${num}`
  return num === 1 ? ` ÷ ${den}` : ` × ${num} ÷ ${den}`
}

function gcd(a: number, b: number): number {
  let x = a
  let y = b
  while (y !== 0) [x, y] = [y, x % y]
  return x
}

/** The label of the piece between fittings `a` and `b` (ordered) on a run. */
export function pieceLabel(run: Run, a: RunFitting, b: RunFitting): string {
  return run.kind === 'cross' ? 'cross run' : `${run.kind} side segment (${a.kind} to ${b.kind})`
}
