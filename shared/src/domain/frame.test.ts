import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import {
  DEMO_COMPACT_6_FRAME,
  DEMO_HALF_INCH_FITTINGS,
  DEMO_TOTE_12_REV_A_FRAME,
  DEMO_TOTE_12_REV_B_FRAME,
  FRAME_CAUTIONS,
  PVC_SCHEDULE_40_OD,
  SCHEDULE_40_FITTINGS_TABLE,
  computeFrame,
  pvcSchedule40Od,
  schedule40Fittings,
  schedule40SocketDepth,
  type FrameInputs,
  type FrameResult,
} from './frame'
import { WATER_ONLY_PRESSURE_TEST_CAUTION } from './safety-cautions'
import { LENGTH_BASE_PER_INCH, formatLength, inches, millimetres, toInches, toMillimetres } from './units'

/** The cut list as { key: [length in inches, quantity] }, for compact comparisons. */
function cuts(result: FrameResult): Record<string, [number, number]> {
  return Object.fromEntries(result.cutList.map((line) => [line.key, [toInches(line.length), line.quantity]]))
}

function codes(result: FrameResult): string[] {
  return result.warnings.map((w) => w.code)
}

// A frame with round numbers, worked by hand below. The pipe OD of exactly 1 in is made up to keep the
// arithmetic readable; the tee's take-off differs from the elbow's so the two cannot be confused.
const HAND_WORKED: FrameInputs = {
  enclosure: { insideWidth: inches(12), insideLength: inches(20), insideHeight: inches(14) },
  recessBelowRim: inches(2),
  wallClearance: inches(0.5),
  pipeOutsideDiameter: inches(1),
  elbow: { socketDepth: inches(0.75), centreToSocketBottom: inches(0.5) },
  tee: { socketDepth: inches(0.75), centreToSocketBottom: inches(0.625) },
  layout: { crossRuns: 2, riserSide: 'long' },
  sprayers: { perLongSide: 0, perShortSide: 2, perCrossRun: 2, minDistanceFromFitting: inches(0.5) },
  riser: { pumpOutletHeight: inches(4), pumpAdapter: { socketDepth: inches(0.75), socketBottomAboveOutlet: inches(0.5) } },
  cutPrecision: inches(1 / 16),
}

