// `npm start`: from a fresh clone to a running Kitwright. Each step is idempotent and logged.
//   --dev           Vite with hot reload + a watching API server instead of the built app
//   --only-migrate  set up the database and apply migrations, then stop
//   --only-seed     set up the database, migrate and load the demo data, then stop
import { existsSync, readFileSync, readdirSync, statSync } from 'node:fs'
import path from 'node:path'
import { step } from './lib/log.mjs'
import { ensureNodeModules, root, run, dataDir } from './lib/system.mjs'

const args = new Set(process.argv.slice(2))
const dev = args.has('--dev')

ensureNodeModules()
// Imported after the install, so a fresh clone can run this file with no node_modules.
const { startPostgres } = await import('./lib/postgres.mjs')
const { localPorts, bucket } = await import('./lib/config.mjs')
const { localSecret } = await import('./lib/secrets.mjs')
const { onCleanup, startChild, stopAll, stopOnSignals, tsxBin } = await import('./lib/processes.mjs')

stopOnSignals()
const pg = startPostgres(localPorts.postgres)
if (pg.startedHere) onCleanup(() => pg.stop())

const env = {
  DATABASE_URL: process.env.DATABASE_URL ?? pg.url('kitwright'),
  SESSION_SECRET: process.env.SESSION_SECRET ?? localSecret('session'),
  // The demo store (npm run demo:store) signs with the same file-kept secret.
  STORE_WEBHOOK_SECRET: process.env.STORE_WEBHOOK_SECRET ?? localSecret('store-webhook'),
  S3_ENDPOINT: process.env.S3_ENDPOINT ?? `http://127.0.0.1:${localPorts.s3}`,
  S3_BUCKET: bucket,
  S3_ACCESS_KEY_ID: process.env.S3_ACCESS_KEY_ID ?? 'S3RVER',
  S3_SECRET_ACCESS_KEY: process.env.S3_SECRET_ACCESS_KEY ?? 'S3RVER',
  SMTP_URL: process.env.SMTP_URL ?? `smtp://127.0.0.1:${localPorts.smtp}`,
  CARRIER_URL: process.env.CARRIER_URL ?? `http://127.0.0.1:${localPorts.carrier}`,
}

try {
  await startChild('db', tsxBin, ['scripts/setup-db.ts', ...(args.has('--only-migrate') ? ['migrate'] : [])], { env })
    .then((child) => new Promise((resolve, reject) => child.once('exit', (c) => (c === 0 ? resolve() : reject(new Error('database set-up failed'))))))
  if (args.has('--only-migrate') || args.has('--only-seed')) await stopAll(0)

  step('starting the local S3, SMTP and carrier stand-ins')
  await startChild('storage-fake', tsxBin, ['storage-fake/index.ts'], {
    env: { FAKE_DATA_DIR: dataDir, FAKE_S3_PORT: String(localPorts.s3), FAKE_SMTP_PORT: String(localPorts.smtp), FAKE_CARRIER_PORT: String(localPorts.carrier), S3_BUCKET: bucket },
    readyWhen: /^ready$/,
  })

  if (dev) {
    step('starting the API (watching) and Vite with hot reload')
    await startChild('api', tsxBin, ['watch', 'server/src/index.ts'], {
      env: { ...env, PORT: String(localPorts.api), LOG_LEVEL: 'warn' },
      readyWhen: /listening on/,
    })
    await startChild('vite', path.join(root, 'node_modules/.bin/vite'), ['client', '--port', String(localPorts.app), '--strictPort'], {
      env: { KITWRIGHT_API: `http://127.0.0.1:${localPorts.api}` },
      readyWhen: /Local:/,
    })
  } else {
    buildClientIfStale()
    await startChild('api', tsxBin, ['server/src/index.ts'], {
      env: { ...env, PORT: String(localPorts.app), NODE_ENV: 'production', CLIENT_DIST: path.join(root, 'client/dist'), LOG_LEVEL: 'warn' },
      readyWhen: /listening on/,
    })
  }
  printWelcome()
} catch (err) {
  console.error(`[kitwright] ${err instanceof Error ? err.message : err}`)
  await stopAll(1)
}

function newestMtime(dir) {
  let newest = 0
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    if (entry.name === 'node_modules' || entry.name === 'dist') continue
    const full = path.join(dir, entry.name)
    newest = Math.max(newest, entry.isDirectory() ? newestMtime(full) : statSync(full).mtimeMs)
  }
  return newest
}

function buildClientIfStale() {
  const built = path.join(root, 'client/dist/index.html')
  const sources = Math.max(newestMtime(path.join(root, 'client')), newestMtime(path.join(root, 'shared/src')))
  if (existsSync(built) && statSync(built).mtimeMs > sources) return
  step('building the client (vite build)')
  run('npm', ['run', 'build', '--silent'])
}

function printWelcome() {
  const users = JSON.parse(readFileSync(path.join(root, 'server/src/db/demo-users.json'), 'utf8'))
  const rows = users.map((u) => `  ${u.role.padEnd(10)} ${u.email.padEnd(28)} ${u.password.padEnd(20)} ${u.pin ?? ''}`)
  console.log(`
Kitwright is running at http://localhost:${localPorts.app}

Demo sign-ins (invented shop: Mistwell Tote Works)
  ${'role'.padEnd(10)} ${'email'.padEnd(28)} ${'password'.padEnd(20)} bench PIN
${rows.join('\n')}

Press Ctrl-C to stop Kitwright, PostgreSQL and the stand-ins.`)
}
