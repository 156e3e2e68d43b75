// `npm start`: from a fresh clone to a running Kitwright. Each step is idempotent and logged.
//   --dev           Vite with hot reload + a watching API server instead of the built app
//   --only-migrate  set up the database and apply migrations, then stop
//   --only-seed     set up the database, migrate and load the demo data, then stop
//   --lan           serve on the shop network (0.0.0.0) so tablets reach it; prints every address
//   --https         serve HTTPS with a local certificate authority made in .data/tls/ (or KITWRIGHT_HTTPS=1)
import { existsSync, readFileSync, readdirSync, statSync } from 'node:fs'
import path from 'node:path'
import { step } from './lib/log.mjs'
import { ensureNodeModules, root, run, dataDir } from './lib/system.mjs'

const args = new Set(process.argv.slice(2))
const dev = args.has('--dev')
const lan = args.has('--lan')
const https = args.has('--https') || ['1', 'true'].includes(process.env.KITWRIGHT_HTTPS ?? '')

ensureNodeModules()
// Imported after the install, so a fresh clone can run this file with no node_modules.
const { startPostgres } = await import('./lib/postgres.mjs')
const { localPorts, bucket } = await import('./lib/config.mjs')
const { localSecret } = await import('./lib/secrets.mjs')
const { onCleanup, startChild, stopAll, stopOnSignals, tsxBin } = await import('./lib/processes.mjs')
const { servingPlan } = await import('./lib/network.mjs')
const { fail } = await import('./lib/log.mjs')

if (dev && https) fail('--https serves the built app; run it without --dev (Vite\'s dev server has no certificate)')
let served
try {
  served = servingPlan({ lan, https, appPort: localPorts.app, s3Port: localPorts.s3 })
} catch (err) {
  fail(err.message)
}
// The local authority and the server certificate for every name and address tablets may use.
let tls = null
if (https) {
  const { ensureLocalCertificates } = await import('./lib/tls.mjs')
  tls = ensureLocalCertificates(path.join(dataDir, 'tls'), served.certHosts)
  if (tls.createdCa) step(`made a local certificate authority: ${path.relative(root, tls.caFile)} (tablets trust it once; "Connect a tablet" offers it)`)
  if (tls.issued) step(`issued the server certificate for ${served.certHosts.join(', ')}`)
}
// The stand-in photo store, unless a real one is configured: HTTPS when the app is, so pages may upload to it.
const localS3 = !process.env.S3_ENDPOINT

stopOnSignals()
const pg = startPostgres(localPorts.postgres)
if (pg.startedHere) onCleanup(() => pg.stop())

const env = {
  DATABASE_URL: process.env.DATABASE_URL ?? pg.url('kitwright'),
  SESSION_SECRET: process.env.SESSION_SECRET ?? localSecret('session'),
  // The demo store (npm run demo:store) signs with the same file-kept secret.
  STORE_WEBHOOK_SECRET: process.env.STORE_WEBHOOK_SECRET ?? localSecret('store-webhook'),
  S3_ENDPOINT: process.env.S3_ENDPOINT ?? `${tls ? 'https' : 'http'}://127.0.0.1:${localPorts.s3}`,
  // What browsers use for photos; in LAN mode the stand-in's address on the shop network.
  ...(served.s3PublicUrl && (localS3 || process.env.S3_PUBLIC_URL) ? { S3_PUBLIC_URL: served.s3PublicUrl } : {}),
  S3_BUCKET: bucket,
  S3_ACCESS_KEY_ID: process.env.S3_ACCESS_KEY_ID ?? 'S3RVER',
  S3_SECRET_ACCESS_KEY: process.env.S3_SECRET_ACCESS_KEY ?? 'S3RVER',
  SMTP_URL: process.env.SMTP_URL ?? `smtp://127.0.0.1:${localPorts.smtp}`,
  // The carrier's shipping API through its SDK, pointed at the local stand-in unless a real account is given.
  CARRIER_API_URL: process.env.CARRIER_API_KEY ? (process.env.CARRIER_API_URL ?? '') : `http://127.0.0.1:${localPorts.carrier}/v2/`,
  CARRIER_API_KEY: process.env.CARRIER_API_KEY ?? 'local-stand-in',
  CARRIER_WEBHOOK_SECRET: process.env.CARRIER_WEBHOOK_SECRET ?? localSecret('carrier-webhook'),
  // Phone orders' payment links through the payment service's SDK, pointed at the local stand-in unless a real key is given.
  ...(process.env.PAYMENT_SERVICE_KEY
    ? {}
    : { PAYMENT_SERVICE_KEY: 'sk_test_kitwright_local', PAYMENT_SERVICE_URL: `http://127.0.0.1:${localPorts.payments}`, PAYMENT_WEBHOOK_SECRET: localSecret('payment-webhook') }),
}
// Where the payment stand-in posts its signed events: the API as this machine reaches it.
const apiOrigin = `${tls ? 'https' : 'http'}://127.0.0.1:${dev ? localPorts.api : localPorts.app}`

