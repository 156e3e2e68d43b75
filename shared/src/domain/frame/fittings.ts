/**
 * The fittings table: every pipe and fitting figure the frame calculator's defaults use, each with its
 * source beside it. Lengths here are inches as the tables print them; the functions below turn them
 * into base units (units.ts).
 *
 * Sources, and how sure each figure is:
 * - Pipe outside diameters: ASTM D1785 (PVC pipe, Schedules 40, 80 and 120), its table of pipe
 *   dimensions. From memory of that table; they are also the figures printed on every Schedule 40
 *   pipe maker's dimension sheet.
 * - Socket depths: ASTM D2466 (PVC plastic pipe fittings, Schedule 40), the table of tapered socket
 *   dimensions ("Tapered Sockets for PVC Pipe Fittings, Schedule 40", Table 1 in the editions we
 *   recall: table number from memory), column C, socket length, minimum. The values are from memory
 *   of that table; the same iron-pipe-size Schedule 40 socket figures (0.688, 0.719, 0.875 in)
 *   appear in Table 1 of the sister standard ASTM D2468 (ABS fittings, Schedule 40), which we read
 *   in a published copy. Dimension letters follow ASTM D2749 (symbols for dimensions of plastic
 *   pipe fittings): C socket depth, G centre to socket bottom.
 * - Centre-to-socket-bottom (G) of 90° elbows and tees: ASTM D2466's table of dimensions of 90° ells,
 *   tees and crosses, G minimum. Value and table from memory, not checked against a copy. Moulded
 *   fittings differ from maker to maker by more than the rounding of a cut: a shop should measure the
 *   fittings it buys and enter its own figures on the revision.
 */
import { inches, type Length } from '../units'
import type { FittingAllowance } from './types'

/** Where a figure in this table comes from, in words a reader can look up. */
export type FigureSource = string

/** A figure in inches with its source. */
export interface SourcedInches {
  inches: number
  source: FigureSource
}

/** The nominal sizes of Schedule 40 PVC in the table. */
export const PVC_NOMINAL_SIZES = ['1/2', '3/4', '1'] as const
/** A nominal size listed in the table. */
export type PvcNominalSize = (typeof PVC_NOMINAL_SIZES)[number]

const D1785 = 'ASTM D1785, table of pipe dimensions (Schedule 40 outside diameter); from memory'
const D2466_SOCKET =
  'ASTM D2466, tapered socket dimensions (Table 1, number from memory), C socket length min; value from memory, matches ASTM D2468 Table 1'
const D2466_G = 'ASTM D2466, dimensions of 90° ells, tees and crosses, G centre to socket bottom min; table and value from memory'

/**
 * Outside diameters of Schedule 40 PVC pipe by nominal size, in inches (ASTM D1785, table of
 * dimensions): 1/2 in → 0.840 in, 3/4 in → 1.050 in, 1 in → 1.315 in. Use {@link pvcSchedule40Od}
 * for the value in base units.
 */
export const PVC_SCHEDULE_40_OD: Record<PvcNominalSize, number> = {
  '1/2': 0.84,
  '3/4': 1.05,
  '1': 1.315,
}

/** The table, row by row: pipe OD, socket depth (C) and the 90° ell/tee centre to socket bottom (G). */
export const SCHEDULE_40_FITTINGS_TABLE: Record<
  PvcNominalSize,
  { pipeOutsideDiameter: SourcedInches; socketDepth: SourcedInches; ellAndTeeCentreToSocketBottom: SourcedInches }
> = {
  '1/2': {
    pipeOutsideDiameter: { inches: PVC_SCHEDULE_40_OD['1/2'], source: D1785 },
    socketDepth: { inches: 0.688, source: D2466_SOCKET },
    ellAndTeeCentreToSocketBottom: { inches: 0.5, source: D2466_G },
  },
  '3/4': {
    pipeOutsideDiameter: { inches: PVC_SCHEDULE_40_OD['3/4'], source: D1785 },
    socketDepth: { inches: 0.719, source: D2466_SOCKET },
    ellAndTeeCentreToSocketBottom: { inches: 0.594, source: D2466_G },
  },
  '1': {
    pipeOutsideDiameter: { inches: PVC_SCHEDULE_40_OD['1'], source: D1785 },
    socketDepth: { inches: 0.875, source: D2466_SOCKET },
    ellAndTeeCentreToSocketBottom: { inches: 0.688, source: D2466_G },
  },
}

/** Outside diameter of Schedule 40 PVC pipe of a nominal size, in base units (ASTM D1785). */
export function pvcSchedule40Od(nominal: PvcNominalSize): Length {
  return inches(SCHEDULE_40_FITTINGS_TABLE[nominal].pipeOutsideDiameter.inches)
}

/** The least socket depth of a Schedule 40 PVC socket fitting, in base units (ASTM D2466 socket table). */
export function schedule40SocketDepth(nominal: PvcNominalSize): Length {
  return inches(SCHEDULE_40_FITTINGS_TABLE[nominal].socketDepth.inches)
}

/**
 * How pipe seats in Schedule 40 PVC 90° elbows and tees of a nominal size, from the table: socket
 * depth C and centre to socket bottom G (ASTM D2466; see the module comment for what is from memory).
 */
export function schedule40Fittings(nominal: PvcNominalSize): { elbow: FittingAllowance; tee: FittingAllowance } {
  const row = SCHEDULE_40_FITTINGS_TABLE[nominal]
  const allowance: FittingAllowance = {
    socketDepth: inches(row.socketDepth.inches),
    centreToSocketBottom: inches(row.ellAndTeeCentreToSocketBottom.inches),
  }
  return { elbow: { ...allowance }, tee: { ...allowance } }
}