describe('outside figures', () => {
  it('Schedule 40 PVC outside diameters agree with the metric pipe table (ASME B36.10M, DN 15/20/25)', () => {
    // Schedule 40 PVC is made to iron pipe size outside diameters (ASTM D1785), the same ODs that
    // ASME B36.10M lists in millimetres for NPS 1/2, 3/4 and 1 (DN 15, 20, 25): 21.3, 26.7 and 33.4 mm
    // (B36.10M's table to 0.1 mm; figures from memory of that table). A different table and unit from
    // the one the code was typed from, so a slip in the code's inch figure shows here.
    expect(Math.abs(toMillimetres(pvcSchedule40Od('1/2')) - 21.3)).toBeLessThanOrEqual(0.05)
    expect(Math.abs(toMillimetres(pvcSchedule40Od('3/4')) - 26.7)).toBeLessThanOrEqual(0.05)
    expect(Math.abs(toMillimetres(pvcSchedule40Od('1')) - 33.4)).toBeLessThanOrEqual(0.05)
    // 1/2 in: 0.840 in × 25.4 mm/in = 21.336 mm, held to the nearest base unit (0.625 µm)
    expect(toMillimetres(pvcSchedule40Od('1/2'))).toBeCloseTo(21.336, 3)
    expect(PVC_SCHEDULE_40_OD['1/2']).toBeCloseTo(21.3 / 25.4, 2) // the inch table agrees with the metric one to 0.01 in
  })

  it('the demo tote is worked from its shape: 12 in up a tote tapering 3-1/2 in over 14 in, it is 3 in wider than its floor', () => {
    // DEMO_TOTE_12_REV_A_ENCLOSURE is 13 × 20-1/2 in on the floor, 16-1/2 × 24 in at the rim, 14 in deep; the
    // manifold sits 2 in below the rim (common practice for tote manifolds, no published source), so
    // 12 in up: width 13 + 3-1/2 × 12/14 = 16 in, length 20-1/2 + 3-1/2 × 12/14 = 23-1/2 in.
    const result = computeFrame(DEMO_TOTE_12_REV_A_FRAME)
    expect(result.derivation).toContain('manifold centreline height = inside height 14" − recess below rim 2" = 12"')
    expect(DEMO_TOTE_12_REV_A_FRAME.enclosure.insideWidth).toBe(inches(16))
    expect(DEMO_TOTE_12_REV_A_FRAME.enclosure.insideLength).toBe(inches(23.5))
  })

  it('the demo 12-site tote, revision A, gives the cut list worked by hand from its inputs', () => {
    // Inputs: inside 16 × 23-1/2 in at the manifold (worked above), 14 in deep, manifold 12 in up,
    // wall clearance 1/2 in, 1/2 in Schedule 40 pipe (OD 0.840 in, so half is 0.42 in), 1/2 in elbows and
    // tees 1/2 in from centre to socket bottom (G of ASTM D2466's ells and tees table, from memory: fittings.ts), four cross
    // runs, riser tee in the middle of the front short side, pump outlet 4-1/2 in up, adapter socket
    // bottom 1/2 in above the outlet, cuts to the nearest 1/16 in.
    //   centreline width  W = 16 − 2 × (0.5 + 0.42) = 14.16 in; length L = 23.5 − 1.84 = 21.66 in
    //   long sides: elbow, four tees, elbow → five spaces of 21.66 ÷ 5 = 4.332 in;
    //     every piece 4.332 − 0.5 − 0.5 = 3.332 in → ×16 = 53.31 → 53/16 = 3-5/16 in (2 elbow–tee + 3 tee–tee per side)
    //   plain short side: 14.16 − 1 = 13.16 in → ×16 = 210.56 → 211/16 = 13-3/16 in
    //   riser short side: two halves of 14.16 ÷ 2 = 7.08 in, cut 6.08 in → ×16 = 97.28 → 97/16 = 6-1/16 in
    //   cross runs: 14.16 − 1 = 13.16 in → 13-3/16 in (×4)
    //   riser: top end 12 − 0.5 = 11.5 in; bottom end 4.5 + 0.5 = 5 in; cut 6-1/2 in
    //   total 10 × 3-5/16 + 13-3/16 + 2 × 6-1/16 + 4 × 13-3/16 + 6-1/2 = 117-11/16 in in 18 pieces
    const result = computeFrame(DEMO_TOTE_12_REV_A_FRAME)
    expect(cuts(result)).toEqual({
      'long:elbow-tee': [3.3125, 4],
      'long:tee-tee': [3.3125, 6],
      'short:elbow-elbow': [13.1875, 1],
      'short:elbow-riser_tee': [6.0625, 2],
      cross: [13.1875, 4],
      riser: [6.5, 1],
    })
    expect(toInches(result.totalCutLength)).toBe(117.6875)
    expect(result.pieceCount).toBe(18)
    // three sprayers on each 14.16 in cross run: every 4.72 in, the first half a space (2.36 in) from the tee's centre
    const holes = result.sprayerHoles.filter((h) => h.run === 'cross run 1')
    expect(holes.map((h) => toInches(h.fromDatum))).toEqual([2.36, 7.08, 11.8].map((x) => expect.closeTo(x, 3)))
  })

  it('a 12-site tote manifold takes about 10 ft of pipe, usually a little more (common practice): 110 to 140 in', () => {
    for (const inputs of [DEMO_TOTE_12_REV_A_FRAME, DEMO_TOTE_12_REV_B_FRAME]) {
      const result = computeFrame(inputs)
      expect(result.ok).toBe(true)
      expect(result.sprayerHoles).toHaveLength(12)
      expect(toInches(result.totalCutLength)).toBeGreaterThanOrEqual(110)
      expect(toInches(result.totalCutLength)).toBeLessThanOrEqual(140)
    }
  })
})

