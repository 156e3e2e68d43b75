import { z } from 'zod'
import { CsvRowErrorSchema } from './csv'
import { formatHsCode } from './customs'
import { formatLengthForInput, parseLength, type LengthUnit } from './domain/units'
import { PART_KINDS, PartInputSchema, type Part, type PartInput, type PartInputDraft } from './parts'

/**
 * The columns of a parts CSV, in the order export writes them. Import matches headers ignoring case
 * and surrounding spaces, in any order; see docs/csv-parts.md for what each holds.
 */
export const PART_CSV_COLUMNS = [
  'sku',
  'name',
  'kind',
  'unit_of_measure',
  'unit_cost',
  'weight_g',
  'electrical',
  'lot_tracked',
  'supplier',
  'lead_time_days',
  'reorder_point',
  'reorder_quantity',
  'shelf_location',
  'nominal_size',
  'outside_diameter',
  'stick_lengths',
  'hs_code',
  'origin_country',
  'customs_description',
  'active',
] as const
/** A column of a parts CSV. */
export type PartCsvColumn = (typeof PART_CSV_COLUMNS)[number]

/** Columns an import file must have; the others may be left out (blank means "none" or the default). */
export const REQUIRED_PART_CSV_COLUMNS: readonly PartCsvColumn[] = ['sku', 'name', 'kind', 'unit_cost', 'weight_g']

/** The CSV column that holds each field of a part, for pointing errors at the right cell. */
export const PART_FIELD_COLUMNS: Record<keyof PartInput, PartCsvColumn> = {
  sku: 'sku',
  name: 'name',
  kind: 'kind',
  unitOfMeasure: 'unit_of_measure',
  unitCostCents: 'unit_cost',
  weightGrams: 'weight_g',
  electrical: 'electrical',
  lotTracked: 'lot_tracked',
  supplier: 'supplier',
  leadTimeDays: 'lead_time_days',
  reorderPoint: 'reorder_point',
  reorderQuantity: 'reorder_quantity',
  shelfLocation: 'shelf_location',
  nominalSize: 'nominal_size',
  outsideDiameter: 'outside_diameter',
  stickLengths: 'stick_lengths',
  hsCode: 'hs_code',
  originCountry: 'origin_country',
  customsDescription: 'customs_description',
}

/** The body of an import or its preview: the file's text. */
export const PartCsvBodySchema = z
  .object({ csv: z.string().min(1, 'Choose or paste a CSV file').max(900_000, 'The file is too large; import at most about 5 000 parts at a time') })
  .strict()
/** The body of an import or its preview. */
export type PartCsvBody = z.infer<typeof PartCsvBodySchema>

/** Something to fix in an import file: row as in the file (the header is row 1), and the column if known. */
export const PartCsvErrorSchema = CsvRowErrorSchema
/** Something to fix in an import file. */
export type PartCsvError = z.infer<typeof PartCsvErrorSchema>

/** What importing a file would do, row by row; nothing is written while `errors` is not empty. */
export const PartImportPreviewSchema = z.object({
  rows: z.array(
    z.object({
      row: z.number().int().min(2),
      sku: z.string(),
      /** Create a new part, or update the part that has this SKU; null when the row has errors. */
      action: z.enum(['create', 'update']).nullable(),
      part: PartInputSchema.nullable(),
    }),
  ),
  errors: z.array(PartCsvErrorSchema),
  creates: z.number().int().min(0),
  updates: z.number().int().min(0),
})
/** What importing a file would do, row by row. */
export type PartImportPreview = z.infer<typeof PartImportPreviewSchema>

/** What an import did. */
export const PartImportResultSchema = z.object({ created: z.number().int().min(0), updated: z.number().int().min(0) })
/** What an import did. */
export type PartImportResult = z.infer<typeof PartImportResultSchema>

/** A part as one CSV record (column → cell text, not yet neutralised), lengths in `unit`. */
export function partToCsvRecord(part: Part, unit: LengthUnit): Record<PartCsvColumn, string> {
  return {
    sku: part.sku,
    name: part.name,
    kind: part.kind,
    unit_of_measure: part.unitOfMeasure,
    unit_cost: part.unitCostCents === null ? '' : (part.unitCostCents / 100).toFixed(2),
    weight_g: String(part.weightGrams),
    electrical: part.electrical ? 'yes' : 'no',
    lot_tracked: part.lotTracked ? 'yes' : 'no',
    supplier: part.supplier ?? '',
    lead_time_days: part.leadTimeDays === null ? '' : String(part.leadTimeDays),
    reorder_point: String(part.reorderPoint),
    reorder_quantity: String(part.reorderQuantity),
    shelf_location: part.shelfLocation ?? '',
    nominal_size: part.nominalSize ?? '',
    outside_diameter: part.outsideDiameter === null ? '' : formatLengthForInput(part.outsideDiameter, unit),
    stick_lengths: part.stickLengths.map((l) => formatLengthForInput(l, unit)).join('; '),
    hs_code: part.hsCode ? formatHsCode(part.hsCode) : '',
    origin_country: part.originCountry ?? '',
    customs_description: part.customsDescription ?? '',
    active: part.active ? 'yes' : 'no',
  }
}

/** A record read from a CSV row: cells by column, blank or missing cells as ''. */
export type PartCsvRecord = Partial<Record<PartCsvColumn, string>>

/** The outcome of reading one CSV record as a part. */
export type PartFromCsv =
  | { ok: true; part: PartInput; active: boolean }
  | { ok: false; errors: { column: PartCsvColumn | null; message: string }[] }

