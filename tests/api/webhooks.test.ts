import { Writable } from 'node:stream'
import { and, asc, count, eq, isNull, sql, sum } from 'drizzle-orm'
import { pino } from 'pino'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ApiErrorBodySchema } from '@kitwright/shared/errors'
import { StoreWebhookReplySchema } from '@kitwright/shared/store-events'
import { seedDemo } from '../../server/src/seeds/demo'
import { DEMO_PART_SKUS } from '../../server/src/seeds/catalog'
import { kitRevisions, kits, mailMessages, orderEvents, orderLines, orders, parts, stockMoves, storeEvents, users, workOrders } from '../../server/src/db/schema/index'
import { reserveStock } from '../../server/src/features/stock/stock.service'
import { signStoreDelivery } from '../../server/src/features/webhooks/store-signature'
import { startWorkers } from '../../server/src/workers'
import { buildApp } from '../support/app'
import { deliver, paidEvent, waitFor } from '../support/store-webhook'
import { createTestDb, type TestDb } from '../support/test-db'

let t: TestDb
let built: ReturnType<typeof buildApp>
const logLines: { level: number; msg: string; reason?: string }[] = []

beforeAll(async () => {
  t = await createTestDb()
  await seedDemo(t.db)
  const sink = new Writable({
    write(chunk: Buffer, _enc, done) {
      for (const line of chunk.toString().split('\n').filter(Boolean)) logLines.push(JSON.parse(line) as (typeof logLines)[number])
      done()
    },
  })
  built = buildApp(t, { logger: pino({ level: 'warn' }, sink) })
  await startWorkers(built.deps)
})
afterAll(() => t.drop())

async function storedEvents() {
  const [row] = await t.db.select({ n: count() }).from(storeEvents)
  return row!.n
}
async function orderNamed(number: string) {
  const [row] = await t.db.select().from(orders).where(eq(orders.number, number))
  return row
}
async function processed(eventId: string) {
  return waitFor(`event ${eventId} to be processed`, async () => {
    const [row] = await t.db.select().from(storeEvents).where(eq(storeEvents.eventId, eventId))
    return row?.processedAt ? row : undefined
  })
}
async function timeline(orderId: string) {
  return t.db.select().from(orderEvents).where(eq(orderEvents.orderId, orderId)).orderBy(asc(orderEvents.createdAt))
}