describe('fittings table (ASTM D1785 pipe, ASTM D2466 Schedule 40 socket fittings)', () => {
  it('socket depth C: ASTM D2466 tapered socket table (Table 1, number from memory), socket length min', () => {
    // From memory of ASTM D2466's socket table: 1/2 in 0.688 in, 3/4 in 0.719 in, 1 in 0.875 in. The
    // same figures are printed in ASTM D2468 (ABS Schedule 40 fittings), Table 1 "Tapered Sockets",
    // column C socket length min, for the same iron-pipe-size sockets.
    expect(SCHEDULE_40_FITTINGS_TABLE['1/2'].socketDepth.inches).toBe(0.688)
    expect(SCHEDULE_40_FITTINGS_TABLE['3/4'].socketDepth.inches).toBe(0.719)
    expect(SCHEDULE_40_FITTINGS_TABLE['1'].socketDepth.inches).toBe(0.875)
    // 0.688 in × 40 640 base units per inch = 27 960.32 → 27 960 base units
    expect(schedule40SocketDepth('1/2')).toBe(27_960)
  })

  it('centre to socket bottom G of 90° elbows and tees: ASTM D2466 ells/tees table, from memory', () => {
    // From memory, not checked against a copy: 1/2 in 0.500, 3/4 in 0.594, 1 in 0.688 in.
    expect(SCHEDULE_40_FITTINGS_TABLE['1/2'].ellAndTeeCentreToSocketBottom.inches).toBe(0.5)
    expect(SCHEDULE_40_FITTINGS_TABLE['3/4'].ellAndTeeCentreToSocketBottom.inches).toBe(0.594)
    expect(SCHEDULE_40_FITTINGS_TABLE['1'].ellAndTeeCentreToSocketBottom.inches).toBe(0.688)
    expect(schedule40Fittings('1/2')).toEqual({
      elbow: { socketDepth: inches(0.688), centreToSocketBottom: inches(0.5) },
      tee: { socketDepth: inches(0.688), centreToSocketBottom: inches(0.5) },
    })
  })

  it('every figure names its source, and says so where it is from memory', () => {
    for (const row of Object.values(SCHEDULE_40_FITTINGS_TABLE)) {
      expect(row.pipeOutsideDiameter.source).toMatch(/^ASTM D1785.*from memory/)
      expect(row.socketDepth.source).toMatch(/^ASTM D2466.*from memory/)
      expect(row.ellAndTeeCentreToSocketBottom.source).toMatch(/^ASTM D2466.*from memory/)
    }
  })

  it('the demo kits take their fittings from the table', () => {
    expect(DEMO_HALF_INCH_FITTINGS).toEqual(schedule40Fittings('1/2'))
    expect(DEMO_TOTE_12_REV_A_FRAME.elbow).toEqual(schedule40Fittings('1/2').elbow)
    expect(DEMO_TOTE_12_REV_A_FRAME.tee).toEqual(schedule40Fittings('1/2').tee)
    expect(DEMO_TOTE_12_REV_A_FRAME.pipeOutsideDiameter).toBe(pvcSchedule40Od('1/2'))
    expect(DEMO_TOTE_12_REV_A_FRAME.riser.pumpAdapter.socketDepth).toBe(schedule40SocketDepth('1/2'))
  })

  it("checks the pipe left showing between sockets with the table's socket depth (demo revision A, by hand)", () => {
    // Revision A's 3-5/16 in long-side pieces (worked above) sit 0.688 in into each socket:
    // 3.3125 − 2 × 0.688 = 1.9365 in shows, about 1-15/16 in. The 6-1/2 in riser: 6.5 − 2 × 0.688 = 5.124 in.
    const result = computeFrame(DEMO_TOTE_12_REV_A_FRAME)
    const line = (key: string) => result.cutList.find((l) => l.key === key)?.derivation.at(-1)
    expect(line('long:elbow-tee')).toBe('check: exposed pipe = cut 3-5/16" − elbow socket ≈11/16" − tee socket ≈11/16" = ≈1-15/16" (must not be negative)')
    expect(line('riser')).toBe('check: exposed pipe = cut 6-1/2" − tee socket ≈11/16" − adapter socket ≈11/16" = ≈5-1/8" (must not be negative)')
    expect(toInches(result.cutList[0]!.length - 2 * schedule40SocketDepth('1/2'))).toBeCloseTo(1.9365, 3)
  })
})