/** Money as typed in a file: dollars with up to two decimals (`12.34`, `$0.65`, `3`), in cents. */
export function parseDollars(text: string): number | null {
  const m = /^\$?\s*(\d{1,9})(?:\.(\d{1,2}))?$/.exec(text.trim())
  if (!m) return null
  return Number(m[1]) * 100 + Number((m[2] ?? '').padEnd(2, '0'))
}

const WHOLE = /^\d{1,9}$/

/**
 * Reads one CSV record as a part: human units in (`10 ft`, `0.840 in`, `12.34`, grams), the shared
 * part rules applied, and every problem reported against its column. Bare lengths are read in `unit`.
 */
export function partFromCsvRecord(record: PartCsvRecord, unit: LengthUnit): PartFromCsv {
  const errors: { column: PartCsvColumn | null; message: string }[] = []
  const cell = (c: PartCsvColumn) => (record[c] ?? '').trim()
  const whole = (c: PartCsvColumn, what: string, blank: number | null) => {
    const v = cell(c)
    if (v === '') return blank
    if (!WHOLE.test(v)) errors.push({ column: c, message: `Write ${what} as a whole number, e.g. 12 (found "${v}")` })
    return Number(v)
  }
  const length = (c: PartCsvColumn, text: string) => {
    const r = parseLength(text, unit)
    if (!r.ok) errors.push({ column: c, message: r.message })
    return r.ok ? r.value : 0
  }

  const kindText = cell('kind').toLowerCase().replace(/[\s-]+/g, '_')
  if (kindText === '') errors.push({ column: 'kind', message: `Enter the kind: ${PART_KINDS.join(', ')}` })
  else if (!(PART_KINDS as readonly string[]).includes(kindText)) {
    errors.push({ column: 'kind', message: `Unknown kind "${cell('kind')}"; use ${PART_KINDS.join(', ')}` })
  }
  const costText = cell('unit_cost')
  const cost = parseDollars(costText)
  if (cost === null) errors.push({ column: 'unit_cost', message: `Write the unit cost in dollars and cents, e.g. 12.34 (found "${costText}")` })
  const weight = cell('weight_g') === '' ? null : whole('weight_g', 'the weight in grams', 0)
  if (weight === null) errors.push({ column: 'weight_g', message: 'Enter the weight of one unit in grams, e.g. 730' })
  const activeText = cell('active').toLowerCase()
  const active = ['', 'yes', 'y', 'true', '1'].includes(activeText)
  if (!active && !['no', 'n', 'false', '0'].includes(activeText)) {
    errors.push({ column: 'active', message: `Write yes or no for active (found "${cell('active')}")` })
  }
  // Blank keeps what the catalog says (no, for a new part).
  const electricalText = cell('electrical').toLowerCase()
  const electrical = electricalText === '' ? undefined : ['yes', 'y', 'true', '1'].includes(electricalText) ? true : ['no', 'n', 'false', '0'].includes(electricalText) ? false : null
  if (electrical === null) errors.push({ column: 'electrical', message: `Write yes or no for electrical, whether it runs on mains power (found "${cell('electrical')}")` })
  const lotText = cell('lot_tracked').toLowerCase()
  const lotTracked = lotText === '' ? undefined : ['yes', 'y', 'true', '1'].includes(lotText) ? true : ['no', 'n', 'false', '0'].includes(lotText) ? false : null
  if (lotTracked === null) errors.push({ column: 'lot_tracked', message: `Write yes or no for lot_tracked, whether it is received and fitted by the supplier's lot (found "${cell('lot_tracked')}")` })
  const od = cell('outside_diameter')
  const sticks = cell('stick_lengths')

  const draft: PartInputDraft = {
    sku: cell('sku'),
    name: cell('name'),
    kind: (PART_KINDS as readonly string[]).includes(kindText) ? (kindText as PartInput['kind']) : 'hardware',
    unitOfMeasure: cell('unit_of_measure') || 'each',
    unitCostCents: cost ?? 0,
    weightGrams: weight ?? 0,
    ...(typeof electrical === 'boolean' ? { electrical } : {}),
    ...(typeof lotTracked === 'boolean' ? { lotTracked } : {}),
    supplier: cell('supplier'),
    leadTimeDays: whole('lead_time_days', 'the lead time in days', null),
    reorderPoint: whole('reorder_point', 'the reorder point', 0) ?? 0,
    reorderQuantity: whole('reorder_quantity', 'the reorder quantity', 0) ?? 0,
    shelfLocation: cell('shelf_location'),
    nominalSize: cell('nominal_size'),
    outsideDiameter: od === '' ? null : length('outside_diameter', od),
    stickLengths: sticks === '' ? [] : sticks.split(/[;|]/).map((s) => s.trim()).filter(Boolean).map((s) => length('stick_lengths', s)),
    hsCode: cell('hs_code'),
    originCountry: cell('origin_country'),
    customsDescription: cell('customs_description'),
  }
  const parsed = PartInputSchema.safeParse(draft)
  if (!parsed.success) {
    const done = new Set(errors.map((e) => e.column))
    for (const issue of parsed.error.issues) {
      const column = PART_FIELD_COLUMNS[issue.path[0] as keyof PartInput] ?? null
      // A cell already reported (e.g. unreadable cost) is not reported again by the part rules.
      if (!done.has(column)) errors.push({ column, message: issue.message })
      done.add(column)
    }
  }
  if (errors.length > 0 || !parsed.success) return { ok: false, errors }
  return { ok: true, part: parsed.data, active }
}
