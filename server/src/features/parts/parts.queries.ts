import { and, asc, count, desc, eq, ilike, inArray, or, sql, type SQL } from 'drizzle-orm'
import type { LengthUnit } from '@kitwright/shared/domain/units'
import type { PartInput, PartListQuery, PartSortField } from '@kitwright/shared/parts'
import type { Db, Tx } from '../../db/client'
import { parts, shopSettings, type PartRow } from '../../db/schema/index'

type Conn = Db | Tx

const SORT_COLUMNS = {
  sku: parts.sku,
  name: parts.name,
  kind: parts.kind,
  unitCost: parts.unitCostCents,
  supplier: parts.supplier,
  shelfLocation: parts.shelfLocation,
} satisfies Record<PartSortField, unknown>

/** `%` and `_` typed into a search are literal characters, not wildcards. */
function likeEscape(text: string) {
  return text.replace(/[\\%_]/g, (c) => `\\${c}`)
}

function listWhere(q: PartListQuery): SQL | undefined {
  const conditions: SQL[] = []
  if (q.kind) conditions.push(eq(parts.kind, q.kind))
  if (q.active !== 'all') conditions.push(eq(parts.active, q.active === 'true'))
  if (q.q) {
    const pattern = `%${likeEscape(q.q)}%`
    conditions.push(or(ilike(parts.sku, pattern), ilike(parts.name, pattern), ilike(parts.supplier, pattern))!)
  }
  return conditions.length ? and(...conditions) : undefined
}

export async function selectPartsPage(db: Conn, q: PartListQuery): Promise<{ rows: PartRow[]; total: number }> {
  const where = listWhere(q)
  const column = SORT_COLUMNS[q.sort]
  const order = q.dir === 'asc' ? asc(column) : desc(column)
  // Nulls (no supplier, no shelf) sort last either way; SKU then breaks ties so pages never overlap.
  const rows = await db
    .select()
    .from(parts)
    .where(where)
    .orderBy(sql`${column} is null`, order, asc(parts.sku))
    .limit(q.pageSize)
    .offset((q.page - 1) * q.pageSize)
  const [counted] = await db.select({ n: count() }).from(parts).where(where)
  return { rows, total: counted?.n ?? 0 }
}

export async function selectPart(db: Conn, id: string): Promise<PartRow | undefined> {
  const [row] = await db.select().from(parts).where(eq(parts.id, id))
  return row
}

export async function selectPartIdBySku(db: Conn, sku: string): Promise<string | undefined> {
  const [row] = await db.select({ id: parts.id }).from(parts).where(eq(parts.sku, sku))
  return row?.id
}

export async function selectPartsBySku(db: Conn, skus: string[]): Promise<PartRow[]> {
  if (skus.length === 0) return []
  return db.select().from(parts).where(inArray(parts.sku, skus))
}

export async function selectAllParts(db: Conn): Promise<PartRow[]> {
  return db.select().from(parts).orderBy(asc(parts.sku))
}

/**
 * The supplier record a part's supplier name stands for (same name, whatever its case), or null:
 * the part is linked to it, so drafts from shortages go to that supplier.
 */
function supplierIdOf(name: string | null) {
  return name ? sql<string | null>`(select s.id from suppliers s where lower(s.name) = lower(${name.trim()}))` : sql<null>`null`
}

export async function insertPart(db: Conn, input: PartInput): Promise<PartRow> {
  const [row] = await db.insert(parts).values({ ...input, supplierId: supplierIdOf(input.supplier) }).returning()
  return row!
}

export async function updatePartRow(db: Conn, id: string, set: Partial<PartInput> & { active?: boolean }): Promise<PartRow | undefined> {
  const link = set.supplier === undefined ? {} : { supplierId: supplierIdOf(set.supplier) }
  const [row] = await db.update(parts).set({ ...set, ...link, updatedAt: new Date() }).where(eq(parts.id, id)).returning()
  return row
}

/** Inserts or, for a SKU already stored, overwrites the part; `active` is left alone when undefined. */
export async function upsertPart(db: Conn, input: PartInput, active: boolean | undefined): Promise<void> {
  const values = { ...(active === undefined ? input : { ...input, active }), supplierId: supplierIdOf(input.supplier) }
  await db
    .insert(parts)
    .values(values)
    .onConflictDoUpdate({ target: parts.sku, set: { ...values, updatedAt: new Date() } })
}

/** The unit bare lengths are read in: the shop's display unit, inches until the shop has settings. */
export async function selectShopLengthUnit(db: Conn): Promise<LengthUnit> {
  const [row] = await db.select({ unit: shopSettings.displayUnit }).from(shopSettings).where(eq(shopSettings.id, 1))
  return row?.unit ?? 'in'
}
