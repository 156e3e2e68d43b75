import { execFileSync } from 'node:child_process'
import { and, eq } from 'drizzle-orm'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ApiErrorBodySchema } from '@kitwright/shared/errors'
import { OrderDetailSchema } from '@kitwright/shared/orders'
import { PackViewSchema, type PackView } from '@kitwright/shared/pack'
import { createApp } from '../../server/src/app'
import { seedDemo } from '../../server/src/seeds/demo'
import { DEMO_CARRIER } from '../../server/src/seeds/shipping'
import { auditEvents, orderEvents, orders, parcels, shipments, shippingLabels } from '../../server/src/db/schema/index'
import type { Carrier, CarrierLabel } from '../../server/src/features/shipping/carrier'
import { easyPostCarrier } from '../../server/src/features/shipping/easypost-carrier'
import { Unavailable } from '../../server/src/lib/http-errors'
import { signCarrierEvent, trackingEventBody } from '../../storage-fake/carrier'
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

function view(res: { status: number; body: unknown }, status = 200): PackView {
  expect(res.status, JSON.stringify(res.body)).toBe(status)
  return PackViewSchema.parse(res.body)
}
function error(res: { status: number; body: unknown }, status: number) {
  expect(res.status, JSON.stringify(res.body)).toBe(status)
  return ApiErrorBodySchema.parse(res.body).error
}
const parcelsOfView = (v: PackView) => v.parcels.map((p) => ({ workOrderIds: p.workOrderIds, boxId: p.boxId!, scaleGrams: null }))

/** An order of `kits` with every item confirmed at the bench: ready for its label. */
async function readyOrder(kits: string[]) {
  const made = await insertPackOrder(
    t.db,
    kits.map((kitSku) => ({ kitSku })),
  )
  let v = view(await packer.get(`/api/pack/orders/${made.order.id}`))
  for (const item of v.items) {
    v =
      item.kind === 'unit'
        ? view(await packer.post(`/api/pack/orders/${made.order.id}/scan`).send({ code: item.binCode ?? item.serial }))
        : view(await packer.post(`/api/pack/orders/${made.order.id}/tick`).send({ itemKey: item.key }))
  }
  expect(v.canLabel, v.blockers.join('; ')).toBe(true)
  return { ...made, view: v }
}

/** One parcel per unit, each in the box the bench proposed for the first. */
function parcelPerUnit(v: PackView) {
  const boxId = v.parcels[0]!.boxId!
  return [...new Set(v.parcels.flatMap((p) => p.workOrderIds))].map((id) => ({ workOrderIds: [id], boxId, scaleGrams: null }))
}

