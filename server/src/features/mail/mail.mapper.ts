import type { MailMessage, MailSummary } from '@kitwright/shared/mail'
import type { MailMessageRow } from '../../db/schema/index'

export function toMailSummary(row: MailMessageRow, orderNumber: string | null): MailSummary {
  return {
    id: row.id,
    to: row.to,
    subject: row.subject,
    status: row.status,
    purpose: row.purpose,
    attempts: row.attempts,
    lastError: row.lastError,
    order: row.orderId && orderNumber ? { id: row.orderId, number: orderNumber } : null,
    createdAt: row.createdAt.toISOString(),
    sentAt: row.sentAt?.toISOString() ?? null,
  }
}

export function toMailMessage(row: MailMessageRow, orderNumber: string | null): MailMessage {
  return {
    ...toMailSummary(row, orderNumber),
    text: row.text,
    html: row.html,
    attachments: row.attachments.map((a) => ({ filename: a.filename, contentType: a.contentType, bytes: Buffer.byteLength(a.contentBase64, 'base64') })),
  }
}
