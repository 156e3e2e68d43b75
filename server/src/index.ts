import { createApp } from './app'
import { createDb } from './db/client'
import { readEnv } from './env'
import { createLogger } from './lib/logger'

const env = readEnv()
const logger = createLogger(env.LOG_LEVEL)
const { db, pool } = createDb(env.DATABASE_URL)
const { app } = createApp({
  db,
  pool,
  logger,
  tokens: {
    secret: new TextEncoder().encode(env.SESSION_SECRET),
    lifetimeSeconds: env.SESSION_MINUTES * 60,
    secureCookies: env.NODE_ENV === 'production',
  },
  clientDist: env.CLIENT_DIST,
})

const server = app.listen(env.PORT, env.HOST, () => {
  // Printed, not logged: the start script waits for this line whatever the log level.
  console.log(`Kitwright API listening on http://${env.HOST}:${env.PORT}`)
})

function shutdown() {
  server.close(() => void pool.end().then(() => process.exit(0)))
  setTimeout(() => process.exit(0), 5000).unref()
}
process.on('SIGINT', shutdown)
process.on('SIGTERM', shutdown)
