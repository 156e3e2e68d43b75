import nodemailer, { type Transporter } from 'nodemailer'

const transports = new Map<string, Transporter>()

/** One SMTP transport per relay URL, made on first use; a real SMTP conversation, never a JSON stand-in. */
export function smtpTransport(smtpUrl: string | undefined): Transporter {
  if (!smtpUrl) throw new Error('SMTP_URL is not set: e-mail cannot be sent until it names an SMTP relay')
  let transport = transports.get(smtpUrl)
  if (!transport) {
    transport = nodemailer.createTransport({ url: smtpUrl, connectionTimeout: 10_000, greetingTimeout: 10_000, socketTimeout: 30_000 })
    transports.set(smtpUrl, transport)
  }
  return transport
}
