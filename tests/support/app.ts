import request from 'supertest'
import type { Role } from '@kitwright/shared/roles'
import { createApp } from '../../server/src/app'
import { carrierFromEnv } from '../../server/src/features/shipping/easypost-carrier'
import type { Deps } from '../../server/src/deps'
import { createJobs } from '../../server/src/lib/jobs'
import { createLogger } from '../../server/src/lib/logger'
import { createStorage, type StorageConfig } from '../../server/src/lib/storage'
import type { TestDb } from './test-db'
import { insertUser, TEST_PASSWORD } from './factories'

export const TEST_TOKENS: Deps['tokens'] = {
  secret: new TextEncoder().encode('kitwright-test-secret-0123456789abcdef'),
  lifetimeSeconds: 30 * 60,
  secureCookies: false,
}

/** The secret the tests' web store signs its webhook deliveries with. */
export const TEST_STORE_SECRET = 'kitwright-test-store-secret-0123456789abcdef'

/**
 * The app over a test database. Its job queue shares the database's pool and starts on first use
 * (most files never enqueue anything); `t.drop()` stops it. Workers run only where a test starts
 * them (`startWorkers(built.deps)`).
 */
export function buildApp(
  t: Pick<TestDb, 'db' | 'pool'> & Partial<Pick<TestDb, 'onDrop'>>,
  options: { logger?: Deps['logger']; storage?: StorageConfig; payments?: Deps['payments']; now?: Deps['now'] } = {},
) {
  const logger = options.logger ?? createLogger('silent')
  const jobs = createJobs({ pool: t.pool, logger, maintenance: false, retryDelaySeconds: 1, pollingIntervalSeconds: 0.5, stopTimeoutMs: 1000 })
  t.onDrop?.(() => jobs.stop())
  const deps: Deps = {
    db: t.db,
    pool: t.pool,
    logger,
    tokens: TEST_TOKENS,
    jobs,
    mail: { smtpUrl: process.env.SMTP_URL, from: 'orders@kitwright-test.example' },
    storeWebhookSecret: TEST_STORE_SECRET,
    // The run's carrier stand-in (started by `npm test`).
    carrier: carrierFromEnv(process.env),
    publicUrl: 'http://localhost:3000',
    payments: options.payments ?? null,
    now: options.now,
    storage: createStorage(options.storage ?? testStorageConfig()),
  }
  return { ...createApp(deps), deps }
}

/** The run's S3 stand-in (s3rver, started by `npm test`). */
export function testStorageConfig(): StorageConfig {
  const { S3_ENDPOINT, S3_BUCKET, S3_ACCESS_KEY_ID, S3_SECRET_ACCESS_KEY } = process.env
  if (!S3_ENDPOINT || !S3_BUCKET || !S3_ACCESS_KEY_ID || !S3_SECRET_ACCESS_KEY)
    throw new Error('S3_* is not set: run the suite with `npm test`, which starts the S3 stand-in')
  return { endpoint: S3_ENDPOINT, bucket: S3_BUCKET, accessKeyId: S3_ACCESS_KEY_ID, secretAccessKey: S3_SECRET_ACCESS_KEY, region: 'us-east-1' }
}

/** A supertest agent that keeps cookies, signed in as a new user of `role`. */
export async function signedInAs(app: ReturnType<typeof buildApp>['app'], t: TestDb, role: Role) {
  const user = await insertUser(t.db, { role })
  const agent = request.agent(app)
  const res = await agent.post('/api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD })
  if (res.status !== 200) throw new Error(`sign-in as ${role} failed: ${res.status} ${JSON.stringify(res.body)}`)
  return { agent, user }
}
