import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { inches } from '@kitwright/shared/domain/units'
import { ApiErrorBodySchema } from '@kitwright/shared/errors'
import { ScanResultSchema } from '@kitwright/shared/scan'
import { randomUUID } from 'node:crypto'
import { ReturnSchema } from '@kitwright/shared/returns'
import { orders, parts, returns, users } from '../../server/src/db/schema/index'
import { seedDemo } from '../../server/src/seeds/demo'
import { DEMO_PART_SKUS } from '../../server/src/seeds/catalog'
import { buildApp, signedInAs } from '../support/app'
import { insertBin, insertBuildRevision, insertBuildWorkOrder } from '../support/build-factories'
import { insertOffcut } from '../support/cut-run-factories'
import { createTestDb, type TestDb } from '../support/test-db'

let t: TestDb
let cutter: Awaited<ReturnType<typeof signedInAs>>['agent']
let packer: Awaited<ReturnType<typeof signedInAs>>['agent']
let tote: Awaited<ReturnType<typeof insertBuildRevision>>

beforeAll(async () => {
  t = await createTestDb()
  const { app } = buildApp(t)
  await seedDemo(t.db)
  tote = await insertBuildRevision(t.db)
  cutter = (await signedInAs(app, t, 'cutter')).agent
  packer = (await signedInAs(app, t, 'packer')).agent
})
afterAll(() => t.drop())

async function scan(code: string, agent = cutter) {
  const res = await agent.get(`/api/scan/${encodeURIComponent(code)}`)
  expect(res.status).toBe(200)
  return ScanResultSchema.parse(res.body)
}

describe('GET /api/scan/:code resolves every kind of Kitwright code', () => {
  it('a bin holding a unit: the unit and where it goes next', async () => {
    const wo = await insertBuildWorkOrder(t.db, tote.revision.id, tote.kit.id, 'cut')
    const bin = await insertBin(t.db, wo.id)
    const result = await scan(bin.code.toLowerCase()) // scanners and hands type either case
    expect(result).toMatchObject({ kind: 'bin', code: bin.code, workOrderSerial: wo.serial, status: 'cut', next: { place: 'build' } })
    expect(result.title).toContain(wo.serial)
  })

  it('an empty bin: fill it at the cut bench', async () => {
    const bin = await insertBin(t.db, null)
    expect(await scan(bin.code)).toMatchObject({ kind: 'bin', next: { place: 'cut' } })
  })

  it("a unit's serial", async () => {
    const wo = await insertBuildWorkOrder(t.db, tote.revision.id, tote.kit.id, 'waiting_cut')
    expect(await scan(wo.serial.toLowerCase())).toMatchObject({ kind: 'work_order', workOrderSerial: wo.serial, next: { place: 'cut' } })
  })

  it('an order number', async () => {
    const [order] = await t.db.select().from(orders).limit(1)
    expect(await scan(order!.number)).toMatchObject({ kind: 'order', orderId: order!.id })
  })

  it('an offcut label, with its length in the shop unit', async () => {
    const offcut = await insertOffcut(t.db, DEMO_PART_SKUS.pipeHalfInch, inches(14.5))
    expect(offcut.code).toMatch(/^OC-\d{6,}$/)
    const result = await scan(offcut.code.toLowerCase())
    expect(result).toMatchObject({ kind: 'offcut', status: 'in_stock', next: { place: 'stock' } })
    expect(result.title).toContain('14-1/2"')
  })

  it('offcut codes come from a sequence: a hundred offcuts, a hundred codes, each scan finds its own', async () => {
    const made = []
    for (let i = 0; i < 100; i++) made.push(await insertOffcut(t.db, DEMO_PART_SKUS.pipeHalfInch, inches(10 + (i % 20))))
    expect(new Set(made.map((o) => o.code)).size).toBe(100)
    for (const o of [made[0]!, made[57]!, made[99]!]) expect(await scan(o.code)).toMatchObject({ kind: 'offcut', code: o.code })
  })

  it('refuses a code that names things of two kinds, naming both, instead of picking one', async () => {
    const bin = await insertBin(t.db, null)
    await t.db.insert(parts).values({ sku: bin.code.toLowerCase(), name: 'A part typed like a bin code', kind: 'hardware', unitCostCents: 100, weightGrams: 10 })
    const res = await cutter.get(`/api/scan/${encodeURIComponent(bin.code)}`)
    expect(res.status).toBe(409)
    expect(ApiErrorBodySchema.parse(res.body).error.message).toMatch(new RegExp(`names bin ${bin.code} and part ${bin.code.toLowerCase()}; Kitwright will not guess which`))
  })

  it("a part's SKU, with its shelf", async () => {
    expect(await scan(DEMO_PART_SKUS.sprayer)).toMatchObject({ kind: 'part', next: { place: 'stock', message: 'Shelf A2-01' } })
  })

  it('an unknown code: 404 with a message that says what to do', async () => {
    const res = await cutter.get('/api/scan/NOT-A-CODE-42')
    expect(res.status).toBe(404)
    expect(ApiErrorBodySchema.parse(res.body).error.message).toMatch(/No bin, unit, order, offcut, part or return has the code "NOT-A-CODE-42"/)
  })
})

