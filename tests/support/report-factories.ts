import { randomBytes } from 'node:crypto'
import { sql } from 'drizzle-orm'
import type { Db } from '../../server/src/db/client'
import {
  buildSteps,
  buildStepTicks,
  cutParts,
  cutRunCuts,
  cutRuns,
  cutRunSticks,
  kitRevisions,
  kits,
  leakTests,
  offcuts,
  orderEvents,
  orderLines,
  orders,
  parcels,
  shipments,
  type NewCutRunRow,
  type NewOrderRow,
  type WorkOrderRow,
  workOrders,
} from '../../server/src/db/schema/index'

const tag = () => randomBytes(3).toString('hex').toUpperCase()

/** An invented kit with released revisions `codes`, each with `steps` build steps. */
export async function insertReportKit(db: Db, codes: string[], steps = 3) {
  const t = tag()
  const [kit] = await db.insert(kits).values({ sku: `TST-RPT-${t}`, name: `Report tote kit ${t}` }).returning()
  const revisions = []
  for (const code of codes) {
    const [rev] = await db.insert(kitRevisions).values({ kitId: kit!.id, code, status: 'released', releasedAt: new Date('2026-01-05T00:00:00Z') }).returning()
    const stepRows = await db
      .insert(buildSteps)
      .values(Array.from({ length: steps }, (_, i) => ({ revisionId: rev!.id, position: i + 1, text: `Step ${i + 1}` })))
      .returning()
    revisions.push({ ...rev!, steps: stepRows.sort((a, b) => a.position - b.position) })
  }
  return { kit: kit!, revisions }
}

/** An order for an invented customer with one kit line of `quantity` units. */
export async function insertReportOrder(db: Db, kitId: string, values: Partial<NewOrderRow> & { quantity?: number } = {}) {
  const t = tag()
  const { quantity = 1, ...rest } = values
  const [order] = await db
    .insert(orders)
    .values({
      number: `R-${t}`,
      source: 'phone',
      status: 'released',
      paymentStatus: 'paid',
      customerName: `Juniper Hale ${t}`,
      customerEmail: `juniper-${t.toLowerCase()}@leafmail.example`,
      shipName: `Juniper Hale ${t}`,
      shipLine1: '9 Mossbank Lane',
      shipCity: 'Millbrook Falls',
      shipPostalCode: '97001',
      shipCountry: 'US',
      placedAt: new Date('2026-03-01T00:00:00Z'),
      ...rest,
    })
    .returning()
  const [line] = await db.insert(orderLines).values({ orderId: order!.id, lineNo: 1, kitId, sku: 'TST-RPT', description: 'Report tote kit', quantity }).returning()
  return { order: order!, line: line! }
}

/** A work order (unit) of an order line, in `status`, with its release and last change times. */
export async function insertReportUnit(
  db: Db,
  o: { order: { id: string }; line: { id: string } },
  revisionId: string,
  status: WorkOrderRow['status'],
  times: { createdAt?: Date; updatedAt?: Date } = {},
): Promise<WorkOrderRow> {
  const [wo] = await db
    .insert(workOrders)
    .values({ serial: sql`'U-' || nextval('work_order_serial_seq')`, orderId: o.order.id, orderLineId: o.line.id, kitRevisionId: revisionId, status, ...times })
    .returning()
  return wo!
}

/** A step tick of a unit at `at`; `undoneAt` makes it an undone tick. */
export async function insertTick(db: Db, workOrderId: string, stepId: string, userId: string, at: string, undoneAt?: string) {
  await db.insert(buildStepTicks).values({
    workOrderId,
    buildStepId: stepId,
    tickedBy: userId,
    tickedAt: new Date(at),
    ...(undoneAt ? { undoneAt: new Date(undoneAt), undoneBy: userId } : {}),
  })
}

/** A leak test of a unit: attempt number, passed or not, at `at` (readings of the demo protocol). */
export async function insertLeakTest(db: Db, workOrderId: string, userId: string, attempt: number, passed: boolean, at: string) {
  await db.insert(leakTests).values({
    workOrderId,
    attempt,
    startPressurePa: 103_421,
    endPressurePa: passed ? 102_000 : 90_000,
    holdMinutes: 10,
    waterVolumeMl: 30_000,
    enteredUnit: 'psi',
    passed,
    reason: passed ? null : 'Pressure dropped more than allowed',
    testedBy: userId,
    testedAt: new Date(at),
  })
}

