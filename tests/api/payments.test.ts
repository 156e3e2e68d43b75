import type { Server } from 'node:http'
import type { AddressInfo } from 'node:net'
import { and, eq } from 'drizzle-orm'
import Stripe from 'stripe'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { OrderDetailSchema } from '@kitwright/shared/orders'
import { OrderPaymentsSchema } from '@kitwright/shared/payments'
import { mailMessages, orderEvents, orderPayments, paymentEvents, shopSettings, workOrders } from '../../server/src/db/schema/index'
import { seedDemo } from '../../server/src/seeds/demo'
import { stripePaymentService } from '../../server/src/features/payments/payment-service'
import { startPaymentsFake } from '../../storage-fake/payments'
import { runDir } from '../faults/private-services'
import { buildApp, signedInAs } from '../support/app'
import { buildNewOrder } from '../support/order-factories'
import { createTestDb, type TestDb } from '../support/test-db'

// Phone orders paid by hand or through a payment link. The link goes through the payment service's
// official SDK (the `stripe` package) to the local stand-in, which posts signed events back to this
// app listening on a real port, as the service would.

const WEBHOOK_SECRET = 'whsec_kitwright_payments_test_secret'
let t: TestDb
let built: ReturnType<typeof buildApp>
let server: Server
let standIn: Awaited<ReturnType<typeof startPaymentsFake>>
let planner: Awaited<ReturnType<typeof signedInAs>>['agent']

