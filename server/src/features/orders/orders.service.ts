import { formatDay } from '@kitwright/shared/dates'
import { ORDER_SOURCE_LABELS, ORDER_STATUS_LABELS, PAYMENT_STATUS_LABELS, wordFor } from '@kitwright/shared/status-words'
import type { NewOrder, OrderDetail, OrderListQuery, OrderSource, OrdersPage } from '@kitwright/shared/orders'
import type { Db, Tx } from '../../db/client'
import type { OrderEventRow, OrderRow } from '../../db/schema/index'
import type { SessionUser } from '../../lib/auth'
import { BadRequest, Conflict, NotFound } from '../../lib/http-errors'
import { writeOrdersCsv } from './orders.csv'
import { promiseForOrder } from './promise.service'
import { listMeasurementFlags } from '../build/measurement-flags'
import { toOrder, toOrderDetail } from './orders.mapper'
import {
  countOrders,
  insertOrderEvent,
  insertOrderIfNew,
  insertOrderLines,
  selectExportLines,
  selectKitsForLines,
  selectOrderByNumber,
  selectOrdersPage,
  selectOrderTree,
} from './orders.queries'

/** Who did something to an order; null when it was the store or the system. */
export type OrderActor = Pick<SessionUser, 'id' | 'name'> | null

/** What {@link createOrder} did: the order (new or already stored) and whether it created it. */
export interface CreateOrderResult {
  order: OrderRow
  created: boolean
}

const SOURCE_WORDS: Record<OrderSource, string> = {
  store: 'Received from the web store',
  csv: 'Imported from a CSV file',
  phone: 'Entered as a phone order',
  replacement: 'Made as the replacement for a returned unit',
}

/** Appends one event to an order's timeline inside the caller's transaction. */
export async function addOrderEvent(
  tx: Tx,
  event: { orderId: string; kind: string; message: string; data?: unknown; actor?: OrderActor },
): Promise<OrderEventRow> {
  return insertOrderEvent(tx, {
    orderId: event.orderId,
    kind: event.kind,
    message: event.message,
    data: event.data ?? null,
    actorId: event.actor?.id ?? null,
  })
}

/**
 * Stores a new order with its lines and a `received` event, inside the caller's transaction. An
 * order that arrives without a promised ship date is promised the shop's lead time after it was placed.
 * Idempotent by order number: when the number is already stored (or another transaction stores it
 * first), it returns that order and creates nothing. Each line maps to a kit by the kit's SKU (any
 * case) or else by the kit's store product id; a line that maps to no kit is kept with no kit and
 * flagged on the timeline, so a planner sees it before release.
 */
export async function createOrder(tx: Tx, input: NewOrder, source: OrderSource, actor: OrderActor): Promise<CreateOrderResult> {
  const existing = await selectOrderByNumber(tx, input.number)
  if (existing) return { order: existing, created: false }

  const totalCents = input.lines.reduce((sum, l) => sum + l.quantity * l.unitPriceCents, 0)
  const candidates = await selectKitsForLines(
    tx,
    input.lines.flatMap((l) => (l.kitSku ? [l.kitSku] : [])),
    input.lines.flatMap((l) => (l.storeProductId ? [l.storeProductId] : [])),
  )
  const kitFor = (line: NewOrder['lines'][number]) =>
    (line.kitSku ? candidates.find((k) => k.sku.toLowerCase() === line.kitSku!.toLowerCase()) : undefined) ??
    (line.storeProductId ? candidates.find((k) => k.storeProductId === line.storeProductId) : undefined)
  // An order without a promise gets one from the work ahead of it (see promise.service).
  const promised = input.promisedShipDate ? null : await promiseForOrder(tx, input.lines.map((l) => ({ kitId: kitFor(l)?.id ?? null, quantity: l.quantity })), input.placedAt)
  const order = await insertOrderIfNew(tx, {
    number: input.number,
    source,
    status: 'open',
    paymentStatus: input.paymentStatus ?? 'pending',
    customerName: input.customer.name,
    customerEmail: input.customer.email,
    customerPhone: input.customer.phone ?? null,
    shipName: input.shipTo.name,
    shipLine1: input.shipTo.line1,
    shipLine2: input.shipTo.line2 ?? null,
    shipCity: input.shipTo.city,
    shipRegion: input.shipTo.region ?? null,
    shipPostalCode: input.shipTo.postalCode,
    shipCountry: input.shipTo.country,
    placedAt: new Date(input.placedAt),
    promisedShipDate: input.promisedShipDate ?? promised!.date,
    totalCents,
    currency: input.currency,
    note: input.note ?? null,
  })
  if (!order) {
    // Another transaction stored the same number between our look and our insert.
    return { order: (await selectOrderByNumber(tx, input.number))!, created: false }
  }

  const mapped = input.lines.map((line, i) => ({ line, lineNo: i + 1, kit: kitFor(line) }))
  await insertOrderLines(
    tx,
    mapped.map(({ line, lineNo, kit }) => ({
      orderId: order.id,
      lineNo,
      kitId: kit?.id ?? null,
      storeProductId: line.storeProductId ?? null,
      sku: kit?.sku ?? line.kitSku ?? line.storeProductId!,
      description: kit?.name ?? line.description ?? `Store product ${line.storeProductId ?? line.kitSku}`,
      quantity: line.quantity,
      unitPriceCents: line.unitPriceCents,
    })),
  )

  const units = input.lines.reduce((sum, l) => sum + l.quantity, 0)
  await addOrderEvent(tx, {
    orderId: order.id,
    kind: 'received',
    message:
      `${SOURCE_WORDS[source]}: ${units} unit${units === 1 ? '' : 's'} on ${input.lines.length} line${input.lines.length === 1 ? '' : 's'}` +
      (promised ? `; promised to ship by ${formatDay(promised.date)}${promised.reasons.length ? `: ${promised.reasons.join('; ')}` : ''}` : ''),
    data: { source, number: input.number, promisedShipDate: order.promisedShipDate, leadTimeDays: promised?.leadTimeDays ?? null, promiseReasons: promised?.reasons ?? null },
    actor,
  })
  for (const { line, lineNo, kit } of mapped) {
    if (kit) continue
    const what = line.kitSku ? `kit SKU ${line.kitSku}` : `store product ${line.storeProductId}`
    const named = line.description ? ` (${line.description})` : ''
    await addOrderEvent(tx, {
      orderId: order.id,
      kind: 'unmapped_line',
      message: `Line ${lineNo}: ${what}${named} maps to no kit. Set the store product id on the right kit, then release; until then this line cannot be built.`,
      data: { lineNo, kitSku: line.kitSku ?? null, storeProductId: line.storeProductId ?? null },
      actor: null,
    })
  }
  return { order, created: true }
}

