import { describe, expect, it } from 'vitest'
import { computeFrame } from '@kitwright/shared/domain/frame'
import { formatLengthForInput, parseLength, toMillimetres, type LengthUnit } from '@kitwright/shared/domain/units'
import { RevisionContentSchema, type RevisionDetail } from '@kitwright/shared/kits'
import { fieldKey, formFieldFor, frameInputsFrom, toContent, toFormValues, toteFrom, type RevisionFormValues } from './revision-form-model'

// The revision editor's model: what a planner types (lengths like 18 1/2, pressures in psi, water in
// litres) to the API's integers (base length units, pascals, millilitres) and back. Expected values
// are worked by hand below, with the unit factors' sources named:
// - 1 in = 25.4 mm exactly (international inch, 1959; NIST SP 811 Appendix B).
// - 1 psi = 6.894 757 kPa (NIST SP 811 Appendix B.8).
// - 1 L = 1000 mL (SI).

const parseIn = (text: string) => parseLength(text, 'in')
const formatFor = (unit: LengthUnit) => (v: number) => formatLengthForInput(v, unit)
/** A length typed in a unit, as the API stores it (parsing is tested in shared/src/domain/units.test.ts). */
const len = (text: string) => {
  const r = parseLength(text, 'in')
  if (!r.ok) throw new Error(r.message)
  return r.value
}

const PIPE = '0c8a3f3e-4a55-4a4c-9a61-5c1e2b9d7f01'
const SPRAYER = '1d9b4f4f-5b66-4b5d-8b72-6d2f3cae8012'
const part = (sku: string, kind: 'stock_length' | 'hardware') => ({ sku, name: sku, kind, unitCostCents: 100, weightGrams: 10 })

/** A revision as the API sends it, typed by hand: the demo 12-site tote's frame as a planner would enter it. */
const REVISION: RevisionDetail = {
  id: '2e0c5a50-6c77-4c6e-9c83-7e3f4dbf9123',
  kit: { id: '3f1d6b61-7d88-4d7f-8d94-8f4a5ec0a234', sku: 'MW-TOTE-12', name: 'Mistwell 12-site tote' },
  code: 'A',
  status: 'draft',
  notes: 'First run',
  frame: {
    pipePartId: PIPE,
    inputs: {
      enclosure: { insideWidth: len('16'), insideLength: len('23 1/2'), insideHeight: len('14') },
      recessBelowRim: len('2'),
      wallClearance: len('1/2'),
      pipeOutsideDiameter: len('0.840 in'),
      elbow: { socketDepth: len('0.688 in'), centreToSocketBottom: len('1/2') },
      tee: { socketDepth: len('0.688 in'), centreToSocketBottom: len('1/2') },
      layout: { crossRuns: 4, riserSide: 'short' },
      sprayers: { perLongSide: 0, perShortSide: 0, perCrossRun: 3, minDistanceFromFitting: len('1/2') },
      riser: { pumpOutletHeight: len('4 1/2'), pumpAdapter: { socketDepth: len('0.688 in'), socketBottomAboveOutlet: len('1/2') } },
      cutPrecision: len('1/16'),
    },
    tote: { topInsideWidth: len('16 1/2'), topInsideLength: len('24'), bottomInsideWidth: len('13'), bottomInsideLength: len('20 1/2'), insideHeight: len('14') },
  },
  // 5 psi to hold, 7 psi at most, 10 minutes, 0.5 psi drop allowed, 8 L of water.
  leakTest: { minPressurePa: 34_474, maxPressurePa: 48_263, holdMinutes: 10, maxDropPa: 3447, waterVolumeMl: 8000 },
  bomLines: [{ id: '4a2e7c72-8e99-4e80-9ea5-9a5b6fd1b345', partId: SPRAYER, part: part('SPR-360', 'hardware'), quantity: 12, note: null }],
  cutParts: [
    {
      id: '5b3f8d83-9faa-4f91-afb6-ab6c70e2c456',
      partId: PIPE,
      part: part('PVC-050', 'stock_length'),
      label: 'cross run',
      length: len('13 3/16'),
      quantity: 4,
      frameKey: 'cross',
      calculatedLength: len('13 3/16'),
      overrideReason: null,
    },
  ],
  buildSteps: [
    {
      id: '6c4a9e94-a0bb-4aa2-b0c7-bc7d81f3d567',
      position: 1,
      text: 'Leak test the manifold',
      caution: 'Water only, never compressed air',
      photoRequired: true,
      measurementRequired: true,
      measurementUnit: 'psi',
      measurementMin: 4.5,
      measurementMax: 5.5,
      freeOrder: false,
      outOfLimitsRework: true,
    },
  ],
  rollup: { costCents: 0, weightGrams: 0, cutLength: 0, stickLengthUsed: 0, pieceCount: 0, problems: [] },
  releasedAt: null,
  releasedBy: null,
  createdAt: '2026-03-01T00:00:00Z',
  updatedAt: '2026-03-01T00:00:00Z',
}

