/**
 * Sprayer holes: evenly spaced along each run, the first half a space from the run's datum, each
 * placed on its cut piece and measured from that piece's end for marking before assembly.
 */
import { allowanceOf } from './cut-list'
import { orderPair, pieceLabel, type FittingKind, type Run, type RunFitting } from './geometry'
import type { FrameInputs, FrameWarning, SprayerHole } from './types'

type Show = (value: number) => string

/**
 * Every sprayer hole, run by run. Adds one derivation line per kind of run (long side, short side,
 * cross run) and an error for each run whose holes come too close to a fitting.
 */
export function placeHoles(runs: readonly Run[], inputs: FrameInputs, derivation: string[], warnings: FrameWarning[], show: Show): SprayerHole[] {
  const holes: SprayerHole[] = []
  const described = new Set<Run['kind']>()
  for (const run of runs) {
    if (run.sprayers === 0) continue
    const spacing = run.span / run.sprayers
    const positions = Array.from({ length: run.sprayers }, (_, i) => Math.round((i + 0.5) * spacing))
    if (!described.has(run.kind)) {
      described.add(run.kind)
      const runWords = run.kind === 'cross' ? 'each cross run' : `each ${run.kind} side`
      derivation.push(
        `sprayer holes on ${runWords}: ${run.sprayers} evenly spaced, every ${run.spanWords} ${show(run.span)} ÷ ${run.sprayers} = ${show(spacing)}, the first half a space (${show(spacing / 2)}) from ${run.datum}: ${positions.map(show).join(', ')}`,
      )
    }
    holes.push(...positions.map((position, index) => holeAt(run, inputs, position, index)))
    const crowded = positions.flatMap((position, index) => (tooCloseToFitting(run, inputs, position) ? [index + 1] : []))
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

/** Where a fitting's centre is along its run. */
function positionOf(run: Run, fitting: RunFitting): number {
  return (run.span * fitting.step) / run.steps
}

/** From a fitting's centre to its socket mouth (face): centre-to-socket-bottom plus socket depth. */
function centreToFace(inputs: FrameInputs, kind: FittingKind): number {
  const a = allowanceOf(inputs, kind)
  return a.centreToSocketBottom + a.socketDepth
}

function tooCloseToFitting(run: Run, inputs: FrameInputs, position: number): boolean {
  return run.fittings.some((f) => Math.abs(position - positionOf(run, f)) < centreToFace(inputs, f.kind) + inputs.sprayers.minDistanceFromFitting)
}

/** The hole at `position` along the run: on the piece that spans it, measured from that piece's datum end. */
function holeAt(run: Run, inputs: FrameInputs, position: number, index: number): SprayerHole {
  let i = 0
  while (i + 2 < run.fittings.length && positionOf(run, run.fittings[i + 1]!) <= position) i++
  const start = run.fittings[i]!
  const [a, b] = orderPair(start, run.fittings[i + 1])
  return {
    run: run.name,
    number: index + 1,
    datum: run.datum,
    fromDatum: position,
    piece: pieceLabel(run, a, b),
    pieceEnd: `${start.kind} end, toward ${run.datum}`,
    fromPieceEnd: Math.round(position - positionOf(run, start) - allowanceOf(inputs, start.kind).centreToSocketBottom),
  }
}
