// The job workers on their own, for a shop that runs the API with RUN_WORKERS=false:
//   DATABASE_URL=… SMTP_URL=… node_modules/.bin/tsx server/src/worker.ts
import { createDb } from './db/client'
import { readEnv } from './env'
import { createJobs } from './lib/jobs'
import { createLogger } from './lib/logger'
import { startWorkers } from './workers'

const env = readEnv()
const logger = createLogger(env.LOG_LEVEL)
const { db, pool } = createDb(env.DATABASE_URL)
const jobs = createJobs({ connectionString: env.DATABASE_URL, logger })
await jobs.start()
await startWorkers({ db, jobs, logger, mail: { smtpUrl: env.SMTP_URL, from: env.MAIL_FROM } })
console.log('Kitwright workers running')

let stopping = false
async function shutdown() {
  if (stopping) return
  stopping = true
  setTimeout(() => process.exit(0), 15_000).unref()
  await jobs.stop()
  await pool.end()
  process.exit(0)
}
process.on('SIGINT', () => void shutdown())
process.on('SIGTERM', () => void shutdown())
