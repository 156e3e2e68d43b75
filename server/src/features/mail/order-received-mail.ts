import { asc, eq } from 'drizzle-orm'
import type { Tx } from '../../db/client'
import { orderLines, orders } from '../../db/schema/index'
import type { Jobs } from '../../lib/jobs'
import { getShopSettings } from '../settings/settings.service'
import { queueMail } from './mail.service'

function escapeHtml(text: string) {
  return text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!)
}

/** `2026-03-14` as `Saturday, March 14, 2026` (the date itself, read in UTC so it never shifts a day). */
function longDate(isoDate: string) {
  return new Date(`${isoDate}T00:00:00Z`).toLocaleDateString('en-US', { weekday: 'long', year: 'numeric', month: 'long', day: 'numeric', timeZone: 'UTC' })
}

export interface OrderReceivedContent {
  subject: string
  text: string
  html: string
}

/** The words of the "order received" e-mail: a thank-you, the order number, the kits, when it should ship. */
export function orderReceivedContent(input: {
  shopName: string
  customerName: string
  orderNumber: string
  promisedShipDate: string | null
  lines: { description: string; sku: string; quantity: number }[]
}): OrderReceivedContent {
  const firstName = input.customerName.split(/\s+/)[0] ?? input.customerName
  const when = input.promisedShipDate
    ? `We plan to ship it by ${longDate(input.promisedShipDate)}.`
    : 'We will write again as soon as it ships.'
  const subject = `${input.shopName}: we have your order ${input.orderNumber}`
  const list = input.lines.map((l) => `  ${l.quantity} × ${l.description} (${l.sku})`)
  const text = [
    `Hello ${firstName},`,
    '',
    `Thank you for your order ${input.orderNumber}. Your payment came through and the workshop has it on the list:`,
    '',
    ...list,
    '',
    `${when} Every kit is cut, assembled and leak-tested in the workshop before it is packed.`,
    '',
    'Reply to this e-mail if anything needs changing.',
    '',
    `The ${input.shopName} workshop`,
  ].join('\n')
  const items = input.lines.map((l) => `<li>${l.quantity} × ${escapeHtml(l.description)} <small>(${escapeHtml(l.sku)})</small></li>`).join('')
  const html = [
    `<p>Hello ${escapeHtml(firstName)},</p>`,
    `<p>Thank you for your order <strong>${escapeHtml(input.orderNumber)}</strong>. Your payment came through and the workshop has it on the list:</p>`,
    `<ul>${items}</ul>`,
    `<p>${escapeHtml(when)} Every kit is cut, assembled and leak-tested in the workshop before it is packed.</p>`,
    '<p>Reply to this e-mail if anything needs changing.</p>',
    `<p>The ${escapeHtml(input.shopName)} workshop</p>`,
  ].join('\n')
  return { subject, text, html }
}

/** Queues the "order received" e-mail to the order's customer (once per order) inside the caller's transaction. */
export async function queueOrderReceivedMail(tx: Tx, jobs: Jobs, orderId: string): Promise<string | null> {
  const [order] = await tx.select().from(orders).where(eq(orders.id, orderId))
  if (!order) throw new Error(`Order ${orderId} vanished before its e-mail was queued`)
  const lines = await tx.select().from(orderLines).where(eq(orderLines.orderId, orderId)).orderBy(asc(orderLines.lineNo))
  const { shopName } = await getShopSettings(tx)
  const content = orderReceivedContent({
    shopName,
    customerName: order.customerName,
    orderNumber: order.number,
    promisedShipDate: order.promisedShipDate,
    lines: lines.map((l) => ({ description: l.description, sku: l.sku, quantity: l.quantity })),
  })
  return queueMail(tx, jobs, { to: order.customerEmail, ...content, orderId, purpose: 'order_received' })
}
