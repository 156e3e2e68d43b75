// A unit built with lots of the demo pump and sprayers, shipped through the pack bench's own routes:
// its parts leave the shelf from those lots, and the recall of the pump lot shows when and how it went.
import { and, eq, isNotNull } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { LotDetailSchema } from '@kitwright/shared/lots'
import { PackViewSchema } from '@kitwright/shared/pack'
import { parcels, parts, stockLots, stockMoves, unitLots, users } from '../../server/src/db/schema/index'
import { DEMO_PART_SKUS } from '../../server/src/seeds/catalog'
import { seedDemo } from '../../server/src/seeds/demo'
import { buildApp, signedInAs } from '../support/app'
import { insertPackOrder, receivePlenty } from '../support/pack-factories'
import { createTestDb, type TestDb } from '../support/test-db'

let t: TestDb
let built: ReturnType<typeof buildApp>
type Agent = Awaited<ReturnType<typeof signedInAs>>['agent']
let packer: Agent
let planner: Agent

beforeAll(async () => {
  t = await createTestDb()
  await seedDemo(t.db)
  await receivePlenty(t.db)
  built = buildApp(t)
  packer = (await signedInAs(built.app, t, 'packer')).agent
  planner = (await signedInAs(built.app, t, 'planner')).agent
})
afterAll(() => t.drop())

function ok<T>(res: { status: number; body: unknown }, status: number, schema: { parse: (v: unknown) => T }): T {
  expect(res.status, JSON.stringify(res.body)).toBe(status)
  return schema.parse(res.body)
}

async function lotOf(sku: string, code: string) {
  const [row] = await t.db
    .select({ id: stockLots.id, partId: stockLots.partId })
    .from(stockLots)
    .innerJoin(parts, eq(parts.id, stockLots.partId))
    .where(and(eq(parts.sku, sku), eq(stockLots.code, code)))
  return row!
}
async function lotOnHand(lotId: string) {
  const moves = await t.db.select({ quantity: stockMoves.quantity }).from(stockMoves).where(eq(stockMoves.lotId, lotId))
  return moves.reduce((n, m) => n + m.quantity, 0)
}

describe('shipping a unit built with lots', () => {
  it('takes the pump and sprayers off the shelf from the lots fitted, and the recall shows the shipment', async () => {
    const made = await insertPackOrder(t.db, [{ kitSku: 'MW-TOTE-6C' }])
    const unit = made.units[0]!
    const pump = await lotOf(DEMO_PART_SKUS.pump, 'BW-2609-114')
    const sprayersOld = await lotOf(DEMO_PART_SKUS.sprayer, 'NZ-2608-31')
    const sprayersNew = await lotOf(DEMO_PART_SKUS.sprayer, 'NZ-2610-12')
    // The build bench recorded them (the unit is already built, so they are written as the bench left them).
    const [assembler] = await t.db.select({ id: users.id }).from(users).where(eq(users.role, 'assembler'))
    await t.db.insert(unitLots).values([
      { workOrderId: unit.wo.id, partId: pump.partId, lotId: pump.id, quantity: 1, fittedBy: assembler!.id },
      { workOrderId: unit.wo.id, partId: sprayersOld.partId, lotId: sprayersOld.id, quantity: 2, fittedBy: assembler!.id },
      { workOrderId: unit.wo.id, partId: sprayersNew.partId, lotId: sprayersNew.id, quantity: 4, fittedBy: assembler!.id },
    ])
    const before = { pump: await lotOnHand(pump.id), old: await lotOnHand(sprayersOld.id), new: await lotOnHand(sprayersNew.id) }

    let v = ok(await packer.get(`/api/pack/orders/${made.order.id}`), 200, PackViewSchema)
    for (const item of v.items) {
      v = ok(
        item.kind === 'unit'
          ? await packer.post(`/api/pack/orders/${made.order.id}/scan`).send({ code: item.binCode ?? item.serial })
          : await packer.post(`/api/pack/orders/${made.order.id}/tick`).send({ itemKey: item.key }),
        200,
        PackViewSchema,
      )
    }
    expect(v.canLabel, v.blockers.join('; ')).toBe(true)
    const boxes = v.parcels.map((p) => ({ workOrderIds: p.workOrderIds, boxId: p.boxId!, scaleGrams: null }))
    ok(await packer.post(`/api/pack/orders/${made.order.id}/label`).send({ service: 'ground', parcels: boxes }), 201, PackViewSchema)
    const shipped = await packer.post(`/api/pack/orders/${made.order.id}/ship`).send({})
    expect(shipped.status, JSON.stringify(shipped.body)).toBe(200)

    // The 6-site kit takes one pump and six sprayers: 1 from the pump lot, 2 + 4 from the sprayer lots.
    expect({ pump: await lotOnHand(pump.id), old: await lotOnHand(sprayersOld.id), new: await lotOnHand(sprayersNew.id) }).toEqual({
      pump: before.pump - 1,
      old: before.old - 2,
      new: before.new - 4,
    })
    const shipMoves = await t.db
      .select()
      .from(stockMoves)
      .where(and(eq(stockMoves.workOrderId, unit.wo.id), eq(stockMoves.kind, 'ship'), isNotNull(stockMoves.lotId)))
    expect(shipMoves.map((m) => m.quantity).sort()).toEqual([-1, -2, -4].sort())

    const detail = ok(await planner.get(`/api/lots/${pump.id}`), 200, LotDetailSchema)
    const row = detail.recall.find((u) => u.serial === unit.wo.serial)!
    const [parcel] = await t.db.select().from(parcels).where(isNotNull(parcels.trackingNumber))
    expect(row).toMatchObject({ status: 'shipped', trackingNumber: parcel!.trackingNumber, shipTo: { city: 'Ashgrove', region: 'OR' } })
    expect(row.shippedAt).not.toBeNull()
  })
})
