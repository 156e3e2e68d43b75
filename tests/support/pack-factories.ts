import { randomBytes } from 'node:crypto'
import { and, eq, sql } from 'drizzle-orm'
import type { Db } from '../../server/src/db/client'
import { bins, bomLines, kitRevisions, kits, leakTests, orderLines, orders, users, workOrders, type WorkOrderRow } from '../../server/src/db/schema/index'
import { reserveStock } from '../../server/src/features/stock/stock.service'

type LeakResult = 'passed' | 'failed' | 'none'

export interface PackLine {
  /** A demo kit (seedDemo): MW-TOTE-12, MW-TOTE-6C, MW-SPARE-SPR6, MW-SPARE-CUP12. */
  kitSku: string
  quantity?: number
  /** The units' status; built by default (a manifold's build finished, a spare pack as released). */
  status?: WorkOrderRow['status']
  /** A manifold unit's latest leak test; passed by default. */
  leakTest?: LeakResult
}

async function newestRevision(db: Db, kitSku: string) {
  const [row] = await db
    .select({ revision: kitRevisions, kitId: kits.id })
    .from(kitRevisions)
    .innerJoin(kits, eq(kits.id, kitRevisions.kitId))
    .where(and(eq(kits.sku, kitSku), eq(kitRevisions.status, 'released')))
    .orderBy(sql`${kitRevisions.releasedAt} desc nulls last`, sql`${kitRevisions.code} desc`)
    .limit(1)
  if (!row) throw new Error(`no released revision of ${kitSku}; seed the demo first`)
  return row
}

/**
 * A released order for an invented customer, as the build bench leaves it: one work order per unit
 * at the kit's newest released revision, its BOM reserved in the ledger, each manifold unit in its
 * own bin with a leak test recorded (passed unless told). Needs the demo data (seedDemo).
 */
export async function insertPackOrder(db: Db, lines: PackLine[]) {
  const tag = randomBytes(3).toString('hex').toUpperCase()
  const [tester] = await db.select().from(users).limit(1)
  if (!tester) throw new Error('no user to record the leak tests; seed the demo first')
  const [order] = await db
    .insert(orders)
    .values({
      number: `P-${tag}`,
      source: 'phone',
      status: 'released',
      paymentStatus: 'paid',
      customerName: `Hollis Marchbank ${tag}`,
      customerEmail: `hollis-${tag.toLowerCase()}@fernmail.example`,
      shipName: `Hollis Marchbank ${tag}`,
      shipLine1: '9 Lanternwood Close',
      shipCity: 'Ashgrove',
      shipRegion: 'OR',
      shipPostalCode: '97019',
      shipCountry: 'US',
      placedAt: new Date(),
      releasedAt: new Date(),
    })
    .returning()
  const units: { wo: WorkOrderRow; kitSku: string; binCode: string | null; binId: string | null }[] = []
  for (const [i, line] of lines.entries()) {
    const { revision, kitId } = await newestRevision(db, line.kitSku)
    const [ol] = await db.insert(orderLines).values({ orderId: order!.id, lineNo: i + 1, kitId, sku: line.kitSku, description: line.kitSku, quantity: line.quantity ?? 1 }).returning()
    const manifold = revision.frameInputs !== null
    for (let n = 0; n < (line.quantity ?? 1); n++) {
      const [wo] = await db
        .insert(workOrders)
        .values({ serial: sql`'U-' || nextval('work_order_serial_seq')`, orderId: order!.id, orderLineId: ol!.id, kitRevisionId: revision.id, status: line.status ?? 'built' })
        .returning()
      const bom = await db.select().from(bomLines).where(eq(bomLines.revisionId, revision.id))
      await db.transaction((tx) =>
        reserveStock(
          tx,
          { workOrderId: wo!.id, lines: bom.map((b) => ({ partId: b.partId, quantity: b.quantity, stickLength: null })), reason: `Order ${order!.number}` },
          { id: tester.id, name: tester.name },
        ),
      )
      let binCode: string | null = null
      let binId: string | null = null
      if (manifold) {
        const [bin] = await db.insert(bins).values({ code: `BIN-P${randomBytes(3).toString('hex').toUpperCase()}`, status: 'in_use', workOrderId: wo!.id, assignedAt: new Date() }).returning()
        binCode = bin!.code
        binId = bin!.id
        const result = line.leakTest ?? 'passed'
        if (result !== 'none') {
          await db.insert(leakTests).values({
            workOrderId: wo!.id,
            attempt: 1,
            startPressurePa: 103_421,
            endPressurePa: result === 'passed' ? 100_663 : 90_000,
            holdMinutes: 10,
            waterVolumeMl: revision.leakTestWaterVolumeMl ?? 30_000,
            enteredUnit: 'psi',
            passed: result === 'passed',
            reason: result === 'passed' ? null : 'Pressure dropped 1.95 psi, more than the allowed 0.50 psi',
            testedBy: tester.id,
          })
        }
      }
      units.push({ wo: wo!, kitSku: line.kitSku, binCode, binId })
    }
  }
  return { order: order!, units }
}

/** Tops every part up by 500 on hand (a receive move each), so the tests' reservations never run short. */
export async function receivePlenty(db: Db) {
  await db.execute(sql`insert into stock_moves (part_id, kind, quantity, stick_length, reference)
    select p.id, 'receive', 500, case when p.kind = 'stock_length' then p.stick_lengths[1] end, 'TEST-TOP-UP' from parts p`)
}
