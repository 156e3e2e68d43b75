import { and, asc, eq, inArray, sql } from 'drizzle-orm'
import type { SaveSupplier, SaveSupplierPart, Supplier } from '@kitwright/shared/purchasing'
import type { Db, Tx } from '../../db/client'
import { parts, supplierParts, suppliers, type SupplierRow } from '../../db/schema/index'
import { Conflict, NotFound } from '../../lib/http-errors'

/** Suppliers with what each sells, by name. */
export async function listSuppliers(db: Db | Tx, ids?: readonly string[]): Promise<Supplier[]> {
  const rows = await db
    .select()
    .from(suppliers)
    .where(ids ? inArray(suppliers.id, [...ids]) : undefined)
    .orderBy(asc(sql`lower(${suppliers.name})`))
  if (rows.length === 0) return []
  const sold = await db
    .select({ sp: supplierParts, sku: parts.sku, name: parts.name, preferredId: parts.supplierId })
    .from(supplierParts)
    .innerJoin(parts, eq(parts.id, supplierParts.partId))
    .where(inArray(supplierParts.supplierId, rows.map((r) => r.id)))
    .orderBy(asc(parts.sku))
  return rows.map((s) => toSupplier(s, sold.filter((p) => p.sp.supplierId === s.id)))
}

function toSupplier(s: SupplierRow, sold: { sp: typeof supplierParts.$inferSelect; sku: string; name: string; preferredId: string | null }[]): Supplier {
  return {
    id: s.id,
    name: s.name,
    contactName: s.contactName,
    email: s.email,
    phone: s.phone,
    leadTimeDays: s.leadTimeDays,
    minimumOrderCents: s.minimumOrderCents,
    active: s.active,
    parts: sold.map((p) => ({
      partId: p.sp.partId,
      sku: p.sku,
      name: p.name,
      supplierSku: p.sp.supplierSku,
      packSize: p.sp.packSize,
      priceBreaks: p.sp.priceBreaks,
      preferred: p.preferredId === s.id,
    })),
  }
}

export async function getSupplier(db: Db | Tx, id: string): Promise<Supplier> {
  const [found] = await listSuppliers(db, [id])
  if (!found) throw new NotFound('No such supplier')
  return found
}

async function nameTaken(db: Db | Tx, name: string, exceptId: string | null) {
  const [row] = await db.select({ id: suppliers.id }).from(suppliers).where(sql`lower(${suppliers.name}) = lower(${name})`)
  return row !== undefined && row.id !== exceptId
}

export async function createSupplier(db: Db, input: SaveSupplier): Promise<Supplier> {
  if (await nameTaken(db, input.name, null)) throw new Conflict(`There is already a supplier named ${input.name}`, { name: 'Already used by another supplier' })
  const [row] = await db.insert(suppliers).values(input).returning()
  return getSupplier(db, row!.id)
}

export async function updateSupplier(db: Db, id: string, input: SaveSupplier): Promise<Supplier> {
  if (await nameTaken(db, input.name, id)) throw new Conflict(`There is already a supplier named ${input.name}`, { name: 'Already used by another supplier' })
  const [row] = await db.update(suppliers).set({ ...input, updatedAt: new Date() }).where(eq(suppliers.id, id)).returning({ id: suppliers.id })
  if (!row) throw new NotFound('No such supplier')
  return getSupplier(db, id)
}

/** Sets what a supplier sells of a part; `preferred` makes them the part's supplier. */
export async function saveSupplierPart(db: Db, supplierId: string, partId: string, input: SaveSupplierPart): Promise<Supplier> {
  return db.transaction(async (tx) => {
    const [supplier] = await tx.select({ id: suppliers.id, name: suppliers.name }).from(suppliers).where(eq(suppliers.id, supplierId))
    if (!supplier) throw new NotFound('No such supplier')
    const [part] = await tx.select({ id: parts.id, supplierId: parts.supplierId }).from(parts).where(eq(parts.id, partId))
    if (!part) throw new NotFound('No such part')
    const values = { supplierSku: input.supplierSku, packSize: input.packSize, priceBreaks: input.priceBreaks }
    await tx
      .insert(supplierParts)
      .values({ supplierId, partId, ...values })
      .onConflictDoUpdate({ target: [supplierParts.supplierId, supplierParts.partId], set: { ...values, updatedAt: new Date() } })
    // The part's supplier name (its form, list and CSV) follows the record it is linked to.
    if (input.preferred || part.supplierId === null) await tx.update(parts).set({ supplierId, supplier: supplier.name, updatedAt: new Date() }).where(eq(parts.id, partId))
    return getSupplier(tx, supplierId)
  })
}

/** The supplier no longer sells the part; it stops being the part's supplier. */
export async function removeSupplierPart(db: Db, supplierId: string, partId: string): Promise<Supplier> {
  return db.transaction(async (tx) => {
    const removed = await tx.delete(supplierParts).where(and(eq(supplierParts.supplierId, supplierId), eq(supplierParts.partId, partId))).returning({ id: supplierParts.id })
    if (removed.length === 0) throw new NotFound('That supplier does not sell that part')
    await tx.update(parts).set({ supplierId: null, updatedAt: new Date() }).where(and(eq(parts.id, partId), eq(parts.supplierId, supplierId)))
    return getSupplier(tx, supplierId)
  })
}
