import { describe, expect, it } from 'vitest'
import { formatLengthForInput, inches, millimetres } from './domain/units'
import { neutraliseCsvCell, restoreCsvCell, csvErrorKey, csvErrorsFromFields } from './csv'
import { parseDollars, partFromCsvRecord, partToCsvRecord } from './parts-csv'
import type { Part } from './parts'

const pipeRecord = {
  sku: 'PVC-050-S40', name: '1/2 in pipe', kind: 'stock_length', unit_cost: '3.48', weight_g: '730',
  nominal_size: '1/2', outside_diameter: '0.840 in', stick_lengths: '10 ft; 20 ft',
}

describe('reading a parts CSV record', () => {
  it('reads pipe in human units: 10 ft sticks and a 0.840 in outside diameter', () => {
    const r = partFromCsvRecord(pipeRecord, 'in')
    expect(r.ok).toBe(true)
    if (!r.ok) return
    // ASTM D1785: 1/2 in Schedule 40 PVC is 0.840 in outside diameter; 1 ft = 12 in.
    expect(r.part.outsideDiameter).toBe(inches(0.84))
    expect(r.part.stickLengths).toEqual([inches(120), inches(240)])
    expect(r.part.unitCostCents).toBe(348)
    expect(r.part.unitOfMeasure).toBe('each')
    expect(r.active).toBe(true)
  })

  it('reads bare lengths in the shop unit: 3048 in a millimetre shop is 10 ft', () => {
    // 1 in = 25.4 mm exactly (international yard and pound agreement, 1959): 120 in = 3048 mm.
    const r = partFromCsvRecord({ ...pipeRecord, outside_diameter: '21.336', stick_lengths: '3048' }, 'mm')
    expect(r.ok && r.part.stickLengths).toEqual([inches(120)])
    expect(r.ok && r.part.outsideDiameter).toBe(inches(0.84))
  })

  it('reports each bad cell against its column with what to fix', () => {
    const r = partFromCsvRecord({ sku: 'X 1', name: '', kind: 'widget', unit_cost: '12,50', weight_g: '1.5', active: 'maybe' }, 'in')
    expect(r.ok).toBe(false)
    if (r.ok) return
    const by = Object.fromEntries(r.errors.map((e) => [e.column, e.message]))
    expect(by.kind).toMatch(/Unknown kind "widget"/)
    expect(by.unit_cost).toMatch(/dollars and cents/)
    expect(by.weight_g).toMatch(/whole number/)
    expect(by.active).toMatch(/yes or no/)
    expect(by.sku).toMatch(/letters, digits/)
    expect(by.name).toBe('Enter a name')
  })

  it('applies the kind rules: pipe needs stick lengths, hardware may not have them', () => {
    const pipe = partFromCsvRecord({ ...pipeRecord, stick_lengths: '' }, 'in')
    expect(!pipe.ok && pipe.errors).toEqual([{ column: 'stick_lengths', message: expect.stringMatching(/at least one stick length/) }])
    const elbow = partFromCsvRecord({ sku: 'E', name: 'Elbow', kind: 'hardware', unit_cost: '0.42', weight_g: '11', stick_lengths: '10 ft' }, 'in')
    expect(!elbow.ok && elbow.errors[0]?.column).toBe('stick_lengths')
  })

  it('reads dollars exactly, without going through floating point', () => {
    expect(parseDollars('12.34')).toBe(1234)
    expect(parseDollars('$0.65')).toBe(65)
    expect(parseDollars('3')).toBe(300)
    expect(parseDollars('0.1')).toBe(10)
    expect(parseDollars('1.005')).toBeNull()
    expect(parseDollars('-1')).toBeNull()
  })
})

describe('writing a parts CSV record', () => {
  it('writes lengths exactly so they read back to the same base units', () => {
    for (const v of [inches(0.84), inches(120), inches(4.25), millimetres(21.34), 1, 12_345]) {
      for (const unit of ['in', 'mm'] as const) {
        const back = partFromCsvRecord({ ...pipeRecord, outside_diameter: formatLengthForInput(v, unit) }, unit)
        expect(back.ok && back.part.outsideDiameter).toBe(v)
      }
    }
    expect(formatLengthForInput(inches(240), 'in')).toBe('20 ft')
    expect(formatLengthForInput(inches(0.84), 'in')).toBe('0.84 in')
  })

  it('round-trips a whole part', () => {
    const part: Part = {
      id: '6f1c2a52-8d1e-4c55-9a55-0d1f6f3e2b11', sku: 'PVC-050-S40', name: 'Pipe', kind: 'stock_length', unitOfMeasure: 'stick',
      unitCostCents: 348, weightGrams: 730, electrical: false, lotTracked: false, supplier: 'Yard', leadTimeDays: 3, reorderPoint: 20, reorderQuantity: 50,
      shelfLocation: 'P1', nominalSize: '1/2', outsideDiameter: inches(0.84), stickLengths: [inches(120), inches(240)],
      hsCode: '3917230000', originCountry: 'US', customsDescription: 'Rigid PVC pipe, cut to length',
      active: false, createdAt: '', updatedAt: '',
    }
    const r = partFromCsvRecord(partToCsvRecord(part, 'in'), 'in')
    expect(r.ok).toBe(true)
    if (!r.ok) return
    const { id: _i, active, createdAt: _c, updatedAt: _u, ...input } = part
    expect(r.part).toEqual(input)
    expect(r.active).toBe(active)
  })
})

describe('customs columns', () => {
  it('read an HS code with dots and a country in any case, and refuse a bad code or ZZ against their columns', () => {
    const ok = partFromCsvRecord({ ...pipeRecord, hs_code: '3917.23', origin_country: 'us', customs_description: 'Rigid PVC pipe' }, 'in')
    expect(ok.ok && [ok.part.hsCode, ok.part.originCountry, ok.part.customsDescription]).toEqual(['391723', 'US', 'Rigid PVC pipe'])
    const bad = partFromCsvRecord({ ...pipeRecord, hs_code: '3917', origin_country: 'ZZ' }, 'in')
    expect(bad.ok).toBe(false)
    if (bad.ok) return
    expect(bad.errors.map((e) => e.column)).toEqual(['hs_code', 'origin_country'])
    expect(bad.errors[1]!.message).toMatch(/"ZZ" is not an ISO 3166-1 country code/)
  })
})

describe('spreadsheet formula injection (OWASP, CSV Injection)', () => {
  it('prefixes a quote to cells starting with = + - @ tab or CR, and import takes it off again', () => {
    for (const bad of ['=1+1', '+SUM(A1)', '-2', '@cmd', '\tx', '\rx']) {
      expect(neutraliseCsvCell(bad)).toBe(`'${bad}`)
      expect(restoreCsvCell(neutraliseCsvCell(bad))).toBe(bad)
    }
    expect(neutraliseCsvCell('Elbow')).toBe('Elbow')
    expect(restoreCsvCell("'quoted")).toBe("'quoted")
  })
})

describe('row errors in an API error body', () => {
  it('travel as fields keyed rows.<row>.<column> and read back sorted by row', () => {
    const errors = [{ row: 4, column: 'unit_cost', message: 'a' }, { row: 3, column: null, message: 'b' }]
    const fields = Object.fromEntries(errors.map((e) => [csvErrorKey(e), e.message]))
    expect(csvErrorsFromFields({ ...fields, other: 'x' })).toEqual([errors[1], errors[0]])
  })
})
