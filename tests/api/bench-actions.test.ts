import { randomUUID } from 'node:crypto'
import { and, eq, isNull } from 'drizzle-orm'
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest'
import { BuildPageSchema, PresignedPhotoSchema, type BuildPage } from '@kitwright/shared/build'
import { BENCH_ACTION_ID_HEADER, BENCH_ACTION_REPLAYED_HEADER, BENCH_ACTION_TAKEN_AT_HEADER } from '@kitwright/shared/bench-actions'
import { AuditPageSchema } from '@kitwright/shared/audit'
import { ApiErrorBodySchema } from '@kitwright/shared/errors'
import { auditEvents, buildStepTicks, clientActions, leakTests, workOrders } from '../../server/src/db/schema/index'
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

async function setUp() {
  const rev = await insertBuildRevision(t.db)
  const wo = await insertBuildWorkOrder(t.db, rev.revision.id, rev.kit.id, 'cut')
  const a = await signedInAs(app, t, 'assembler')
  const step = (position: number) => rev.steps[position - 1]!.id
  return { ...rev, wo, assembler: a.agent, assemblerUser: a.user, step }
}

/** A bench action as the tablet's queue sends it: the action's id and when it was taken on the bench. */
function queued(agent: Agent, path: string, body: object, id: string, takenAt: string) {
  return agent.post(path).set(BENCH_ACTION_ID_HEADER, id).set(BENCH_ACTION_TAKEN_AT_HEADER, takenAt).set('x-kitwright-bench', 'build').send(body)
}
const tickPath = (woId: string, stepId: string) => `/api/build/${woId}/steps/${stepId}/tick`

function page(res: { status: number; body: unknown }): BuildPage {
  expect(res.status, JSON.stringify(res.body)).toBe(200)
  return BuildPageSchema.parse(res.body)
}
function refusal(res: { status: number; body: unknown }, status: number) {
  expect(res.status, JSON.stringify(res.body)).toBe(status)
  return ApiErrorBodySchema.parse(res.body).error
}
const standingTicks = (woId: string) => t.db.select().from(buildStepTicks).where(and(eq(buildStepTicks.workOrderId, woId), isNull(buildStepTicks.undoneAt)))
const minutesAgo = (m: number) => new Date(Date.now() - m * 60_000).toISOString()

