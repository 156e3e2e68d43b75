/**
 * The frame calculator's public entry: `@kitwright/shared/domain/frame` resolves here (the shared
 * package maps `./*` to `src/*.ts`), and the parts live in ./frame/:
 * - frame/compute.ts: computeFrame, tying the parts together;
 * - frame/geometry.ts: the centreline rectangle, the runs and their fittings (the layout and its words);
 * - frame/cut-list.ts: each piece's cut length and its derivation;
 * - frame/sprayers.ts: the sprayer holes;
 * - frame/fittings.ts: the fittings table, every pipe and fitting figure with its source;
 * - frame/cautions.ts: the cautions shown with a cut list;
 * - frame/inputs.ts: the input checks; frame/types.ts: the types; frame/demo.ts: the demo kits' inputs.
 */
export { computeFrame } from './frame/compute'
export type {
  ComputeFrameOptions,
  FittingAllowance,
  FrameCutLine,
  FrameInputs,
  FrameResult,
  FrameWarning,
  FrameWarningSeverity,
  PumpAdapter,
  SprayerHole,
} from './frame/types'
export {
  PVC_NOMINAL_SIZES,
  PVC_SCHEDULE_40_OD,
  SCHEDULE_40_FITTINGS_TABLE,
  pvcSchedule40Od,
  schedule40Fittings,
  schedule40SocketDepth,
  type FigureSource,
  type PvcNominalSize,
  type SourcedInches,
} from './frame/fittings'
export { FRAME_CAUTIONS, SHORT_PIECE_CAUTION_LENGTH } from './frame/cautions'
export { MAX_CROSS_RUNS, MAX_SPRAYERS_PER_RUN } from './frame/inputs'
export {
  DEMO_COMPACT_6_ENCLOSURE,
  DEMO_COMPACT_6_FRAME,
  DEMO_HALF_INCH_FITTINGS,
  DEMO_RECESS_BELOW_RIM,
  DEMO_TOTE_12_REV_A_ENCLOSURE,
  DEMO_TOTE_12_REV_A_FRAME,
  DEMO_TOTE_12_REV_B_ENCLOSURE,
  DEMO_TOTE_12_REV_B_FRAME,
} from './frame/demo'
