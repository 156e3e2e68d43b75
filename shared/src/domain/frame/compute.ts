/**
 * The frame calculator: derives the pipe cut list of a kit's spray manifold from the tote it sits in,
 * with the derivation of every length, the sprayer hole positions, warnings and cautions. See
 * geometry.ts for the layout and its words, cut-list.ts for the pieces, sprayers.ts for the holes,
 * fittings.ts for the sourced pipe and fitting figures.
 */
import { FRAME_CAUTIONS, shortPieceWarnings } from './cautions'
import { frameCutList } from './cut-list'
import { buildRuns, centreline, lengthWriter, tooNarrowWarning } from './geometry'
import { checkInputs } from './inputs'
import { placeHoles } from './sprayers'
import type { ComputeFrameOptions, FrameInputs, FrameResult, FrameWarning } from './types'

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
  const show = lengthWriter(unit)
  const invalid = checkInputs(inputs, unit)
  if (invalid.length > 0) return emptyResult(invalid)

  const warnings: FrameWarning[] = []
  const rectangle = centreline(inputs, show)
  const derivation = [...rectangle.derivation]
  if (rectangle.width <= 0) {
    return { ...emptyResult([tooNarrowWarning(inputs, rectangle.edge, show)]), derivation }
  }
  const runs = buildRuns(inputs, rectangle.width, rectangle.length, warnings)
  const cutList = frameCutList(runs, rectangle.manifoldHeight, { inputs, unit, show, warnings })
  warnings.push(...shortPieceWarnings(cutList, show))
  const sprayerHoles = placeHoles(runs, inputs, derivation, warnings, show)
  // Errors first; the sort is stable, so each group keeps the order the checks found them in.
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
