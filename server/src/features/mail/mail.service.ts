import { and, count, desc, eq, lt, sql } from 'drizzle-orm'
import type { MailListQuery, MailMessage, MailPage } from '@kitwright/shared/mail'
import type { Db, Tx } from '../../db/client'
import { mailMessages, orders } from '../../db/schema/index'
import type { Deps } from '../../deps'
import { Conflict, NotFound } from '../../lib/http-errors'
import type { JobContext, Jobs } from '../../lib/jobs'
import { addOrderEvent } from '../orders/orders.service'
import { mailSender } from '../settings/settings.service'
import { toMailMessage, toMailSummary } from './mail.mapper'
import { smtpTransport } from './mailer'

export interface OutgoingMail {
  to: string
  subject: string
  text: string
  html?: string
  orderId: string | null
  /** Why it is sent, e.g. `order_received`; with the order, a purpose is sent at most once. */
  purpose: string
  /** Files sent with it (a purchase order's PDF); stored with the message, so every try sends the same bytes. */
  attachments?: { filename: string; contentType: string; content: Buffer }[]
}

/**
 * Puts a message in the outbox and enqueues its sending, inside the caller's transaction. A second
 * message for the same order and purpose is dropped: returns null.
 */
export async function queueMail(tx: Tx, jobs: Jobs, mail: OutgoingMail): Promise<string | null> {
  const [row] = await tx
    .insert(mailMessages)
    .values({
      to: mail.to,
      subject: mail.subject,
      text: mail.text,
      html: mail.html ?? null,
      orderId: mail.orderId,
      purpose: mail.purpose,
      attachments: (mail.attachments ?? []).map((a) => ({ filename: a.filename, contentType: a.contentType, contentBase64: a.content.toString('base64') })),
    })
    .onConflictDoNothing({ target: [mailMessages.orderId, mailMessages.purpose] })
    .returning({ id: mailMessages.id })
  if (!row) return null
  await jobs.send('send-mail', { mailId: row.id }, { singletonKey: row.id, tx })
  if (mail.orderId) {
    await addOrderEvent(tx, { orderId: mail.orderId, kind: 'mail_queued', message: `E-mail queued to ${mail.to}: ${mail.subject}`, data: { mailId: row.id } })
  }
  return row.id
}

/**
 * The `send-mail` job: sends one queued message over SMTP and marks it sent. While the relay is
 * unreachable the message stays queued with the error and the queue retries it; after the last try
 * it is marked failed. The row stays locked while sending, so two workers never send it twice.
 */
export async function deliverMail(deps: Pick<Deps, 'db' | 'mail'>, mailId: string, job: JobContext): Promise<void> {
  let failure: Error | null = null
  await deps.db.transaction(async (tx) => {
    const [mail] = await tx.select().from(mailMessages).where(eq(mailMessages.id, mailId)).for('update')
    if (!mail || mail.status === 'sent') return
    // The sender is read as the message goes out, so a sender changed in the settings applies to the next mail.
    const sender = await mailSender(tx, deps.mail.from)
    try {
      await smtpTransport(deps.mail.smtpUrl).sendMail({
        from: sender.from,
        ...(sender.replyTo ? { replyTo: sender.replyTo } : {}),
        to: mail.to,
        subject: mail.subject,
        text: mail.text,
        ...(mail.html ? { html: mail.html } : {}),
        ...(mail.attachments.length > 0
          ? { attachments: mail.attachments.map((a) => ({ filename: a.filename, contentType: a.contentType, content: Buffer.from(a.contentBase64, 'base64') })) }
          : {}),
        headers: { 'X-Kitwright-Mail-Id': mail.id },
      })
    } catch (err) {
      failure = err instanceof Error ? err : new Error(String(err))
      const last = job.retryCount >= job.retryLimit
      await tx
        .update(mailMessages)
        .set({ attempts: sql`${mailMessages.attempts} + 1`, lastError: failure.message.slice(0, 1000), status: last ? 'failed' : 'queued' })
        .where(eq(mailMessages.id, mail.id))
      return
    }
    await tx.update(mailMessages).set({ status: 'sent', sentAt: new Date(), attempts: sql`${mailMessages.attempts} + 1`, lastError: null }).where(eq(mailMessages.id, mail.id))
    if (mail.orderId) {
      await addOrderEvent(tx, { orderId: mail.orderId, kind: 'mail_sent', message: `E-mail sent to ${mail.to}: ${mail.subject}`, data: { mailId: mail.id } })
    }
  })
  if (failure) throw failure
}

