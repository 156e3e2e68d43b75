import type { MeasurementFlag } from '@kitwright/shared/measurement-flags'
import type { Order, OrderDetail } from '@kitwright/shared/orders'
import type { OrderListRecord, OrderTree } from './orders.queries'

const iso = (v: Date | string) => (v instanceof Date ? v : new Date(v)).toISOString()

export function toOrder(r: OrderListRecord): Order {
  return {
    id: r.id,
    number: r.number,
    source: r.source,
    status: r.status,
    paymentStatus: r.paymentStatus,
    customerName: r.customerName,
    customerEmail: r.customerEmail,
    shipCity: r.shipCity,
    shipCountry: r.shipCountry,
    placedAt: iso(r.placedAt),
    promisedShipDate: r.promisedShipDate,
    totalCents: r.totalCents,
    currency: r.currency,
    units: r.units,
    summary: r.summary,
    unmappedLines: r.unmappedLines,
    workOrderCount: r.workOrderCount,
    late: r.late,
    stage: r.stage,
    priority: r.priority,
    onHold: r.onHold,
    holdReason: r.holdReason,
  }
}

/** Serial numbers sort by their number, so U-9999 comes before U-10000. */
function serialNumber(serial: string) {
  return Number(/(\d+)$/.exec(serial)?.[1] ?? 0)
}

export function toOrderDetail(o: OrderTree, measurementFlags: MeasurementFlag[]): OrderDetail {
  const lines = o.lines
  return {
    id: o.id,
    number: o.number,
    source: o.source,
    status: o.status,
    paymentStatus: o.paymentStatus,
    customerName: o.customerName,
    customerEmail: o.customerEmail,
    shipCity: o.shipCity,
    shipCountry: o.shipCountry,
    placedAt: o.placedAt.toISOString(),
    promisedShipDate: o.promisedShipDate,
    totalCents: o.totalCents,
    currency: o.currency,
    units: lines.reduce((s, l) => s + l.quantity, 0),
    summary: lines.map((l) => `${l.quantity} × ${l.sku}`).join(', '),
    unmappedLines: lines.filter((l) => l.kitId === null).length,
    workOrderCount: o.workOrders.length,
    late: o.late,
    stage: o.stage,
    priority: o.priority,
    onHold: o.heldAt !== null,
    holdReason: o.holdReason,
    heldAt: o.heldAt?.toISOString() ?? null,
    heldByName: o.heldByName,
    customer: { name: o.customerName, email: o.customerEmail, phone: o.customerPhone },
    shipTo: {
      name: o.shipName,
      line1: o.shipLine1,
      line2: o.shipLine2,
      city: o.shipCity,
      region: o.shipRegion,
      postalCode: o.shipPostalCode,
      country: o.shipCountry,
    },
    note: o.note,
    releasedAt: o.releasedAt?.toISOString() ?? null,
    shippedAt: o.shippedAt?.toISOString() ?? null,
    cancelledAt: o.cancelledAt?.toISOString() ?? null,
    lines: lines.map((l) => ({
      id: l.id,
      lineNo: l.lineNo,
      sku: l.sku,
      description: l.description,
      storeProductId: l.storeProductId,
      quantity: l.quantity,
      unitPriceCents: l.unitPriceCents,
      kit: l.kit ? { id: l.kit.id, sku: l.kit.sku, name: l.kit.name } : null,
    })),
    events: o.events.map((e) => ({
      id: e.id,
      kind: e.kind,
      message: e.message,
      data: e.data ?? null,
      actorName: e.actor?.name ?? null,
      createdAt: e.createdAt.toISOString(),
    })),
    workOrders: [...o.workOrders]
      .sort((a, b) => serialNumber(a.serial) - serialNumber(b.serial))
      .map((w) => ({
        id: w.id,
        serial: w.serial,
        status: w.status,
        orderLineId: w.orderLineId,
        kitSku: w.revision.kit.sku,
        revisionCode: w.revision.code,
        dueDate: w.dueDate,
        createdAt: w.createdAt.toISOString(),
      })),
    measurementFlags,
  }
}