describe('hand-worked frame of 3/4 in Schedule 40 fittings from the table', () => {
  // 3/4 in pipe OD 1.050 in (ASTM D1785), sockets 0.719 in deep and G = 0.594 in (ASTM D2466, from
  // memory: see fittings.ts), in a tote 16 × 24 in inside at the manifold, 14 in deep, 2 in recess,
  // 1/2 in clearance, no cross runs, the riser on the front short side, pump outlet 4-1/2 in, adapter
  // socket bottom 1/2 in above it (invented), cuts to the nearest 1/16 in.
  //   centreline width  = 16 − 2 × (0.5 + 0.525) = 13.95 in;  length = 24 − 2.05 = 21.95 in
  //   long sides, elbow to elbow: 21.95 − 2 × 0.594 = 20.762 → ×16 = 332.19 → 332/16 = 20-3/4 in (×2)
  //   back short side: 13.95 − 1.188 = 12.762 → 204.19 → 204/16 = 12-3/4 in
  //   front short side halves: 6.975 − 1.188 = 5.787 → 92.59 → 93/16 = 5-13/16 in (×2)
  //   riser: top 12 − 0.594 = 11.406; bottom 4.5 + 0.5 = 5; 6.406 → 102.496 → 102/16 = 6-3/8 in
  //   exposed pipe on the 5-13/16 in halves: 5.8125 − 2 × 0.719 = 4.3745 in
  const result = computeFrame({
    enclosure: { insideWidth: inches(16), insideLength: inches(24), insideHeight: inches(14) },
    recessBelowRim: inches(2),
    wallClearance: inches(0.5),
    pipeOutsideDiameter: pvcSchedule40Od('3/4'),
    ...schedule40Fittings('3/4'),
    layout: { crossRuns: 0, riserSide: 'short' },
    sprayers: { perLongSide: 0, perShortSide: 0, perCrossRun: 0, minDistanceFromFitting: inches(0.5) },
    riser: { pumpOutletHeight: inches(4.5), pumpAdapter: { socketDepth: schedule40SocketDepth('3/4'), socketBottomAboveOutlet: inches(0.5) } },
    cutPrecision: inches(1 / 16),
  })

  it('gives the hand-worked cut list', () => {
    expect(cuts(result)).toEqual({
      'long:elbow-elbow': [20.75, 2],
      'short:elbow-riser_tee': [5.8125, 2],
      'short:elbow-elbow': [12.75, 1],
      riser: [6.375, 1],
    })
    expect(result.ok).toBe(true)
    const half = result.cutList.find((l) => l.key === 'short:elbow-riser_tee')!
    expect(toInches(half.length - 2 * schedule40SocketDepth('3/4'))).toBeCloseTo(4.3745, 3)
  })
})

