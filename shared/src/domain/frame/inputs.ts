/**
 * The frame calculator's input checks: every figure readable and in range, the width the shorter side,
 * the recess inside the tote. Each problem says which field to fix.
 */
import { formatLength, type Length, type LengthUnit } from '../units'
import type { FrameInputs, FrameWarning } from './types'

/** The most cross runs a frame may have. */
export const MAX_CROSS_RUNS = 20
/** The most sprayers a run may have. */
export const MAX_SPRAYERS_PER_RUN = 50

/** One `invalid_input` error per problem with the inputs, in field order; empty when they can be read. */
export function checkInputs(inputs: FrameInputs, unit: LengthUnit): FrameWarning[] {
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