describe('GET /api/scan/:code finds a return by its label or its number', () => {
  /** A shipped unit with a return whose label was bought (as the carrier leaves it: tracking number, key). */
  async function returnWithLabel() {
    const wo = await insertBuildWorkOrder(t.db, tote.revision.id, tote.kit.id, 'shipped')
    const [office] = await t.db.select().from(users).limit(1)
    const tag = randomUUID().slice(0, 8).toUpperCase()
    const [ret] = await t.db
      .insert(returns)
      .values({
        number: `R-S${tag}`,
        workOrderId: wo.id,
        orderId: wo.orderId,
        reason: 'Leaks',
        openedBy: office!.id,
        labelStatus: 'bought',
        labelKey: randomUUID(),
        trackingNumber: `BP9${tag}`,
      })
      .returning()
    return { wo, ret: ret! }
  }

  it('the packer scanning the return label anywhere gets the return to open; after receiving, it waits for the office', async () => {
    const { wo, ret } = await returnWithLabel()
    const byLabel = await scan(ret.trackingNumber!.toLowerCase(), packer)
    expect(byLabel).toMatchObject({
      kind: 'return',
      code: ret.number,
      status: 'awaiting_parcel',
      returnId: ret.id,
      orderId: wo.orderId,
      workOrderSerial: wo.serial,
      next: { place: 'pack' },
    })
    expect(byLabel.title).toBe(`Return ${ret.number} of unit ${wo.serial} (${tote.kit.name}): Leaks`)
    // The return's own number finds it too, and the pack bench receives the parcel by it.
    expect(await scan(ret.number.toLowerCase(), packer)).toMatchObject({ kind: 'return', returnId: ret.id })
    const received = await packer.post('/api/returns/receive').send({ code: ret.number })
    expect(received.status, JSON.stringify(received.body)).toBe(200)
    expect(ReturnSchema.parse(received.body)).toMatchObject({ id: ret.id, status: 'received', received: { code: ret.number } })
    expect(await scan(ret.trackingNumber!, packer)).toMatchObject({ kind: 'return', status: 'received', next: { place: 'office' } })
    // The serial on the unit itself names its return too, and says where it goes.
    const bySerial = await scan(wo.serial, packer)
    expect(bySerial).toMatchObject({ kind: 'work_order', returnId: ret.id, next: { place: 'office' } })
    expect(bySerial.title).toMatch(new RegExp(`, returned on ${ret.number}$`))
  })

  it('tells a bench that does not open returns to take the parcel to the pack bench, without the ids to open it', async () => {
    const { wo, ret } = await returnWithLabel()
    const result = await scan(ret.trackingNumber!)
    expect(result).toMatchObject({
      kind: 'return',
      code: ret.number,
      returnId: null,
      orderId: null,
      workOrderSerial: wo.serial,
      next: { place: 'pack', message: "A customer's parcel coming back: take it to the pack bench to be received" },
    })
    // The reason the customer gave is the office's and the pack bench's to read.
    expect(result.title).toBe(`Return ${ret.number} of unit ${wo.serial} (${tote.kit.name})`)
    expect(await scan(wo.serial)).toMatchObject({ kind: 'work_order', returnId: null, next: { place: 'pack' } })
    // And the return itself stays closed to that bench.
    expect((await cutter.get(`/api/returns/${ret.id}`)).status).toBe(403)
  })
})
