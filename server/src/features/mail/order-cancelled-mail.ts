import { asc, eq } from 'drizzle-orm'
import type { Tx } from '../../db/client'
import { orderLines, orders } from '../../db/schema/index'
import type { Jobs } from '../../lib/jobs'
import { getShopSettings } from '../settings/settings.service'
import { queueMail } from './mail.service'
import { escapeHtml, firstNameOf, type MailContent } from './mail-words'

/** The outbox purpose of the cancellation e-mail (one per order). */
export const ORDER_CANCELLED = 'order_cancelled'

/**
 * The words of the cancellation e-mail: which order, what was in it, that nothing will ship, and that
 * any refund comes from the store where the customer paid (Kitwright takes no payments). The
 * planner's reason is an office note and stays out of the customer's e-mail.
 */
export function orderCancelledContent(input: {
  shopName: string
  customerName: string
  orderNumber: string
  lines: { description: string; sku: string; quantity: number }[]
}): MailContent {
  const firstName = firstNameOf(input.customerName)
  const subject = `${input.shopName}: your order ${input.orderNumber} is cancelled`
  const opening = `Your order ${input.orderNumber} is cancelled. Nothing of it will be made or shipped:`
  const refund = 'If you paid for it, the refund is made through the store where you ordered, in the way you paid.'
  const list = input.lines.map((l) => `  ${l.quantity} × ${l.description} (${l.sku})`)
  const text = [
    `Hello ${firstName},`,
    '',
    opening,
    '',
    ...list,
    '',
    refund,
    '',
    'If you did not ask for this, or want to order again, reply to this e-mail.',
    '',
    `The ${input.shopName} workshop`,
  ].join('\n')
  const items = input.lines.map((l) => `<li>${l.quantity} × ${escapeHtml(l.description)} <small>(${escapeHtml(l.sku)})</small></li>`).join('')
  const html = [
    `<p>Hello ${escapeHtml(firstName)},</p>`,
    `<p>Your order <strong>${escapeHtml(input.orderNumber)}</strong> is cancelled. Nothing of it will be made or shipped:</p>`,
    `<ul>${items}</ul>`,
    `<p>${escapeHtml(refund)}</p>`,
    '<p>If you did not ask for this, or want to order again, reply to this e-mail.</p>',
    `<p>The ${escapeHtml(input.shopName)} workshop</p>`,
  ].join('\n')
  return { subject, text, html }
}

/** Queues the cancellation e-mail to the order's customer (once per order) inside the caller's transaction. */
export async function queueOrderCancelledMail(tx: Tx, jobs: Jobs, orderId: string): Promise<string | null> {
  const [order] = await tx.select().from(orders).where(eq(orders.id, orderId))
  if (!order) throw new Error(`Order ${orderId} vanished before its e-mail was queued`)
  const lines = await tx.select().from(orderLines).where(eq(orderLines.orderId, orderId)).orderBy(asc(orderLines.lineNo))
  const { shopName } = await getShopSettings(tx)
  const content = orderCancelledContent({
    shopName,
    customerName: order.customerName,
    orderNumber: order.number,
    lines: lines.map((l) => ({ description: l.description, sku: l.sku, quantity: l.quantity })),
  })
  return queueMail(tx, jobs, { to: order.customerEmail, ...content, orderId, purpose: ORDER_CANCELLED })
}
