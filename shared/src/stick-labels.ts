/** A number to place under a stick drawing: the centre of its piece and its half width (with padding). */
export interface UnderLabel {
  cx: number
  half: number
}

/**
 * Rows under a stick drawing for the numbers of pieces too narrow to hold theirs, used by the
 * screens and the cut sheet alike. Each number goes in the first row where it overlaps no other
 * number and its leader line (from the stick down to it) crosses no number in a row above; when
 * no row within `maxLevels` allows that, in the first row where the number itself fits (its leader
 * may then pass behind a number). Returns each label's row (0 = just under the stick).
 */
export function placeUnderLabels(labels: readonly UnderLabel[], opts: { leaderHalf: number; maxLevels: number; min: number; max: number }): number[] {
  const taken: [number, number][][] = []
  const free = (level: number, a: number, b: number) => (taken[level] ?? []).every(([s, e]) => b <= s || a >= e)
  const take = (level: number, a: number, b: number) => (taken[level] ??= []).push([a, b])
  return labels.map(({ cx, half }) => {
    const a = Math.max(opts.min, cx - half)
    const b = Math.min(opts.max, cx + half)
    const leaderClear = (level: number) => {
      for (let l = 0; l < level; l++) if (!free(l, cx - opts.leaderHalf, cx + opts.leaderHalf)) return false
      return true
    }
    let chosen = -1
    for (let level = 0; level < opts.maxLevels && chosen < 0; level++) if (free(level, a, b) && leaderClear(level)) chosen = level
    // Rows are unbounded in number, so some row is always free for the number itself.
    for (let level = 0; chosen < 0; level++) if (free(level, a, b)) chosen = level
    take(chosen, a, b)
    for (let l = 0; l < chosen; l++) take(l, cx - opts.leaderHalf, cx + opts.leaderHalf)
    return chosen
  })
}