describe('buying a label exactly once', () => {
  it('ten buys at once for one order give one label; every answer shows that label', async () => {
    const { order, view: v } = await readyOrder(['MW-TOTE-6C'])
    const answers = await Promise.all(
      Array.from({ length: 10 }, () => packer.post(`/api/pack/orders/${order.id}/label`).send({ service: 'ground', parcels: parcelsOfView(v) })),
    )
    const views = answers.map((a) => view(a, 201))
    const numbers = new Set(views.map((x) => x.shipment?.trackingNumber))
    expect(numbers.size).toBe(1)
    expect([...numbers][0]).toMatch(/^BP\d+$/)
    const [shipment] = await t.db.select().from(shipments).where(eq(shipments.orderId, order.id))
    expect(await t.db.select().from(shippingLabels).where(eq(shippingLabels.shipmentId, shipment!.id))).toHaveLength(1)
    const events = await t.db
      .select()
      .from(orderEvents)
      .where(and(eq(orderEvents.orderId, order.id), eq(orderEvents.kind, 'label_bought')))
    expect(events).toHaveLength(1)
    expect(shipment).toMatchObject({ status: 'labelled', carrier: DEMO_CARRIER })
  })

  it('gives every parcel of a shipment its own tracking number', async () => {
    const { order, view: v } = await readyOrder(['MW-TOTE-6C', 'MW-TOTE-6C'])
    const labelled = view(await packer.post(`/api/pack/orders/${order.id}/label`).send({ service: 'express', parcels: parcelPerUnit(v) }), 201)
    expect(labelled.parcels).toHaveLength(2)
    const numbers = labelled.parcels.map((p) => p.trackingNumber)
    expect(numbers.every((n) => /^BP\d+$/.test(n ?? ''))).toBe(true)
    expect(new Set(numbers).size).toBe(2)
    expect(labelled.shipment!.trackingNumber).toBe(numbers[0])
    // The 4 × 6 in label: page N carries parcel N's own tracking number (read back with poppler's pdftotext).
    const res = await packer
      .get(`/api/shipments/${labelled.shipment!.id}/label.pdf`)
      .buffer(true)
      .parse((r, cb) => {
        const chunks: Buffer[] = []
        r.on('data', (c: Buffer) => chunks.push(c))
        r.on('end', () => cb(null, Buffer.concat(chunks)))
      })
    expect(res.status).toBe(200)
    const pages = execFileSync('pdftotext', ['-layout', '-', '-'], { input: res.body as Buffer, encoding: 'utf8' }).split('\f')
    expect(pages[0]).toContain(numbers[0])
    expect(pages[0]).not.toContain(numbers[1])
    expect(pages[1]).toContain(numbers[1])
  })

  it('finishes a purchase cut short after the carrier sold the label: the retry records that same label, not a second one', async () => {
    const { order, view: v } = await readyOrder(['MW-TOTE-6C'])
    const real = built.deps.carrier!
    let sold: CarrierLabel | null = null
    // The carrier sells the label, then the answer is lost (as when the process dies or the line drops).
    const lossy: Carrier = {
      ...real,
      async buyLabel(ref, choice, key) {
        sold = await real.buyLabel(ref, choice, key)
        throw new Unavailable('The carrier could not be reached (connection reset); nothing was lost, try again in a minute')
      },
    }
    const crashing = createApp({ ...built.deps, carrier: lossy }).app
    const packerAgain = await signedInAs(crashing, t, 'packer')
    const e = error(await packerAgain.agent.post(`/api/pack/orders/${order.id}/label`).send({ service: 'ground', parcels: parcelsOfView(v) }), 503)
    expect(e.message).toMatch(/could not be reached/)
    expect(e.message).not.toMatch(/Something went wrong/)
    const stuck = view(await packer.get(`/api/pack/orders/${order.id}`))
    expect(stuck.shipment?.status).toBe('buying')
    expect(stuck.canFinishBuying).toBe(true)
    expect(sold).not.toBeNull()

    // Buy again (any bench, any body): the purchase under way is finished with its own key.
    const done = view(await packer.post(`/api/pack/orders/${order.id}/label`).send({ service: 'express', parcels: parcelsOfView(v) }), 201)
    expect(done.shipment).toMatchObject({ status: 'labelled', service: 'ground', trackingNumber: sold!.parcels[0]!.trackingNumber })
    const [shipment] = await t.db.select().from(shipments).where(eq(shipments.orderId, order.id))
    expect(await t.db.select().from(shippingLabels).where(eq(shippingLabels.shipmentId, shipment!.id))).toHaveLength(1)
  })

  it('puts the box back to packing when the carrier refuses the purchase, and says why', async () => {
    const { order, view: v } = await readyOrder(['MW-TOTE-6C'])
    const e = error(await packer.post(`/api/pack/orders/${order.id}/label`).send({ service: 'overnight', parcels: parcelsOfView(v) }), 409)
    expect(e.message).toMatch(/^The carrier refused the label: No service "overnight"/)
    const after = view(await packer.get(`/api/pack/orders/${order.id}`))
    expect(after.shipment?.status).toBe('packing')
    expect(after.canLabel).toBe(true)
  })

  it('answers a carrier that cannot be reached with what happened, never a bare server error', async () => {
    const { order, view: v } = await readyOrder(['MW-TOTE-6C'])
    const down = createApp({ ...built.deps, carrier: easyPostCarrier({ apiKey: 'k', baseUrl: 'http://127.0.0.1:9/v2/', timeoutMs: 2000 }) }).app
    const bench = (await signedInAs(down, t, 'packer')).agent
    const e = error(await bench.post(`/api/pack/orders/${order.id}/quote`).send({ parcels: parcelsOfView(v) }), 503)
    expect(e.message).toMatch(/^The carrier could not be reached/)
  })

  it('checks the ship-to address with the carrier before quoting', async () => {
    const { order, view: v } = await readyOrder(['MW-SPARE-SPR6'])
    await t.db.update(orders).set({ shipPostalCode: '970' }).where(eq(orders.id, order.id))
    const e = error(await packer.post(`/api/pack/orders/${order.id}/quote`).send({ parcels: parcelsOfView(v) }), 409)
    expect(e.message).toMatch(/cannot deliver to order .*ship-to address: Unable to verify address.*ZIP codes are 5 digits/)
  })
})