describe('hand-worked frame', () => {
  // Centreline rectangle: 12 − 2 × (1/2 + 1/2) = 10 in wide; 20 − 2 = 18 in long.
  // Left long side: elbow at 0, cross tees at 6 and 12 (18 ÷ 3), riser tee at 9 (the middle), elbow at 18.
  //   elbow → tee:       C = 6, cut = 6 − 1/2 − 5/8 = 4-7/8        (×2 on each long side = 4)
  //   tee → riser tee:   C = 3, cut = 3 − 5/8 − 5/8 = 1-3/4        (×2)
  // Right long side: elbow → tee 4-7/8 (×2 counted above); tee → tee C = 6, cut = 6 − 5/4 = 4-3/4 (×1)
  // Short sides: C = 10, cut = 10 − 1/2 − 1/2 = 9                  (×2)
  // Cross runs:  C = 10, cut = 10 − 5/8 − 5/8 = 8-3/4              (×2)
  // Riser: top end 14 − 2 − 5/8 = 11-3/8; bottom end 4 + 1/2 = 4-1/2; cut 6-7/8
  // Total: 4 × 4-7/8 + 2 × 1-3/4 + 4-3/4 + 2 × 9 + 2 × 8-3/4 + 6-7/8 = 70-1/8 in over 12 pieces
  const result = computeFrame(HAND_WORKED)

  it('gives the hand-worked cut list', () => {
    expect(cuts(result)).toEqual({
      'long:elbow-tee': [4.875, 4],
      'long:tee-riser_tee': [1.75, 2],
      'long:tee-tee': [4.75, 1],
      'short:elbow-elbow': [9, 2],
      cross: [8.75, 2],
      riser: [6.875, 1],
    })
    expect(toInches(result.totalCutLength)).toBe(70.125)
    expect(result.pieceCount).toBe(12)
    expect(result.ok).toBe(true)
  })

  it('labels every piece for the cutter', () => {
    expect(result.cutList.map((line) => line.label)).toEqual([
      'long side segment (elbow to tee)',
      'long side segment (tee to riser tee)',
      'long side segment (tee to tee)',
      'short side segment (elbow to elbow)',
      'cross run',
      'riser',
    ])
  })

  it('shows the arithmetic line by line', () => {
    const line = (key: string) => result.cutList.find((l) => l.key === key)?.derivation
    expect(result.derivation.slice(0, 3)).toEqual([
      'centreline width = inside width 12" − 2 × (wall clearance 1/2" + half pipe OD 1/2") = 10"',
      'centreline length = inside length 20" − 2 × (wall clearance 1/2" + half pipe OD 1/2") = 18"',
      'manifold centreline height = inside height 14" − recess below rim 2" = 12"',
    ])
    expect(line('long:elbow-tee')).toEqual([
      'centre-to-centre = centreline length 18" ÷ 3 = 6"',
      'cut = centre-to-centre 6" − elbow centre-to-socket-bottom 1/2" − tee centre-to-socket-bottom 5/8" = 4-7/8"',
      'check: exposed pipe = cut 4-7/8" − elbow socket 3/4" − tee socket 3/4" = 3-3/8" (must not be negative)',
    ])
    expect(line('long:tee-riser_tee')).toEqual([
      'centre-to-centre = centreline length 18" ÷ 6 = 3"',
      'cut = centre-to-centre 3" − 2 × tee centre-to-socket-bottom 5/8" = 1-3/4"',
      'check: exposed pipe = cut 1-3/4" − 2 × tee socket 3/4" = 1/4" (must not be negative)',
    ])
    expect(line('cross')?.[0]).toBe('centre-to-centre = centreline width 10"')
    expect(line('riser')).toEqual([
      'top end = manifold centreline height 12" − tee centre-to-socket-bottom 5/8" = 11-3/8"',
      'bottom end = pump outlet height 4" + adapter socket bottom above the outlet 1/2" = 4-1/2"',
      'cut = top end 11-3/8" − bottom end 4-1/2" = 6-7/8"',
      'check: exposed pipe = cut 6-7/8" − tee socket 3/4" − adapter socket 3/4" = 5-3/8" (must not be negative)',
    ])
  })

  it('spaces the sprayer holes evenly along each run, from a stated datum', () => {
    // Short side, 10 in between elbow centres, 2 sprayers: one every 5 in, the first 2-1/2 in from the
    // left elbow's centre; on the cut piece that is 2-1/2 − 1/2 (elbow take-off) = 2 in from its end.
    const front = result.sprayerHoles.filter((h) => h.run === 'front short side')
    expect(front.map((h) => toInches(h.fromDatum))).toEqual([2.5, 7.5])
    expect(front.map((h) => toInches(h.fromPieceEnd))).toEqual([2, 7])
    expect(front[0]?.datum).toBe('the centre of the left corner elbow')
    expect(front[0]?.piece).toBe('short side segment (elbow to elbow)')
    // Cross runs: 10 in between tee centres → 2-1/2 and 7-1/2 in; 2-1/2 − 5/8 = 1-7/8 in from the piece end
    const cross = result.sprayerHoles.filter((h) => h.run === 'cross run 2')
    expect(cross.map((h) => toInches(h.fromPieceEnd))).toEqual([1.875, 6.875])
    expect(result.sprayerHoles).toHaveLength(2 * 2 + 2 * 2)
    expect(result.derivation[3]).toBe(
      'sprayer holes on each short side: 2 evenly spaced, every centreline width 10" ÷ 2 = 5", the first half a space (2-1/2") from the centre of the left corner elbow: 2-1/2", 7-1/2"',
    )
  })

  it('cautions about the short pieces, and carries the safety cautions', () => {
    expect(result.warnings).toEqual([
      {
        code: 'short_piece',
        severity: 'caution',
        message:
          'The long side segment (tee to riser tee) is only 1-3/4": cut it from a longer piece held in a clamp, or with a ratchet pipe cutter, and keep fingers clear of the blade.',
      },
    ])
    expect(result.cautions).toBe(FRAME_CAUTIONS)
    expect(FRAME_CAUTIONS.join(' ')).toMatch(/eye protection/)
    expect(FRAME_CAUTIONS.join(' ')).toMatch(/ground-fault protected/)
    expect(FRAME_CAUTIONS.join(' ')).toMatch(/Local electrical codes and licensed practice/)
    // Common practice; the warning PVC pipe and fitting makers print (water only, never compressed air or gas).
    expect(FRAME_CAUTIONS).toContain(WATER_ONLY_PRESSURE_TEST_CAUTION)
    expect(WATER_ONLY_PRESSURE_TEST_CAUTION).toMatch(/^Test with water only — never compressed air or gas/)
  })

  it('writes the derivation in millimetres for a metric shop', () => {
    const metric = computeFrame(HAND_WORKED, { unit: 'mm' })
    expect(metric.derivation[0]).toBe('centreline width = inside width 304.8 mm − 2 × (wall clearance 12.7 mm + half pipe OD 12.7 mm) = 254.0 mm')
    expect(metric.cutList).toEqual(result.cutList.map((l) => ({ ...l, derivation: expect.any(Array) })))
  })

  it('rounds cut lengths to the cut precision and says so', () => {
    // 0.5 mm precision: the 4-7/8 in piece is 123.825 mm → 124.0 mm (248 half-millimetres)
    const metric = computeFrame({ ...HAND_WORKED, cutPrecision: millimetres(0.5) }, { unit: 'mm' })
    const piece = metric.cutList.find((l) => l.key === 'long:elbow-tee')
    expect(piece?.length).toBe(millimetres(124))
    expect(piece?.derivation).toContain('rounded to the nearest 0.50 mm: 124.0 mm')
  })
})