describe('revision form model: from the API to the form', () => {
  const values = toFormValues(REVISION, formatFor('in'))

  it('shows lengths as a planner types them: fractions of an inch, decimals where no 64th fits', () => {
    // 23-1/2 in is a whole number of 64ths; 0.840 in (1/2 in Schedule 40 PVC OD, ASTM D1785, from memory) is not.
    expect(values.frame.inputs[fieldKey('enclosure.insideLength')]).toBe('23-1/2"')
    expect(values.frame.inputs[fieldKey('pipeOutsideDiameter')]).toBe('0.84 in')
    expect(values.frame.inputs[fieldKey('cutPrecision')]).toBe('1/16"')
    expect(values.frame.inputs[fieldKey('layout.crossRuns')]).toBe('4')
    expect(values.frame.tote.bottomInsideLength).toBe('20-1/2"')
    expect(values.cutParts[0]?.length).toBe('13-3/16"')
  })

  it('shows the leak test in psi and litres', () => {
    // 34 474 Pa ÷ 6894.757 Pa/psi = 5.0001 → 5; 48 263 ÷ 6894.757 = 7.0000 → 7; 3447 ÷ 6894.757 = 0.49995 → 0.5; 8000 mL = 8 L
    expect(values.leakTest).toEqual({ pressureUnit: 'psi', minPressure: '5', maxPressure: '7', holdMinutes: '10', maxDrop: '0.5', waterLitres: '8' })
  })

  it('starts an empty revision with no frame, no leak test, and zero counts', () => {
    const empty = toFormValues({ ...REVISION, notes: null, frame: null, leakTest: null, bomLines: [], cutParts: [], buildSteps: [] }, formatFor('in'))
    expect(empty.hasFrame).toBe(false)
    expect(empty.hasLeakTest).toBe(false)
    expect(empty.notes).toBe('')
    expect(empty.frame.inputs[fieldKey('sprayers.perCrossRun')]).toBe('0')
    expect(empty.frame.inputs[fieldKey('wallClearance')]).toBe('')
    expect(empty.frame.riserSide).toBe('short')
  })
})

describe('revision form model: from the form back to the API', () => {
  it('gives back exactly what came in, in inches and in millimetres, and the API accepts it', () => {
    for (const unit of ['in', 'mm'] as const) {
      const values = toFormValues(REVISION, formatFor(unit))
      const back = toContent(values, (text) => parseLength(text, unit))
      expect(back.errors).toEqual({})
      const { notes, frame, leakTest, bomLines, cutParts, buildSteps } = REVISION
      expect(back.value).toEqual({
        notes,
        frame,
        leakTest,
        bomLines: bomLines.map(({ partId, quantity, note }) => ({ partId, quantity, note })),
        cutParts: cutParts.map(({ partId, label, length, quantity, frameKey, overrideReason }) => ({ partId, label, length, quantity, frameKey, overrideReason })),
        buildSteps: buildSteps.map(({ id: _id, position: _p, ...s }) => s),
      })
      expect(RevisionContentSchema.safeParse(back.value).success).toBe(true)
    }
  })

  it('reads what a planner types into the frame calculator: 18 1/2, 0.840 in, 108 mm', () => {
    const values = toFormValues(REVISION, formatFor('in'))
    values.frame.inputs[fieldKey('enclosure.insideLength')] = '18 1/2'
    values.frame.inputs[fieldKey('pipeOutsideDiameter')] = '0.840 in'
    values.frame.inputs[fieldKey('riser.pumpOutletHeight')] = '108 mm'
    const { value, errors } = frameInputsFrom(values.frame, parseIn)
    expect(errors).toEqual({})
    // 18.5 in × 25.4 = 469.9 mm; 0.840 in × 25.4 = 21.336 mm
    expect(toMillimetres(value!.enclosure.insideLength)).toBeCloseTo(469.9, 6)
    expect(toMillimetres(value!.pipeOutsideDiameter)).toBeCloseTo(21.336, 3)
    expect(toMillimetres(value!.riser.pumpOutletHeight)).toBe(108)
    expect(value!.layout).toEqual({ crossRuns: 4, riserSide: 'short' })
  })

  it('feeds the live calculator: the typed demo frame gives the cut list worked by hand in frame.test.ts', () => {
    const values = toFormValues(REVISION, formatFor('in'))
    const inputs = frameInputsFrom(values.frame, parseIn).value!
    const cross = computeFrame(inputs).cutList.find((l) => l.key === 'cross')
    // 16 − 2 × (1/2 + 0.42) = 14.16 in between tee centres, less 2 × 1/2 in → 13.16 → 13-3/16 in (nearest 1/16)
    expect(cross && toMillimetres(cross.length)).toBeCloseTo((13 + 3 / 16) * 25.4, 6)
    expect(cross?.quantity).toBe(4)
  })

  it('converts pressures from psi or kPa, and litres to millilitres', () => {
    const values = toFormValues(REVISION, formatFor('in'))
    values.leakTest = { pressureUnit: 'psi', minPressure: '2.5', maxPressure: '10', holdMinutes: '15', maxDrop: '0', waterLitres: '12.5' }
    // 2.5 psi × 6894.757 Pa/psi = 17 236.9 → 17 237 Pa; 10 psi = 68 947.6 → 68 948 Pa; 12.5 L = 12 500 mL
    expect(toContent(values, parseIn).value?.leakTest).toEqual({ minPressurePa: 17_237, maxPressurePa: 68_948, holdMinutes: 15, maxDropPa: 0, waterVolumeMl: 12_500 })
    values.leakTest = { ...values.leakTest, pressureUnit: 'kPa', minPressure: '34.5', maxPressure: '48' }
    expect(toContent(values, parseIn).value?.leakTest).toMatchObject({ minPressurePa: 34_500, maxPressurePa: 48_000 })
  })

  it('leaves out what is switched off: no frame, no leak test, no measurement limits', () => {
    const values = toFormValues(REVISION, formatFor('in'))
    values.hasFrame = false
    values.hasLeakTest = false
    values.frame.inputs[fieldKey('wallClearance')] = 'not a length' // ignored with the frame off
    values.buildSteps[0] = { ...values.buildSteps[0]!, measurementRequired: false, measurementMin: 'x' }
    const { value, errors } = toContent(values, parseIn)
    expect(errors).toEqual({})
    expect(value?.frame).toBeNull()
    expect(value?.leakTest).toBeNull()
    expect(value?.buildSteps[0]).toMatchObject({ measurementRequired: false, measurementUnit: null, measurementMin: null, measurementMax: null, outOfLimitsRework: false })
  })
})

