/**
 * Demo catalog inputs: invented totes and kits of our own scenario, for the demo only. Tote sizes
 * are not any maker's product. Fitting figures come from the fittings table (fittings.ts).
 */
import { insideAtHeight, type EnclosureShape } from '../reservoir'
import { inches, type Length } from '../units'
import { pvcSchedule40Od, schedule40Fittings, schedule40SocketDepth } from './fittings'
import type { FittingAllowance, FrameInputs } from './types'

/**
 * 1/2 in Schedule 40 PVC socket (slip) fittings as used in the demo kits: the figures of the fittings
 * table (fittings.ts): socket depth 0.688 in (ASTM D2466 socket table, from memory) and
 * centre-to-socket-bottom 1/2 in (ASTM D2466 ells and tees, from memory). A shop should measure the
 * fittings it buys.
 */
export const DEMO_HALF_INCH_FITTINGS: { elbow: FittingAllowance; tee: FittingAllowance } = schedule40Fittings('1/2')

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
      // The adapter's socket takes 1/2 in pipe like any 1/2 in Schedule 40 socket (fittings table);
      // its socket bottom 1/2 in above the outlet is the invented demo pump's.
      pumpAdapter: { socketDepth: schedule40SocketDepth('1/2'), socketBottomAboveOutlet: inches(0.5) },
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
