import { createServer } from 'node:net'
import path from 'node:path'
import { createDb } from '../../server/src/db/client'
import { ensureDatabase } from '../../server/src/db/ensure-database'
import { migrateDb } from '../../server/src/db/migrate'
import { seedDemo } from '../../server/src/seeds/demo'
import { startS3Fake } from '../../storage-fake/s3'
import { startSmtpCatcher } from '../../storage-fake/smtp'

// Throwaway services for the fault tests: their own PostgreSQL cluster, S3 stand-in and SMTP catcher,
// on free ports under this run's folder, so stopping them never disturbs any other test.

/** The private cluster of scripts/lib/postgres.mjs (plain JavaScript: it runs before `npm ci`). */
interface PostgresCluster {
  url(db: string): string
  stop(): void
  remove(): void
}
// @ts-expect-error plain JavaScript module of the start-up scripts, without type declarations
const { startPostgres } = (await import('../../scripts/lib/postgres.mjs')) as { startPostgres: (port: number, options: { dir: string }) => PostgresCluster }

const root = path.resolve(import.meta.dirname, '../..')
/** This run's folder (`npm test` sets TEST_RUN_DIR; it removes it at the end). */
export const runDir = process.env.TEST_RUN_DIR ?? path.join(root, '.data/test/manual')

export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = createServer()
    srv.once('error', reject)
    srv.listen(0, '127.0.0.1', () => {
      const addr = srv.address()
      srv.close(() => (typeof addr === 'object' && addr ? resolve(addr.port) : reject(new Error('no free port'))))
    })
  })
}

/** A private PostgreSQL cluster under <run>/faults-pg/<name>, with one migrated database holding the demo shop. */
export async function privatePostgres(name: string) {
  const dir = path.join(runDir, 'faults-pg', name)
  const port = await freePort()
  let cluster: PostgresCluster = startPostgres(port, { dir })
  const url = cluster.url('kitwright_faults')
  await ensureDatabase(url, { recreate: true })
  const seeding = createDb(url)
  try {
    await migrateDb(seeding.db)
    await seedDemo(seeding.db)
  } finally {
    await seeding.pool.end()
  }
  return {
    url,
    port,
    /** Fast shutdown: every connection is cut, as when the database host goes away. */
    stop: () => cluster.stop(),
    start: () => {
      cluster = startPostgres(port, { dir })
    },
    destroy: () => cluster.remove(),
  }
}

/** The S3 stand-in on a fixed free port, so it comes back where the app expects it; its files survive a restart. */
export async function privateS3(name: string) {
  const port = await freePort()
  const directory = path.join(runDir, 'faults-s3', name)
  const bucket = 'kitwright-faults'
  let server: { close(): Promise<unknown> } | null = await startS3Fake({ port, directory, bucket })
  return {
    config: { endpoint: `http://127.0.0.1:${port}`, bucket, accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER', region: 'us-east-1' },
    async stop() {
      await server?.close()
      server = null
    },
    async start() {
      server = await startS3Fake({ port, directory, bucket })
    },
  }
}

/** The SMTP catcher on a fixed free port, writing each message as an .eml file into its own folder. */
export async function privateSmtp(name: string) {
  const port = await freePort()
  const directory = path.join(runDir, 'faults-mail', name)
  let server: { close(): Promise<void> } | null = await startSmtpCatcher({ port, directory })
  return {
    url: `smtp://127.0.0.1:${port}`,
    directory,
    async stop() {
      await server?.close()
      server = null
    },
    async start() {
      server = await startSmtpCatcher({ port, directory })
    },
  }
}

/** Milliseconds since `start`, to one decimal of a second, for the printed figures. */
export const seconds = (ms: number) => `${(ms / 1000).toFixed(2)} s`
