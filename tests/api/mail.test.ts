import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs'
import { createServer } from 'node:net'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { eq } from 'drizzle-orm'
import { simpleParser, type ParsedMail } from 'mailparser'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { MailMessageSchema, MailPageSchema } from '@kitwright/shared/mail'
import { DEMO_SHOP_NAME, seedDemo } from '../../server/src/seeds/demo'
import { DEMO_MAIL_IDENTITY } from '../../server/src/seeds/shipping'
import { mailMessages, orders } from '../../server/src/db/schema/index'
import { startWorkers } from '../../server/src/workers'
import { startSmtpCatcher } from '../../storage-fake/smtp'
import { buildApp, signedInAs } from '../support/app'
import { deliver, paidEvent, waitFor } from '../support/store-webhook'
import { createTestDb, type TestDb } from '../support/test-db'
import { waitForQueueIdle } from '../support/queue'

let t: TestDb
let built: ReturnType<typeof buildApp>
beforeAll(async () => {
  t = await createTestDb()
  await seedDemo(t.db)
  built = buildApp(t)
  await startWorkers(built.deps)
})
afterAll(() => t.drop())

/** Every message the catcher in `dir` holds for `to`, parsed. */
async function caught(dir: string, to: string): Promise<ParsedMail[]> {
  const files = readdirSync(dir).filter((f) => f.endsWith('.eml'))
  const parsed = await Promise.all(files.map((f) => simpleParser(readFileSync(path.join(dir, f)))))
  return parsed.filter((m) => (Array.isArray(m.to) ? m.to : m.to ? [m.to] : []).some((a) => a.value.some((v) => v.address === to)))
}

async function mailFor(orderNumber: string) {
  return waitFor(`the e-mail of ${orderNumber} to be sent`, async () => {
    const [row] = await t.db
      .select({ mail: mailMessages })
      .from(mailMessages)
      .innerJoin(orders, eq(orders.id, mailMessages.orderId))
      .where(eq(orders.number, orderNumber))
    return row?.mail.status === 'sent' ? row.mail : undefined
  })
}

