import { eq } from 'drizzle-orm'
import request from 'supertest'
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest'
import { z } from 'zod'
import { inches } from '@kitwright/shared/domain/units'
import { BuildWorklistItemSchema, CutWorklistItemSchema, PackWorklistItemSchema } from '@kitwright/shared/worklists'
import { cutParts, cutRunCuts, cutRuns, cutRunSticks, orders, workOrders } from '../../server/src/db/schema/index'
import { buildApp, signedInAs } from '../support/app'
import { insertBin, insertBuildRevision, insertBuildWorkOrder } from '../support/build-factories'
import { insertPart } from '../support/factories'
import { createTestDb, type TestDb } from '../support/test-db'

let t: TestDb
let app: ReturnType<typeof buildApp>['app']

beforeAll(async () => {
  t = await createTestDb()
  app = buildApp(t).app
})
afterEach(() => t.truncate())
afterAll(() => t.drop())

const day = (offset: number) => new Date(Date.now() + offset * 86_400_000).toISOString().slice(0, 10)

/** A unit in `status` whose order is rush or not, promised `promised`, last changed `changedAt`. */
async function unit(
  rev: Awaited<ReturnType<typeof insertBuildRevision>>,
  status: 'cut' | 'building' | 'rework' | 'built' | 'waiting_cut' | 'shipped',
  rush: boolean,
  promised: string | null,
  changedAt: Date,
) {
  const wo = await insertBuildWorkOrder(t.db, rev.revision.id, rev.kit.id, status)
  await t.db.update(orders).set({ priority: rush ? 'rush' : 'normal', promisedShipDate: promised }).where(eq(orders.id, wo.orderId))
  await t.db.update(workOrders).set({ updatedAt: changedAt }).where(eq(workOrders.id, wo.id))
  return wo
}

describe('the build bench worklist', () => {
  it('lists units ready to build, rush first, then by promised date, then the longest wait, with late flags and bins', async () => {
    const rev = await insertBuildRevision(t.db)
    const hour = (h: number) => new Date(Date.now() - h * 3_600_000)
    const normalSoon = await unit(rev, 'cut', false, day(1), hour(1))
    const normalLate = await unit(rev, 'building', false, day(-2), hour(2))
    const rushLater = await unit(rev, 'cut', true, day(5), hour(3))
    const rushSoon = await unit(rev, 'rework', true, day(2), hour(1))
    const noPromise = await unit(rev, 'cut', false, null, hour(30))
    const sameDayOlder = await unit(rev, 'cut', false, day(1), hour(4))
    // Not for this bench: still to cut, already built, shipped.
    await unit(rev, 'waiting_cut', true, day(-5), hour(1))
    await unit(rev, 'built', true, day(-5), hour(1))
    await unit(rev, 'shipped', true, day(-5), hour(1))
    const bin = await insertBin(t.db, normalSoon.id)

    const { agent } = await signedInAs(app, t, 'assembler')
    const res = await agent.get('/api/build/worklist')
    expect(res.status).toBe(200)
    const list = z.array(BuildWorklistItemSchema).parse(res.body)
    expect(list.map((u) => u.serial)).toEqual([rushSoon, rushLater, normalLate, sameDayOlder, normalSoon, noPromise].map((w) => w.serial))
    expect(list.find((u) => u.serial === normalLate.serial)).toMatchObject({ late: true, rush: false, promisedShipDate: day(-2), status: 'building' })
    expect(list.find((u) => u.serial === rushSoon.serial)).toMatchObject({ late: false, rush: true, status: 'rework' })
    expect(list.find((u) => u.serial === normalSoon.serial)).toMatchObject({ binCode: bin.code, kitSku: rev.kit.sku, revisionCode: 'A' })
    expect(Date.parse(list.find((u) => u.serial === noPromise.serial)!.waitingSince)).toBeLessThan(Date.now() - 29 * 3_600_000)
  })

  it('is for the build bench and the office only', async () => {
    expect((await request(app).get('/api/build/worklist')).status).toBe(401)
    for (const role of ['cutter', 'packer'] as const) {
      const { agent } = await signedInAs(app, t, role)
      expect((await agent.get('/api/build/worklist')).status).toBe(403)
    }
    for (const role of ['planner', 'admin'] as const) {
      const { agent } = await signedInAs(app, t, role)
      expect((await agent.get('/api/build/worklist')).status).toBe(200)
    }
  })
})

