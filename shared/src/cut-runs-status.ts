/** Where a cut run is: planned (draft), frozen and reserved (published), all cut (done), or dropped. */
export const CUT_RUN_STATUSES = ['draft', 'published', 'done', 'cancelled'] as const
/** Where one stick of a cut run is at the saw. */
export const CUT_STICK_STATUSES = ['pending', 'in_progress', 'done', 'damaged'] as const
/** Where one cut is: still to cut, cut (ticked at the bench), or moved to another stick by a re-plan. */
export const CUT_STATUSES = ['pending', 'cut', 'replanned'] as const
/** Whether a bin is on the rack or travelling with a work order. */
export const BIN_STATUSES = ['free', 'in_use'] as const
/** How the engine's plan ended: proven at the bound, good without proof, or stopped by the time limit. */
export const PLAN_STATUSES = ['optimal', 'feasible', 'time-limit'] as const
