import { eq } from 'drizzle-orm'
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest'
import { CutRunDetailSchema } from '@kitwright/shared/cut-runs'
import { ApiErrorBodySchema } from '@kitwright/shared/errors'
import { ShopSettingsSchema } from '@kitwright/shared/settings'
import { auditEvents, cutRunSticks, shopSettings } from '../../server/src/db/schema/index'
import { seedDemo } from '../../server/src/seeds/demo'
import { buildApp, signedInAs } from '../support/app'
import { insertWorkOrders } from '../support/cut-run-factories'
import { createTestDb, type TestDb } from '../support/test-db'

let t: TestDb
let app: ReturnType<typeof buildApp>['app']
type Agent = Awaited<ReturnType<typeof signedInAs>>['agent']
let admin: Agent
let planner: Agent
let cutter: Agent

beforeAll(async () => {
  t = await createTestDb()
  app = buildApp(t).app
})
beforeEach(async () => {
  await t.truncate()
  await seedDemo(t.db)
  admin = (await signedInAs(app, t, 'admin')).agent
  planner = (await signedInAs(app, t, 'planner')).agent
  cutter = (await signedInAs(app, t, 'cutter')).agent
})
afterAll(() => t.drop())

describe('the planning time of cut runs', () => {
  it('is a shop setting, 2 s unless the owner changes it, kept within half a second and 120 s', async () => {
    const seen = ShopSettingsSchema.parse((await admin.get('/api/settings')).body)
    expect(seen.nestingTimeLimitSeconds).toBe(2)
    const bad = await admin.patch('/api/settings').send({ nestingTimeLimitSeconds: 0.1 })
    expect(bad.status).toBe(400)
    expect(ApiErrorBodySchema.parse(bad.body).error.fields).toHaveProperty('nestingTimeLimitSeconds')
    expect((await planner.patch('/api/settings').send({ nestingTimeLimitSeconds: 5 })).status).toBe(403)
    const ok = await admin.patch('/api/settings').send({ nestingTimeLimitSeconds: 7.5 })
    expect(ok.status).toBe(200)
    expect(ShopSettingsSchema.parse(ok.body).nestingTimeLimitSeconds).toBe(7.5)
    const [row] = await t.db.select().from(shopSettings).where(eq(shopSettings.id, 1))
    expect(row?.nestingTimeLimitMs).toBe(7500)
  })

  it('"take longer" plans a draft again with the same work orders and replaces its sticks; only the office, only drafts', async () => {
    const wos = await insertWorkOrders(t.db, { kitSku: 'MW-TOTE-12', count: 2 })
    const ids = wos.map((w) => w.id)
    const first = await planner.post('/api/cut-runs').send({ workOrderIds: ids })
    expect(first.status, JSON.stringify(first.body)).toBe(201)
    const draft = CutRunDetailSchema.parse(first.body)
    const pieces = draft.sticks.flatMap((s) => s.cuts).length

    expect((await cutter.post(`/api/cut-runs/${draft.id}/replan`).send({ timeLimitSeconds: 3 })).status).toBe(403)
    expect((await planner.post(`/api/cut-runs/${draft.id}/replan`).send({ timeLimitSeconds: 500 })).status).toBe(400)

    const again = await planner.post(`/api/cut-runs/${draft.id}/replan`).send({ timeLimitSeconds: 3 })
    expect(again.status, JSON.stringify(again.body)).toBe(200)
    const replanned = CutRunDetailSchema.parse(again.body)
    expect(replanned.id).toBe(draft.id)
    expect(replanned.status).toBe('draft')
    // The same pieces for the same work orders, none lost or doubled, on new sticks only.
    const cuts = replanned.sticks.flatMap((s) => s.cuts)
    expect(cuts).toHaveLength(pieces)
    expect(new Set(cuts.map((c) => c.workOrderId))).toEqual(new Set(ids))
    const rows = await t.db.select().from(cutRunSticks).where(eq(cutRunSticks.cutRunId, draft.id))
    expect(rows).toHaveLength(replanned.sticks.length)
    expect(rows.every((r) => !draft.sticks.some((s) => s.id === r.id))).toBe(true)
    expect(replanned.totals.sticksUsed).toBe(replanned.sticks.length)
    const audit = await t.db.select().from(auditEvents).where(eq(auditEvents.action, 'cut_run.replan'))
    expect(audit).toHaveLength(1)

    // Once published it is frozen.
    expect((await planner.post(`/api/cut-runs/${draft.id}/publish`)).status).toBe(200)
    const late = await planner.post(`/api/cut-runs/${draft.id}/replan`).send({})
    expect(late.status).toBe(409)
    expect(ApiErrorBodySchema.parse(late.body).error.message).toMatch(/only a draft/)
  })
})
