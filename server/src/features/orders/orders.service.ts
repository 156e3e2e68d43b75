import type { NewOrder, OrderSource } from '@kitwright/shared/orders'
import type { Tx } from '../../db/client'
import type { OrderEventRow, OrderRow } from '../../db/schema/index'
import type { SessionUser } from '../../lib/auth'
import { insertOrderEvent, insertOrderIfNew, insertOrderLines, selectKitsForLines, selectOrderByNumber } from './orders.queries'

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
 * Stores a new order with its lines and a `received` event, inside the caller's transaction.
 * Idempotent by order number: when the number is already stored (or another transaction stores it
 * first), it returns that order and creates nothing. Each line maps to a kit by the kit's SKU (any
 * case) or else by the kit's store product id; a line that maps to no kit is kept with no kit and
 * flagged on the timeline, so a planner sees it before release.
 */
export async function createOrder(tx: Tx, input: NewOrder, source: OrderSource, actor: OrderActor): Promise<CreateOrderResult> {
  const existing = await selectOrderByNumber(tx, input.number)
  if (existing) return { order: existing, created: false }

  const totalCents = input.lines.reduce((sum, l) => sum + l.quantity * l.unitPriceCents, 0)
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
    promisedShipDate: input.promisedShipDate ?? null,
    totalCents,
    currency: input.currency,
    note: input.note ?? null,
  })
  if (!order) {
    // Another transaction stored the same number between our look and our insert.
    return { order: (await selectOrderByNumber(tx, input.number))!, created: false }
  }

  const candidates = await selectKitsForLines(
    tx,
    input.lines.flatMap((l) => (l.kitSku ? [l.kitSku] : [])),
    input.lines.flatMap((l) => (l.storeProductId ? [l.storeProductId] : [])),
  )
  const kitFor = (line: NewOrder['lines'][number]) =>
    (line.kitSku ? candidates.find((k) => k.sku.toLowerCase() === line.kitSku!.toLowerCase()) : undefined) ??
    (line.storeProductId ? candidates.find((k) => k.storeProductId === line.storeProductId) : undefined)

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
    message: `${SOURCE_WORDS[source]}: ${units} unit${units === 1 ? '' : 's'} on ${input.lines.length} line${input.lines.length === 1 ? '' : 's'}`,
    data: { source, number: input.number },
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
