/** A number to place under a stick drawing: the centre of its piece and its half width (with padding). */
export interface UnderLabel {
  cx: number
  half: number
}

/**
 * Rows under a stick drawing for the numbers of pieces too narrow to hold theirs, used by the
 * screens and the cut sheet alike. Each number goes in the first of `maxLevels` rows where it
 * overlaps nothing and its leader line (from the stick down to it) crosses no number in a row
 * above. Where pieces are so narrow that no such row exists, it goes in the first row where it
 * overlaps no other number; its leader then passes behind numbers above it, which the drawings
 * print on a paper-white halo. Returns each label's row (0 = just under the stick).
 */
export function placeUnderLabels(labels: readonly UnderLabel[], opts: { leaderHalf: number; maxLevels: number; min: number; max: number }): number[] {
  const numbers: [number, number][][] = []
  const leaders: [number, number][][] = []
  const clear = (list: [number, number][][], level: number, a: number, b: number) => (list[level] ?? []).every(([s, e]) => b <= s || a >= e)
  const add = (list: [number, number][][], level: number, a: number, b: number) => (list[level] ??= []).push([a, b])
  return labels.map(({ cx, half }) => {
    const a = Math.max(opts.min, cx - half)
    const b = Math.min(opts.max, cx + half)
    const leaderClear = (level: number) => {
      for (let l = 0; l < level; l++) if (!clear(numbers, l, cx - opts.leaderHalf, cx + opts.leaderHalf)) return false
      return true
    }
    let chosen = -1
    for (let level = 0; level < opts.maxLevels && chosen < 0; level++) if (clear(numbers, level, a, b) && clear(leaders, level, a, b) && leaderClear(level)) chosen = level
    // Rows are unbounded in number, so some row is always free of numbers.
    for (let level = 0; chosen < 0; level++) if (clear(numbers, level, a, b)) chosen = level
    add(numbers, chosen, a, b)
    for (let l = 0; l < chosen; l++) add(leaders, l, cx - opts.leaderHalf, cx + opts.leaderHalf)
    return chosen
  })
}
