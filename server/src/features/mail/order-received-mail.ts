import { and, asc, eq } from 'drizzle-orm'
import { formatDayWithWeekday } from '@kitwright/shared/dates'
import type { OrderStatus, PaymentStatus } from '@kitwright/shared/orders'
import type { Tx } from '../../db/client'
import { mailMessages, orderLines, orders, type OrderRow } from '../../db/schema/index'
import type { Jobs } from '../../lib/jobs'
import { getShopSettings } from '../settings/settings.service'
import { queueMail } from './mail.service'
import { escapeHtml, firstNameOf, type MailContent } from './mail-words'

/** The outbox purpose of the "order received" e-mail (one per order). */
export const ORDER_RECEIVED = 'order_received'

/** Where the order stands when the e-mail is written: it promises a ship date only when paid and open. */
export interface OrderStanding {
  status: OrderStatus
  paymentStatus: PaymentStatus
  onHold: boolean
  promisedShipDate: string | null
}

/** What the customer is told happens next, in one or two sentences; a date only for a paid, open order. */
export function whatHappensNext(s: OrderStanding): { said: string; promisesDate: boolean } {
  if (s.status === 'cancelled') return { said: 'This order has since been cancelled, so nothing will be made or shipped; we are sending you a separate e-mail about it.', promisesDate: false }
  if (s.status === 'shipped' || s.status === 'partially_shipped') return { said: 'It is already on its way; the shipping e-mail has the tracking number.', promisesDate: false }
  if (s.paymentStatus !== 'paid') return { said: 'We start on it as soon as the payment comes through, and write again with a ship date then.', promisesDate: false }
  if (s.onHold) return { said: 'We are checking a detail of the order before it goes to the workshop; we will write again as soon as it is on its way.', promisesDate: false }
  if (s.promisedShipDate) return { said: `We plan to ship it by ${formatDayWithWeekday(s.promisedShipDate)}.`, promisesDate: true }
  return { said: 'We will write again as soon as it ships.', promisesDate: false }
}

/** The words of the "order received" e-mail: a thank-you, the order number, the kits, what happens next. */
export function orderReceivedContent(input: {
  shopName: string
  customerName: string
  orderNumber: string
  standing: OrderStanding
  lines: { description: string; sku: string; quantity: number }[]
}): MailContent {
  const firstName = firstNameOf(input.customerName)
  const next = whatHappensNext(input.standing)
  const paid = input.standing.paymentStatus === 'paid'
  const opening = `Thank you for your order ${input.orderNumber}. ${paid ? 'Your payment came through and the workshop has it on the list' : 'The workshop has it on the list'}:`
  const workshop = next.promisesDate || (input.standing.status !== 'cancelled' && paid) ? ' Every kit is cut, assembled and leak-tested in the workshop before it is packed.' : ''
  const subject = `${input.shopName}: we have your order ${input.orderNumber}`
  const list = input.lines.map((l) => `  ${l.quantity} × ${l.description} (${l.sku})`)
  const text = [`Hello ${firstName},`, '', opening, '', ...list, '', `${next.said}${workshop}`, '', 'Reply to this e-mail if anything needs changing.', '', `The ${input.shopName} workshop`].join('\n')
  const items = input.lines.map((l) => `<li>${l.quantity} × ${escapeHtml(l.description)} <small>(${escapeHtml(l.sku)})</small></li>`).join('')
  const html = [
    `<p>Hello ${escapeHtml(firstName)},</p>`,
    `<p>${escapeHtml(opening).replace(escapeHtml(input.orderNumber), `<strong>${escapeHtml(input.orderNumber)}</strong>`)}</p>`,
    `<ul>${items}</ul>`,
    `<p>${escapeHtml(`${next.said}${workshop}`)}</p>`,
    '<p>Reply to this e-mail if anything needs changing.</p>',
    `<p>The ${escapeHtml(input.shopName)} workshop</p>`,
  ].join('\n')
  return { subject, text, html }
}

async function contentFor(tx: Tx, order: OrderRow): Promise<MailContent> {
  const lines = await tx.select().from(orderLines).where(eq(orderLines.orderId, order.id)).orderBy(asc(orderLines.lineNo))
  const { shopName } = await getShopSettings(tx)
  return orderReceivedContent({
    shopName,
    customerName: order.customerName,
    orderNumber: order.number,
    standing: { status: order.status, paymentStatus: order.paymentStatus, onHold: order.heldAt !== null, promisedShipDate: order.promisedShipDate },
    lines: lines.map((l) => ({ description: l.description, sku: l.sku, quantity: l.quantity })),
  })
}

/** Queues the "order received" e-mail to the order's customer (once per order) inside the caller's transaction. */
export async function queueOrderReceivedMail(tx: Tx, jobs: Jobs, orderId: string): Promise<string | null> {
  const [order] = await tx.select().from(orders).where(eq(orders.id, orderId))
  if (!order) throw new Error(`Order ${orderId} vanished before its e-mail was queued`)
  return queueMail(tx, jobs, { to: order.customerEmail, ...(await contentFor(tx, order)), orderId, purpose: ORDER_RECEIVED })
}

/**
 * Rewrites the order's "order received" e-mail while it still waits in the outbox, after the order
 * was cancelled, put on hold or taken off hold, so it never promises a date the order no longer
 * has. A message being sent holds its row lock; once sent it is left as it went out.
 */
export async function refreshOrderReceivedMail(tx: Tx, orderId: string): Promise<void> {
  const [order] = await tx.select().from(orders).where(eq(orders.id, orderId))
  if (!order) return
  const content = await contentFor(tx, order)
  await tx
    .update(mailMessages)
    .set({ subject: content.subject, text: content.text, html: content.html })
    .where(and(eq(mailMessages.orderId, orderId), eq(mailMessages.purpose, ORDER_RECEIVED), eq(mailMessages.status, 'queued')))
}