describe('the pack bench worklist', () => {
  it('lists orders with built units, rush first then by promise, counting what is ready of what is to ship; not held orders', async () => {
    const rev = await insertBuildRevision(t.db)
    const now = new Date()
    const normal = await unit(rev, 'built', false, day(1), now)
    const late = await unit(rev, 'built', false, day(-1), now)
    const rush = await unit(rev, 'built', true, day(9), now)
    // A second unit of the rush order, not built yet: 1 of 2 ready.
    const [line] = await t.db.select().from(workOrders).where(eq(workOrders.id, rush.id))
    await t.db.insert(workOrders).values({ serial: `${rush.serial}-B`, orderId: rush.orderId, orderLineId: line!.orderLineId, kitRevisionId: rev.revision.id, status: 'building' })
    const held = await unit(rev, 'built', true, day(-3), now)
    await t.db.update(orders).set({ heldAt: now, holdReason: 'Customer asked to wait' }).where(eq(orders.id, held.orderId))
    await unit(rev, 'building', true, day(-3), now)
    const bin = await insertBin(t.db, late.id)

    const { agent } = await signedInAs(app, t, 'packer')
    const res = await agent.get('/api/pack/worklist')
    expect(res.status).toBe(200)
    const list = z.array(PackWorklistItemSchema).parse(res.body)
    expect(list.map((o) => o.orderId)).toEqual([rush.orderId, late.orderId, normal.orderId])
    expect(list[0]).toMatchObject({ rush: true, late: false, unitsToShip: 2, ready: [{ serial: rush.serial, binCode: null }] })
    expect(list[1]).toMatchObject({ rush: false, late: true, unitsToShip: 1, ready: [{ serial: late.serial, binCode: bin.code }] })

    for (const role of ['assembler', 'cutter'] as const) {
      const { agent: other } = await signedInAs(app, t, role)
      expect((await other.get('/api/pack/worklist')).status).toBe(403)
    }
    expect((await request(app).get('/api/pack/worklist')).status).toBe(401)
  })
})

describe('the cut bench worklist', () => {
  it('lists published runs with a rush unit first, then by the earliest promise among their units', async () => {
    const rev = await insertBuildRevision(t.db)
    const pipe = await insertPart(t.db, { kind: 'stock_length', stickLengths: [inches(120)], nominalSize: '1/2 in' })
    const [part] = await t.db.insert(cutParts).values({ revisionId: rev.revision.id, partId: pipe.id, label: 'side', length: inches(20), quantity: 1, position: 1 }).returning()
    const run = async (number: string, status: 'published' | 'draft' | 'done', units: { rush: boolean; promised: string | null }[], cut = 0) => {
      const [r] = await t.db.insert(cutRuns).values({ number, status, kerf: 0, endTrim: 0, minOffcut: 0, planStatus: 'optimal', publishedAt: new Date() }).returning()
      const [stick] = await t.db.insert(cutRunSticks).values({
        cutRunId: r!.id,
        partId: pipe.id,
        stickLength: inches(120),
        length: inches(120),
        patternIndex: 0,
        position: 1,
        remnant: 0,
        remnantIsOffcut: false,
      }).returning()
      let i = 0
      for (const u of units) {
        const wo = await unit(rev, 'waiting_cut', u.rush, u.promised, new Date())
        await t.db.insert(cutRunCuts).values({
          cutRunId: r!.id,
          stickId: stick!.id,
          position: ++i,
          offset: 0,
          length: inches(20),
          workOrderId: wo.id,
          cutPartId: part!.id,
          status: i <= cut ? 'cut' : 'pending',
        })
      }
      return r!
    }
    const plain = await run('CR-0101', 'published', [{ rush: false, promised: day(4) }, { rush: false, promised: day(2) }], 1)
    const withRush = await run('CR-0102', 'published', [{ rush: false, promised: day(8) }, { rush: true, promised: day(7) }])
    const lateRun = await run('CR-0103', 'published', [{ rush: false, promised: day(-1) }])
    await run('CR-0104', 'draft', [{ rush: true, promised: day(-9) }])

    const { agent } = await signedInAs(app, t, 'cutter')
    const res = await agent.get('/api/cut-runs/worklist')
    expect(res.status).toBe(200)
    const list = z.array(CutWorklistItemSchema).parse(res.body)
    expect(list.map((r) => r.number)).toEqual([withRush.number, lateRun.number, plain.number])
    expect(list[0]).toMatchObject({ rush: true, rushUnits: 1, promisedShipDate: day(7), workOrderCount: 2, cutsDone: 0, cutsTotal: 2 })
    expect(list[1]).toMatchObject({ late: true, rush: false })
    expect(list[2]).toMatchObject({ promisedShipDate: day(2), cutsDone: 1, cutsTotal: 2, late: false })
    for (const role of ['assembler', 'packer'] as const) {
      const { agent: other } = await signedInAs(app, t, role)
      expect((await other.get('/api/cut-runs/worklist')).status).toBe(403)
    }
  })
})
