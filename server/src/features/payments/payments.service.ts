import { randomUUID } from 'node:crypto'
import { and, asc, eq, inArray, sql } from 'drizzle-orm'
import { jwtVerify, SignJWT } from 'jose'
import { formatMoney } from '@kitwright/shared/money'
import { PAYMENT_METHOD_LABELS, type OrderPayments, type RecordPayment } from '@kitwright/shared/payments'
import type { Db, Tx } from '../../db/client'
import { orderPayments, orders, paymentEvents, paymentLinks, type PaymentLinkRow } from '../../db/schema/index'
import type { Deps } from '../../deps'
import { recordAudit, type AuditContext } from '../../lib/audit'
import type { SessionUser, TokenConfig } from '../../lib/auth'
import { Conflict, HttpError, NotFound } from '../../lib/http-errors'
import { queueMail } from '../mail/mail.service'
import { addOrderEvent } from '../orders/orders.service'
import { getShopSettings } from '../settings/settings.service'
import { autoReleasePaidOrder } from '../work-orders/auto-release'
import type { PaymentEvent } from './payment-service'

// A different audience from session and record tokens: a pay link opens only its own checkout.
const AUDIENCE = 'kitwright:payment-link'

async function lockOrder(tx: Tx, orderId: string) {
  const [order] = await tx.select().from(orders).where(eq(orders.id, orderId)).for('update')
  if (!order) throw new NotFound('No such order')
  return order
}

async function paidSoFar(db: Db | Tx, orderId: string): Promise<number> {
  const [row] = await db.select({ cents: sql<number>`coalesce(sum(${orderPayments.amountCents}), 0)::int` }).from(orderPayments).where(eq(orderPayments.orderId, orderId))
  return row?.cents ?? 0
}

/** An order may take a payment here only when the shop itself collects it: not a store order, not cancelled, not paid. */
function refusePayment(order: typeof orders.$inferSelect): HttpError | null {
  if (order.source === 'store') return new Conflict(`Order ${order.number} is paid through the web store; record its payment there`)
  if (order.status === 'cancelled') return new Conflict(`Order ${order.number} is cancelled; it takes no payment`)
  if (order.paymentStatus !== 'pending') return new Conflict(`Order ${order.number} is already ${order.paymentStatus}; nothing is due`)
  return null
}

/**
 * Adds a payment to the order inside `tx` and, once the payments cover the total, marks the order
 * paid, says so on the timeline and lets the auto-release setting release it.
 */
async function addPayment(tx: Tx, order: typeof orders.$inferSelect, payment: typeof orderPayments.$inferInsert, actor: { id: string; name: string } | null) {
  await tx.insert(orderPayments).values(payment)
  const paid = await paidSoFar(tx, order.id)
  const words = `${formatMoney(payment.amountCents, order.currency)} received (${PAYMENT_METHOD_LABELS[payment.method]}${payment.reference ? `, ${payment.reference}` : ''})`
  if (paid >= order.totalCents) {
    await tx.update(orders).set({ paymentStatus: 'paid', updatedAt: new Date() }).where(eq(orders.id, order.id))
    await addOrderEvent(tx, { orderId: order.id, kind: 'payment', message: `${words}; the order is paid in full.`, data: { method: payment.method }, actor })
    await autoReleasePaidOrder(tx, order.id)
  } else {
    await addOrderEvent(tx, { orderId: order.id, kind: 'payment', message: `${words}; ${formatMoney(order.totalCents - paid, order.currency)} still due.`, data: { method: payment.method }, actor })
  }
}

/** The order's payment panel. */
export async function getOrderPayments(db: Db, orderId: string, linksAvailable: boolean): Promise<OrderPayments> {
  const [order] = await db.select().from(orders).where(eq(orders.id, orderId))
  if (!order) throw new NotFound('No such order')
  const payments = await db.select().from(orderPayments).where(eq(orderPayments.orderId, orderId)).orderBy(asc(orderPayments.recordedAt))
  const links = await db.select().from(paymentLinks).where(eq(paymentLinks.orderId, orderId)).orderBy(asc(paymentLinks.createdAt))
  const paidCents = payments.reduce((s, p) => s + p.amountCents, 0)
  return {
    totalCents: order.totalCents,
    paidCents,
    dueCents: order.paymentStatus === 'pending' ? Math.max(0, order.totalCents - paidCents) : 0,
    currency: order.currency,
    paymentStatus: order.paymentStatus,
    payments: payments.map((p) => ({ id: p.id, method: p.method, amountCents: p.amountCents, reference: p.reference, recordedAt: p.recordedAt.toISOString(), recordedBy: p.recordedBy })),
    links: links.map((l) => ({ id: l.id, status: l.status, amountCents: l.amountCents, url: l.url, error: l.error, createdAt: l.createdAt.toISOString(), paidAt: l.paidAt?.toISOString() ?? null })),
    linksAvailable,
  }
}

