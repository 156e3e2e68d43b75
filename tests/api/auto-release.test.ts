import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs'
import { createServer } from 'node:net'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { and, eq } from 'drizzle-orm'
import { simpleParser } from 'mailparser'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { OrderDetailSchema } from '@kitwright/shared/orders'
import { ShortagesSchema } from '@kitwright/shared/work-orders'
import { auditEvents, mailMessages, orders, shopSettings, stockMoves, users, workOrders } from '../../server/src/db/schema/index'
import { seedDemo } from '../../server/src/seeds/demo'
import { createKit, releaseRevision, saveRevision } from '../../server/src/features/kits/kits.service'
import { startWorkers } from '../../server/src/workers'
import { startSmtpCatcher } from '../../storage-fake/smtp'
import { buildApp, signedInAs } from '../support/app'
import { insertPart } from '../support/factories'
import { deliver, paidEvent, waitFor } from '../support/store-webhook'
import { createTestDb, type TestDb } from '../support/test-db'
import { waitForQueueIdle } from '../support/queue'

let t: TestDb
let built: ReturnType<typeof buildApp>
let planner: Awaited<ReturnType<typeof signedInAs>>['agent']
let admin: Awaited<ReturnType<typeof signedInAs>>['agent']

beforeAll(async () => {
  t = await createTestDb()
  await seedDemo(t.db)
  built = buildApp(t)
  await startWorkers(built.deps)
  planner = (await signedInAs(built.app, t, 'planner')).agent
  admin = (await signedInAs(built.app, t, 'admin')).agent
})
afterAll(() => t.drop())

async function orderOf(number: string) {
  return waitFor(`order ${number} to be taken in`, async () => {
    const [row] = await t.db.select().from(orders).where(eq(orders.number, number))
    return row
  })
}
async function detail(id: string) {
  return OrderDetailSchema.parse((await planner.get(`/api/orders/${id}`)).body)
}
async function setAutoRelease(on: boolean) {
  const res = await admin.patch('/api/settings').send({ autoReleasePaid: on })
  expect(res.status, JSON.stringify(res.body)).toBe(200)
}

/** A spare pack sold in the store as `productId`, whose one part has only `stock` in the ledger and `perUnit` per pack. */
async function starvedStoreKit(productId: string, stock: number, perUnit: number) {
  const part = await insertPart(t.db, { name: 'Test float switch' })
  if (stock > 0) await t.db.insert(stockMoves).values({ partId: part.id, kind: 'receive', quantity: stock })
  const kit = await createKit(t.db, { sku: `TST-AR-${part.sku.slice(4)}`, name: 'Test float switch pack', storeProductId: productId, description: null })
  const rev = kit.revisions[0]!.id
  await saveRevision(t.db, rev, {
    notes: null,
    frame: null,
    leakTest: null,
    bomLines: [{ partId: part.id, quantity: perUnit, note: null }],
    cutParts: [],
    buildSteps: [{
      text: 'Bag the switches.',
      caution: null,
      photoRequired: false,
      measurementRequired: false,
      measurementUnit: null,
      measurementMin: null,
      measurementMax: null,
      freeOrder: false,
      outOfLimitsRework: false,
    }],
  })
  const [owner] = await t.db.select().from(users).where(eq(users.role, 'admin')).limit(1)
  await releaseRevision(t.db, rev, owner!)
  return { part, kitSku: kit.sku }
}

