import { and, asc, desc, eq, inArray, isNull, sql } from 'drizzle-orm'
import type { Db, Tx } from '../../db/client'
import { bomLines, cutParts, kitRevisions, kits, orderLines, orders, parts, workOrders } from '../../db/schema/index'

/** The order, locked so two releases of it queue and the second sees it released. */
export async function lockOrder(tx: Tx, id: string) {
  const [row] = await tx.select().from(orders).where(eq(orders.id, id)).for('update')
  return row
}

/** The order as it stands, without locking it (the release preview only reads). */
export async function selectOrderForRelease(tx: Tx, id: string) {
  const [row] = await tx.select().from(orders).where(eq(orders.id, id))
  return row
}

/** What bulk release sorts by: priority, promised ship date, placed. */
export async function selectReleaseSortKeys(db: Db, ids: readonly string[]) {
  if (ids.length === 0) return []
  return db
    .select({ id: orders.id, number: orders.number, priority: orders.priority, promisedShipDate: orders.promisedShipDate, placedAt: orders.placedAt })
    .from(orders)
    .where(inArray(orders.id, [...ids]))
}

export async function selectLines(tx: Tx, orderId: string) {
  return tx.select().from(orderLines).where(eq(orderLines.orderId, orderId)).orderBy(asc(orderLines.lineNo))
}

/** Kits by their store product id, to map lines that mapped to no kit when the order came in. */
export async function selectKitsByStoreProduct(tx: Tx, productIds: readonly string[]) {
  if (productIds.length === 0) return []
  return tx.select().from(kits).where(inArray(kits.storeProductId, [...productIds]))
}

export async function mapLineToKit(tx: Tx, lineId: string, kit: { id: string; sku: string; name: string }) {
  await tx.update(orderLines).set({ kitId: kit.id, sku: kit.sku, description: kit.name }).where(and(eq(orderLines.id, lineId), isNull(orderLines.kitId)))
}

/** The newest released revision of each kit (by release time), with its kit's SKU. */
export async function selectNewestReleasedRevisions(tx: Tx, kitIds: readonly string[]) {
  if (kitIds.length === 0) return []
  return tx
    .selectDistinctOn([kitRevisions.kitId], { id: kitRevisions.id, kitId: kitRevisions.kitId, code: kitRevisions.code, kitSku: kits.sku })
    .from(kitRevisions)
    .innerJoin(kits, eq(kits.id, kitRevisions.kitId))
    .where(and(inArray(kitRevisions.kitId, [...kitIds]), eq(kitRevisions.status, 'released')))
    .orderBy(kitRevisions.kitId, desc(kitRevisions.releasedAt), desc(kitRevisions.createdAt))
}

/** The BOM lines of the revisions, each with its part's SKU and name. */
export async function selectBomLines(tx: Tx, revisionIds: readonly string[]) {
  if (revisionIds.length === 0) return []
  return tx
    .select({ revisionId: bomLines.revisionId, partId: bomLines.partId, quantity: bomLines.quantity, sku: parts.sku, name: parts.name })
    .from(bomLines)
    .innerJoin(parts, eq(parts.id, bomLines.partId))
    .where(inArray(bomLines.revisionId, [...revisionIds]))
    .orderBy(asc(bomLines.revisionId), asc(bomLines.position))
}

/** Revisions among these that have cut parts (the others skip the cut bench). */
export async function selectRevisionsWithCutParts(tx: Tx, revisionIds: readonly string[]): Promise<Set<string>> {
  if (revisionIds.length === 0) return new Set()
  const rows = await tx.selectDistinct({ revisionId: cutParts.revisionId }).from(cutParts).where(inArray(cutParts.revisionId, [...revisionIds]))
  return new Set(rows.map((r) => r.revisionId))
}

/** The next serial numbers from the shop-wide sequence, in one round trip. */
export async function nextSerials(tx: Tx, count: number): Promise<number[]> {
  if (count === 0) return []
  const result = await tx.execute<{ n: string }>(sql`select nextval('work_order_serial_seq')::text as n from generate_series(1, ${count})`)
  return result.rows.map((r) => Number(r.n))
}

export async function insertWorkOrders(tx: Tx, values: (typeof workOrders.$inferInsert)[]) {
  if (values.length === 0) return []
  return tx.insert(workOrders).values(values).returning()
}

export async function markReleased(tx: Tx, orderId: string) {
  await tx.update(orders).set({ status: 'released', releasedAt: new Date(), updatedAt: new Date() }).where(eq(orders.id, orderId))
}

export async function selectOrderNumbersById(db: Db, ids: readonly string[]): Promise<Map<string, string>> {
  if (ids.length === 0) return new Map()
  const rows = await db.select({ id: orders.id, number: orders.number }).from(orders).where(inArray(orders.id, [...ids]))
  return new Map(rows.map((r) => [r.id, r.number]))
}
