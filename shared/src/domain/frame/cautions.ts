/**
 * The cautions shown beside a frame's cut list, and the warning for pieces too short to hold safely.
 * The shop-wide wording lives in safety-cautions.ts; local codes and licensed practice come first.
 */
import { inches, type Length } from '../units'
import { SOLVENT_CEMENT_CAUTION, WATER_ONLY_PRESSURE_TEST_CAUTION } from '../safety-cautions'
import type { FrameCutLine, FrameWarning } from './types'

/**
 * Pieces shorter than this get a caution to cut them from a longer, clamped piece: a short offcut
 * held by hand puts fingers near the blade (common practice in the trade, no published source).
 */
export const SHORT_PIECE_CAUTION_LENGTH: Length = inches(3)

/** Safety cautions shown with every cut list; local codes and licensed practice come first. */
export const FRAME_CAUTIONS: readonly string[] = [
  'Wear eye protection when cutting, drilling and tapping PVC. Clamp the pipe; never hold a short piece by hand near a blade or bit.',
  'Deburr cut ends and clear swarf out of the pipe after drilling and tapping, or it will block the sprayers.',
  SOLVENT_CEMENT_CAUTION,
  'The pump runs on mains power next to water: plug it into a ground-fault protected (GFCI/RCD) outlet and leave a drip loop in the cord. Local electrical codes and licensed practice take precedence over these notes.',
  WATER_ONLY_PRESSURE_TEST_CAUTION,
]

/** A caution for every cut line shorter than {@link SHORT_PIECE_CAUTION_LENGTH}. */
export function shortPieceWarnings(cutList: readonly FrameCutLine[], show: (value: number) => string): FrameWarning[] {
  return cutList
    .filter((line) => line.length > 0 && line.length < SHORT_PIECE_CAUTION_LENGTH)
    .map((line) => ({
      code: 'short_piece',
      severity: 'caution',
      message: `The ${line.label} is only ${show(line.length)}: cut it from a longer piece held in a clamp, or with a ratchet pipe cutter, and keep fingers clear of the blade.`,
    }))
}
