import { asc, eq, inArray, sql } from 'drizzle-orm'
import type { Db, Tx } from '../../db/client'
import { kits, orderEvents, orderLines, orders, type NewOrderRow, type OrderRow } from '../../db/schema/index'

type Conn = Db | Tx

export async function selectOrderByNumber(db: Conn, number: string): Promise<OrderRow | undefined> {
  const [row] = await db.select().from(orders).where(eq(orders.number, number))
  return row
}

export async function selectOrderNumbers(db: Conn, numbers: readonly string[]): Promise<Set<string>> {
  if (numbers.length === 0) return new Set()
  const rows = await db.select({ number: orders.number }).from(orders).where(inArray(orders.number, [...numbers]))
  return new Set(rows.map((r) => r.number))
}

/**
 * Inserts the order unless its number is taken; returns undefined when it was (a concurrent insert of
 * the same number waits for the other transaction and then does nothing).
 */
export async function insertOrderIfNew(db: Conn, values: NewOrderRow): Promise<OrderRow | undefined> {
  const [row] = await db.insert(orders).values(values).onConflictDoNothing({ target: orders.number }).returning()
  return row
}

export async function insertOrderLines(db: Conn, values: (typeof orderLines.$inferInsert)[]) {
  return db.insert(orderLines).values(values).returning()
}

export async function insertOrderEvent(db: Conn, values: typeof orderEvents.$inferInsert) {
  const [row] = await db.insert(orderEvents).values(values).returning()
  return row!
}

/** Kits a line may name: by SKU (any case) or by the store's product id. */
export async function selectKitsForLines(db: Conn, skus: readonly string[], storeProductIds: readonly string[]) {
  const lowered = [...new Set(skus.map((s) => s.toLowerCase()))]
  const products = [...new Set(storeProductIds)]
  if (lowered.length === 0 && products.length === 0) return []
  const bySku = lowered.length ? sql`lower(${kits.sku}) in ${lowered}` : sql`false`
  const byProduct = products.length ? sql`${kits.storeProductId} in ${products}` : sql`false`
  return db
    .select({ id: kits.id, sku: kits.sku, name: kits.name, storeProductId: kits.storeProductId })
    .from(kits)
    .where(sql`${bySku} or ${byProduct}`)
    .orderBy(asc(kits.sku))
}