/** A shipment of an order in `status`, shipped at `shippedAt`, with one parcel per list of units. */
export async function insertShipment(db: Db, orderId: string, userId: string, status: 'packing' | 'labelled' | 'shipped', shippedAt: string | null, parcelUnits: string[][]) {
  const [shipment] = await db
    .insert(shipments)
    .values({
      orderId,
      status,
      carrier: status === 'packing' ? null : 'Test carrier',
      trackingNumber: status === 'packing' ? null : `TRK${tag()}${tag()}`,
      shippedAt: shippedAt ? new Date(shippedAt) : null,
      shippedBy: shippedAt ? userId : null,
      createdBy: userId,
    })
    .returning()
  for (const [i, units] of parcelUnits.entries()) {
    await db.insert(parcels).values({
      shipmentId: shipment!.id,
      position: i + 1,
      boxName: 'Tote carton',
      length: 1000,
      width: 1000,
      height: 1000,
      workOrderIds: units,
      estimatedGrams: 5000,
      actualGrams: 5000,
      dimensionalGrams: 4000,
      billableGrams: 5000,
      sscc: String(Math.floor(Math.random() * 1e17)).padStart(18, '0'),
    })
  }
  return shipment!
}

/** The store's payment event on an order's timeline, at `at`. */
export async function insertPaymentEvent(db: Db, orderId: string, at: string) {
  await db.insert(orderEvents).values({ orderId, kind: 'payment', message: 'The web store reports this order paid.', createdAt: new Date(at) })
}

/** A cut part of a revision (one piece of `length` from pipe `partId`). */
export async function insertCutPart(db: Db, revisionId: string, partId: string, length: number) {
  const [row] = await db.insert(cutParts).values({ revisionId, partId, label: 'Riser', length, quantity: 1, position: 1 }).returning()
  return row!
}

export interface StickSpec {
  length: number
  status: 'pending' | 'in_progress' | 'done' | 'damaged'
  remnant: number
  /** A remnant put back on the rack as an offcut. */
  offcut?: boolean
  cuts: { length: number; status: 'pending' | 'cut' | 'replanned'; cutAt?: string }[]
}

/** A cut run with its plan totals and its sticks and cuts as the bench left them. */
export async function insertCutRun(
  db: Db,
  run: Pick<NewCutRunRow, 'status' | 'lengthUsed' | 'pieceLength' | 'offcutLength'> & { completedAt?: string },
  sticks: StickSpec[],
  piece: { partId: string; cutPartId: string; workOrderId: string },
) {
  const [row] = await db
    .insert(cutRuns)
    .values({
      number: `CR-T${tag()}`,
      status: run.status,
      kerf: 0,
      endTrim: 0,
      minOffcut: 10_000,
      planStatus: 'optimal',
      lengthUsed: run.lengthUsed,
      pieceLength: run.pieceLength,
      offcutLength: run.offcutLength,
      publishedAt: new Date('2026-03-01T08:00:00Z'),
      completedAt: run.completedAt ? new Date(run.completedAt) : null,
    })
    .returning()
  for (const [i, s] of sticks.entries()) {
    const [offcut] = s.offcut ? await db.insert(offcuts).values({ partId: piece.partId, length: s.remnant }).returning() : []
    const [stick] = await db
      .insert(cutRunSticks)
      .values({
        cutRunId: row!.id,
        partId: piece.partId,
        stickLength: s.length,
        length: s.length,
        patternIndex: i,
        position: i + 1,
        status: s.status,
        remnant: s.remnant,
        remnantIsOffcut: s.offcut ?? false,
        offcutId: offcut?.id ?? null,
      })
      .returning()
    let offset = 0
    for (const [j, c] of s.cuts.entries()) {
      await db.insert(cutRunCuts).values({
        cutRunId: row!.id,
        stickId: stick!.id,
        position: j + 1,
        offset,
        length: c.length,
        workOrderId: piece.workOrderId,
        cutPartId: piece.cutPartId,
        status: c.status,
        cutAt: c.cutAt ? new Date(c.cutAt) : null,
      })
      offset += c.length
    }
  }
  return row!
}