describe('revision form model: bad input says what to fix, field by field', () => {
  it('names every field that does not read, with the API field path, and returns no content', () => {
    const values: RevisionFormValues = toFormValues(REVISION, formatFor('in'))
    values.frame.pipePartId = ''
    values.frame.inputs[fieldKey('wallClearance')] = '1,5'
    values.frame.inputs[fieldKey('layout.crossRuns')] = '2.5'
    values.frame.tote.insideHeight = ''
    values.leakTest = { ...values.leakTest, minPressure: '-3', holdMinutes: 'ten', waterLitres: 'lots' }
    values.bomLines[0] = { ...values.bomLines[0]!, quantity: '1.5' }
    values.cutParts[0] = { ...values.cutParts[0]!, length: '3/8', quantity: '' }
    values.buildSteps[0] = { ...values.buildSteps[0]!, measurementMax: 'high' }
    const mm = toContent(values, (text) => parseLength(text, 'mm'))
    expect(mm.value).toBeNull()
    expect(Object.keys(mm.errors).sort()).toEqual(
      [
        'frame.pipePartId',
        'frame.inputs.wallClearance',
        'frame.inputs.layout.crossRuns',
        'frame.tote.insideHeight',
        'leakTest.minPressurePa',
        'leakTest.holdMinutes',
        'leakTest.waterVolumeMl',
        'bomLines.0.quantity',
        'cutParts.0.length',
        'cutParts.0.quantity',
        'buildSteps.0.measurementMax',
      ].sort(),
    )
    expect(mm.errors['frame.pipePartId']).toBe('Choose the pipe the frame is cut from')
    expect(mm.errors['frame.inputs.wallClearance']).toBe('Write decimals with a point, not a comma: "1.5" instead of "1,5".')
    expect(mm.errors['frame.inputs.layout.crossRuns']).toBe('Enter a whole number')
    expect(mm.errors['leakTest.minPressurePa']).toBe('Enter a pressure in psi')
    expect(mm.errors['leakTest.holdMinutes']).toBe('Enter whole minutes')
    expect(mm.errors['leakTest.waterVolumeMl']).toBe('Enter the water volume in litres')
    expect(mm.errors['cutParts.0.length']).toMatch(/^"3\/8" is a fraction, which only makes sense in inches/)
    expect(mm.errors['buildSteps.0.measurementMax']).toBe('Enter a number')
  })

  it('tote inputs are checked only when the tote is filled in', () => {
    const values = toFormValues(REVISION, formatFor('in'))
    values.frame.tote.topInsideWidth = 'wide'
    const { value, errors } = toteFrom(values.frame, parseIn)
    expect(value).toBeNull()
    expect(Object.keys(errors)).toEqual(['frame.tote.topInsideWidth'])
    expect(errors['frame.tote.topInsideWidth']).toMatch(/^"wide" does not start with a number: write a length/)
    values.frame.hasTote = false
    expect(toContent(values, parseIn).value?.frame?.tote).toBeNull()
  })

  it('puts the API\'s field errors (a 400\'s fields) on the form\'s inputs', () => {
    expect(formFieldFor('frame.inputs.elbow.socketDepth')).toBe('frame.inputs.elbow__socketDepth')
    expect(formFieldFor('frame.inputs.layout.riserSide')).toBe('frame.riserSide')
    expect(formFieldFor('leakTest.minPressurePa')).toBe('leakTest.minPressure')
    expect(formFieldFor('leakTest.waterVolumeMl')).toBe('leakTest.waterLitres')
    expect(formFieldFor('leakTest.holdMinutes')).toBe('leakTest.holdMinutes')
    expect(formFieldFor('cutParts.2.length')).toBe('cutParts.2.length')
  })
})
