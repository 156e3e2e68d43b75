import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { foldRuns, runNumbers, sawOrder, stopSettings } from './saw-order'
import { inches } from './units'

const saw = { trim: inches(1 / 4), kerf: inches(1 / 8) }
const piece = (length: number, part: string, wo: string) => ({ length, part, wo })
const key = (p: { part: string; wo: string }) => `${p.part}|${p.wo}`

describe('saw order', () => {
  it('cuts the longest first, equal lengths together, then by cut part and work order', () => {
    // Longest first with equal lengths grouped is common practice at a chop saw with a stop block.
    const given = [
      piece(inches(4), 'arm', 'W2'),
      piece(inches(11), 'riser', 'W1'),
      piece(inches(4), 'arm', 'W1'),
      piece(inches(4), 'tee', 'W1'),
      piece(inches(11), 'riser', 'W2'),
      piece(inches(4), 'arm', 'W2'),
    ]
    const out = sawOrder(given, key, saw)
    expect(out.map((p) => [p.length / inches(1), p.part, p.wo])).toEqual([
      [11, 'riser', 'W1'],
      [11, 'riser', 'W2'],
      [4, 'arm', 'W1'],
      [4, 'arm', 'W2'],
      [4, 'arm', 'W2'],
      [4, 'tee', 'W1'],
    ])
    expect(out.map((p) => p.sequence)).toEqual([1, 2, 3, 4, 5, 6])
  })

  it('places each piece after the trim and every earlier piece plus one kerf (worked by hand)', () => {
    // By hand, in inches: trim 1/4; piece 1 (11) at 1/4; piece 2 (11) at 1/4 + 11 + 1/8 = 11 3/8;
    // piece 3 (4) at 11 3/8 + 11 1/8 = 22 1/2; piece 4 (4) at 22 1/2 + 4 1/8 = 26 5/8.
    const out = sawOrder([piece(inches(4), 'a', 'x'), piece(inches(11), 'b', 'x'), piece(inches(4), 'a', 'x'), piece(inches(11), 'b', 'x')], key, saw)
    expect(out.map((p) => p.offset)).toEqual([inches(1 / 4), inches(11 + 3 / 8), inches(22 + 1 / 2), inches(26 + 5 / 8)])
  })

  it('on any stick: every piece kept, lengths never grow, offsets follow trim + pieces + kerfs, and the stop block is set once per distinct length', () => {
    fc.assert(
      fc.property(fc.array(
        fc.record({ length: fc.integer({ min: 1, max: 6 }).map((n) => n * inches(1)), part: fc.constantFrom('a', 'b'), wo: fc.constantFrom('W1', 'W2', 'W3') }),
        { maxLength: 30 },
      ), (pieces) => {
        const out = sawOrder(pieces, key, saw)
        expect(out).toHaveLength(pieces.length)
        expect([...out.map((p) => p.length)].sort()).toEqual([...pieces.map((p) => p.length)].sort())
        let at = saw.trim
        out.forEach((p, i) => {
          if (i > 0) expect(p.length).toBeLessThanOrEqual(out[i - 1]!.length)
          expect(p.offset).toBe(at)
          at += p.length + saw.kerf
        })
        expect(stopSettings(out.map((p) => p.length))).toBe(new Set(pieces.map((p) => p.length)).size)
      }),
    )
  })
})

describe('runs of equal pieces', () => {
  it('folds consecutive equal pieces and numbers them by cut number', () => {
    const runs = foldRuns(['a', 'a', 'b', 'a', 'a', 'a'], (x, y) => x === y)
    expect(runs.map((r) => [runNumbers(r), r.items.length])).toEqual([
      ['1–2', 2],
      ['3', 1],
      ['4–6', 3],
    ])
    expect(foldRuns([], () => true)).toEqual([])
  })
})
