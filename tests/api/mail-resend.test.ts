import { readdirSync, readFileSync } from 'node:fs'
import path from 'node:path'
import { eq } from 'drizzle-orm'
import { simpleParser } from 'mailparser'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ApiErrorBodySchema } from '@kitwright/shared/errors'
import { MailMessageSchema } from '@kitwright/shared/mail'
import { seedDemo } from '../../server/src/seeds/demo'
import { auditEvents, mailMessages } from '../../server/src/db/schema/index'
import { sweepFailedMail, SWEEP_MAX_ATTEMPTS } from '../../server/src/features/mail/mail.service'
import { startWorkers } from '../../server/src/workers'
import { buildApp, signedInAs } from '../support/app'
import { waitForQueueIdle } from '../support/queue'
import { createTestDb, type TestDb } from '../support/test-db'

let t: TestDb
let built: ReturnType<typeof buildApp>
let planner: Awaited<ReturnType<typeof signedInAs>>['agent']
let packer: Awaited<ReturnType<typeof signedInAs>>['agent']
beforeAll(async () => {
  t = await createTestDb()
  await seedDemo(t.db)
  built = buildApp(t)
  await startWorkers(built.deps)
  planner = (await signedInAs(built.app, t, 'planner')).agent
  packer = (await signedInAs(built.app, t, 'packer')).agent
})
afterAll(() => t.drop())

/** How many messages the run's SMTP catcher holds for `to`. */
async function caughtFor(to: string) {
  const dir = process.env.FAKE_MAIL_DIR
  if (!dir) throw new Error('FAKE_MAIL_DIR is not set: run the suite with `npm test`')
  const files = readdirSync(dir).filter((f) => f.endsWith('.eml'))
  const parsed = await Promise.all(files.map((f) => simpleParser(readFileSync(path.join(dir, f)))))
  return parsed.filter((m) => (Array.isArray(m.to) ? m.to : m.to ? [m.to] : []).some((a) => a.value.some((v) => v.address === to))).length
}

/** A message whose retries ran out while the relay was away. */
async function failedMail(to: string, attempts = 6) {
  const [row] = await t.db
    .insert(mailMessages)
    .values({ to, subject: 'Your order has shipped', text: 'On its way.', orderId: null, purpose: `test:${to}`, status: 'failed', attempts, lastError: 'connect ECONNREFUSED 127.0.0.1:25' })
    .returning()
  return row!
}

describe('mail that failed for good', () => {
  it('"Send again" from the office sends it once, audited; a second tap is refused in words; a packer may not', async () => {
    const mail = await failedMail('tamsin.orrery@mail.example')
    expect((await packer.post(`/api/mail/${mail.id}/resend`)).status).toBe(403)
    const res = await planner.post(`/api/mail/${mail.id}/resend`)
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    expect(MailMessageSchema.parse(res.body).status).toBe('queued')
    await waitForQueueIdle(t.db)
    const [after] = await t.db.select().from(mailMessages).where(eq(mailMessages.id, mail.id))
    expect(after).toMatchObject({ status: 'sent', attempts: 7 })
    expect(await caughtFor('tamsin.orrery@mail.example')).toBe(1)
    const again = await planner.post(`/api/mail/${mail.id}/resend`)
    expect(again.status).toBe(409)
    expect(ApiErrorBodySchema.parse(again.body).error.message).toBe('This e-mail was sent already; each e-mail goes out once')
    const audits = await t.db.select().from(auditEvents).where(eq(auditEvents.action, 'mail.resend'))
    expect(audits.map((a) => a.entityId)).toContain(mail.id)
  })

  it('the periodic sweep requeues failed mail once even when two processes sweep at the same moment, and each goes out once', async () => {
    const a = await failedMail('ivo.quennell@mail.example')
    const b = await failedMail('ilse.morrow@mail.example')
    const spent = await failedMail('brannoch.fell@mail.example', SWEEP_MAX_ATTEMPTS)
    const [x, y] = await Promise.all([sweepFailedMail(built.deps), sweepFailedMail(built.deps)])
    expect(x + y).toBe(2)
    await waitForQueueIdle(t.db)
    for (const m of [a, b]) {
      const [row] = await t.db.select().from(mailMessages).where(eq(mailMessages.id, m.id))
      expect(row!.status).toBe('sent')
      expect(await caughtFor(m.to)).toBe(1)
    }
    // One tried as often as the sweep allows is left for a person to send again.
    expect((await t.db.select().from(mailMessages).where(eq(mailMessages.id, spent.id)))[0]!.status).toBe('failed')
  })
})