describe('release paid orders automatically', () => {
  it('is off by default: a paid store order waits for a planner', async () => {
    const [settings] = await t.db.select().from(shopSettings)
    expect(settings!.autoReleasePaid).toBe(false)
    await deliver(built.app, paidEvent('MW-AR-1001'))
    const order = await orderOf('MW-AR-1001')
    // The order-received mail is the last thing the job writes; once it is there, the job is done.
    await waitFor('the order-received mail', async () => (await t.db.select().from(mailMessages).where(eq(mailMessages.orderId, order.id)))[0])
    expect((await orderOf('MW-AR-1001')).status).toBe('open')
    expect(await t.db.$count(workOrders, eq(workOrders.orderId, order.id))).toBe(0)
  })

  it('when on, the job that takes the paid order in releases it, and a shortage leaves the units waiting with it listed', async () => {
    await setAutoRelease(true)
    try {
      const { part, kitSku } = await starvedStoreKit('tst-store-ar-float', 3, 2)
      await deliver(
        built.app,
        paidEvent('MW-AR-1002', {
          order: {
            ...paidEvent('MW-AR-1002').order,
            lines: [{ productId: 'tst-store-ar-float', title: 'Float switch pack', quantity: 2, unitPriceCents: 900 }],
          },
        }),
      )
      const order = await waitFor('the automatic release', async () => {
        const [row] = await t.db.select().from(orders).where(and(eq(orders.number, 'MW-AR-1002'), eq(orders.status, 'released')))
        return row
      })
      const d = await detail(order.id)
      expect(d.workOrders).toHaveLength(2)
      expect(d.workOrders.every((w) => w.kitSku === kitSku)).toBe(true)
      const released = d.events.find((e) => e.kind === 'released')!
      expect(released.message).toMatch(/^Released automatically when paid \(shop setting\) into 2 work orders/)
      expect(released.actorName).toBeNull()
      // 2 packs × 2 switches = 4 needed, 3 in stock: 3 reserved, 1 short.
      const shortage = d.events.find((e) => e.kind === 'shortage')!
      expect(shortage.message).toContain(`${part.sku} Test float switch short 1 of 4`)
      const page = ShortagesSchema.parse((await planner.get('/api/shortages')).body)
      expect(page.rows.find((r) => r.partId === part.id)).toMatchObject({ needed: 4, reserved: 3, available: 0, short: 1 })
      const [audit] = await t.db.select().from(auditEvents).where(and(eq(auditEvents.entityId, order.id), eq(auditEvents.action, 'order.release')))
      expect(audit).toMatchObject({ actorId: null, summary: expect.stringContaining('automatically when paid') })
      // The customer still hears from the shop.
      expect(await t.db.$count(mailMessages, eq(mailMessages.orderId, order.id))).toBe(1)
    } finally {
      await setAutoRelease(false)
    }
  })

  it('when on, an order it cannot release stays received and the timeline says why', async () => {
    await setAutoRelease(true)
    try {
      await deliver(
        built.app,
        paidEvent('MW-AR-1003', { order: { ...paidEvent('MW-AR-1003').order, lines: [{ productId: 'no-such-product', title: 'Mystery pack', quantity: 1, unitPriceCents: 500 }] } }),
      )
      const order = await orderOf('MW-AR-1003')
      const note = await waitFor('the note on the timeline', async () => (await detail(order.id)).events.find((e) => e.message.startsWith('Not released automatically')))
      expect(note.message).toMatch(/line 1: no-such-product \(Mystery pack\) maps to no kit/)
      const d = await detail(order.id)
      expect(d).toMatchObject({ status: 'open', stage: 'received', workOrderCount: 0 })
      expect(await t.db.$count(mailMessages, eq(mailMessages.orderId, order.id))).toBe(1)
    } finally {
      await setAutoRelease(false)
    }
  })
})

describe('mail while the relay is down', () => {
  it('a release queues the mail with the SMTP catcher stopped, and after it restarts the mail arrives once', { timeout: 60_000 }, async () => {
    const t2 = await createTestDb()
    const dir = mkdtempSync(path.join(tmpdir(), 'kitwright-mail-'))
    let catcher: { close(): Promise<void> } | null = null
    try {
      await seedDemo(t2.db)
      await t2.db.update(shopSettings).set({ autoReleasePaid: true })
      const port = await new Promise<number>((resolve) => {
        const srv = createServer().listen(0, '127.0.0.1', () => {
          const addr = srv.address()
          srv.close(() => resolve(typeof addr === 'object' && addr ? addr.port : 0))
        })
      })
      const down = buildApp(t2)
      down.deps.mail.smtpUrl = `smtp://127.0.0.1:${port}` // the catcher is stopped: nothing listens there
      await startWorkers(down.deps)
      await deliver(down.app, paidEvent('MW-AR-2001'))

      const released = await waitFor('the release', async () => {
        const [row] = await t2.db.select().from(orders).where(and(eq(orders.number, 'MW-AR-2001'), eq(orders.status, 'released')))
        return row
      })
      expect(await t2.db.$count(workOrders, eq(workOrders.orderId, released.id))).toBe(3)
      const failed = await waitFor('a failed attempt', async () => {
        const [row] = await t2.db.select().from(mailMessages).where(eq(mailMessages.orderId, released.id))
        return row && row.attempts >= 1 ? row : undefined
      })
      expect(failed.status).toBe('queued')
      expect(failed.lastError).toMatch(/ECONNREFUSED|connect/i)

      catcher = await startSmtpCatcher({ port, directory: dir })
      const sent = await waitFor(
        'the retried send',
        async () => {
          const [row] = await t2.db.select().from(mailMessages).where(eq(mailMessages.orderId, released.id))
          return row?.status === 'sent' ? row : undefined
        },
        30_000,
      )
      expect(sent.attempts).toBeGreaterThanOrEqual(2)
      await waitForQueueIdle(t2.db) // every job done: a stray second send would have landed by now
      const files = readdirSync(dir).filter((f) => f.endsWith('.eml'))
      const mails = await Promise.all(files.map((f) => simpleParser(readFileSync(path.join(dir, f)))))
      const toCustomer = mails.filter((m) => (Array.isArray(m.to) ? m.to : m.to ? [m.to] : []).some((a) => a.value.some((v) => v.address === 'mw-ar-2001@buyer.example')))
      expect(toCustomer).toHaveLength(1)
      expect(toCustomer[0]!.subject).toContain('MW-AR-2001')
    } finally {
      await catcher?.close()
      await t2.drop()
      rmSync(dir, { recursive: true, force: true })
    }
  })
})
