import { asc, eq, inArray, sql, type SQL } from 'drizzle-orm'
import type { OrderListQuery } from '@kitwright/shared/orders'
import { FINISHED_WORK_ORDER_STATUSES, STARTED_WORK_ORDER_STATUSES, type OrderStage } from '@kitwright/shared/order-stage'
import type { Db, Tx } from '../../db/client'
import { kits, orderEvents, orderLines, orders, workOrders, type NewOrderRow, type OrderRow } from '../../db/schema/index'

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

export async function insertOrderEvent(db: Conn, values: Omit<typeof orderEvents.$inferInsert, 'createdAt'>) {
  // The clock, not the transaction's start: events written in one transaction keep their order.
  const [row] = await db.insert(orderEvents).values({ ...values, createdAt: sql`clock_timestamp()` }).returning()
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

/** An orders list row as the list query returns it, before the mapper shapes it. */
export interface OrderListRecord extends Record<string, unknown> {
  id: string
  number: string
  source: OrderRow['source']
  status: OrderRow['status']
  paymentStatus: OrderRow['paymentStatus']
  customerName: string
  customerEmail: string
  shipCity: string
  shipCountry: string
  placedAt: Date | string
  promisedShipDate: string | null
  totalCents: number
  currency: string
  units: number
  summary: string
  unmappedLines: number
  workOrderCount: number
  late: boolean
  stage: OrderStage
  priority: OrderRow['priority']
  onHold: boolean
  holdReason: string | null
  total: number
}

const SORT_COLUMNS: Record<OrderListQuery['sort'], SQL> = {
  number: sql`o.number`,
  placedAt: sql`o.placed_at`,
  promisedShipDate: sql`o.promised_ship_date`,
  customer: sql`lower(o.customer_name)`,
  status: sql`o.status`,
  total: sql`o.total_cents`,
  // Rush first when ascending.
  priority: sql`(case o.priority when 'rush' then 0 else 1 end)`,
}

function likePattern(text: string) {
  return `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`
}

/** Whether an order is late: past its promised ship date (the database's today) and still to ship. */
export const LATE_SQL = sql`(o.promised_ship_date < current_date and o.status not in ('shipped', 'cancelled'))`

const quoted = (list: readonly string[]) => sql.raw(list.map((s) => `'${s}'`).join(', '))

/**
 * The order's stage (see `orderStage` in shared/order-stage.ts, which this mirrors and the tests
 * compare with): from its status, its hold and its work orders that are not cancelled.
 */
export const STAGE_SQL = sql`(case
  when o.status = 'cancelled' then 'cancelled'
  when o.status = 'shipped' then 'shipped'
  when o.held_at is not null then 'on_hold'
  when o.status = 'partially_shipped' then 'partially_shipped'
  when o.status = 'open' then 'received'
  when exists (select 1 from work_orders sw where sw.order_id = o.id and sw.status <> 'cancelled')
    and not exists (select 1 from work_orders sw where sw.order_id = o.id and sw.status not in ('cancelled', ${quoted(FINISHED_WORK_ORDER_STATUSES)})) then 'ready_to_pack'
  when exists (select 1 from work_orders sw where sw.order_id = o.id and sw.status in (${quoted(STARTED_WORK_ORDER_STATUSES)})) then 'in_production'
  else 'released'
end)`

function listWhere(q: Omit<OrderListQuery, 'page' | 'pageSize' | 'sort' | 'dir'>): SQL {
  const conditions: SQL[] = [sql`true`]
  if (q.status) conditions.push(sql`o.status = ${q.status}`)
  if (q.stage) conditions.push(sql`${STAGE_SQL} = ${q.stage}`)
  if (q.priority) conditions.push(sql`o.priority = ${q.priority}`)
  if (q.late) conditions.push(LATE_SQL)
  // Placed dates are calendar days in UTC, both ends included.
  if (q.from) conditions.push(sql`o.placed_at >= (${q.from}::date)::timestamp at time zone 'UTC'`)
  if (q.to) conditions.push(sql`o.placed_at < (${q.to}::date + 1)::timestamp at time zone 'UTC'`)
  if (q.kitId) conditions.push(sql`exists (select 1 from order_lines fl where fl.order_id = o.id and fl.kit_id = ${q.kitId})`)
  if (q.q) {
    const pattern = likePattern(q.q)
    conditions.push(sql`(o.number ilike ${pattern} or o.customer_name ilike ${pattern} or o.customer_email ilike ${pattern})`)
  }
  return sql.join(conditions, sql` and `)
}

/**
 * One page of orders in one statement: each order with its units, a short summary of its lines, its
 * unmapped lines and work orders counted, whether it is late, and the count of all matching orders.
 * With `limit` undefined, every matching order (for the export).
 */
export async function selectOrdersPage(db: Conn, q: Omit<OrderListQuery, 'page' | 'pageSize'> & { limit?: number; offset?: number }): Promise<OrderListRecord[]> {
  const direction = q.dir === 'desc' ? sql`desc nulls last` : sql`asc nulls last`
  const page = q.limit !== undefined ? sql`limit ${q.limit} offset ${q.offset ?? 0}` : sql``
  const result = await db.execute<OrderListRecord>(sql`
    select o.id, o.number, o.source, o.status, o.payment_status as "paymentStatus",
      o.customer_name as "customerName", o.customer_email as "customerEmail",
      o.ship_city as "shipCity", o.ship_country as "shipCountry", o.placed_at as "placedAt",
      o.promised_ship_date::text as "promisedShipDate", o.total_cents as "totalCents", o.currency,
      coalesce(l.units, 0)::int as "units", coalesce(l.summary, '') as "summary",
      coalesce(l.unmapped, 0)::int as "unmappedLines", coalesce(w.n, 0)::int as "workOrderCount",
      ${LATE_SQL} as "late", ${STAGE_SQL} as "stage", o.priority, (o.held_at is not null) as "onHold",
      o.hold_reason as "holdReason",
      (count(*) over ())::int as "total"
    from orders o
    left join lateral (
      select sum(ol.quantity) as units, count(*) filter (where ol.kit_id is null) as unmapped,
        string_agg(ol.quantity || ' × ' || ol.sku, ', ' order by ol.line_no) as summary
      from order_lines ol where ol.order_id = o.id
    ) l on true
    left join lateral (select count(*) as n from work_orders wo where wo.order_id = o.id) w on true
    where ${listWhere(q)}
    order by ${SORT_COLUMNS[q.sort]} ${direction}, o.number asc
    ${page}
  `)
  return result.rows
}

/** Counts the orders matching the filters (for a page past the last one). */
export async function countOrders(db: Conn, q: Omit<OrderListQuery, 'page' | 'pageSize' | 'sort' | 'dir'>): Promise<number> {
  const result = await db.execute<{ n: number }>(sql`select count(*)::int as n from orders o where ${listWhere(q)}`)
  return result.rows[0]?.n ?? 0
}

/** An order with its lines (and their kits), timeline (with who) and work orders (with revision and kit). */
export async function selectOrderTree(db: Conn, id: string) {
  const order = await db.query.orders.findFirst({
    where: eq(orders.id, id),
    with: {
      lines: { with: { kit: true }, orderBy: asc(orderLines.lineNo) },
      events: { with: { actor: { columns: { id: true, name: true } } }, orderBy: [asc(orderEvents.createdAt), asc(orderEvents.id)] },
      workOrders: { with: { revision: { with: { kit: { columns: { sku: true } } } } }, orderBy: asc(workOrders.serial) },
    },
  })
  if (!order) return undefined
  const [flags] = (await db.execute<{ late: boolean; stage: OrderStage }>(sql`select ${LATE_SQL} as late, ${STAGE_SQL} as stage from orders o where o.id = ${id}`)).rows
  const heldBy = order.heldBy ? (await db.query.users.findFirst({ where: (u, { eq: is }) => is(u.id, order.heldBy!), columns: { name: true } }))?.name ?? null : null
  return { ...order, late: flags?.late ?? false, stage: flags?.stage ?? 'received', heldByName: heldBy }
}
export type OrderTree = NonNullable<Awaited<ReturnType<typeof selectOrderTree>>>

/** An order line with its order's fields, for the export. */
export interface OrderExportRecord extends Record<string, unknown> {
  number: string
  placedAt: Date | string
  promisedShipDate: string | null
  customerName: string
  customerEmail: string
  customerPhone: string | null
  shipName: string
  shipLine1: string
  shipLine2: string | null
  shipCity: string
  shipRegion: string | null
  shipPostalCode: string
  shipCountry: string
  currency: string
  paymentStatus: string
  note: string | null
  status: string
  source: string
  kitSku: string | null
  storeProductId: string | null
  sku: string
  description: string
  quantity: number
  unitPriceCents: number
}

/** Every line of every order matching the list's filters, in the list's order, in one statement. */
export async function selectExportLines(db: Conn, q: Omit<OrderListQuery, 'page' | 'pageSize'>): Promise<OrderExportRecord[]> {
  const direction = q.dir === 'desc' ? sql`desc nulls last` : sql`asc nulls last`
  const result = await db.execute<OrderExportRecord>(sql`
    select o.number, o.placed_at as "placedAt", o.promised_ship_date::text as "promisedShipDate",
      o.customer_name as "customerName", o.customer_email as "customerEmail", o.customer_phone as "customerPhone",
      o.ship_name as "shipName", o.ship_line1 as "shipLine1", o.ship_line2 as "shipLine2", o.ship_city as "shipCity",
      o.ship_region as "shipRegion", o.ship_postal_code as "shipPostalCode", o.ship_country as "shipCountry",
      o.currency, o.payment_status as "paymentStatus", o.note, o.status, o.source,
      k.sku as "kitSku", ol.store_product_id as "storeProductId", ol.sku, ol.description, ol.quantity,
      ol.unit_price_cents as "unitPriceCents"
    from orders o
    join order_lines ol on ol.order_id = o.id
    left join kits k on k.id = ol.kit_id
    where ${listWhere(q)}
    order by ${SORT_COLUMNS[q.sort]} ${direction}, o.number asc, ol.line_no asc
  `)
  return result.rows
}
