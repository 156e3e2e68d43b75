import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { placeUnderLabels } from './stick-labels'

const opts = { leaderHalf: 1, maxLevels: 4, min: 0, max: 1000 }

describe('numbers under a stick drawing', () => {
  it('alternates two rows for narrow pieces side by side, leaders clear of the numbers', () => {
    const labels = Array.from({ length: 6 }, (_, i) => ({ cx: 5 + i * 10, half: 6 }))
    expect(placeUnderLabels(labels, opts)).toEqual([0, 1, 0, 1, 0, 1])
  })

  it('ends on a row even when every leader would cross a number (pieces narrower than half a number)', () => {
    const labels = Array.from({ length: 40 }, (_, i) => ({ cx: 2 + i * 4, half: 13 }))
    const levels = placeUnderLabels(labels, opts)
    expect(levels).toHaveLength(40)
    // Each number is 26 wide over pieces 4 apart: 7 rows are enough (26 / 4 rounded up), never a staircase.
    expect(Math.max(...levels)).toBeLessThan(7)
  })

  it('never puts two numbers over each other in one row', () => {
    fc.assert(
      fc.property(fc.array(fc.record({ cx: fc.integer({ min: 0, max: 300 }), half: fc.integer({ min: 2, max: 20 }) }), { maxLength: 60 }), (raw) => {
        const labels = [...raw].sort((a, b) => a.cx - b.cx)
        const levels = placeUnderLabels(labels, opts)
        for (let i = 0; i < labels.length; i++) {
          for (let j = i + 1; j < labels.length; j++) {
            if (levels[i] !== levels[j]) continue
            const [p, q] = [labels[i]!, labels[j]!]
            expect(Math.min(opts.max, q.cx + q.half) <= Math.max(0, p.cx - p.half) || Math.max(0, q.cx - q.half) >= Math.min(opts.max, p.cx + p.half)).toBe(true)
          }
        }
      }),
    )
  })
})
