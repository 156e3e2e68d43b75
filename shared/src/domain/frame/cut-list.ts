/**
 * The cut list: one line per distinct piece of pipe, with how its length was worked out. A pipe between
 * fittings a and b is cut to centre-to-centre − e(a) − e(b), e being each fitting's
 * centre-to-socket-bottom (see geometry.ts); the riser runs from the pump adapter's socket bottom up to
 * the riser tee's branch socket bottom.
 */
import { formatLength, type Length, type LengthUnit } from '../units'
import { fractionWords, KIND_KEY, orderPair, pieceLabel, type FittingKind, type Run } from './geometry'
import type { FittingAllowance, FrameCutLine, FrameInputs, FrameWarning } from './types'

/** What every piece's arithmetic needs: the inputs, how to write lengths, and where warnings go. */
export interface CutContext {
  inputs: FrameInputs
  unit: LengthUnit
  show: (value: number) => string
  warnings: FrameWarning[]
}

/** How pipe seats in a fitting of this kind (a riser tee is a tee). */
export function allowanceOf(inputs: FrameInputs, kind: FittingKind): FittingAllowance {
  return kind === 'elbow' ? inputs.elbow : inputs.tee
}

function roundCut(value: number, precision: Length): Length {
  return Math.round(value / precision) * precision
}

function roundedWords(cut: Length, { inputs, unit, show }: CutContext): string {
  return `rounded to the nearest ${formatLength(inputs.cutPrecision, unit, { denominator: 64, decimals: 2 })}: ${show(cut)}`
}

/**
 * Every piece of the frame, grouped by key: equal keys come out at equal lengths by construction
 * (exact steps along each run). Errors for impossible pieces go to `ctx.warnings`.
 */
export function frameCutList(runs: readonly Run[], manifoldHeight: Length, ctx: CutContext): FrameCutLine[] {
  const lines = new Map<string, FrameCutLine>()
  for (const run of runs) {
    for (let i = 0; i + 1 < run.fittings.length; i++) addRunPiece(lines, run, i, ctx)
  }
  lines.set('riser', riserLine(manifoldHeight, ctx))
  return [...lines.values()]
}

/** The piece between fittings i and i + 1 of a run: a new line, or one more of an existing line. */
function addRunPiece(lines: Map<string, FrameCutLine>, run: Run, i: number, ctx: CutContext): void {
  const { inputs, show } = ctx
  const from = run.fittings[i]
  const to = run.fittings[i + 1]
  const [a, b] = orderPair(from, to)
  const gap = Math.abs(to!.step - from!.step)
  const key = run.kind === 'cross' ? 'cross' : `${run.kind}:${KIND_KEY[a.kind]}-${KIND_KEY[b.kind]}`
  const existing = lines.get(key)
  if (existing) {
    existing.quantity += 1
    return
  }
  const label = pieceLabel(run, a, b)
  const centreToCentre = (run.span * gap) / run.steps
  const ea = allowanceOf(inputs, a.kind).centreToSocketBottom
  const eb = allowanceOf(inputs, b.kind).centreToSocketBottom
  const sa = allowanceOf(inputs, a.kind).socketDepth
  const sb = allowanceOf(inputs, b.kind).socketDepth
  const raw = centreToCentre - ea - eb
  const cut = roundCut(raw, inputs.cutPrecision)
  checkPiece(label, raw, cut, sa + sb, ctx)
  const fraction = fractionWords(gap, run.steps)
  const derivation = [
    fraction === ''
      ? `centre-to-centre = ${run.spanWords} ${show(run.span)}`
      : `centre-to-centre = ${run.spanWords} ${show(run.span)}${fraction} = ${show(centreToCentre)}`,
    `cut = centre-to-centre ${show(centreToCentre)} − ${takeOffWords(a.kind, b.kind, ea, eb, show)} = ${show(raw)}`,
  ]
  if (cut !== Math.round(raw)) derivation.push(roundedWords(cut, ctx))
  derivation.push(exposedWords(cut, a.kind, sa, b.kind, sb, show))
  lines.set(key, { key, label, length: cut, quantity: 1, derivation })
}

/** The riser: from the pump adapter's socket bottom up to the riser tee's branch socket bottom. */
function riserLine(manifoldHeight: Length, ctx: CutContext): FrameCutLine {
  const { inputs, show } = ctx
  const { tee, riser } = inputs
  const adapter = riser.pumpAdapter
  const top = manifoldHeight - tee.centreToSocketBottom
  const bottom = riser.pumpOutletHeight + adapter.socketBottomAboveOutlet
  const raw = top - bottom
  const cut = roundCut(raw, inputs.cutPrecision)
  checkPiece('riser', raw, cut, tee.socketDepth + adapter.socketDepth, ctx)
  const derivation = [
    `top end = manifold centreline height ${show(manifoldHeight)} − tee centre-to-socket-bottom ${show(tee.centreToSocketBottom)} = ${show(top)}`,
    `bottom end = pump outlet height ${show(riser.pumpOutletHeight)} + adapter socket bottom above the outlet ${show(adapter.socketBottomAboveOutlet)} = ${show(bottom)}`,
    `cut = top end ${show(top)} − bottom end ${show(bottom)} = ${show(raw)}`,
  ]
  if (cut !== Math.round(raw)) derivation.push(roundedWords(cut, ctx))
  derivation.push(
    `check: exposed pipe = cut ${show(cut)} − tee socket ${show(tee.socketDepth)} − adapter socket ${show(adapter.socketDepth)} = ${show(cut - tee.socketDepth - adapter.socketDepth)} (must not be negative)`,
  )
  return { key: 'riser', label: 'riser', length: cut, quantity: 1, derivation }
}

/** An error when a piece comes out negative, or too short to fill its two sockets. */
function checkPiece(label: string, raw: number, cut: Length, sockets: Length, { warnings, show }: CutContext): void {
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

function takeOffWords(a: FittingKind, b: FittingKind, ea: Length, eb: Length, show: (v: number) => string): string {
  const name = (kind: FittingKind) => (kind === 'riser tee' ? 'tee' : kind)
  if (name(a) === name(b)) return `2 × ${name(a)} centre-to-socket-bottom ${show(ea)}`
  return `${name(a)} centre-to-socket-bottom ${show(ea)} − ${name(b)} centre-to-socket-bottom ${show(eb)}`
}

function exposedWords(cut: Length, a: FittingKind, sa: Length, b: FittingKind, sb: Length, show: (v: number) => string): string {
  const name = (kind: FittingKind) => (kind === 'riser tee' ? 'tee' : kind)
  const sockets = name(a) === name(b) ? `2 × ${name(a)} socket ${show(sa)}` : `${name(a)} socket ${show(sa)} − ${name(b)} socket ${show(sb)}`
  return `check: exposed pipe = cut ${show(cut)} − ${sockets} = ${show(cut - sa - sb)} (must not be negative)`
}
