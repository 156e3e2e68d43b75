// The S3 stand-in stops in the middle of a unit's build: ticks go on, a photo confirm
// gets a clear 503, and once the store is back the same photo goes through without losing anything.
import { eq } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { BuildPageSchema, PresignedPhotoSchema } from '@kitwright/shared/build'
import { ApiErrorBodySchema } from '@kitwright/shared/errors'
import { createDb } from '../../server/src/db/client'
import { buildStepTicks, leakTests, unitPhotos } from '../../server/src/db/schema/index'
import { buildApp, signedInAs } from '../support/app'
import { insertBuildRevision, insertBuildWorkOrder } from '../support/build-factories'
import { waitFor } from '../support/store-webhook'
import type { TestDb } from '../support/test-db'
import { privatePostgres, privateS3, seconds } from './private-services'

let pg: Awaited<ReturnType<typeof privatePostgres>>
let s3: Awaited<ReturnType<typeof privateS3>>
let conn: ReturnType<typeof createDb>
let built: ReturnType<typeof buildApp>

beforeAll(async () => {
  pg = await privatePostgres('photos')
  s3 = await privateS3('photos')
  conn = createDb(pg.url)
  built = buildApp(conn, { storage: s3.config })
})
afterAll(async () => {
  await built?.deps.jobs.stop()
  await conn?.pool.end()
  await s3?.stop()
  pg?.destroy()
})

const PASSING = { unit: 'psi', startPressure: 15, endPressure: 14.6, holdMinutes: 10, waterVolumeMl: 30_000, leaks: [] }

describe('the photo store stops and starts again in the middle of a build', () => {
  it('answers 503 on the photo while it is down, keeps every tick and test, and takes the photo when it is back', async () => {
    const rev = await insertBuildRevision(conn.db)
    const wo = await insertBuildWorkOrder(conn.db, rev.revision.id, rev.kit.id)
    const step = (n: number) => rev.steps[n - 1]!.id
    const { agent } = await signedInAs(built.app, conn as unknown as TestDb, 'assembler')
    const bytes = new Uint8Array(3000).map((_, i) => (i * 7) % 256)
    const presign = () => agent.post(`/api/build/${wo.id}/photos/presign`).send({ contentType: 'image/jpeg', size: bytes.length, stepId: step(3) })
    const confirm = (key: string) => agent.post(`/api/build/${wo.id}/photos/confirm`).send({ key })

    expect((await agent.post(`/api/build/${wo.id}/steps/${step(1)}/tick`).send({ measurement: 18 })).status).toBe(200)

    await s3.stop()
    const stoppedAt = Date.now()
    // The bench goes on: a tick is recorded while the store is away (the leak test waits for every step, photo step included).
    expect((await agent.post(`/api/build/${wo.id}/steps/${step(2)}/tick`).send({})).status).toBe(200)
    // Presigning is signing only (no call to the store), so the tablet gets its URL, but the upload cannot land.
    const pending = PresignedPhotoSchema.parse((await presign()).body)
    await expect(fetch(pending.url, { method: 'PUT', headers: pending.headers, body: bytes })).rejects.toThrow()
    const asked = Date.now()
    const down = await confirm(pending.key)
    const answeredIn = Date.now() - asked
    expect(down.status).toBe(503)
    expect(ApiErrorBodySchema.parse(down.body).error).toMatchObject({
      code: 'unavailable',
      message: expect.stringMatching(/photo store \(S3\) is not reachable.*ticks already made are kept/),
    })
    // Nothing about the photo was recorded as taken.
    expect((await conn.db.select().from(unitPhotos).where(eq(unitPhotos.workOrderId, wo.id))).every((p) => p.uploadedAt === null)).toBe(true)

    await s3.start()
    const back = Date.now()
    // The tablet retries the same upload (its presigned URL is good for ten minutes) until it lands.
    await waitFor('the upload to land', async () => {
      const put = await fetch(pending.url, { method: 'PUT', headers: pending.headers, body: bytes }).catch(() => null)
      return put?.status === 200 ? true : undefined
    })
    const page = BuildPageSchema.parse((await confirm(pending.key)).body)
    const recovered = Date.now() - back
    expect(page.photos.map((p) => p.key)).toEqual([pending.key])
    expect(new Uint8Array(await (await fetch(page.photos[0]!.url!)).arrayBuffer())).toEqual(bytes)

    // Every tick made before and during the outage is on record, once each; the build then finishes.
    const ticks = await conn.db.select().from(buildStepTicks).where(eq(buildStepTicks.workOrderId, wo.id))
    expect(ticks.map((x) => x.buildStepId).sort()).toEqual([step(1), step(2)].sort())
    expect((await agent.post(`/api/build/${wo.id}/steps/${step(3)}/tick`).send({})).status).toBe(200)
    expect((await agent.post(`/api/build/${wo.id}/steps/${step(4)}/tick`).send({})).status).toBe(200)
    expect((await agent.post(`/api/build/${wo.id}/leak-tests`).send(PASSING)).status).toBe(201)
    expect(await conn.db.select().from(leakTests).where(eq(leakTests.workOrderId, wo.id))).toHaveLength(1)
    console.log(
      `[faults] S3 down ${seconds(back - stoppedAt)}: confirm answered 503 in ${answeredIn} ms; photo confirmed ${seconds(recovered)} after the store came back; ticks kept, leak test recorded once the photo step was done`,
    )
  })
})