function checkDateRange(q: Pick<OrderListQuery, 'from' | 'to'>) {
  if (q.from && q.to && q.from > q.to) throw new BadRequest(`The "from" date ${q.from} is after the "to" date ${q.to}; swap them`, { from: 'After the "to" date' })
}

export async function listOrders(db: Db, q: OrderListQuery): Promise<OrdersPage> {
  checkDateRange(q)
  const rows = await selectOrdersPage(db, { ...q, limit: q.pageSize, offset: (q.page - 1) * q.pageSize })
  // Past the last page the count still tells the client where the last page is.
  const total = rows[0]?.total ?? (q.page > 1 ? await countOrders(db, q) : 0)
  return { items: rows.map(toOrder), total, page: q.page, pageSize: q.pageSize }
}

export async function getOrder(db: Db | Tx, id: string): Promise<OrderDetail> {
  const tree = await selectOrderTree(db, id)
  if (!tree) throw new NotFound('No such order')
  // The same rows as the planner's list on the home page, for this order's units only.
  return toOrderDetail(tree, await listMeasurementFlags(db, { orderId: id }))
}

function numberTaken(number: string) {
  return new Conflict(`An order numbered ${number} already exists; open it, or give this order another number`, { number: 'Already in use' })
}

/** Kit SKUs a hand-entered or imported line names that match no kit, with the line's index. */
export async function unknownKitSkus(db: Db | Tx, lines: NewOrder['lines']): Promise<{ index: number; sku: string }[]> {
  const skus = lines.flatMap((l) => (l.kitSku ? [l.kitSku] : []))
  const found = new Set((await selectKitsForLines(db, skus, [])).map((k) => k.sku.toLowerCase()))
  return lines.flatMap((l, index) => (l.kitSku && !found.has(l.kitSku.toLowerCase()) ? [{ index, sku: l.kitSku }] : []))
}

/**
 * A phone order typed in by a planner: refused (409, pointing at the number) when the number is
 * taken, and (400) when a line names a kit SKU that does not exist, since the form offers only kits.
 */
export async function createPhoneOrder(db: Db, input: NewOrder, actor: NonNullable<OrderActor>): Promise<OrderDetail> {
  const unknown = await unknownKitSkus(db, input.lines)
  if (unknown.length > 0) {
    const fields = Object.fromEntries(unknown.map((u) => [`lines.${u.index}.kitSku`, `No kit has the SKU ${u.sku}`]))
    throw new BadRequest(`Line ${unknown[0]!.index + 1}: no kit has the SKU ${unknown[0]!.sku}; choose one of the kits`, fields)
  }
  return db.transaction(async (tx) => {
    const { order, created } = await createOrder(tx, input, 'phone', actor)
    if (!created) throw numberTaken(input.number)
    return getOrder(tx, order.id)
  })
}

const money = (cents: number) => (cents / 100).toFixed(2)

/** Every line of the orders matching the list's filters (not just one page), as CSV. */
export async function exportOrdersCsv(db: Db, q: Omit<OrderListQuery, 'page' | 'pageSize'>): Promise<string> {
  checkDateRange(q)
  const rows = await selectExportLines(db, q)
  return writeOrdersCsv(
    rows.map((r) => ({
      record: {
        order_number: r.number,
        placed_at: (r.placedAt instanceof Date ? r.placedAt : new Date(r.placedAt)).toISOString(),
        promised_ship_date: r.promisedShipDate ?? '',
        customer_name: r.customerName,
        customer_email: r.customerEmail,
        customer_phone: r.customerPhone ?? '',
        ship_name: r.shipName,
        ship_line1: r.shipLine1,
        ship_line2: r.shipLine2 ?? '',
        ship_city: r.shipCity,
        ship_region: r.shipRegion ?? '',
        ship_postal_code: r.shipPostalCode,
        ship_country: r.shipCountry,
        currency: r.currency,
        payment_status: r.paymentStatus,
        note: r.note ?? '',
        // A line that maps to no kit exports its store product, so it imports back the same way.
        kit_sku: r.kitSku ?? (r.storeProductId ? '' : r.sku),
        store_product_id: r.storeProductId ?? '',
        description: r.description,
        quantity: String(r.quantity),
        unit_price: money(r.unitPriceCents),
        status: wordFor(ORDER_STATUS_LABELS, r.status),
        status_code: r.status,
        source: wordFor(ORDER_SOURCE_LABELS, r.source),
        source_code: r.source,
        payment: wordFor(PAYMENT_STATUS_LABELS, r.paymentStatus),
        line_total: money(r.quantity * r.unitPriceCents),
      },
    })),
  )
}