describe('voiding a label', () => {
  it('before shipping: the refund is asked, the reason audited, the box opens again and a new label can be bought', async () => {
    const { order, view: v } = await readyOrder(['MW-TOTE-6C'])
    const first = view(await packer.post(`/api/pack/orders/${order.id}/label`).send({ service: 'ground', parcels: parcelsOfView(v) }), 201)
    const shipmentId = first.shipment!.id
    expect(error(await packer.post(`/api/shipments/${shipmentId}/void-label`).send({ reason: '' }), 400).fields).toHaveProperty('reason')
    const voided = view(await packer.post(`/api/shipments/${shipmentId}/void-label`).send({ reason: 'Wrong box size chosen' }))
    expect(voided.shipment).toMatchObject({ status: 'packing', trackingNumber: null })
    expect(voided.shipment!.voidedLabels).toEqual([
      expect.objectContaining({ reason: 'Wrong box size chosen', refundStatus: 'submitted', trackingNumbers: [first.shipment!.trackingNumber] }),
    ])
    expect(await t.db.select().from(parcels).where(eq(parcels.shipmentId, shipmentId))).toHaveLength(0)
    const [audit] = await t.db
      .select()
      .from(auditEvents)
      .where(and(eq(auditEvents.action, 'shipment.void_label'), eq(auditEvents.entityId, order.id)))
    expect(audit?.summary).toContain('Reason: Wrong box size chosen')
    expect(voided.canLabel).toBe(true)
    const second = view(await packer.post(`/api/pack/orders/${order.id}/label`).send({ service: 'express', parcels: parcelsOfView(voided) }), 201)
    expect(second.shipment!.trackingNumber).not.toBe(first.shipment!.trackingNumber)
    // Voiding twice is refused in words.
    view(await packer.post(`/api/shipments/${shipmentId}/void-label`).send({ reason: 'Changed my mind' }))
    expect(error(await packer.post(`/api/shipments/${shipmentId}/void-label`).send({ reason: 'Again' }), 409).message).toBe(
      'This shipment has no bought label to void',
    )
  })

  it('after shipping: only a planner voids a mistaken label; the shipment stays shipped', async () => {
    const { order, view: v } = await readyOrder(['MW-SPARE-SPR6'])
    const labelled = view(await packer.post(`/api/pack/orders/${order.id}/label`).send({ service: 'ground', parcels: parcelsOfView(v) }), 201)
    expect((await packer.post(`/api/pack/orders/${order.id}/ship`).send({})).status).toBe(200)
    const shipmentId = labelled.shipment!.id
    expect(error(await packer.post(`/api/shipments/${shipmentId}/void-label`).send({ reason: 'Printed twice' }), 403).message).toMatch(
      /only a planner or the owner/,
    )
    const after = view(
      await planner.post(`/api/shipments/${shipmentId}/void-label`).send({ reason: 'Label printed for the wrong order; parcel went with the reprint' }),
    )
    expect(after.shipment).toMatchObject({ id: shipmentId, status: 'shipped' })
    expect(after.shipment!.voidedLabels[0]!.reason).toMatch(/wrong order/)
    const detail = OrderDetailSchema.parse((await planner.get(`/api/orders/${order.id}`)).body)
    expect(detail.events.some((e) => e.kind === 'label_voided' && /after shipping/.test(e.message))).toBe(true)
  })
})

describe('tracking events from the carrier', () => {
  const secret = process.env.CARRIER_WEBHOOK_SECRET ?? ''
  const post = (body: string, signature = signCarrierEvent(secret, body)) =>
    request(built.app).post('/api/shipments/tracking-events').set('content-type', 'application/json').set('x-hmac-signature', signature).send(body)

  it('shows in transit and delivered on the order, once per event, and refuses a bad signature', async () => {
    expect(secret.length).toBeGreaterThan(0)
    const { order, view: v } = await readyOrder(['MW-SPARE-CUP12'])
    const labelled = view(await packer.post(`/api/pack/orders/${order.id}/label`).send({ service: 'ground', parcels: parcelsOfView(v) }), 201)
    const tracking = labelled.parcels[0]!.trackingNumber!
    const moving = trackingEventBody({ eventId: `evt_${tracking}_1`, trackingCode: tracking, status: 'in_transit', message: 'Departed the sorting hub' })
    expect((await post(moving)).body).toEqual({ received: true, duplicate: false })
    expect((await post(moving)).body).toEqual({ received: true, duplicate: true })
    const bad = await post(trackingEventBody({ trackingCode: tracking, status: 'delivered' }), signCarrierEvent('not-the-secret-at-all', moving))
    expect(error(bad, 401).message).toMatch(/signature does not verify/)
    expect(
      (await post(trackingEventBody({ eventId: `evt_${tracking}_2`, trackingCode: tracking, status: 'delivered', message: 'Left at the front door' }))).status,
    ).toBe(200)
    // An older event arriving late does not move the status back.
    expect((await post(trackingEventBody({ eventId: `evt_${tracking}_0`, trackingCode: tracking, status: 'pre_transit' }))).status).toBe(200)
    const after = view(await packer.get(`/api/pack/orders/${order.id}`))
    expect(after.shipment!.trackingStatus).toBe('delivered')
    const detail = OrderDetailSchema.parse((await planner.get(`/api/orders/${order.id}`)).body)
    const lines = detail.events.filter((e) => e.kind === 'tracking' || e.kind === 'delivered').map((e) => e.message)
    expect(lines).toEqual(
      expect.arrayContaining([`Parcel ${tracking}: in transit (Departed the sorting hub)`, `Parcel ${tracking}: delivered (Left at the front door)`]),
    )
    expect(lines.filter((l) => l.includes('in transit'))).toHaveLength(1)
  })
})