describe('POST /api/webhooks/store: the signature', () => {
  it('takes a signed paid order: 200, the raw event stored, the order created by the job', async () => {
    const event = paidEvent('MW-W-1001')
    const res = await deliver(built.app, event)
    expect(res.status).toBe(200)
    expect(StoreWebhookReplySchema.parse(res.body)).toEqual({ received: true, duplicate: false })

    const stored = await processed(event.eventId)
    expect(stored).toMatchObject({ type: 'order.paid', orderNumber: 'MW-W-1001', error: null })
    expect(stored.payload).toEqual(event)

    const order = (await orderNamed('MW-W-1001'))!
    expect(order).toMatchObject({ source: 'store', paymentStatus: 'paid', status: 'open', customerEmail: 'mw-w-1001@buyer.example', shipCity: 'Brookmere' })
    expect(order.totalCents).toBe(18900 + 2 * 1200)
    const lines = await t.db
      .select({ sku: kits.sku, quantity: orderLines.quantity })
      .from(orderLines)
      .leftJoin(kits, eq(kits.id, orderLines.kitId))
      .where(eq(orderLines.orderId, order.id))
      .orderBy(orderLines.lineNo)
    expect(lines).toEqual([
      { sku: 'MW-TOTE-12', quantity: 1 },
      { sku: 'MW-SPARE-CUP12', quantity: 2 },
    ])
    expect((await timeline(order.id)).map((e) => e.kind)).toContain('received')
  })

  it('refuses a forged signature with 401, stores nothing and logs one line with the reason', async () => {
    const before = await storedEvents()
    const linesBefore = logLines.length
    const event = paidEvent('MW-W-1002')
    const wrongSecret = await deliver(built.app, event, { secret: 'not-the-shop-secret-but-just-as-long-0123456789' })
    expect(wrongSecret.status).toBe(401)
    expect(ApiErrorBodySchema.parse(wrongSecret.body).error.message).toMatch(/signature does not match/)

    // A body changed after signing: the signature was made over other bytes.
    const ts = Math.floor(Date.now() / 1000)
    const signature = signStoreDelivery('kitwright-test-store-secret-0123456789abcdef', ts, JSON.stringify(event))
    const tampered = await deliver(built.app, { ...event, orderNumber: 'MW-W-9999' }, { timestamp: ts, signature })
    expect(tampered.status).toBe(401)

    const missing = await deliver(built.app, event, { signature: '' })
    expect(missing.status).toBe(401)

    expect(await storedEvents()).toBe(before)
    expect(await orderNamed('MW-W-1002')).toBeUndefined()
    const rejections = logLines.slice(linesBefore).filter((l) => l.msg === 'store webhook delivery rejected')
    expect(rejections.map((l) => l.reason)).toEqual(['signature does not match the body', 'signature does not match the body', 'no X-Store-Signature header'])
    expect(JSON.stringify(logLines)).not.toContain('kitwright-test-store-secret')
  })

  it('refuses a timestamp more than 5 minutes off, either way, with 401, even when the signature is right', async () => {
    const before = await storedEvents()
    const now = Math.floor(Date.now() / 1000)
    const stale = await deliver(built.app, paidEvent('MW-W-1003'), { timestamp: now - 6 * 60 })
    expect(stale.status).toBe(401)
    expect(stale.body.error.message).toMatch(/old \(limit 300 s\)/)
    const ahead = await deliver(built.app, paidEvent('MW-W-1003'), { timestamp: now + 6 * 60 })
    expect(ahead.status).toBe(401)
    // Four minutes off is within the tolerance.
    const late = await deliver(built.app, paidEvent('MW-W-1003'), { timestamp: now - 4 * 60 })
    expect(late.status).toBe(200)
    expect(await storedEvents()).toBe(before + 1)
  })

  it('answers a signed but malformed event with 400 saying which field to fix, and stores nothing', async () => {
    const before = await storedEvents()
    const bad = paidEvent('MW-W-1004')
    const res = await deliver(built.app, { ...bad, order: { ...bad.order, lines: [] } })
    expect(res.status).toBe(400)
    expect(ApiErrorBodySchema.parse(res.body).error.fields).toHaveProperty(['order.lines'])
    const unknownType = await deliver(built.app, { ...bad, type: 'order.refunded' })
    expect(unknownType.status).toBe(400)
    expect(await storedEvents()).toBe(before)
  })
})

