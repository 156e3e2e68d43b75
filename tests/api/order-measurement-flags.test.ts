import { eq } from 'drizzle-orm'
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest'
import { z } from 'zod'
import { MeasurementFlagSchema } from '@kitwright/shared/measurement-flags'
import { OrderDetailSchema } from '@kitwright/shared/orders'
import { buildSteps, buildStepTicks } from '../../server/src/db/schema/index'
import { buildApp, signedInAs } from '../support/app'
import { insertBuildRevision, insertBuildWorkOrder } from '../support/build-factories'
import { createTestDb, type TestDb } from '../support/test-db'

let t: TestDb
let app: ReturnType<typeof buildApp>['app']
type Agent = Awaited<ReturnType<typeof signedInAs>>['agent']

beforeAll(async () => {
  t = await createTestDb()
  app = buildApp(t).app
})
afterEach(() => t.truncate())
afterAll(() => t.drop())

const tick = (agent: Agent, woId: string, stepId: string, body: object = {}) => agent.post(`/api/build/${woId}/steps/${stepId}/tick`).send(body)
const undo = (agent: Agent, woId: string, stepId: string) => agent.post(`/api/build/${woId}/steps/${stepId}/undo`).send({})

async function orderDetail(agent: Agent, orderId: string) {
  const res = await agent.get(`/api/orders/${orderId}`)
  expect(res.status, JSON.stringify(res.body)).toBe(200)
  return OrderDetailSchema.parse(res.body)
}

describe('out-of-limits measurements on the order page', () => {
  it('shows the unit, step, value, limits, reason and who; the same row as the home list; reworked once undone and measured again', async () => {
    // The revision's first step takes the tote's width, 17.75 – 18.25 in, and sends a unit outside them to rework.
    const rev = await insertBuildRevision(t.db)
    const step1 = rev.steps[0]!
    await t.db.update(buildSteps).set({ outOfLimitsRework: true }).where(eq(buildSteps.id, step1.id))
    const wo = await insertBuildWorkOrder(t.db, rev.revision.id, rev.kit.id, 'cut')
    const other = await insertBuildWorkOrder(t.db, rev.revision.id, rev.kit.id, 'cut')
    const { agent: assembler, user: assemblerUser } = await signedInAs(app, t, 'assembler')
    const { agent: planner } = await signedInAs(app, t, 'planner')

    expect((await orderDetail(planner, wo.orderId)).measurementFlags).toEqual([])
    const reason = 'Tote bulges at the handle; a narrower one is on order'
    expect((await tick(assembler, wo.id, step1.id, { measurement: '18 1/2', reason })).status).toBe(200)
    expect((await tick(assembler, other.id, step1.id, { measurement: 17.5, reason: 'Tote from the old batch' })).status).toBe(200)

    const detail = await orderDetail(planner, wo.orderId)
    // Only this order's unit: the other order's flag stays on its own order.
    expect(detail.measurementFlags).toEqual([
      expect.objectContaining({
        workOrderId: wo.id,
        serial: wo.serial,
        workOrderStatus: 'rework',
        orderId: wo.orderId,
        stepPosition: 1,
        stepText: 'Measure the tote width at the manifold height.',
        measurement: 18.5,
        unit: 'in',
        min: 17.75,
        max: 18.25,
        reason,
        rework: true,
        by: assemblerUser.name,
        undoneAt: null,
        undoneBy: null,
      }),
    ])
    // The home page's attention list has the very same row (one query serves both).
    const home = z.array(MeasurementFlagSchema).parse((await planner.get('/api/build/out-of-limits')).body)
    expect(home.find((f) => f.tickId === detail.measurementFlags[0]!.tickId)).toEqual(detail.measurementFlags[0])
    expect(home.map((f) => f.workOrderId).sort()).toEqual([wo.id, other.id].sort())

    // Rework: the step undone, the right tote measured within limits. The order keeps the flag, marked undone; the home list drops it.
    expect((await undo(assembler, wo.id, step1.id)).status).toBe(200)
    expect((await tick(assembler, wo.id, step1.id, { measurement: 18 })).status).toBe(200)
    const after = await orderDetail(planner, wo.orderId)
    expect(after.measurementFlags).toHaveLength(1)
    expect(after.measurementFlags[0]).toMatchObject({ tickId: detail.measurementFlags[0]!.tickId, measurement: 18.5, undoneBy: assemblerUser.name })
    expect(after.measurementFlags[0]!.workOrderStatus).not.toBe('rework')
    const [row] = await t.db.select().from(buildStepTicks).where(eq(buildStepTicks.id, detail.measurementFlags[0]!.tickId))
    expect(row!.undoneAt?.toISOString()).toBe(after.measurementFlags[0]!.undoneAt)
    const homeAfter = z.array(MeasurementFlagSchema).parse((await planner.get('/api/build/out-of-limits')).body)
    expect(homeAfter.map((f) => f.workOrderId)).toEqual([other.id])
  })

  it('is the office’s: a bench role cannot read the order', async () => {
    const rev = await insertBuildRevision(t.db)
    const wo = await insertBuildWorkOrder(t.db, rev.revision.id, rev.kit.id, 'cut')
    const { agent: assembler } = await signedInAs(app, t, 'assembler')
    expect((await assembler.get(`/api/orders/${wo.orderId}`)).status).toBe(403)
  })
})