/** The outbox, newest first, optionally one status only. */
export async function listMail(db: Db, query: MailListQuery): Promise<MailPage> {
  const where = query.status ? eq(mailMessages.status, query.status) : undefined
  const [rows, [total]] = await Promise.all([
    db
      .select({ mail: mailMessages, orderNumber: orders.number })
      .from(mailMessages)
      .leftJoin(orders, eq(orders.id, mailMessages.orderId))
      .where(where)
      .orderBy(desc(mailMessages.createdAt), desc(mailMessages.id))
      .limit(query.pageSize)
      .offset((query.page - 1) * query.pageSize),
    db.select({ n: count() }).from(mailMessages).where(where),
  ])
  return { items: rows.map((r) => toMailSummary(r.mail, r.orderNumber)), total: total?.n ?? 0, page: query.page, pageSize: query.pageSize }
}

/** One message with its bodies. */
export async function getMail(db: Db, id: string): Promise<MailMessage> {
  const [row] = await db
    .select({ mail: mailMessages, orderNumber: orders.number })
    .from(mailMessages)
    .leftJoin(orders, eq(orders.id, mailMessages.orderId))
    .where(and(eq(mailMessages.id, id)))
  if (!row) throw new NotFound('No such message in the outbox')
  return toMailMessage(row.mail, row.orderNumber)
}

/** Attempts after which the periodic sweep stops trying a message by itself (about a day of sweeps); "Send again" still works. */
export const SWEEP_MAX_ATTEMPTS = 200

/**
 * Puts a message that failed for good back in the queue. The status flips in one statement, so two
 * sweeps or two taps requeue it once; the send job locks the row and skips a sent message, so it
 * still goes out once. Returns false when the message was not failed.
 */
async function requeueFailed(deps: Pick<Deps, 'db' | 'jobs'>, mailId: string): Promise<boolean> {
  return deps.db.transaction(async (tx) => {
    const [row] = await tx.update(mailMessages).set({ status: 'queued' }).where(and(eq(mailMessages.id, mailId), eq(mailMessages.status, 'failed'))).returning({ id: mailMessages.id })
    if (!row) return false
    await deps.jobs.send('send-mail', { mailId }, { singletonKey: mailId, tx })
    return true
  })
}

/** "Send again" on a message that failed for good (the office, from the outbox or the home page). */
export async function resendMail(deps: Pick<Deps, 'db' | 'jobs'>, mailId: string): Promise<MailMessage> {
  if (!(await requeueFailed(deps, mailId))) {
    const current = await getMail(deps.db, mailId)
    throw new Conflict(current.status === 'sent' ? 'This e-mail was sent already; each e-mail goes out once' : 'This e-mail is already waiting to be sent')
  }
  return getMail(deps.db, mailId)
}

/**
 * The periodic sweep: every message that failed for good (its retries ran out during a long relay
 * outage) goes back in the queue, until it has been tried {@link SWEEP_MAX_ATTEMPTS} times.
 */
export async function sweepFailedMail(deps: Pick<Deps, 'db' | 'jobs' | 'logger'>): Promise<number> {
  const failed = await deps.db.select({ id: mailMessages.id }).from(mailMessages).where(and(eq(mailMessages.status, 'failed'), lt(mailMessages.attempts, SWEEP_MAX_ATTEMPTS)))
  let requeued = 0
  for (const { id } of failed) if (await requeueFailed(deps, id)) requeued += 1
  if (requeued > 0) deps.logger.info({ requeued }, 'failed e-mail put back in the queue by the sweep')
  return requeued
}
