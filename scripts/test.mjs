// `npm test`: the same set-up as `npm start` (dependencies, PostgreSQL, stand-ins, Chromium), then
// the whole suite in one vitest run: unit, API over the real database, browser end-to-end.
// Extra arguments go to vitest, e.g. `npm test -- --project unit`.
import { existsSync, readdirSync, rmSync } from 'node:fs'
import path from 'node:path'
import { step } from './lib/log.mjs'
import { dataDir, ensureAptPackage, ensureNodeModules, root } from './lib/system.mjs'

ensureNodeModules()
ensureAptPackage('chromium', () => existsSync('/usr/bin/chromium'))
ensureAptPackage('poppler-utils', () => existsSync('/usr/bin/pdftoppm'))

const { startPostgres } = await import('./lib/postgres.mjs')
const { localPorts, bucket } = await import('./lib/config.mjs')
const { freePort } = await import('./lib/ports.mjs')
const { onCleanup, startChild, stopAll, stopOnSignals, tsxBin } = await import('./lib/processes.mjs')

stopOnSignals()
const pg = startPostgres(localPorts.postgres)
// Stopped at the end only when no other run (a second `npm test` beside this one) still has databases in it.
if (pg.startedHere) onCleanup(async () => ((await otherRunsUsing(pg.url('postgres'))) ? undefined : pg.stop()))

await dropDeadRuns(pg.url('postgres'))

// Every run gets its own databases, stand-in ports and folders, so two runs can share the cluster.
const runId = `r${process.pid}`
const testPorts = { s3: await freePort(), smtp: await freePort(), carrier: await freePort(), payments: await freePort() }
const testData = path.join(dataDir, 'test', runId)
const testDbBase = `kitwright_test_${runId}`
onCleanup(() => dropRunDatabases(pg.url('postgres'), testDbBase))
onCleanup(() => rmSync(testData, { recursive: true, force: true }))

step('starting the test S3, SMTP, carrier and payment stand-ins')
await startChild('storage-fake', tsxBin, ['storage-fake/index.ts'], {
  env: {
    FAKE_DATA_DIR: testData,
    FAKE_S3_PORT: String(testPorts.s3),
    FAKE_SMTP_PORT: String(testPorts.smtp),
    FAKE_CARRIER_PORT: String(testPorts.carrier),
    FAKE_PAYMENTS_PORT: String(testPorts.payments),
    S3_BUCKET: bucket,
  },
  readyWhen: /^ready$/,
  quiet: true,
})

step('running the test suite (vitest: unit, api, e2e)')
const vitest = await startChild('vitest', path.join(root, 'node_modules/.bin/vitest'), ['run', ...process.argv.slice(2)], {
  env: {
    // Each run recreates its databases from this name: <name>_template, one per test file, <name>_e2e.
    TEST_DATABASE_URL: pg.url(testDbBase),
    S3_ENDPOINT: `http://127.0.0.1:${testPorts.s3}`,
    S3_BUCKET: bucket,
    S3_ACCESS_KEY_ID: 'S3RVER',
    S3_SECRET_ACCESS_KEY: 'S3RVER',
    SMTP_URL: `smtp://127.0.0.1:${testPorts.smtp}`,
    CARRIER_API_URL: `http://127.0.0.1:${testPorts.carrier}/v2/`,
    CARRIER_API_KEY: 'test-stand-in',
    CARRIER_WEBHOOK_SECRET: 'kitwright-test-carrier-webhook-secret',
    FAKE_MAIL_DIR: path.join(testData, 'mail'),
    TEST_RUN_DIR: testData,
    NO_COLOR: '1',
  },
})
const code = await new Promise((resolve) => vitest.once('exit', (c) => resolve(c ?? 1)))
await stopAll(code)

/** Runs `fn` with a client on the cluster's admin database; a failure is reported with `what` and answered with `fallback`. */
async function withAdmin(adminUrl, what, fallback, fn) {
  const { default: pgModule } = await import('pg')
  const client = new pgModule.Client({ connectionString: adminUrl })
  try {
    await client.connect()
    return await fn(client)
  } catch (err) {
    console.error(`[kitwright] could not ${what}: ${err.message}`)
    return fallback
  } finally {
    await client.end().catch(() => {})
  }
}

/** Every run's databases are named kitwright_test_r<pid of its npm test>_…: the run is alive while that process is. */
async function runDatabases(client) {
  const { rows } = await client.query("select datname from pg_database where datname like 'kitwright_test_r%'")
  return rows.map(({ datname }) => ({ datname, pid: Number(/^kitwright_test_r(\d+)_/.exec(datname)?.[1]) }))
}
function isAlive(pid) {
  try {
    process.kill(pid, 0)
    return true
  } catch (err) {
    return err.code === 'EPERM'
  }
}

async function otherRunsUsing(adminUrl) {
  return withAdmin(adminUrl, 'tell whether other test runs use PostgreSQL', false, async (client) =>
    (await runDatabases(client)).some(({ pid }) => pid !== process.pid && isAlive(pid)),
  )
}

/** Databases and folders left by runs that were killed (no clean-up ran): they would keep the cluster running forever. */
async function dropDeadRuns(adminUrl) {
  await withAdmin(adminUrl, 'drop the databases of finished test runs', undefined, async (client) => {
    const dead = (await runDatabases(client)).filter(({ pid }) => pid !== process.pid && !isAlive(pid))
    for (const { datname } of dead) await client.query(`drop database if exists "${datname}" with (force)`)
  })
  const runsDir = path.join(dataDir, 'test')
  for (const name of existsSync(runsDir) ? readdirSync(runsDir) : []) {
    const pid = Number(/^r(\d+)$/.exec(name)?.[1])
    if (pid && pid !== process.pid && !isAlive(pid)) rmSync(path.join(runsDir, name), { recursive: true, force: true })
  }
}

async function dropRunDatabases(adminUrl, prefix) {
  await withAdmin(adminUrl, 'drop the test databases', undefined, async (client) => {
    const { rows } = await client.query('select datname from pg_database where datname like $1', [`${prefix}%`])
    for (const { datname } of rows) await client.query(`drop database if exists "${datname}" with (force)`)
  })
}