beforeAll(async () => {
  t = await createTestDb()
  await seedDemo(t.db)
  // The stand-in first (the app needs its address), then the app on a free port, registered as the webhook endpoint.
  standIn = await startPaymentsFake({ port: 0, directory: `${runDir}/payments-${process.pid}`, webhookSecret: WEBHOOK_SECRET })
  built = buildApp(t, { payments: stripePaymentService({ key: 'sk_test_kitwright', url: standIn.url, webhookSecret: WEBHOOK_SECRET }) })
  server = built.app.listen(0, '127.0.0.1')
  await new Promise((r) => server.once('listening', r))
  const appUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}`
  const sdk = new Stripe('sk_test_kitwright', { host: '127.0.0.1', port: Number(new URL(standIn.url).port), protocol: 'http' })
  await sdk.webhookEndpoints.create({ url: `${appUrl}/api/webhooks/payments`, enabled_events: ['checkout.session.completed'] })
  planner = (await signedInAs(built.app, t, 'planner')).agent
})
afterAll(async () => {
  await new Promise((r) => server.close(r))
  await standIn.close()
  await t.drop()
})

async function phoneOrder(totalQuantity = 2) {
  const res = await planner.post('/api/orders').send(buildNewOrder({ lines: [{ kitSku: 'MW-TOTE-6C', quantity: totalQuantity, unitPriceCents: 12900 }] }))
  expect(res.status, JSON.stringify(res.body)).toBe(201)
  return OrderDetailSchema.parse(res.body)
}
async function payments(orderId: string) {
  return OrderPaymentsSchema.parse((await planner.get(`/api/orders/${orderId}/payments`)).body)
}

describe('payments recorded by hand', () => {
  it('adds up part payments, refuses more than is due, and marks the order paid when covered', async () => {
    const order = await phoneOrder() // 2 × $129.00 = $258.00
    expect(await payments(order.id)).toMatchObject({ totalCents: 25800, paidCents: 0, dueCents: 25800, paymentStatus: 'pending' })

    const first = await planner.post(`/api/orders/${order.id}/payments`).send({ method: 'cash', amountCents: 10000, reference: 'Receipt 0142' })
    expect(first.status).toBe(201)
    expect(OrderPaymentsSchema.parse(first.body)).toMatchObject({ paidCents: 10000, dueCents: 15800, paymentStatus: 'pending' })

    // $258.00 − $100.00 = $158.00 due: $200.00 is too much, and says how much may be entered.
    const tooMuch = await planner.post(`/api/orders/${order.id}/payments`).send({ method: 'bank_transfer', amountCents: 20000 })
    expect(tooMuch.status).toBe(409)
    expect(tooMuch.body.error.message).toBe(`Order ${order.number} has $158.00 due; enter at most that`)
    const negative = await planner.post(`/api/orders/${order.id}/payments`).send({ method: 'cash', amountCents: -5 })
    expect(negative.status).toBe(400)
    expect(negative.body.error.fields.amountCents).toBe('The amount must be more than zero')
    expect(await t.db.$count(orderPayments, eq(orderPayments.orderId, order.id))).toBe(1) // nothing written by the refusals

    const rest = await planner.post(`/api/orders/${order.id}/payments`).send({ method: 'card_by_phone', amountCents: 15800 })
    expect(OrderPaymentsSchema.parse(rest.body)).toMatchObject({ paidCents: 25800, dueCents: 0, paymentStatus: 'paid' })
    const events = await t.db.select().from(orderEvents).where(and(eq(orderEvents.orderId, order.id), eq(orderEvents.kind, 'payment')))
    expect(events.map((e) => e.message)).toEqual(['$100.00 received (Cash, Receipt 0142); $158.00 still due.', '$158.00 received (Card taken by phone); the order is paid in full.'])
    expect((await planner.post(`/api/orders/${order.id}/payments`).send({ method: 'cash', amountCents: 1 })).status).toBe(409)
  })

  it('a paid phone order follows the auto-release setting', async () => {
    await t.db.update(shopSettings).set({ autoReleasePaid: true })
    try {
      const order = await phoneOrder(1)
      await planner.post(`/api/orders/${order.id}/payments`).send({ method: 'cash', amountCents: 12900 })
      expect(await t.db.$count(workOrders, eq(workOrders.orderId, order.id))).toBe(1)
    } finally {
      await t.db.update(shopSettings).set({ autoReleasePaid: false })
    }
  })

  it('store orders are paid through the store, and only planners record payments', async () => {
    const order = await phoneOrder(1)
    for (const role of ['packer', 'assembler', 'cutter'] as const) {
      const { agent } = await signedInAs(built.app, t, role)
      expect((await agent.post(`/api/orders/${order.id}/payments`).send({ method: 'cash', amountCents: 100 })).status).toBe(403)
      expect((await agent.post(`/api/orders/${order.id}/payment-links`).send({})).status).toBe(403)
    }
  })
})

describe('a payment link through the payment service', () => {
  it('makes one checkout for one order whatever the clicks, mails it under the public address, and the payment lands once under redelivery', async () => {
    const order = await phoneOrder(1) // $129.00
    const [a, b] = await Promise.all([planner.post(`/api/orders/${order.id}/payment-links`).send({}), planner.post(`/api/orders/${order.id}/payment-links`).send({})])
    expect([a.status, b.status]).toEqual([201, 201])
    const panel = await payments(order.id)
    expect(panel.links).toHaveLength(1)
    expect(panel.links[0]).toMatchObject({ status: 'open', amountCents: 12900 })
    expect(panel.links[0]!.url).toMatch(new RegExp(`^${standIn.url}/pay/cs_test_`))

    // One e-mail, whose link is Kitwright's own address, leading to the checkout.
    const mails = await t.db.select().from(mailMessages).where(and(eq(mailMessages.orderId, order.id), eq(mailMessages.purpose, `payment_link:${panel.links[0]!.id}`)))
    expect(mails).toHaveLength(1)
    const link = /http:\/\/localhost:3000\/api\/pay\/[\w.-]+/.exec(mails[0]!.text)![0]
    const go = await planner.get(new URL(link).pathname)
    expect(go.status).toBe(303)
    expect(go.headers.location).toBe(panel.links[0]!.url)

    // The customer pays on the stand-in's page; it posts the signed event to the app.
    const paid = await fetch(panel.links[0]!.url!, { method: 'POST', redirect: 'manual' })
    expect(paid.status).toBe(303)
    await expect.poll(async () => (await payments(order.id)).paymentStatus, { timeout: 15_000 }).toBe('paid')

    // The service sends the same event again, several times at once: still one payment.
    const { data } = (await (await fetch(`${standIn.url}/v1/events`)).json()) as { data: { id: string; data: { object: { id: string } } }[] }
    const event = data.find((e) => e.data.object.id === panel.links[0]!.url!.split('/').pop())!
    await Promise.all(Array.from({ length: 4 }, () => fetch(`${standIn.url}/v1/events/${event.id}/resend`, { method: 'POST' })))
    expect(await t.db.$count(orderPayments, eq(orderPayments.orderId, order.id))).toBe(1)
    expect(await t.db.$count(paymentEvents, eq(paymentEvents.eventId, event.id))).toBe(1)
    expect(await payments(order.id)).toMatchObject({ paidCents: 12900, dueCents: 0, links: [expect.objectContaining({ status: 'paid' })] })

    // The customer's link now says it is paid instead of sending them to pay twice.
    const again = await planner.get(new URL(link).pathname)
    expect(again.status).toBe(200)
    expect(again.text).toContain(`Order ${order.number} is paid. Thank you!`)
  })

  it('refuses an event whose signature does not hold, and stores nothing', async () => {
    const before = await t.db.$count(paymentEvents)
    const body = JSON.stringify({ id: 'evt_forged', object: 'event', type: 'checkout.session.completed', data: { object: {} } })
    const forged = new Stripe('sk_test_x').webhooks.generateTestHeaderString({ payload: body, secret: 'whsec_someone_else_entirely' })
    const res = await planner.post('/api/webhooks/payments').set('content-type', 'application/json').set('stripe-signature', forged).send(body)
    expect(res.status).toBe(401)
    expect(res.body.error.message).toMatch(/^Payment event refused: /)
    expect(await t.db.$count(paymentEvents)).toBe(before)
  })

  it('a pay link that was tampered with says what to do', async () => {
    const res = await planner.get('/api/pay/eyJhbGciOiJIUzI1NiJ9.e30.forged-signature-here')
    expect(res.status).toBe(404)
    expect(res.body.error.message).toMatch(/This payment link is not valid .*Copy the whole link from the e-mail/)
  })
})
