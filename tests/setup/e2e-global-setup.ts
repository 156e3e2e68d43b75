import { spawn, spawnSync, type ChildProcess } from 'node:child_process'
import { createServer } from 'node:net'
import path from 'node:path'
import type { TestProject } from 'vitest/node'
import { createDb } from '../../server/src/db/client'
import { ensureDatabase } from '../../server/src/db/ensure-database'
import { migrateDb } from '../../server/src/db/migrate'
import { seedDemo } from '../../server/src/seeds/demo'
import { testDatabaseUrl } from '../support/env'

const root = path.resolve(import.meta.dirname, '../..')

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = createServer()
    srv.listen(0, '127.0.0.1', () => {
      const addr = srv.address()
      srv.close(() => (typeof addr === 'object' && addr ? resolve(addr.port) : reject(new Error('no port'))))
    })
  })
}

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string
  }
}

/**
 * The browser tests run against the product as a shop runs it: a freshly built client served by a
 * real API process over its own database with the demo data loaded.
 */
export default async function setup(project: TestProject) {
  const url = testDatabaseUrl('e2e')
  await ensureDatabase(url, { recreate: true })
  const { db, pool } = createDb(url)
  try {
    await migrateDb(db)
    await seedDemo(db)
  } finally {
    await pool.end()
  }
  // Built into this run's own folder, so two test runs never overwrite each other's client.
  const clientDist = path.join(process.env.TEST_RUN_DIR ?? path.join(root, '.data/test/manual'), 'client-dist')
  const build = spawnSync(path.join(root, 'node_modules/.bin/vite'), ['build', '--outDir', clientDist, '--emptyOutDir', '--logLevel', 'warn'], {
    cwd: path.join(root, 'client'),
    encoding: 'utf8',
  })
  if (build.status !== 0) throw new Error(`client build failed:\n${build.stdout}${build.stderr}`)

  const port = await freePort()
  const server: ChildProcess = spawn(path.join(root, 'node_modules/.bin/tsx'), ['server/src/index.ts'], {
    cwd: root,
    env: {
      ...process.env,
      DATABASE_URL: url,
      PORT: String(port),
      SESSION_SECRET: 'kitwright-e2e-secret-0123456789abcdef',
      CLIENT_DIST: clientDist,
      LOG_LEVEL: 'warn',
      NODE_ENV: 'test',
    },
    stdio: ['ignore', 'pipe', 'inherit'],
  })
  await new Promise<void>((resolve, reject) => {
    server.stdout!.on('data', (d: Buffer) => {
      if (d.toString().includes('listening on')) resolve()
    })
    server.once('exit', (code) => reject(new Error(`API exited early (${code})`)))
  })
  project.provide('baseUrl', `http://127.0.0.1:${port}`)
  return async () => {
    server.kill('SIGTERM')
    await new Promise((r) => server.once('exit', r))
  }
}
