// The carrier stand-in stops and starts again in the middle of a shipping day (as a second `npm start`
// over the same data does): labels bought before and after never share a tracking number, a purchase
// refused by the outage goes through once the carrier is back, and the packer is
// told what happened in words, never "Something went wrong on the server".
import path from 'node:path'
import { eq } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ApiErrorBodySchema } from '@kitwright/shared/errors'
import { PackViewSchema, type PackView } from '@kitwright/shared/pack'
import { createApp } from '../../server/src/app'
import { createDb } from '../../server/src/db/client'
import { parcels, shipments, shippingLabels } from '../../server/src/db/schema/index'
import { easyPostCarrier } from '../../server/src/features/shipping/easypost-carrier'
import { startCarrierFake } from '../../storage-fake/carrier'
import { buildApp, signedInAs } from '../support/app'
import { insertPackOrder, receivePlenty } from '../support/pack-factories'
import type { TestDb } from '../support/test-db'
import { freePort, privatePostgres, runDir } from './private-services'

let pg: Awaited<ReturnType<typeof privatePostgres>>
let conn: ReturnType<typeof createDb>
let app: ReturnType<typeof createApp>['app']
let carrier: Awaited<ReturnType<typeof startCarrierFake>> | null = null
let port = 0
const dir = path.join(runDir, 'faults-carrier')
type Agent = Awaited<ReturnType<typeof signedInAs>>['agent']
let packer: Agent

beforeAll(async () => {
  pg = await privatePostgres('carrier')
  conn = createDb(pg.url)
  await receivePlenty(conn.db)
  port = await freePort()
  carrier = await startCarrierFake({ port, directory: dir })
  const built = buildApp(conn)
  app = createApp({ ...built.deps, carrier: easyPostCarrier({ apiKey: 'faults', baseUrl: carrier.url, timeoutMs: 3000 }) }).app
  packer = (await signedInAs(app, conn as unknown as TestDb, 'packer')).agent
})
afterAll(async () => {
  await carrier?.close()
  await conn?.pool.end()
  pg?.destroy()
})

function view(res: { status: number; body: unknown }, status = 200): PackView {
  expect(res.status, JSON.stringify(res.body)).toBe(status)
  return PackViewSchema.parse(res.body)
}

async function readyOrder() {
  const { order } = await insertPackOrder(conn.db, [{ kitSku: 'MW-SPARE-SPR6' }])
  let v = view(await packer.get(`/api/pack/orders/${order.id}`))
  for (const item of v.items) v = view(await packer.post(`/api/pack/orders/${order.id}/tick`).send({ itemKey: item.key }))
  return { orderId: order.id, parcels: v.parcels.map((p) => ({ workOrderIds: p.workOrderIds, boxId: p.boxId!, scaleGrams: null })) }
}

async function labelAndShip() {
  const o = await readyOrder()
  view(await packer.post(`/api/pack/orders/${o.orderId}/label`).send({ service: 'ground', parcels: o.parcels }), 201)
  const shipped = await packer.post(`/api/pack/orders/${o.orderId}/ship`).send({})
  expect(shipped.status, JSON.stringify(shipped.body)).toBe(200)
  return o.orderId
}

describe('the carrier restarts mid-day', () => {
  it('ships before and after a restart with no repeated tracking number, and buys the label the outage refused once the carrier is back', async () => {
    for (let i = 0; i < 3; i++) await labelAndShip()

    // The carrier goes away while the packer buys a label.
    await carrier!.close()
    carrier = null
    const caught = await readyOrder()
    const down = await packer.post(`/api/pack/orders/${caught.orderId}/label`).send({ service: 'ground', parcels: caught.parcels })
    expect(down.status).toBe(503)
    const message = ApiErrorBodySchema.parse(down.body).error.message
    expect(message).toMatch(/^The carrier could not be reached/)
    expect(message).not.toMatch(/Something went wrong/)
    // The address check comes first, so nothing was recorded or bought: the box is still open.
    // (A purchase cut off after the carrier sold the label is finished by tests/api/labels.test.ts.)
    expect(view(await packer.get(`/api/pack/orders/${caught.orderId}`)).shipment?.status).toBe('packing')

    // Back on the same port and data, as after a restart; the next tap finishes the purchase.
    carrier = await startCarrierFake({ port, directory: dir })
    view(await packer.post(`/api/pack/orders/${caught.orderId}/label`).send({ service: 'ground', parcels: caught.parcels }), 201)
    for (let i = 0; i < 3; i++) await labelAndShip()

    const numbers = (await conn.db.select({ n: parcels.trackingNumber }).from(parcels)).map((r) => r.n)
    expect(numbers).toHaveLength(7)
    expect(new Set(numbers).size).toBe(7)
    expect(await conn.db.select().from(shippingLabels)).toHaveLength(7)
    expect(await conn.db.select().from(shipments).where(eq(shipments.status, 'buying'))).toHaveLength(0)
    console.log(`[faults] carrier restarted mid-day: 7 labels, 7 distinct tracking numbers, the purchase caught by the outage bought once after it`)
  })
})
