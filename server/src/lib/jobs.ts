import { sql, type SQL } from 'drizzle-orm'
import PgBoss from 'pg-boss'
import type pg from 'pg'
import type { Tx } from '../db/client'
import type { Logger } from './logger'

/** Every queue Kitwright runs and the data its jobs carry: ids only, the rows hold the rest. */
export interface JobData {
  'store-event': { storeEventId: string }
  'send-mail': { mailId: string }
}
export type JobName = keyof JobData
const JOB_NAMES: readonly JobName[] = ['store-event', 'send-mail']

/** What a handler knows of its job besides the data: how often it has been tried already. */
export interface JobContext {
  id: string
  retryCount: number
  retryLimit: number
}
export type JobHandler<N extends JobName> = (data: JobData[N], job: JobContext) => Promise<void>

export interface SendOptions {
  /** At most one waiting job per key (the store's event id, a mail id). */
  singletonKey?: string
  /** Enqueue inside this transaction: the job exists exactly when the caller's rows do. */
  tx?: Tx
}

export interface Jobs {
  /** Installs or checks the `pgboss` schema and creates the queues; idempotent. */
  start(): Promise<void>
  send<N extends JobName>(name: N, data: JobData[N], options?: SendOptions): Promise<string | null>
  /** Runs `handler` for each job of `name` in this process; a throw fails the job and pg-boss retries it. */
  work<N extends JobName>(name: N, handler: JobHandler<N>): Promise<void>
  /** Stops polling, waits for running jobs (up to a few seconds) and closes the queue's own connections. */
  stop(): Promise<void>
}

export interface JobsOptions {
  /** Its own small pool over this URL (production), or… */
  connectionString?: string
  /** …the app's pool (tests: no extra connections, nothing to open). */
  pool?: pg.Pool
  logger: Logger
  /** Attempts after the first; each waits about twice as long as the one before. */
  retryLimit?: number
  retryDelaySeconds?: number
  pollingIntervalSeconds?: number
  /** Jobs of one queue this process runs at once. */
  workersPerQueue?: number
  /** Archive and expiry sweeps; off in tests, where nothing lives long enough to need them. */
  maintenance?: boolean
  stopTimeoutMs?: number
}

/** pg-boss's SQL ($1, $2 …) run inside a Drizzle transaction, so a job commits or rolls back with it. */
function inTransaction(tx: Tx): PgBoss.Db {
  return {
    async executeSql(text: string, values: unknown[]) {
      const pieces = text.split(/\$(\d+)/)
      const chunks: SQL[] = pieces.map((piece, i) => {
        if (i % 2 === 0) return sql.raw(piece)
        const value = values[Number(piece) - 1] ?? null
        // node-postgres would turn a plain object into JSON; Drizzle's params go through as they are.
        const param = value !== null && typeof value === 'object' && !(value instanceof Date) ? JSON.stringify(value) : value
        return sql`${param}`
      })
      const result = await tx.execute(sql.join(chunks))
      return { rows: result.rows }
    },
  }
}

// PostgreSQL's codes for a deadlock, a serialization failure and a unique clash: what two API
// processes starting at the same moment and creating the same queues run into.
const RACE_CODES = new Set(['40P01', '40001', '23505'])

/**
 * Runs `work` again (up to 5 times, after a short random wait) when it lost a race with another
 * process doing the same; creating a queue that now exists is then a no-op.
 */
async function retryWhenRacing<T>(work: () => Promise<T>): Promise<T> {
  for (let attempt = 1; ; attempt++) {
    try {
      return await work()
    } catch (err) {
      const code = (err as { code?: unknown }).code
      if (attempt >= 5 || typeof code !== 'string' || !RACE_CODES.has(code)) throw err
      await new Promise((r) => setTimeout(r, 50 + Math.random() * 200 * attempt))
    }
  }
}

/**
 * The job queue: pg-boss over Kitwright's own PostgreSQL, in its schema `pgboss`. Sending starts it
 * if nobody has yet, so a process that only enqueues needs no extra start-up step.
 */
export function createJobs(options: JobsOptions): Jobs {
  const { logger } = options
  const boss = new PgBoss({
    ...(options.pool
      ? { db: { executeSql: (text: string, values: unknown[]) => options.pool!.query(text, values) } }
      : { connectionString: options.connectionString, max: 4 }),
    schema: 'pgboss',
    application_name: 'kitwright-jobs',
    supervise: options.maintenance ?? true,
    schedule: false,
  })
  boss.on('error', (err) => logger.error({ err }, 'job queue error'))
  let starting: Promise<void> | null = null

  function start() {
    starting ??= (async () => {
      await boss.start()
      for (const name of JOB_NAMES) {
        await retryWhenRacing(() =>
          boss.createQueue(name, {
            name,
            retryLimit: options.retryLimit ?? 5,
            retryDelay: options.retryDelaySeconds ?? 10,
            retryBackoff: true,
            expireInSeconds: 5 * 60,
          }),
        )
      }
    })()
    // A failed start may be tried again by the next caller rather than failing it for good.
    starting.catch(() => (starting = null))
    return starting
  }

  return {
    start,
    async send(name, data, sendOptions = {}) {
      await start()
      return boss.send(name, data, {
        ...(sendOptions.singletonKey ? { singletonKey: sendOptions.singletonKey } : {}),
        ...(sendOptions.tx ? { db: inTransaction(sendOptions.tx) } : {}),
      })
    },
    async work(name, handler) {
      await start()
      const pollingIntervalSeconds = options.pollingIntervalSeconds ?? 2
      for (let n = 0; n < (options.workersPerQueue ?? 2); n++) {
        let workerId = ''
        workerId = await boss.work<JobData[typeof name]>(name, { includeMetadata: true, batchSize: 1, pollingIntervalSeconds }, async (jobs) => {
          try {
            for (const job of jobs) {
              try {
                await handler(job.data, { id: job.id, retryCount: job.retryCount, retryLimit: job.retryLimit })
              } catch (err) {
                logger.warn({ err, job: job.id, queue: name, attempt: job.retryCount + 1 }, 'job failed; the queue retries it')
                throw err
              }
            }
          } finally {
            // pg-boss waits a polling interval after every fetch; while there is work, fetch again at once.
            if (jobs.length > 0) boss.notifyWorker(workerId)
          }
        })
      }
    },
    async stop() {
      if (!starting) return
      // A start that failed has nothing to stop; say why it failed rather than drop it.
      await starting.catch((err: unknown) => logger.warn({ err }, 'the job queue never started; nothing to stop'))
      await boss.stop({ graceful: true, timeout: options.stopTimeoutMs ?? 10_000, wait: true })
      starting = null
    },
  }
}
