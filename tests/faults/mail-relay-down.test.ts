// The SMTP relay goes away in the middle of taking orders: the orders are still taken, their e-mail
// waits in the outbox, and when the relay is back every message goes out exactly once.
import { readdirSync, readFileSync } from 'node:fs'
import path from 'node:path'
import { eq, inArray } from 'drizzle-orm'
import { simpleParser } from 'mailparser'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { MailPageSchema } from '@kitwright/shared/mail'
import { createDb } from '../../server/src/db/client'
import { mailMessages, orders } from '../../server/src/db/schema/index'
import { startWorkers } from '../../server/src/workers'
import { buildApp, signedInAs } from '../support/app'
import { deliver, paidEvent, waitFor } from '../support/store-webhook'
import type { TestDb } from '../support/test-db'
import { privatePostgres, privateSmtp, seconds } from './private-services'
import { waitForQueueIdle } from '../support/queue'

let pg: Awaited<ReturnType<typeof privatePostgres>>
let smtp: Awaited<ReturnType<typeof privateSmtp>>
let conn: ReturnType<typeof createDb>
let built: ReturnType<typeof buildApp>

beforeAll(async () => {
  pg = await privatePostgres('mail')
  smtp = await privateSmtp('mail')
  conn = createDb(pg.url)
  built = buildApp(conn)
  built.deps.mail.smtpUrl = smtp.url
  await startWorkers(built.deps)
})
afterAll(async () => {
  await built?.deps.jobs.stop()
  await conn?.pool.end()
  await smtp?.stop()
  pg?.destroy()
})

/** Recipients of every message the catcher holds, one entry per message. */
async function caughtRecipients(): Promise<string[]> {
  const files = readdirSync(smtp.directory).filter((f) => f.endsWith('.eml'))
  const parsed = await Promise.all(files.map((f) => simpleParser(readFileSync(path.join(smtp.directory, f)))))
  return parsed.flatMap((m) => (Array.isArray(m.to) ? m.to : m.to ? [m.to] : []).flatMap((a) => a.value.map((v) => v.address ?? '')))
}

async function mailOf(numbers: string[]) {
  return conn.db
    .select({ number: orders.number, status: mailMessages.status, attempts: mailMessages.attempts, lastError: mailMessages.lastError })
    .from(mailMessages)
    .innerJoin(orders, eq(orders.id, mailMessages.orderId))
    .where(inArray(orders.number, numbers))
}

describe('the SMTP relay stops and starts again in the middle of taking orders', () => {
  it('keeps taking orders, holds their e-mail in the outbox, and sends each message once when the relay is back', async () => {
    const before = ['MW-F-1001', 'MW-F-1002', 'MW-F-1003']
    const during = ['MW-F-2001', 'MW-F-2002', 'MW-F-2003']
    for (const n of before) expect((await deliver(built.app, paidEvent(n))).status).toBe(200)
    await waitFor('the first e-mails to go out', async () => ((await mailOf(before)).filter((m) => m.status === 'sent').length === 3 ? true : undefined))

    await smtp.stop()
    const stoppedAt = Date.now()
    for (const n of during) expect((await deliver(built.app, paidEvent(n))).status, `order ${n} taken while the relay is down`).toBe(200)
    const queued = await waitFor('two failed attempts on every new message (the queue retries)', async () => {
      const rows = await mailOf(during)
      return rows.length === 3 && rows.every((m) => m.attempts >= 2) ? rows : undefined
    })
    for (const m of queued) {
      expect(m.status).toBe('queued')
      expect(m.lastError).toMatch(/ECONNREFUSED|connect/i)
    }
    // The owner sees them waiting in the outbox page meanwhile.
    const { agent } = await signedInAs(built.app, conn as unknown as TestDb, 'planner')
    const outbox = MailPageSchema.parse((await agent.get('/api/mail?status=queued')).body)
    expect(outbox.items.map((m) => m.order?.number).sort()).toEqual(during)

    await smtp.start()
    const back = Date.now()
    await waitFor('every queued e-mail to go out', async () => ((await mailOf(during)).every((m) => m.status === 'sent') ? true : undefined), 60_000)
    const recovered = Date.now() - back
    await waitForQueueIdle(conn.db) // every job done: a stray second send would have landed by now

    const all = [...before, ...during]
    const recipients = await caughtRecipients()
    for (const n of all) expect(recipients.filter((r) => r === `${n.toLowerCase()}@buyer.example`), n).toHaveLength(1)
    expect(recipients).toHaveLength(all.length)
    const rows = await mailOf(all)
    expect(rows.every((m) => m.status === 'sent' && m.lastError === null)).toBe(true)
    const orderRows = await conn.db.select({ number: orders.number }).from(orders).where(inArray(orders.number, all))
    expect(orderRows).toHaveLength(all.length)
    console.log(
      `[faults] SMTP down ${seconds(back - stoppedAt)}: ${during.length} orders taken meanwhile, their e-mail held (attempts ${queued.map((m) => m.attempts).join('/')}); ` +
        `all sent ${seconds(recovered)} after the relay came back; ${recipients.length} messages caught for ${all.length} orders`,
    )
  })
})
