import { PartInputSchema, type Part, type PartInput, type PartListQuery, type PartPatch, type PartsPage } from '@kitwright/shared/parts'
import { csvErrorKey } from '@kitwright/shared/csv'
import { partFromCsvRecord, partToCsvRecord, type PartCsvError, type PartImportPreview, type PartImportResult } from '@kitwright/shared/parts-csv'
import type { Db, Tx } from '../../db/client'
import { BadRequest, Conflict, NotFound } from '../../lib/http-errors'
import { readPartsCsv, writePartsCsv } from './parts.csv'
import { toPart, toPartInput, withoutCost } from './parts.mapper'
import {
  insertPart,
  selectAllParts,
  selectPart,
  selectPartIdBySku,
  selectPartsBySku,
  selectPartsPage,
  selectShopLengthUnit,
  updatePartRow,
  upsertPart,
} from './parts.queries'

function skuTaken(sku: string) {
  return new Conflict(`A part with the SKU ${sku} already exists; choose another SKU or edit that part`, { sku: 'Already in use' })
}

function isUniqueViolation(err: unknown): boolean {
  return err instanceof Error && ((err as { code?: unknown }).code === '23505' || isUniqueViolation(err.cause))
}

export async function listParts(db: Db, q: PartListQuery): Promise<PartsPage> {
  const { rows, total } = await selectPartsPage(db, q)
  return { items: rows.map(toPart), total, page: q.page, pageSize: q.pageSize }
}

export async function getPart(db: Db, id: string): Promise<Part> {
  const row = await selectPart(db, id)
  if (!row) throw new NotFound('No such part')
  return toPart(row)
}

export async function createPart(db: Db, input: PartInput): Promise<Part> {
  if (await selectPartIdBySku(db, input.sku)) throw skuTaken(input.sku)
  try {
    return toPart(await insertPart(db, input))
  } catch (err) {
    // Two people saving the same new SKU at once: the unique index decides.
    if (isUniqueViolation(err)) throw skuTaken(input.sku)
    throw err
  }
}

/** Applies a change to the stored part; the result as a whole must pass the part rules. */
export async function updatePart(db: Db, id: string, patch: PartPatch): Promise<Part> {
  return db.transaction(async (tx) => {
    const row = await selectPart(tx, id)
    if (!row) throw new NotFound('No such part')
    const { active, ...fields } = patch
    const merged = PartInputSchema.parse({ ...toPartInput(toPart(row)), ...fields })
    if (merged.sku !== row.sku) {
      const other = await selectPartIdBySku(tx, merged.sku)
      if (other && other !== id) throw skuTaken(merged.sku)
    }
    try {
      const updated = await updatePartRow(tx, id, active === undefined ? merged : { ...merged, active })
      return toPart(updated!)
    } catch (err) {
      if (isUniqueViolation(err)) throw skuTaken(merged.sku)
      throw err
    }
  })
}

interface ImportPlan {
  preview: PartImportPreview
  /** Valid rows to write; `active` undefined means leave it (the file has no active column). */
  writes: { part: PartInput; active: boolean | undefined }[]
}

/**
 * Reads a file and works out what importing it would do. A row whose SKU is already stored updates
 * that part: columns the file leaves out keep their stored values, and the merged part must pass
 * the same rules as the form.
 */
async function planImport(db: Db | Tx, csv: string): Promise<ImportPlan> {
  const unit = await selectShopLengthUnit(db)
  const { columns, rows, errors } = readPartsCsv(csv)
  const skus = [...new Set(rows.map((r) => (r.record.sku ?? '').trim()).filter(Boolean))]
  const existing = new Map((await selectPartsBySku(db, skus)).map((r) => [r.sku, toPart(r)]))
  const firstRowOf = new Map<string, number>()
  const preview: PartImportPreview = { rows: [], errors, creates: 0, updates: 0 }
  const writes: ImportPlan['writes'] = []
  for (const { row, record } of rows) {
    const sku = (record.sku ?? '').trim()
    const stored = existing.get(sku)
    const rowErrors: PartCsvError[] = []
    const earlier = firstRowOf.get(sku)
    if (sku && earlier !== undefined) rowErrors.push({ row, column: 'sku', message: `The SKU ${sku} is already on row ${earlier}; keep one row per SKU` })
    if (sku && earlier === undefined) firstRowOf.set(sku, row)
    const merged = stored ? { ...partToCsvRecord(stored, unit), ...record } : record
    const result = partFromCsvRecord(merged, unit)
    if (!result.ok) rowErrors.push(...result.errors.map((e) => ({ row, ...e })))
    const action = stored ? 'update' : 'create'
    if (rowErrors.length > 0 || !result.ok) {
      errors.push(...rowErrors)
      preview.rows.push({ row, sku, action: null, part: null })
      continue
    }
    preview.rows.push({ row, sku, action, part: result.part })
    preview[action === 'create' ? 'creates' : 'updates'] += 1
    writes.push({ part: result.part, active: columns.includes('active') || !stored ? result.active : undefined })
  }
  errors.sort((a, b) => a.row - b.row)
  return { preview, writes }
}

export async function previewPartsImport(db: Db, csv: string): Promise<PartImportPreview> {
  return (await planImport(db, csv)).preview
}

/** Imports the whole file in one transaction, or nothing at all when any row has an error. */
export async function importParts(db: Db, csv: string): Promise<PartImportResult> {
  return db.transaction(async (tx) => {
    const { preview, writes } = await planImport(tx, csv)
    if (preview.errors.length > 0) {
      const first = preview.errors[0]!
      const fields: Record<string, string> = {}
      for (const e of preview.errors) fields[csvErrorKey(e)] ??= e.message
      const more = preview.errors.length > 1 ? ` (and ${preview.errors.length - 1} more)` : ''
      throw new BadRequest(`Nothing was imported: row ${first.row}: ${first.message}${more}`, fields)
    }
    for (const w of writes) await upsertPart(tx, w.part, w.active)
    return { created: preview.creates, updated: preview.updates }
  })
}

/** Every part as CSV; with `costs: false` (a bench role) the unit cost column is left blank. */
export async function exportPartsCsv(db: Db, { costs }: { costs: boolean }): Promise<string> {
  const [rows, unit] = await Promise.all([selectAllParts(db), selectShopLengthUnit(db)])
  return writePartsCsv(rows.map(toPart).map((p) => (costs ? p : withoutCost(p))), unit)
}