try {
  await startChild('db', tsxBin, ['scripts/setup-db.ts', ...(args.has('--only-migrate') ? ['migrate'] : [])], { env })
    .then((child) => new Promise((resolve, reject) => child.once('exit', (c) => (c === 0 ? resolve() : reject(new Error('database set-up failed'))))))
  if (args.has('--only-migrate') || args.has('--only-seed')) await stopAll(0)

  step('starting the local S3, SMTP, carrier and payment stand-ins')
  await startChild('storage-fake', tsxBin, ['storage-fake/index.ts'], {
    env: {
      FAKE_DATA_DIR: dataDir,
      FAKE_S3_PORT: String(localPorts.s3),
      FAKE_SMTP_PORT: String(localPorts.smtp),
      FAKE_CARRIER_PORT: String(localPorts.carrier),
      FAKE_PAYMENTS_PORT: String(localPorts.payments),
      FAKE_PAYMENTS_WEBHOOK_URL: `${apiOrigin}/api/webhooks/payments`,
      FAKE_PAYMENTS_WEBHOOK_SECRET: env.PAYMENT_WEBHOOK_SECRET ?? localSecret('payment-webhook'),
      ...(tls ? { NODE_EXTRA_CA_CERTS: tls.caFile } : {}),
      S3_BUCKET: bucket,
      FAKE_S3_HOST: served.s3Host,
      FAKE_S3_ALLOWED_ORIGINS: served.allowedOrigins.join(','),
      ...(tls ? { FAKE_S3_TLS_CERT_FILE: tls.certFile, FAKE_S3_TLS_KEY_FILE: tls.keyFile } : {}),
    },
    readyWhen: /^ready$/,
  })

  if (dev) {
    step('starting the API (watching) and Vite with hot reload')
    await startChild('api', tsxBin, ['watch', 'server/src/index.ts'], {
      env: { ...env, PORT: String(localPorts.api), PUBLIC_URL: served.publicUrl, LOG_LEVEL: 'warn' },
      readyWhen: /listening on/,
    })
    await startChild('vite', path.join(root, 'node_modules/.bin/vite'), ['client', '--port', String(localPorts.app), '--strictPort', '--host', served.host], {
      env: { KITWRIGHT_API: `http://127.0.0.1:${localPorts.api}` },
      readyWhen: /Local:/,
    })
  } else {
    buildClientIfStale()
    await startChild('api', tsxBin, ['server/src/index.ts'], {
      env: {
        ...env,
        PORT: String(localPorts.app),
        HOST: served.host,
        PUBLIC_URL: served.publicUrl,
        NODE_ENV: 'production',
        CLIENT_DIST: path.join(root, 'client/dist'),
        LOG_LEVEL: 'warn',
        // The API trusts the local authority too: it talks to the HTTPS photo stand-in.
        ...(tls ? { TLS_CERT_FILE: tls.certFile, TLS_KEY_FILE: tls.keyFile, TLS_CA_FILE: tls.caFile, NODE_EXTRA_CA_CERTS: tls.caFile } : {}),
      },
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
  const users = JSON.parse(readFileSync(path.join(root, 'server/src/seeds/demo-users.json'), 'utf8'))
  const rows = users.map((u) => `  ${u.role.padEnd(10)} ${u.email.padEnd(28)} ${u.password.padEnd(20)} ${u.pin ?? ''}`)
  const where = served.reachable.map((r) => `  ${r.url.padEnd(34)} ${r.note}`).join('\n')
  const tablets = lan
    ? `\nTablets on the shop network open ${served.publicUrl}: sign in as the owner, then Tablets
("Connect a tablet") shows it as a QR code.${tls ? `\nEach tablet trusts the local certificate authority once: ${path.relative(root, tls.caFile)} (offered on that page).` : ''}\n`
    : `\nFor the shop's tablets: npm start -- --lan${https ? '' : ' (add --https for the camera scanner)'}\n`
  console.log(`
Kitwright is running at ${served.publicUrl}
${where}
${tablets}
Demo sign-ins (invented shop: Mistwell Tote Works)
  ${'role'.padEnd(10)} ${'email'.padEnd(28)} ${'password'.padEnd(20)} bench PIN
${rows.join('\n')}

Press Ctrl-C to stop Kitwright, PostgreSQL and the stand-ins.`)
}
