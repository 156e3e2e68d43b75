import { createServer as createHttpsServer } from 'node:https'
import { createApp } from './app'
import { paymentServiceFromEnv } from './features/payments/payment-service'
import { carrierFromEnv } from './features/shipping/easypost-carrier'
import { createDb } from './db/client'
import { readEnv } from './env'
import { createJobs } from './lib/jobs'
import { createLogger } from './lib/logger'
import { createStorage, storageConfigFromEnv } from './lib/storage'
import { startWorkers } from './workers'

const env = readEnv()
const payments = (() => {
  try {
    return paymentServiceFromEnv(process.env)
  } catch (err) {
    console.error(`Kitwright cannot start; fix these environment variables (see .env.example):\n  ${err instanceof Error ? err.message : err}`)
    process.exit(1)
  }
})()
const logger = createLogger(env.LOG_LEVEL)
const { db, pool } = createDb(env.DATABASE_URL)
const jobs = createJobs({ connectionString: env.DATABASE_URL, logger })
await jobs.start()
const mail = { smtpUrl: env.SMTP_URL, from: env.MAIL_FROM }
if (env.RUN_WORKERS === 'true') await startWorkers({ db, jobs, logger, mail })
const { app } = createApp({
  db,
  pool,
  logger,
  jobs,
  mail,
  storage: createStorage(storageConfigFromEnv(env)),
  storeWebhookSecret: env.STORE_WEBHOOK_SECRET,
  carrier: carrierFromEnv(process.env),
  payments,
  publicUrl: env.PUBLIC_URL,
  trustProxy: env.TRUST_PROXY,
  served: { listenHost: env.HOST, https: !!env.tls, caCertificate: env.tls?.caCertificate ?? null },
  tokens: {
    secret: new TextEncoder().encode(env.SESSION_SECRET),
    lifetimeSeconds: env.SESSION_MINUTES * 60,
    secureCookies: env.NODE_ENV === 'production',
  },
  clientDist: env.CLIENT_DIST,
})

// HTTPS when given a certificate (npm start -- --https makes a local one): tablet browsers allow the
// camera scanner only in a secure context. Behind a TLS-terminating proxy, serve HTTP and set TRUST_PROXY.
const server = env.tls ? createHttpsServer({ cert: env.tls.cert, key: env.tls.key }, app) : app
const listening = server.listen(env.PORT, env.HOST, () => {
  // Printed, not logged: the start script waits for this line whatever the log level.
  console.log(`Kitwright API listening on ${env.tls ? 'https' : 'http'}://${env.HOST}:${env.PORT} (public address ${env.PUBLIC_URL})`)
})

function shutdown() {
  // Running jobs get a few seconds to finish; an unfinished one is retried by the next process.
  listening.close(() => void jobs.stop().finally(() => pool.end().then(() => process.exit(0))))
  setTimeout(() => process.exit(0), 15_000).unref()
}
process.on('SIGINT', shutdown)
process.on('SIGTERM', shutdown)