describe('store events: exactly once, in any order', () => {
  it('takes a redelivered event once: 200 duplicate, one stored event, one order', async () => {
    const event = paidEvent('MW-W-2001')
    const first = await deliver(built.app, event)
    const again = await deliver(built.app, event)
    expect(first.body).toEqual({ received: true, duplicate: false })
    expect(again.status).toBe(200)
    expect(again.body).toEqual({ received: true, duplicate: true })
    await processed(event.eventId)
    // The store sends the same order again under a new event id: still one order, noted on its timeline.
    const other = paidEvent('MW-W-2001')
    await deliver(built.app, other)
    await processed(other.eventId)
    const [n] = await t.db.select({ n: count() }).from(orders).where(eq(orders.number, 'MW-W-2001'))
    expect(n!.n).toBe(1)
    const order = (await orderNamed('MW-W-2001'))!
    const kinds = (await timeline(order.id)).map((e) => e.kind)
    expect(kinds.filter((k) => k === 'received')).toHaveLength(1)
    expect(kinds).toContain('duplicate_ignored')
  })

  it('1,000 deliveries of 100 distinct orders at a concurrency of 20 create exactly 100 orders', { timeout: 180_000 }, async () => {
    // Each order: two event ids (the store re-sent it), each delivered five times.
    const deliveries = Array.from({ length: 100 }, (_, i) => {
      const number = `MW-LOAD-${String(i).padStart(3, '0')}`
      const a = paidEvent(number)
      const b = paidEvent(number)
      return [a, a, b, a, b, b, a, b, a, b]
    }).flat()
    // Interleave so the copies of one order are spread over the whole run.
    deliveries.sort((x, y) => (x.eventId < y.eventId ? -1 : 1))
    expect(deliveries).toHaveLength(1000)
    const statuses: number[] = []
    let next = 0
    await Promise.all(
      Array.from({ length: 20 }, async () => {
        while (next < deliveries.length) {
          const event = deliveries[next++]!
          statuses.push((await deliver(built.app, event)).status)
        }
      }),
    )
    expect(statuses.filter((s) => s !== 200)).toEqual([])
    const [events] = await t.db.select({ n: count() }).from(storeEvents).where(sql`${storeEvents.orderNumber} like 'MW-LOAD-%'`)
    expect(events!.n).toBe(200)
    await waitFor(
      'every load event to be processed',
      async () => {
        const [left] = await t.db.select({ n: count() }).from(storeEvents).where(and(sql`${storeEvents.orderNumber} like 'MW-LOAD-%'`, isNull(storeEvents.processedAt)))
        return left!.n === 0 ? true : undefined
      },
      120_000,
    )
    const [made] = await t.db.select({ n: count() }).from(orders).where(sql`${orders.number} like 'MW-LOAD-%'`)
    expect(made!.n).toBe(100)
    const [mails] = await t.db
      .select({ n: count() })
      .from(mailMessages)
      .innerJoin(orders, eq(orders.id, mailMessages.orderId))
      .where(sql`${orders.number} like 'MW-LOAD-%'`)
    expect(mails!.n).toBe(100)
  })

  it('keeps an order cancelled when the cancellation arrives before the payment', async () => {
    const cancel = { eventId: 'evt-cancel-3001', type: 'order.cancelled', occurredAt: new Date().toISOString(), orderNumber: 'MW-W-3001', reason: 'customer changed their mind' } as const
    expect((await deliver(built.app, cancel)).status).toBe(200)
    await processed(cancel.eventId)
    expect(await orderNamed('MW-W-3001')).toBeUndefined()

    const paid = paidEvent('MW-W-3001', { occurredAt: new Date(Date.now() - 3600_000).toISOString() })
    expect((await deliver(built.app, paid)).status).toBe(200)
    await processed(paid.eventId)
    const order = (await orderNamed('MW-W-3001'))!
    expect(order.status).toBe('cancelled')
    expect(order.paymentStatus).toBe('paid')
    expect(order.cancelledAt).not.toBeNull()
    const events = await timeline(order.id)
    expect(events.map((e) => e.kind)).toEqual(expect.arrayContaining(['received', 'cancelled']))
    expect(events.find((e) => e.kind === 'cancelled')!.message).toMatch(/customer changed their mind; the cancellation arrived before the payment/)
    // No "we have your order" e-mail for an order that is already cancelled: the cancellation e-mail only.
    const mails = await t.db.select({ purpose: mailMessages.purpose }).from(mailMessages).where(eq(mailMessages.orderId, order.id))
    expect(mails.map((m) => m.purpose)).toEqual(['order_cancelled'])
  })

  it('cancels the work orders of a released order and gives back their reserved stock', async () => {
    const paid = paidEvent('MW-W-3002')
    await deliver(built.app, paid)
    await processed(paid.eventId)
    const order = (await orderNamed('MW-W-3002'))!
    // A work order as release makes one (release itself is tested with the orders desk), holding 4 elbows.
    const [line] = await t.db.select().from(orderLines).where(and(eq(orderLines.orderId, order.id), eq(orderLines.lineNo, 1)))
    const [revision] = await t.db.select().from(kitRevisions).where(eq(kitRevisions.kitId, line!.kitId!)).limit(1)
    const [part] = await t.db.select().from(parts).where(eq(parts.sku, DEMO_PART_SKUS.elbowHalfInch))
    const [planner] = await t.db.select().from(users).where(eq(users.role, 'planner')).limit(1)
    const [wo] = await t.db
      .insert(workOrders)
      .values({ serial: 'T-3002-1', orderId: order.id, orderLineId: line!.id, kitRevisionId: revision!.id, status: 'building' })
      .returning()
    await t.db.transaction((tx) => reserveStock(tx, { workOrderId: wo!.id, lines: [{ partId: part!.id, quantity: 4, stickLength: null }] }, planner!))
    await t.db.update(orders).set({ status: 'released' }).where(eq(orders.id, order.id))

    const cancel = { eventId: 'evt-cancel-3002', type: 'order.cancelled', occurredAt: new Date().toISOString(), orderNumber: 'MW-W-3002' } as const
    await deliver(built.app, cancel)
    await processed(cancel.eventId)
    expect((await orderNamed('MW-W-3002'))!.status).toBe('cancelled')
    const [after] = await t.db.select().from(workOrders).where(eq(workOrders.id, wo!.id))
    expect(after!.status).toBe('cancelled')
    const [held] = await t.db
      .select({ reserved: sum(stockMoves.quantity).mapWith(Number) })
      .from(stockMoves)
      .where(and(eq(stockMoves.workOrderId, wo!.id), sql`${stockMoves.kind} in ('reserve', 'release')`))
    expect(held!.reserved).toBe(0)
    const release = await t.db.select().from(stockMoves).where(and(eq(stockMoves.workOrderId, wo!.id), eq(stockMoves.kind, 'release')))
    expect(release).toHaveLength(1)
    expect(release[0]).toMatchObject({ quantity: -4, createdBy: null })
    expect((await timeline(order.id)).find((e) => e.kind === 'cancelled')!.message).toMatch(/T-3002-1/)
  })

  it('changes the ship-to on an address change and puts it on the timeline', async () => {
    const paid = paidEvent('MW-W-4001')
    await deliver(built.app, paid)
    await processed(paid.eventId)
    const change = {
      eventId: 'evt-address-4001',
      type: 'order.address_changed',
      occurredAt: new Date().toISOString(),
      orderNumber: 'MW-W-4001',
      shipTo: { name: 'Rowan Testerby', line1: '3 Quillbank Road', line2: 'Unit 2', city: 'Hollowford', postalCode: '97111', country: 'us' },
    } as const
    expect((await deliver(built.app, change)).status).toBe(200)
    await processed(change.eventId)
    const order = (await orderNamed('MW-W-4001'))!
    expect(order).toMatchObject({ shipLine1: '3 Quillbank Road', shipLine2: 'Unit 2', shipCity: 'Hollowford', shipRegion: null, shipPostalCode: '97111', shipCountry: 'US' })
    const event = (await timeline(order.id)).find((e) => e.kind === 'address_changed')!
    expect(event.message).toMatch(/12 Fernhollow Lane.*→.*3 Quillbank Road/)
  })

  it('applies an address change that arrived before the payment once the order exists', async () => {
    const change = {
      eventId: 'evt-address-4002',
      type: 'order.address_changed',
      occurredAt: new Date().toISOString(),
      orderNumber: 'MW-W-4002',
      shipTo: { name: 'Sable Oakhurst', line1: '88 Mossgate Street', city: 'Larchton', postalCode: 'K0A 1A0', country: 'CA' },
    } as const
    await deliver(built.app, change)
    await processed(change.eventId)
    const paid = paidEvent('MW-W-4002', { occurredAt: new Date(Date.now() - 600_000).toISOString() })
    await deliver(built.app, paid)
    await processed(paid.eventId)
    const order = (await orderNamed('MW-W-4002'))!
    expect(order).toMatchObject({ status: 'open', shipName: 'Sable Oakhurst', shipLine1: '88 Mossgate Street', shipCountry: 'CA' })
    expect((await timeline(order.id)).find((e) => e.kind === 'address_changed')!.message).toMatch(/arrived before the payment/)
  })

  it('retries an event whose processing failed once, and applies it once', async () => {
    // The first attempt to write an order fails as if the database had dropped out; sequences are not
    // rolled back, so the trigger lets every later attempt through.
    await t.db.execute(sql.raw(`
      create sequence crash_once;
      create function crash_once() returns trigger language plpgsql as $$
      begin
        if new.number = 'MW-W-5001' and nextval('crash_once') = 1 then raise exception 'simulated outage while writing the order'; end if;
        return new;
      end $$;
      create trigger crash_once before insert on orders for each row execute function crash_once();`))
    try {
      const paid = paidEvent('MW-W-5001')
      expect((await deliver(built.app, paid)).status).toBe(200)
      const stored = await processed(paid.eventId)
      expect(stored.error).toBeNull()
      const [{ tries }] = (await t.db.execute<{ tries: string }>(sql`select last_value as tries from crash_once`)).rows as [{ tries: string }]
      expect(Number(tries)).toBe(2)
      const [n] = await t.db.select({ n: count() }).from(orders).where(eq(orders.number, 'MW-W-5001'))
      expect(n!.n).toBe(1)
      const order = (await orderNamed('MW-W-5001'))!
      expect((await timeline(order.id)).filter((e) => e.kind === 'received')).toHaveLength(1)
      const [jobRow] = (await t.db.execute<{ state: string; retry_count: number }>(sql`select state, retry_count from pgboss.job where singleton_key = ${paid.eventId}`)).rows
      expect(jobRow).toEqual({ state: 'completed', retry_count: 1 })
    } finally {
      await t.db.execute(sql.raw('drop trigger crash_once on orders; drop function crash_once(); drop sequence crash_once;'))
    }
  })
})