describe('demo kits', () => {
  it('revision B, in a tote 1 in wider, changes only the pieces that span the width', () => {
    const a = cuts(computeFrame(DEMO_TOTE_12_REV_A_FRAME))
    const b = cuts(computeFrame(DEMO_TOTE_12_REV_B_FRAME))
    expect(b['long:elbow-tee']).toEqual(a['long:elbow-tee'])
    expect(b['long:tee-tee']).toEqual(a['long:tee-tee'])
    expect(b['riser']).toEqual(a['riser'])
    // +1 in of centreline width: cross runs and the plain short side +1 in, the two riser halves +1/2 in
    expect(b['cross']?.[0]).toBe((a['cross']?.[0] ?? 0) + 1)
    expect(b['short:elbow-elbow']?.[0]).toBe((a['short:elbow-elbow']?.[0] ?? 0) + 1)
    expect(b['short:elbow-riser_tee']?.[0]).toBe((a['short:elbow-riser_tee']?.[0] ?? 0) + 0.5)
  })

  it('the compact 6-site kit has 6 sprayer holes and builds without errors', () => {
    const result = computeFrame(DEMO_COMPACT_6_FRAME)
    expect(result.ok).toBe(true)
    expect(result.sprayerHoles).toHaveLength(6)
    expect(result.warnings).toEqual([])
  })

  it('every demo cut list has one length per label, and whole sixteenths', () => {
    for (const inputs of [DEMO_TOTE_12_REV_A_FRAME, DEMO_TOTE_12_REV_B_FRAME, DEMO_COMPACT_6_FRAME]) {
      const lines = computeFrame(inputs).cutList
      expect(new Set(lines.map((l) => l.label)).size).toBe(lines.length)
      for (const line of lines) expect(line.length % (LENGTH_BASE_PER_INCH / 16)).toBe(0)
    }
  })
})