/** A payment a planner took by phone, in cash or by bank transfer. More than is due is refused. */
export async function recordPayment(db: Db, orderId: string, input: RecordPayment, actor: SessionUser, audit: AuditContext) {
  await db.transaction(async (tx) => {
    const order = await lockOrder(tx, orderId)
    const refusal = refusePayment(order)
    if (refusal) throw refusal
    const due = order.totalCents - (await paidSoFar(tx, orderId))
    if (input.amountCents > due) {
      throw new Conflict(`Order ${order.number} has ${formatMoney(due, order.currency)} due; enter at most that`, { amountCents: `At most ${formatMoney(due, order.currency)}` })
    }
    await addPayment(tx, order, { orderId, method: input.method, amountCents: input.amountCents, reference: input.reference, recordedBy: actor.id }, actor)
    await recordAudit(
      tx,
      audit,
      {
        action: 'order.payment',
        entityType: 'order',
        entityId: orderId,
        summary: `Recorded ${formatMoney(input.amountCents, order.currency)} (${PAYMENT_METHOD_LABELS[input.method]}) for order ${order.number}`,
      },
    )
  })
}

/**
 * Sends the customer a link to pay what is due through the payment service. Exactly once: the link
 * is recorded as `creating` with its idempotency key before the service is called, and the call
 * carries the key, so a retry, a double click or a crash in between gets the same checkout back. An
 * open link for the same amount is sent again rather than replaced.
 */
export async function sendPaymentLink(deps: Pick<Deps, 'db' | 'jobs' | 'payments' | 'publicUrl' | 'tokens'>, orderId: string, actor: SessionUser, audit: AuditContext) {
  const { link, order, service } = await deps.db.transaction(async (tx) => {
    const order = await lockOrder(tx, orderId)
    const refusal = refusePayment(order)
    if (refusal) throw refusal
    const service = deps.payments
    if (!service) throw new Conflict('No payment service is set up (PAYMENT_SERVICE_KEY), so no link can be sent; record the payment by hand instead')
    const due = order.totalCents - (await paidSoFar(tx, orderId))
    const [existing] = await tx
      .select()
      .from(paymentLinks)
      .where(and(eq(paymentLinks.orderId, orderId), inArray(paymentLinks.status, ['creating', 'open']), eq(paymentLinks.amountCents, due)))
    if (existing) return { link: existing, order, service }
    const [created] = await tx.insert(paymentLinks).values({ orderId, idempotencyKey: randomUUID(), amountCents: due, createdBy: actor.id }).returning()
    return { link: created!, order, service }
  })

  let open: PaymentLinkRow = link
  if (link.status === 'creating') {
    try {
      const returnUrl = `${deps.publicUrl.replace(/\/+$/, '')}/api/pay/thanks`
      const checkout = await service.createCheckout(
        { orderId, orderNumber: order.number, amountCents: link.amountCents, currency: order.currency, customerEmail: order.customerEmail, returnUrl },
        link.idempotencyKey,
      )
      const [updated] = await deps.db.update(paymentLinks).set({ status: 'open', externalId: checkout.id, url: checkout.url, error: null }).where(eq(paymentLinks.id, link.id)).returning()
      open = updated!
    } catch (err) {
      const why = err instanceof Error ? err.message : String(err)
      await deps.db.update(paymentLinks).set({ error: why }).where(eq(paymentLinks.id, link.id))
      throw new HttpError(503, 'unavailable', `The payment service did not answer (${why}). Nothing was charged; try again, and the same link will be made.`)
    }
  }

  const pay = await payLinkUrl(deps.tokens, deps.publicUrl, open.id)
  const settings = await getShopSettings(deps.db)
  const amount = formatMoney(open.amountCents, order.currency)
  await deps.db.transaction(async (tx) => {
    await queueMail(tx, deps.jobs, {
      to: order.customerEmail,
      orderId,
      // One e-mail per link: sending the same open link again is a no-op here, a new amount is a new link.
      purpose: `payment_link:${open.id}`,
      subject: `Pay for your order ${order.number} (${amount})`,
      text:
        `Hello ${order.customerName},\n\nThank you for your order ${order.number}. You can pay ${amount} securely here:\n${pay}\n\n` +
        `We start on your order as soon as the payment comes through.\n\n${settings.shopName}\n`,
      html:
        `<p>Hello ${escapeHtml(order.customerName)},</p><p>Thank you for your order ${escapeHtml(order.number)}. You can pay ${amount} securely here:</p>` +
        `<p><a href="${pay}">Pay ${amount} for order ${escapeHtml(order.number)}</a></p>` +
        `<p>We start on your order as soon as the payment comes through.</p><p>${escapeHtml(settings.shopName)}</p>`,
    })
    await recordAudit(
      tx,
      audit,
      { action: 'order.payment_link', entityType: 'order', entityId: orderId, summary: `Sent a payment link for ${amount} to ${order.customerEmail} for order ${order.number}` },
    )
  })
  return open
}

