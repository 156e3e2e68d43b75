/**
 * The order in which a cutter takes the pieces of one stick off the saw, and how equal pieces fold
 * into runs for the cut sheet and the cut bench.
 *
 * Kitwright's rule (common practice at a chop saw with a stop block):
 * - Longest piece first. The stick left on the saw stays as long as it can for as long as it can,
 *   so it is easier to clamp and support, and a miscut long piece can still be cut down into one of
 *   the shorter pieces that come later. The short pieces come last, from what remains.
 * - Equal lengths one after another, so the stop block is set once per distinct length on a stick
 *   (the fewest moves possible: every distinct length needs at least one setting).
 * - Within one length, pieces of the same cut part and then the same work order stay together, so
 *   they go into one bin in one go.
 * Physically: the squaring trim comes off first; then each cut frees the next piece from the
 * remaining stick and turns one saw width (kerf) into dust, so piece k starts at
 * `trim + Σ(length + kerf)` of the pieces before it.
 * @module
 */

/** A piece placed in saw order: its 1-based cut number and where it starts on the stick. */
export type Sequenced<T> = T & { sequence: number; offset: number }

/**
 * Puts a stick's pieces in saw order (longest first, equal lengths together, then by `groupKey`:
 * cut part, then work order) and gives each its cut number and its offset from the stick's start
 * (after the end trim and the kerf of every earlier cut). Stable: ties keep their given order.
 */
export function sawOrder<T extends { length: number }>(pieces: readonly T[], groupKey: (piece: T) => string, saw: { trim: number; kerf: number }): Sequenced<T>[] {
  const sorted = pieces
    .map((piece, index) => ({ piece, index, key: groupKey(piece) }))
    .sort((a, b) => b.piece.length - a.piece.length || (a.key < b.key ? -1 : a.key > b.key ? 1 : 0) || a.index - b.index)
  let offset = saw.trim
  return sorted.map(({ piece }, i) => {
    const placed = { ...piece, sequence: i + 1, offset }
    offset += piece.length + saw.kerf
    return placed
  })
}

/** A run of consecutive equal pieces: the pieces and the cut numbers they span. */
export interface PieceRun<T> {
  /** Cut number (1-based) of the first piece of the run. */
  from: number
  /** Cut number of the last piece of the run. */
  to: number
  items: T[]
}

/**
 * Folds consecutive pieces that are `same` into runs, numbered 1-based by position in `pieces`
 * (which should already be in saw order).
 */
export function foldRuns<T>(pieces: readonly T[], same: (a: T, b: T) => boolean): PieceRun<T>[] {
  const runs: PieceRun<T>[] = []
  pieces.forEach((piece, i) => {
    const last = runs.at(-1)
    if (last && same(last.items[last.items.length - 1]!, piece)) {
      last.items.push(piece)
      last.to = i + 1
    } else runs.push({ from: i + 1, to: i + 1, items: [piece] })
  })
  return runs
}

/** Cut numbers of a run as printed: `7` or `3–12`. */
export function runNumbers(run: { from: number; to: number }): string {
  return run.from === run.to ? String(run.from) : `${run.from}–${run.to}`
}

/** How many times the stop block is set to cut `lengths` in the given order (one per change of length). */
export function stopSettings(lengths: readonly number[]): number {
  return lengths.filter((l, i) => i === 0 || l !== lengths[i - 1]).length
}

/**
 * Whether two pieces (in saw order) share one row of a cut list: same length, same cut part, same
 * work order — one stop-block setting and one bin.
 */
export function samePieceRow(a: { length: number; cutPartId: string; workOrderId: string }, b: { length: number; cutPartId: string; workOrderId: string }): boolean {
  return a.length === b.length && a.cutPartId === b.cutPartId && a.workOrderId === b.workOrderId
}
