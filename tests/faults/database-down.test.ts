// The PostgreSQL cluster stops in the middle of the day's work: every request answers a clear 503
// while it is down, the app recovers by itself when it is back, and nothing accepted is lost.
import { eq, inArray } from 'drizzle-orm'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ApiErrorBodySchema } from '@kitwright/shared/errors'
import { createDb } from '../../server/src/db/client'
import { buildStepTicks, leakTests, orders, storeEvents } from '../../server/src/db/schema/index'
import { startWorkers } from '../../server/src/workers'
import { buildApp, signedInAs } from '../support/app'
import { insertBuildRevision, insertBuildWorkOrder } from '../support/build-factories'
import { deliver, paidEvent, waitFor } from '../support/store-webhook'
import type { TestDb } from '../support/test-db'
import { privatePostgres, seconds } from './private-services'
import { waitForQueueIdle } from '../support/queue'

let pg: Awaited<ReturnType<typeof privatePostgres>>
let conn: ReturnType<typeof createDb>
let built: ReturnType<typeof buildApp>

beforeAll(async () => {
  pg = await privatePostgres('database')
  conn = createDb(pg.url)
  built = buildApp(conn)
})
afterAll(async () => {
  await built?.deps.jobs.stop()
  await conn?.pool.end()
  pg?.destroy()
})

describe('the database stops and starts again in the middle of the work', () => {
  it('answers 503 while it is down, recovers by itself, and turns every accepted webhook into its order once', async () => {
    const rev = await insertBuildRevision(conn.db)
    const wo = await insertBuildWorkOrder(conn.db, rev.revision.id, rev.kit.id)
    const step = (n: number) => rev.steps[n - 1]!.id
    const { agent } = await signedInAs(built.app, conn as unknown as TestDb, 'assembler')
    expect((await agent.post(`/api/build/${wo.id}/steps/${step(1)}/tick`).send({ measurement: 18 })).status).toBe(200)

    // Webhooks accepted just before the outage: stored with their jobs, not yet processed.
    const accepted = ['MW-D-1001', 'MW-D-1002', 'MW-D-1003', 'MW-D-1004', 'MW-D-1005']
    const events = accepted.map((n) => paidEvent(n))
    for (const e of events) expect((await deliver(built.app, e)).status).toBe(200)

    pg.stop()
    const stoppedAt = Date.now()
    const refusedEvents = ['MW-D-2001', 'MW-D-2002'].map((n) => paidEvent(n))
    const downAnswers: { what: string; status: number; ms: number }[] = []
    const during = async (what: string, call: () => PromiseLike<{ status: number; body: unknown }>) => {
      const t0 = Date.now()
      const res = await call()
      downAnswers.push({ what, status: res.status, ms: Date.now() - t0 })
      return res
    }
    const health = await during('health', () => request(built.app).get('/api/health'))
    expect(health.body).toEqual({ ok: false, db: 'down' })
    await during('tick', () => agent.post(`/api/build/${wo.id}/steps/${step(2)}/tick`).send({}))
    await during('orders list', () => agent.get('/api/orders'))
    await during('sign-in', () => request(built.app).post('/api/auth/sign-in').send({ email: 'someone@shop.example', password: 'whatever-it-is' }))
    for (const e of refusedEvents) await during(`webhook ${e.orderNumber}`, () => deliver(built.app, e))
    for (const a of downAnswers) expect(a.status, a.what).toBe(503)
    const bodies = await Promise.all([agent.get('/api/build/lookup').query({ code: wo.serial })])
    for (const b of bodies)
      expect(ApiErrorBodySchema.parse(b.body).error).toEqual({ code: 'unavailable', message: 'The database is not reachable; try again in a moment' })

    pg.start()
    const back = Date.now()
    // The app itself needs nothing: the next requests simply reconnect.
    await waitFor('the health check to pass', async () => ((await request(built.app).get('/api/health')).status === 200 ? true : undefined))
    const healthy = Date.now() - back
    await startWorkers(built.deps)
    // The store retries what was refused with 503; the bench repeats the refused tick.
    for (const e of refusedEvents) expect((await deliver(built.app, e)).status).toBe(200)
    expect((await agent.post(`/api/build/${wo.id}/steps/${step(2)}/tick`).send({})).status).toBe(200)
    const all = [...accepted, ...refusedEvents.map((e) => e.orderNumber)]
    await waitFor(
      'every accepted webhook to become its order',
      async () => {
        const rows = await conn.db.select({ number: orders.number }).from(orders).where(inArray(orders.number, all))
        return rows.length === all.length ? true : undefined
      },
      30_000,
    )
    const ordersBack = Date.now() - back
    // Redeliveries of the first events change nothing: still one order each.
    for (const e of events.slice(0, 2)) expect((await deliver(built.app, e)).status).toBe(200)
    await waitForQueueIdle(conn.db) // every store-event job done: a duplicate order would exist by now
    const rows = await conn.db.select({ number: orders.number }).from(orders).where(inArray(orders.number, all))
    expect(rows.map((r) => r.number).sort()).toEqual([...all].sort())
    const stored = await conn.db.select({ eventId: storeEvents.eventId }).from(storeEvents)
    expect(stored).toHaveLength(all.length)
    const ticks = await conn.db.select().from(buildStepTicks).where(eq(buildStepTicks.workOrderId, wo.id))
    expect(ticks.map((x) => x.buildStepId).sort()).toEqual([step(1), step(2)].sort())
    // The leak test comes after every step (photo included); none was recorded, none appeared.
    expect(await conn.db.select().from(leakTests).where(eq(leakTests.workOrderId, wo.id))).toHaveLength(0)

    const slowest = Math.max(...downAnswers.map((a) => a.ms))
    console.log(
      `[faults] PostgreSQL down ${seconds(back - stoppedAt)}: ${downAnswers.length} requests answered 503 (slowest ${slowest} ms); ` +
        `healthy ${seconds(healthy)} after the restart; all ${all.length} orders (${accepted.length} accepted before, ${refusedEvents.length} retried after) once each ${seconds(ordersBack)} after; ticks kept`,
    )
  })
})
