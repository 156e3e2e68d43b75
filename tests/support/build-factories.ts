import { randomBytes } from 'node:crypto'
import { sql } from 'drizzle-orm'
import { PASCALS_PER_PSI } from '@kitwright/shared/kits'
import type { Db } from '../../server/src/db/client'
import { bins, buildSteps, kitRevisions, kits, orderLines, orders, workOrders, type WorkOrderRow } from '../../server/src/db/schema/index'

/**
 * A released revision of an invented test kit with four build steps: a measurement (tote width,
 * 17.75 to 18.25 in), one with a caution, one that needs a photo, and a plain one; and the demo
 * manifolds' leak test protocol (10 to 20 psi, hold 10 min, drop at most 0.5 psi, 30 L).
 */
export async function insertBuildRevision(db: Db, options: { leakTest?: boolean } = {}) {
  const tag = randomBytes(3).toString('hex').toUpperCase()
  const [kit] = await db.insert(kits).values({ sku: `TST-KIT-${tag}`, name: `Test tote kit ${tag}` }).returning()
  const withTest = options.leakTest ?? true
  const [revision] = await db
    .insert(kitRevisions)
    .values({
      kitId: kit!.id,
      code: 'A',
      status: 'released',
      releasedAt: new Date(),
      leakTestMinPressurePa: withTest ? Math.round(10 * PASCALS_PER_PSI) : null,
      leakTestMaxPressurePa: withTest ? Math.round(20 * PASCALS_PER_PSI) : null,
      leakTestHoldMinutes: withTest ? 10 : null,
      leakTestMaxDropPa: withTest ? Math.round(0.5 * PASCALS_PER_PSI) : null,
      leakTestWaterVolumeMl: withTest ? 30_000 : null,
    })
    .returning()
  const steps = await db
    .insert(buildSteps)
    .values([
      {
        revisionId: revision!.id,
        position: 1,
        text: 'Measure the tote width at the manifold height.',
        measurementRequired: true,
        measurementUnit: 'in',
        measurementMin: '17.75',
        measurementMax: '18.25',
      },
      { revisionId: revision!.id, position: 2, text: 'Drill the sprayer holes.', caution: 'Wear eye protection. Clamp the manifold.' },
      { revisionId: revision!.id, position: 3, text: 'Photograph the finished unit from above.', photoRequired: true },
      { revisionId: revision!.id, position: 4, text: 'Fit the pump and route the cord with a drip loop.' },
    ])
    .returning()
  return { kit: kit!, revision: revision!, steps: steps.sort((a, b) => a.position - b.position) }
}

/** An order for an invented customer with one work order of `revisionId` in `status`; serial from the shop's sequence. */
export async function insertBuildWorkOrder(db: Db, revisionId: string, kitId: string, status: WorkOrderRow['status'] = 'cut'): Promise<WorkOrderRow> {
  const tag = randomBytes(3).toString('hex').toUpperCase()
  const [order] = await db
    .insert(orders)
    .values({
      number: `T-${tag}`,
      source: 'phone',
      status: 'released',
      paymentStatus: 'paid',
      customerName: `Tamsin Rowe ${tag}`,
      customerEmail: `tamsin-${tag.toLowerCase()}@leafmail.example`,
      shipName: `Tamsin Rowe ${tag}`,
      shipLine1: '4 Fernhollow Lane',
      shipCity: 'Millbrook Falls',
      shipPostalCode: '97001',
      shipCountry: 'US',
      placedAt: new Date(),
    })
    .returning()
  const [line] = await db.insert(orderLines).values({ orderId: order!.id, lineNo: 1, kitId, sku: 'TST', description: 'Test tote kit', quantity: 1 }).returning()
  const [wo] = await db
    .insert(workOrders)
    .values({ serial: sql`'U-' || nextval('work_order_serial_seq')`, orderId: order!.id, orderLineId: line!.id, kitRevisionId: revisionId, status })
    .returning()
  return wo!
}

/** A bin, holding `workOrderId` when given (as the cut bench leaves it). */
export async function insertBin(db: Db, workOrderId: string | null) {
  const code = `BIN-T${randomBytes(3).toString('hex').toUpperCase()}`
  const [bin] = await db
    .insert(bins)
    .values({ code, status: workOrderId ? 'in_use' : 'free', workOrderId, assignedAt: workOrderId ? new Date() : null })
    .returning()
  return bin!
}