function escapeHtml(s: string) {
  return s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`)
}

/** The address in the customer's e-mail: Kitwright's own, signed, so it can say "already paid" instead of sending them to pay twice. */
export async function payLinkUrl(tokens: TokenConfig, publicUrl: string, linkId: string): Promise<string> {
  const token = await new SignJWT({}).setProtectedHeader({ alg: 'HS256' }).setSubject(linkId).setAudience(AUDIENCE).setIssuedAt().sign(tokens.secret)
  return `${publicUrl.replace(/\/+$/, '')}/api/pay/${token}`
}

/** Where a customer's pay link leads: the checkout while it is open, or why there is nothing to pay. */
export async function resolvePayLink(db: Db, tokens: TokenConfig, token: string): Promise<{ redirect: string } | { message: string }> {
  let linkId: string
  try {
    const { payload } = await jwtVerify(token, tokens.secret, { algorithms: ['HS256'], audience: AUDIENCE })
    if (!payload.sub) throw new Error('no subject')
    linkId = payload.sub
  } catch (err) {
    throw new NotFound(`This payment link is not valid (${err instanceof Error ? err.message : 'unreadable'}). Copy the whole link from the e-mail, or ask the shop for a new one.`)
  }
  const [row] = await db.select({ link: paymentLinks, order: orders }).from(paymentLinks).innerJoin(orders, eq(orders.id, paymentLinks.orderId)).where(eq(paymentLinks.id, linkId))
  if (!row) throw new NotFound('This payment link is no longer valid; ask the shop for a new one.')
  if (row.order.paymentStatus === 'paid' || row.link.status === 'paid') return { message: `Order ${row.order.number} is paid. Thank you!` }
  if (row.order.status === 'cancelled') return { message: `Order ${row.order.number} was cancelled; there is nothing to pay.` }
  if (row.link.status !== 'open' || !row.link.url) return { message: 'This payment link is not ready; ask the shop to send it again.' }
  return { redirect: row.link.url }
}

/**
 * One signed event from the payment service, stored and applied in one transaction: a redelivered
 * event (same id) or a second event for the same payment changes nothing, and when applying fails
 * nothing is stored, so the service's own retry brings it again.
 */
export async function applyPaymentEvent(db: Db, event: PaymentEvent, payload: unknown): Promise<{ duplicate: boolean }> {
  return db.transaction(async (tx) => {
    const [stored] = await tx
      .insert(paymentEvents)
      .values({ eventId: event.id, type: event.type === 'other' ? event.name : event.type, payload })
      .onConflictDoNothing({ target: paymentEvents.eventId })
      .returning({ id: paymentEvents.id })
    if (!stored) return { duplicate: true }
    if (event.type !== 'checkout.paid') return { duplicate: false }

    const [link] = await tx.select().from(paymentLinks).where(eq(paymentLinks.externalId, event.checkoutId)).for('update')
    if (!link) return { duplicate: false } // a checkout Kitwright did not make (another app on the same account)
    if (link.status === 'paid') return { duplicate: true }
    await tx.update(paymentLinks).set({ status: 'paid', paidAt: new Date() }).where(eq(paymentLinks.id, link.id))
    const order = await lockOrder(tx, link.orderId)
    await addPayment(tx, order, { orderId: order.id, method: 'payment_link', amountCents: event.amountCents, reference: event.paymentId, externalId: event.paymentId }, null)
    return { duplicate: false }
  })
}
