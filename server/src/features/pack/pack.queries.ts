import { and, asc, desc, eq, inArray, isNull, ne, sql } from 'drizzle-orm'
import type { Db, Tx } from '../../db/client'
import {
  bins,
  bomLines,
  boxes,
  cutParts,
  kitRevisions,
  kits,
  leakTests,
  orders,
  packChecks,
  parcels,
  parts,
  shipments,
  shippingLabels,
  shopSettings,
  users,
  workOrders,
} from '../../db/schema/index'

type Conn = Db | Tx
const NONE = ['00000000-0000-0000-0000-000000000000']

export async function findOrder(db: Conn, orderId: string) {
  const [row] = await db.select().from(orders).where(eq(orders.id, orderId))
  return row
}

export async function lockOrderRow(tx: Tx, orderId: string) {
  const [row] = await tx.select().from(orders).where(eq(orders.id, orderId)).for('update')
  return row
}

export async function findBinByCode(db: Conn, code: string) {
  const [row] = await db.select().from(bins).where(eq(bins.code, code.toUpperCase()))
  return row
}

export async function findWorkOrderBySerial(db: Conn, serial: string) {
  const [row] = await db.select().from(workOrders).where(sql`upper(${workOrders.serial}) = ${serial.toUpperCase()}`)
  return row
}

export async function findWorkOrder(db: Conn, id: string) {
  const [row] = await db.select().from(workOrders).where(eq(workOrders.id, id))
  return row
}

/** The order's units (cancelled ones left out) with kit, revision and bin, in serial order. */
export function unitsOfOrder(db: Conn, orderId: string) {
  return db
    .select({
      workOrder: workOrders,
      kitSku: kits.sku,
      kitName: kits.name,
      revision: kitRevisions,
      binId: bins.id,
      binCode: bins.code,
    })
    .from(workOrders)
    .innerJoin(kitRevisions, eq(kitRevisions.id, workOrders.kitRevisionId))
    .innerJoin(kits, eq(kits.id, kitRevisions.kitId))
    .leftJoin(bins, eq(bins.workOrderId, workOrders.id))
    .where(and(eq(workOrders.orderId, orderId), ne(workOrders.status, 'cancelled')))
    .orderBy(sql`length(${workOrders.serial})`, asc(workOrders.serial))
}

/** BOM lines of the revisions with each part's kind, unit and weight. */
export function bomOfRevisions(db: Conn, revisionIds: readonly string[]) {
  return db
    .select({
      revisionId: bomLines.revisionId,
      partId: parts.id,
      sku: parts.sku,
      name: parts.name,
      kind: parts.kind,
      unitOfMeasure: parts.unitOfMeasure,
      weightGrams: parts.weightGrams,
      electrical: parts.electrical,
      quantity: bomLines.quantity,
    })
    .from(bomLines)
    .innerJoin(parts, eq(parts.id, bomLines.partId))
    .where(inArray(bomLines.revisionId, revisionIds.length ? [...revisionIds] : NONE))
    .orderBy(asc(bomLines.revisionId), asc(bomLines.position))
}

/** Cut parts of the revisions with the pipe's stick weight and lengths (pipe weight is pro rata). */
export function cutPartsOfRevisions(db: Conn, revisionIds: readonly string[]) {
  return db
    .select({ revisionId: cutParts.revisionId, length: cutParts.length, quantity: cutParts.quantity, stickWeightGrams: parts.weightGrams, stickLengths: parts.stickLengths })
    .from(cutParts)
    .innerJoin(parts, eq(parts.id, cutParts.partId))
    .where(inArray(cutParts.revisionId, revisionIds.length ? [...revisionIds] : NONE))
}

/** The latest leak test of each unit, by work order id. */
export async function latestLeakTests(db: Conn, workOrderIds: readonly string[]) {
  const rows = await db
    .selectDistinctOn([leakTests.workOrderId], { workOrderId: leakTests.workOrderId, passed: leakTests.passed, attempt: leakTests.attempt })
    .from(leakTests)
    .where(inArray(leakTests.workOrderId, workOrderIds.length ? [...workOrderIds] : NONE))
    .orderBy(leakTests.workOrderId, desc(leakTests.attempt))
  return new Map(rows.map((r) => [r.workOrderId, r]))
}

export function activeBoxes(db: Conn) {
  return db.select().from(boxes).where(eq(boxes.active, true)).orderBy(asc(boxes.code))
}

export async function openShipmentOf(db: Conn, orderId: string) {
  const [row] = await db.select().from(shipments).where(and(eq(shipments.orderId, orderId), ne(shipments.status, 'shipped')))
  return row
}

export async function lockShipment(tx: Tx, shipmentId: string) {
  const [row] = await tx.select().from(shipments).where(eq(shipments.id, shipmentId)).for('update')
  return row
}

export async function findShipment(db: Conn, shipmentId: string) {
  const [row] = await db.select().from(shipments).where(eq(shipments.id, shipmentId))
  return row
}

/** The standing (not undone) checks of a shipment. */
export function standingChecks(db: Conn, shipmentId: string) {
  return db
    .select({ check: packChecks, byName: users.name })
    .from(packChecks)
    .innerJoin(users, eq(users.id, packChecks.checkedBy))
    .where(and(eq(packChecks.shipmentId, shipmentId), isNull(packChecks.undoneAt)))
}

export function parcelsOf(db: Conn, shipmentId: string) {
  return db.select().from(parcels).where(eq(parcels.shipmentId, shipmentId)).orderBy(asc(parcels.position))
}

export async function userName(db: Conn, id: string | null) {
  if (!id) return null
  const [row] = await db.select({ name: users.name }).from(users).where(eq(users.id, id))
  return row?.name ?? 'Unknown user'
}

export async function shippingSettings(db: Conn) {
  const [row] = await db.select().from(shopSettings).where(eq(shopSettings.id, 1))
  return row
}

/** Serial references for SSCCs, one per parcel, from the shop-wide sequence. */
export async function nextSsccSerials(tx: Tx, count: number): Promise<number[]> {
  const result = await tx.execute<{ n: string }>(sql`select nextval('sscc_serial_seq')::text as n from generate_series(1, ${count})`)
  return result.rows.map((r) => Number(r.n))
}

/** The labels of a shipment that were voided, newest first. */
/** The order's shipments that have left, oldest first, each with whether it still has a bought label. */
export async function shippedShipmentsOf(db: Conn, orderId: string) {
  const rows = await db.select().from(shipments).where(and(eq(shipments.orderId, orderId), eq(shipments.status, 'shipped'))).orderBy(asc(shipments.shippedAt))
  if (rows.length === 0) return []
  const bought = await db
    .select({ shipmentId: shippingLabels.shipmentId })
    .from(shippingLabels)
    .where(and(inArray(shippingLabels.shipmentId, rows.map((r) => r.id)), eq(shippingLabels.status, 'bought')))
  const withLabel = new Set(bought.map((b) => b.shipmentId))
  return rows.map((row) => ({ row, hasLabel: withLabel.has(row.id) }))
}

export function voidedLabelsOf(db: Conn, shipmentId: string) {
  return db.select().from(shippingLabels).where(and(eq(shippingLabels.shipmentId, shipmentId), eq(shippingLabels.status, 'voided'))).orderBy(desc(shippingLabels.voidedAt))
}