describe('impossible inputs give clear errors', () => {
  it('a tote too narrow for the clearance and pipe', () => {
    const result = computeFrame({ ...HAND_WORKED, enclosure: { ...HAND_WORKED.enclosure, insideWidth: inches(2) } })
    expect(result.ok).toBe(false)
    expect(result.cutList).toEqual([])
    expect(result.warnings[0]?.message).toBe(
      'The tote is too narrow: the wall clearance and pipe take 2" of its 2" inside width. Check the inside width, or reduce the clearance.',
    )
  })

  it('so many cross runs that the fittings collide', () => {
    // 18 in ÷ 12 = 1-1/2 in between fitting centres; tee to tee cut = 1-1/2 − 5/4 = 1/4 in, but the
    // two sockets take 1-1/2 in (elbow to tee likewise: 1-1/2 − 1/2 − 5/8 = 3/8 in)
    const result = computeFrame({
      ...HAND_WORKED,
      layout: { crossRuns: 11, riserSide: 'short' },
      sprayers: { ...HAND_WORKED.sprayers, perShortSide: 0 },
    })
    expect(result.ok).toBe(false)
    expect(result.warnings.filter((w) => w.code === 'too_short_for_sockets').map((w) => w.message)).toContain(
      'The long side segment (tee to tee) is 1/4", shorter than its two sockets take (1-1/2"): the fittings would run into each other. Use fewer cross runs, a larger tote, or (for the riser) a lower pump or a higher manifold.',
    )
  })

  it('a negative length', () => {
    // 18 in ÷ 21 = 6/7 in between tee centres, less 2 × 5/8 in = −0.39 in (elbow to tee: −0.27 in)
    const result = computeFrame({
      ...HAND_WORKED,
      layout: { crossRuns: 20, riserSide: 'short' },
      sprayers: { ...HAND_WORKED.sprayers, perShortSide: 0 },
    })
    expect(codes(result)).toContain('negative_length')
    const messages = result.warnings.filter((w) => w.code === 'negative_length').map((w) => w.message)
    expect(messages).toHaveLength(2)
    expect(messages[0]).toMatch(/^The long side segment \(elbow to tee\) comes out at ≈-1\/4": the fittings need more room/)
    expect(messages[1]).toMatch(/^The long side segment \(tee to tee\) comes out at ≈-3\/8": the fittings need more room/)
  })

  it('a pump too tall for the manifold height', () => {
    const result = computeFrame({
      ...HAND_WORKED,
      riser: { ...HAND_WORKED.riser, pumpOutletHeight: inches(11) },
    })
    // top end 11-3/8, bottom end 11-1/2: −1/8 in
    expect(result.warnings.map((w) => w.message)).toContain(
      'The riser comes out at -1/8": the fittings need more room than the layout leaves. Use fewer cross runs, a larger tote, less wall clearance, or (for the riser) a lower pump or a higher manifold.',
    )
  })

  it('a riser tee on the long side where the middle cross-run tee is', () => {
    const result = computeFrame({ ...HAND_WORKED, layout: { crossRuns: 3, riserSide: 'long' } })
    expect(codes(result)).toEqual(['riser_on_cross_tee'])
    expect(result.warnings[0]?.message).toMatch(/Use an even number of cross runs, or put the riser on a short side/)
  })

  it('a sprayer hole inside or too close to a fitting', () => {
    // 4 sprayers on a 10 in cross run: the first at 1-1/4 in from the tee centre, but the tee's
    // socket mouth is at 5/8 + 3/4 = 1-3/8 in
    const result = computeFrame({ ...HAND_WORKED, sprayers: { ...HAND_WORKED.sprayers, perCrossRun: 4 } })
    expect(result.warnings.filter((w) => w.code === 'hole_too_close_to_fitting').map((w) => w.message)).toEqual([
      `On the cross run 1, sprayer holes 1, 4 would be within 1/2" of a fitting's socket mouth (or inside the fitting). Change the number of sprayers on this run or the number of cross runs.`,
      `On the cross run 2, sprayer holes 1, 4 would be within 1/2" of a fitting's socket mouth (or inside the fitting). Change the number of sprayers on this run or the number of cross runs.`,
    ])
    // a sprayer in the middle of the short side carrying the riser tee lands on the tee
    const onRiser = computeFrame({
      ...HAND_WORKED,
      layout: { crossRuns: 2, riserSide: 'short' },
      sprayers: { ...HAND_WORKED.sprayers, perShortSide: 1 },
    })
    expect(onRiser.warnings.map((w) => w.message)).toContain(
      `On the front short side, sprayer hole 1 would be within 1/2" of a fitting's socket mouth (or inside the fitting). Change the number of sprayers on this run or the number of cross runs.`,
    )
  })

  it('unreadable inputs say which field to fix', () => {
    const result = computeFrame({
      ...HAND_WORKED,
      wallClearance: -1,
      pipeOutsideDiameter: Number.NaN,
      layout: { crossRuns: 1.5, riserSide: 'long' },
    })
    expect(result.ok).toBe(false)
    expect(result.warnings.map((w) => w.message)).toEqual([
      'The wall clearance cannot be negative.',
      'Enter the pipe outside diameter as a length.',
      'The number of cross runs must be a whole number from 0 to 20.',
    ])
    expect(computeFrame({ ...HAND_WORKED, enclosure: { ...HAND_WORKED.enclosure, insideWidth: inches(21) } }).warnings[0]?.message).toBe(
      'The inside width (21") is more than the inside length (20"): enter the shorter side as the width.',
    )
    expect(computeFrame({ ...HAND_WORKED, recessBelowRim: inches(14) }).warnings[0]?.message).toBe(
      'The recess below the rim (14") must be less than the inside height (14").',
    )
  })
})

describe('properties', () => {
  const arbitraryInputs = fc
    .record({
      width: fc.integer({ min: inches(6), max: inches(30) }),
      extra: fc.integer({ min: 0, max: inches(20) }),
      height: fc.integer({ min: inches(6), max: inches(24) }),
      crossRuns: fc.integer({ min: 0, max: 6 }),
      riserSide: fc.constantFrom('long' as const, 'short' as const),
      perLongSide: fc.integer({ min: 0, max: 6 }),
      perShortSide: fc.integer({ min: 0, max: 4 }),
      perCrossRun: fc.integer({ min: 0, max: 5 }),
      precision: fc.constantFrom(inches(1 / 16), inches(1 / 32), millimetres(0.5), millimetres(1)),
    })
    .map(
      (r): FrameInputs => ({
        ...DEMO_TOTE_12_REV_A_FRAME,
        enclosure: { insideWidth: r.width, insideLength: r.width + r.extra, insideHeight: r.height },
        layout: { crossRuns: r.crossRuns, riserSide: r.riserSide },
        sprayers: {
          ...DEMO_TOTE_12_REV_A_FRAME.sprayers,
          perLongSide: r.perLongSide,
          perShortSide: r.perShortSide,
          perCrossRun: r.perCrossRun,
        },
        cutPrecision: r.precision,
      }),
    )

  it('every piece plus its two take-offs spans its centre-to-centre, within the rounding', () => {
    let withCutList = 0
    fc.assert(
      fc.property(arbitraryInputs, (inputs) => {
        const result = computeFrame(inputs)
        const od = inputs.pipeOutsideDiameter
        const width = inputs.enclosure.insideWidth - 2 * inputs.wallClearance - od
        const length = inputs.enclosure.insideLength - 2 * inputs.wallClearance - od
        const e = DEMO_HALF_INCH_FITTINGS.tee.centreToSocketBottom // elbow and tee are alike in the demo
        const half = inputs.cutPrecision / 2 + 1
        // No cut list only where the inputs are refused, with an error that says why.
        if (result.cutList.length === 0) {
          expect(result.ok).toBe(false)
          expect(result.warnings.some((w) => w.severity === 'error')).toBe(true)
          return
        }
        withCutList++
        // four corner-to-corner sides: sum of (cut + 2e) over the pieces of a side = the side's span
        // (both sides of a pair are summed together, hence ÷ 2)
        const perSide = (prefix: string) =>
          result.cutList.filter((l) => l.key.startsWith(prefix)).reduce((sum, l) => sum + l.quantity * (l.length + 2 * e), 0) / 2
        const longPieces = result.cutList.filter((l) => l.key.startsWith('long:')).reduce((n, l) => n + l.quantity, 0)
        const shortPieces = result.cutList.filter((l) => l.key.startsWith('short:')).reduce((n, l) => n + l.quantity, 0)
        expect(Math.abs(perSide('long:') - length)).toBeLessThanOrEqual((longPieces / 2) * half)
        expect(Math.abs(perSide('short:') - width)).toBeLessThanOrEqual((shortPieces / 2) * half)
        const cross = result.cutList.find((l) => l.key === 'cross')
        if (cross) {
          expect(cross.quantity).toBe(inputs.layout.crossRuns)
          expect(Math.abs(cross.length + 2 * e - width)).toBeLessThanOrEqual(half)
        }
        const s = inputs.sprayers
        expect(result.sprayerHoles).toHaveLength(2 * s.perLongSide + 2 * s.perShortSide + inputs.layout.crossRuns * s.perCrossRun)
        expect(result.ok).toBe(!result.warnings.some((w) => w.severity === 'error'))
      }),
      { numRuns: 200 },
    )
    // The sums above were checked on most of the runs, not skipped (totes from 6 in wide mostly fit).
    expect(withCutList).toBeGreaterThan(100)
  })

  it('never throws on arbitrary numbers, and explains every refusal', () => {
    const anyNumber = fc.oneof(fc.integer({ min: -inches(50), max: inches(50) }), fc.double())
    fc.assert(
      fc.property(anyNumber, anyNumber, anyNumber, fc.integer({ min: -2, max: 30 }), (w, l, clearance, crossRuns) => {
        const result = computeFrame({
          ...HAND_WORKED,
          enclosure: { ...HAND_WORKED.enclosure, insideWidth: w, insideLength: l },
          wallClearance: clearance,
          layout: { crossRuns, riserSide: 'short' },
        })
        if (!result.ok) expect(result.warnings.some((x) => x.severity === 'error' && x.message.length > 20)).toBe(true)
        for (const line of result.cutList) expect(formatLength(line.length, 'in')).toMatch(/"$/)
      }),
    )
  })
})