describe('the "order received" e-mail', () => {
  it('goes to the customer once over SMTP, with the order number, the kits and the shop name', async () => {
    const mailDir = process.env.FAKE_MAIL_DIR
    if (!mailDir) throw new Error('FAKE_MAIL_DIR is not set: run the suite with `npm test`')
    const first = paidEvent('MW-M-1001')
    await deliver(built.app, first)
    // The store sends the paid order again under another event id: still one e-mail.
    await deliver(built.app, paidEvent('MW-M-1001'))
    const row = await mailFor('MW-M-1001')
    expect(row).toMatchObject({ to: 'mw-m-1001@buyer.example', purpose: 'order_received', attempts: 1, lastError: null })

    const messages = await waitFor('the message in the catcher', async () => {
      const found = await caught(mailDir, 'mw-m-1001@buyer.example')
      return found.length > 0 ? found : undefined
    })
    await waitForQueueIdle(t.db) // every job done: a stray second send would have landed by now
    expect(await caught(mailDir, 'mw-m-1001@buyer.example')).toHaveLength(1)
    const [mail] = messages
    expect(mail!.subject).toBe(`${DEMO_SHOP_NAME}: we have your order MW-M-1001`)
    // The demo shop's sender from its settings (MAIL_FROM, the deps' address, is only the fallback before one is set).
    expect(mail!.from?.value[0]).toMatchObject({ name: DEMO_MAIL_IDENTITY.mailFromName, address: DEMO_MAIL_IDENTITY.mailFromAddress })
    expect(mail!.replyTo?.value[0]?.address).toBe(DEMO_MAIL_IDENTITY.replyToAddress)
    expect(mail!.text).toContain('Hello Rowan,')
    expect(mail!.text).toMatch(/1 × .*\(MW-TOTE-12\)/)
    expect(mail!.text).toMatch(/2 × .*\(MW-SPARE-CUP12\)/)
    expect(mail!.html).toContain('<strong>MW-M-1001</strong>')
    expect(mail!.headers.get('x-kitwright-mail-id')).toBe(row.id)
  })

  it('stays queued while the relay is down and arrives once when it is back', { timeout: 60_000 }, async () => {
    const t2 = await createTestDb()
    const dir = mkdtempSync(path.join(tmpdir(), 'kitwright-mail-'))
    let catcher: { close(): Promise<void> } | null = null
    try {
      await seedDemo(t2.db)
      const port = await new Promise<number>((resolve) => {
        const srv = createServer().listen(0, '127.0.0.1', () => {
          const addr = srv.address()
          srv.close(() => resolve(typeof addr === 'object' && addr ? addr.port : 0))
        })
      })
      const down = buildApp(t2)
      down.deps.mail.smtpUrl = `smtp://127.0.0.1:${port}` // nothing listens there yet
      await startWorkers(down.deps)
      await deliver(down.app, paidEvent('MW-M-2001'))
      const failed = await waitFor('a failed attempt', async () => {
        const [row] = await t2.db.select().from(mailMessages)
        return row && row.attempts >= 1 ? row : undefined
      })
      expect(failed.status).toBe('queued')
      expect(failed.lastError).toMatch(/ECONNREFUSED|connect/i)

      catcher = await startSmtpCatcher({ port, directory: dir })
      const sent = await waitFor(
        'the retried send',
        async () => {
          const [row] = await t2.db.select().from(mailMessages)
          return row?.status === 'sent' ? row : undefined
        },
        30_000,
      )
      expect(sent.attempts).toBeGreaterThanOrEqual(2)
      expect(sent.lastError).toBeNull()
      await waitForQueueIdle(t2.db) // every job done: a stray second send would have landed by now
      expect(await caught(dir, 'mw-m-2001@buyer.example')).toHaveLength(1)
    } finally {
      await catcher?.close()
      await t2.drop()
      rmSync(dir, { recursive: true, force: true })
    }
  })
})

describe('GET /api/mail (the outbox)', () => {
  it('lists messages newest first, filters by status, and opens one', async () => {
    const { agent } = await signedInAs(built.app, t, 'planner')
    await deliver(built.app, paidEvent('MW-M-3001'))
    await mailFor('MW-M-3001')
    const res = await agent.get('/api/mail?pageSize=10')
    expect(res.status).toBe(200)
    const page = MailPageSchema.parse(res.body)
    expect(page.items[0]!.order?.number).toBe('MW-M-3001')
    const times = page.items.map((m) => m.createdAt)
    expect([...times].sort().reverse()).toEqual(times)

    const queued = MailPageSchema.parse((await agent.get('/api/mail?status=queued')).body)
    expect(queued.items.every((m) => m.status === 'queued')).toBe(true)
    const sent = MailPageSchema.parse((await agent.get('/api/mail?status=sent')).body)
    expect(sent.items.map((m) => m.order?.number)).toContain('MW-M-3001')

    const one = MailMessageSchema.parse((await agent.get(`/api/mail/${page.items[0]!.id}`)).body)
    expect(one.text).toContain('MW-M-3001')
    expect(one.html).toContain('MW-M-3001')

    expect((await agent.get('/api/mail?status=lost')).status).toBe(400)
    expect((await agent.get('/api/mail/6f1c2a52-8d1e-4c55-9a55-0d1f6f3e2b11')).status).toBe(404)
  })

  it('is for admin and planner only', async () => {
    for (const role of ['admin', 'planner'] as const) {
      const { agent } = await signedInAs(built.app, t, role)
      expect((await agent.get('/api/mail')).status).toBe(200)
    }
    for (const role of ['cutter', 'assembler', 'packer'] as const) {
      const { agent } = await signedInAs(built.app, t, role)
      expect((await agent.get('/api/mail')).status).toBe(403)
    }
    expect((await request(built.app).get('/api/mail')).status).toBe(401)
  })
})
