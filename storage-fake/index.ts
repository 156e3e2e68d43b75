// Starts the local stand-ins for the services a real shop would rent: S3, an SMTP relay and a carrier.
// Prints "ready" once all listen; stops on SIGINT/SIGTERM.
import { readFileSync } from 'node:fs'
import path from 'node:path'
import { startCarrierFake } from './carrier'
import { startPaymentsFake } from './payments'
import { startS3Fake } from './s3'
import { startSmtpCatcher } from './smtp'

const dir = process.env.FAKE_DATA_DIR ?? path.resolve('.data')
const s3Port = Number(process.env.FAKE_S3_PORT ?? 54330)
const smtpPort = Number(process.env.FAKE_SMTP_PORT ?? 54325)
const carrierPort = Number(process.env.FAKE_CARRIER_PORT ?? 54331)
const bucket = process.env.S3_BUCKET ?? 'kitwright'
// LAN mode (npm start -- --lan): the S3 stand-in listens where tablets reach it, allows the app's
// origins, and speaks HTTPS when the app does.
const s3Host = process.env.FAKE_S3_HOST ?? '127.0.0.1'
const allowedOrigins = (process.env.FAKE_S3_ALLOWED_ORIGINS ?? '').split(',').filter(Boolean)
const tlsFiles = process.env.FAKE_S3_TLS_CERT_FILE && process.env.FAKE_S3_TLS_KEY_FILE ? {
  cert: readFileSync(process.env.FAKE_S3_TLS_CERT_FILE),
  key: readFileSync(process.env.FAKE_S3_TLS_KEY_FILE),
} : undefined

const s3 = await startS3Fake({ port: s3Port, directory: path.join(dir, 's3'), bucket, address: s3Host, allowedOrigins, tls: tlsFiles })
const smtp = await startSmtpCatcher({ port: smtpPort, directory: path.join(dir, 'mail') })
const payments = await startPaymentsFake({
  port: Number(process.env.FAKE_PAYMENTS_PORT ?? 54332),
  directory: path.join(dir, 'payments'),
  webhookSecret: process.env.FAKE_PAYMENTS_WEBHOOK_SECRET ?? 'local-payments-stand-in-secret',
  webhookUrls: process.env.FAKE_PAYMENTS_WEBHOOK_URL ? [process.env.FAKE_PAYMENTS_WEBHOOK_URL] : [],
})
const carrier = await startCarrierFake({ port: carrierPort, directory: path.join(dir, 'carrier') })
console.log(`[storage-fake] S3 on ${tlsFiles ? 'https' : 'http'}://${s3Host}:${s3Port} (bucket ${bucket}), SMTP on 127.0.0.1:${smtpPort}, carrier on ${carrier.url}, payments on ${payments.url}`)
console.log('ready')

async function stop() {
  await Promise.allSettled([s3.close(), smtp.close(), carrier.close(), payments.close()])
  process.exit(0)
}
process.on('SIGINT', () => void stop())
process.on('SIGTERM', () => void stop())
