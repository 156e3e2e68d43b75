/**
 * The frame calculator's words as types: its inputs, the cut list, the sprayer holes and the warnings.
 * See frame/geometry.ts for the layout and the words centre-to-centre, socket depth and
 * centre-to-socket-bottom.
 */
import type { Length, LengthUnit } from '../units'

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
  /** Outside diameter of the pipe (see PVC_SCHEDULE_40_OD in frame/fittings.ts). */
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

/** Options for computeFrame (frame/compute.ts). */
export interface ComputeFrameOptions {
  /** Unit of the derivation and warning texts (default inches). */
  unit?: LengthUnit
}