describe('bench actions sent from a tablet’s queue', () => {
  it('applies an action once: the same id sent again gets the first answer and changes nothing', async () => {
    const s = await setUp()
    const id = randomUUID()
    const takenAt = minutesAgo(3)
    const first = page(await queued(s.assembler, tickPath(s.wo.id, s.step(1)), { measurement: '18 1/16' }, id, takenAt))
    expect(first.steps[0]!.tick?.measurement).toBe(18.0625)
    const again = await queued(s.assembler, tickPath(s.wo.id, s.step(1)), { measurement: '18 1/16' }, id, takenAt)
    expect(again.headers[BENCH_ACTION_REPLAYED_HEADER]).toBe('1')
    expect(page(again)).toEqual(first)
    expect(await standingTicks(s.wo.id)).toHaveLength(1)
    // The id in capitals is the same id.
    expect(page(await queued(s.assembler, tickPath(s.wo.id, s.step(1)), { measurement: '18 1/16' }, id.toUpperCase(), takenAt))).toEqual(first)
    expect(await standingTicks(s.wo.id)).toHaveLength(1)

    // The audit trail says when it was tapped on the bench and when it reached the server.
    const trail = await t.db.select().from(auditEvents).where(eq(auditEvents.action, 'build.tick'))
    expect(trail).toHaveLength(1)
    expect(trail[0]!.takenAt?.toISOString()).toBe(takenAt)
    expect(trail[0]!.clientActionId).toBe(id)
    expect(trail[0]!.at.getTime()).toBeGreaterThan(Date.parse(takenAt))
    // The audit page shows both times.
    const admin = await signedInAs(app, t, 'admin')
    const listed = AuditPageSchema.parse((await admin.agent.get('/api/audit').query({ action: 'build.tick' })).body)
    expect(listed.items.map((e) => e.takenAt)).toEqual([takenAt])
    const [kept] = await t.db.select().from(clientActions).where(eq(clientActions.id, id))
    expect(kept).toMatchObject({ userId: s.assemblerUser.id, status: 200, bench: 'build', method: 'POST', path: tickPath(s.wo.id, s.step(1)) })
    expect(kept!.takenAt.toISOString()).toBe(takenAt)
    expect(kept!.answeredAt).not.toBeNull()
  })

  it('refuses a tampered or malformed action id with what to fix, and applies nothing', async () => {
    const s = await setUp()
    for (const bad of ['not-a-uuid', '12345678-1234-1234-1234-1234567890', "' or 1=1 --", `${randomUUID()}x`]) {
      const err = refusal(await queued(s.assembler, tickPath(s.wo.id, s.step(2)), {}, bad, minutesAgo(1)).set('x-kitwright-bench', 'build'), 400)
      expect(err.code).toBe('invalid')
      expect(err.fields?.[BENCH_ACTION_ID_HEADER]).toMatch(/UUID/)
    }
    // An id with no time, a time that is no time, a time ahead of the server, a time from last season.
    const noTime = refusal(await s.assembler.post(tickPath(s.wo.id, s.step(2))).set(BENCH_ACTION_ID_HEADER, randomUUID()).send({}), 400)
    expect(noTime.fields?.[BENCH_ACTION_TAKEN_AT_HEADER]).toMatch(/ISO 8601/)
    expect(refusal(await queued(s.assembler, tickPath(s.wo.id, s.step(2)), {}, randomUUID(), 'yesterday'), 400).fields?.[BENCH_ACTION_TAKEN_AT_HEADER]).toMatch(/ISO 8601/)
    expect(refusal(await queued(s.assembler, tickPath(s.wo.id, s.step(2)), {}, randomUUID(), new Date(Date.now() + 3_600_000).toISOString()), 400).message).toMatch(/clock/)
    expect(refusal(await queued(s.assembler, tickPath(s.wo.id, s.step(2)), {}, randomUUID(), minutesAgo(60 * 24 * 45)), 400).message).toMatch(/30 days/)
    expect(await standingTicks(s.wo.id)).toHaveLength(0)
    expect(await t.db.select().from(clientActions)).toHaveLength(0)
  })

  it('refuses an old id replayed with different content (or by someone else) and leaves the first action as it was', async () => {
    const s = await setUp()
    const id = randomUUID()
    const takenAt = minutesAgo(5)
    const first = page(await queued(s.assembler, tickPath(s.wo.id, s.step(1)), { measurement: '18' }, id, takenAt))
    // Same id, another measurement.
    const changed = refusal(await queued(s.assembler, tickPath(s.wo.id, s.step(1)), { measurement: '17 7/8' }, id, takenAt), 409)
    expect(changed.message).toMatch(/already used for another action.*nothing was changed/)
    expect(changed.fields?.[BENCH_ACTION_ID_HEADER]).toBeDefined()
    // Same id on another step, and as an undo.
    refusal(await queued(s.assembler, tickPath(s.wo.id, s.step(2)), {}, id, takenAt), 409)
    refusal(await queued(s.assembler, `/api/build/${s.wo.id}/steps/${s.step(1)}/undo`, {}, id, takenAt), 409)
    // Same id and content, sent by another assembler's session.
    const other = await signedInAs(app, t, 'assembler')
    expect(refusal(await queued(other.agent, tickPath(s.wo.id, s.step(1)), { measurement: '18' }, id, takenAt), 409).message).toMatch(/another person's action/)
    const ticks = await standingTicks(s.wo.id)
    expect(ticks).toHaveLength(1)
    expect(Number(ticks[0]!.measurement)).toBe(18)
    expect(ticks[0]!.tickedBy).toBe(s.assemblerUser.id)
    // The first answer still stands for the first action.
    expect(page(await queued(s.assembler, tickPath(s.wo.id, s.step(1)), { measurement: '18' }, id, takenAt))).toEqual(first)
  })

  it('refuses, with why, an action that became impossible while the tablet was offline, and keeps that answer', async () => {
    const s = await setUp()
    page(await queued(s.assembler, tickPath(s.wo.id, s.step(1)), { measurement: '18' }, randomUUID(), minutesAgo(10)))
    // The planner cancels the unit while the build bench is offline.
    await t.db.update(workOrders).set({ status: 'cancelled' }).where(eq(workOrders.id, s.wo.id))
    const id = randomUUID()
    const err = refusal(await queued(s.assembler, tickPath(s.wo.id, s.step(2)), {}, id, minutesAgo(8)), 409)
    expect(err.message).toBe(`Unit ${s.wo.serial} was cancelled; do not build it`)
    const again = await queued(s.assembler, tickPath(s.wo.id, s.step(2)), {}, id, minutesAgo(8))
    expect(again.headers[BENCH_ACTION_REPLAYED_HEADER]).toBe('1')
    expect(refusal(again, 409).message).toBe(err.message)
    expect(await standingTicks(s.wo.id)).toHaveLength(1)
  })

  it('records once a step two tablets ticked alike (one offline), and refuses a different measurement', async () => {
    const s = await setUp()
    const other = await signedInAs(app, t, 'assembler')
    // The online tablet ticks steps 1 and 2; the offline one had ticked step 2 too.
    page(await s.assembler.post(tickPath(s.wo.id, s.step(1))).send({ measurement: '18' }))
    page(await s.assembler.post(tickPath(s.wo.id, s.step(2))).send({}))
    const late = page(await queued(other.agent, tickPath(s.wo.id, s.step(2)), {}, randomUUID(), minutesAgo(2)))
    expect(late.steps[1]!.tick?.by.id).toBe(s.assemblerUser.id)
    expect(await standingTicks(s.wo.id)).toHaveLength(2)
    const trail = await t.db.select().from(auditEvents).where(eq(auditEvents.action, 'build.tick_again'))
    expect(trail).toHaveLength(1)
    expect(trail[0]!.actorId).toBe(other.user.id)
    expect(trail[0]!.summary).toMatch(/ticked already.*changed nothing/)
    // A different measurement of step 1 is not the same tick: the person must look at it.
    const differs = refusal(await queued(other.agent, tickPath(s.wo.id, s.step(1)), { measurement: '18 1/8' }, randomUUID(), minutesAgo(2)), 409)
    expect(differs.message).toMatch(/already ticked by/)
    // Without the queue's headers (a tap seen on the spot), a second tick is refused as before.
    refusal(await other.agent.post(tickPath(s.wo.id, s.step(2))).send({}), 409)
  })

  it('does not keep an answer that a sign-in would change: the action can be sent again', async () => {
    const s = await setUp()
    const packer = await signedInAs(app, t, 'packer')
    const id = randomUUID()
    refusal(await queued(packer.agent, tickPath(s.wo.id, s.step(1)), { measurement: '18' }, id, minutesAgo(1)), 403)
    expect(await t.db.select().from(clientActions)).toHaveLength(0)
    page(await queued(s.assembler, tickPath(s.wo.id, s.step(1)), { measurement: '18' }, id, minutesAgo(1)))
  })

  it('keeps a leak test sent twice (its answer lost on the way) to one attempt', async () => {
    const s = await setUp()
    page(await s.assembler.post(tickPath(s.wo.id, s.step(1))).send({ measurement: 18 }))
    page(await s.assembler.post(tickPath(s.wo.id, s.step(2))).send({}))
    const presign = await s.assembler.post(`/api/build/${s.wo.id}/photos/presign`).send({ contentType: 'image/jpeg', size: 2048, stepId: s.step(3) })
    const presigned = PresignedPhotoSchema.parse(presign.body)
    expect((await fetch(presigned.url, { method: 'PUT', headers: presigned.headers, body: new Uint8Array(2048).fill(0xd8) })).status).toBe(200)
    page(await queued(s.assembler, `/api/build/${s.wo.id}/photos/confirm`, { key: presigned.key }, randomUUID(), minutesAgo(2)))
    page(await s.assembler.post(tickPath(s.wo.id, s.step(3))).send({}))
    page(await s.assembler.post(tickPath(s.wo.id, s.step(4))).send({}))
    const id = randomUUID()
    const body = { unit: 'psi', startPressure: 15, endPressure: 14.6, holdMinutes: 10, waterVolumeMl: 30_000, leaks: [] }
    const first = await queued(s.assembler, `/api/build/${s.wo.id}/leak-tests`, body, id, minutesAgo(1))
    expect(first.status, JSON.stringify(first.body)).toBe(201)
    const again = await queued(s.assembler, `/api/build/${s.wo.id}/leak-tests`, body, id, minutesAgo(1))
    expect(again.status).toBe(201)
    expect(again.headers[BENCH_ACTION_REPLAYED_HEADER]).toBe('1')
    expect(again.body).toEqual(first.body)
    expect(await t.db.select().from(leakTests).where(eq(leakTests.workOrderId, s.wo.id))).toHaveLength(1)
  })
})
