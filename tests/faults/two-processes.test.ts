// Two API processes side by side over one database and one job queue, as DESIGN.md's "Growing past
// one machine" promises: a session from one works on the other, a webhook delivered to both at once
// makes one order, and each queued e-mail is sent once across both.
import { spawn, type ChildProcess } from 'node:child_process'
import { readdirSync, readFileSync } from 'node:fs'
import path from 'node:path'
import { inArray } from 'drizzle-orm'
import { simpleParser } from 'mailparser'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { SessionSchema } from '@kitwright/shared/auth'
import { createDb } from '../../server/src/db/client'
import { mailMessages, orders, storeEvents } from '../../server/src/db/schema/index'
import { signStoreDelivery } from '../../server/src/features/webhooks/store-signature'
import { TEST_STORE_SECRET } from '../support/app'
import { insertUser, TEST_PASSWORD } from '../support/factories'
import { paidEvent, waitFor } from '../support/store-webhook'
import { freePort, privatePostgres, privateSmtp, seconds } from './private-services'
import { waitForQueueIdle } from '../support/queue'

const root = path.resolve(import.meta.dirname, '../..')
let pg: Awaited<ReturnType<typeof privatePostgres>>
let smtp: Awaited<ReturnType<typeof privateSmtp>>
let conn: ReturnType<typeof createDb>
const apis: { url: string; child: ChildProcess }[] = []
// Every child started, recorded at once, so one that started while its twin failed is stopped too.
const children: ChildProcess[] = []

/** One `tsx server/src/index.ts`, workers on, resolved once it prints that it listens. */
async function startApi(): Promise<{ url: string; child: ChildProcess }> {
  const port = await freePort()
  const child = spawn(path.join(root, 'node_modules/.bin/tsx'), ['server/src/index.ts'], {
    cwd: root,
    env: {
      ...process.env,
      DATABASE_URL: pg.url,
      PORT: String(port),
      SESSION_SECRET: 'kitwright-two-process-secret-0123456789abcdef',
      STORE_WEBHOOK_SECRET: TEST_STORE_SECRET,
      SMTP_URL: smtp.url,
      RUN_WORKERS: 'true',
      LOG_LEVEL: 'error',
      NODE_ENV: 'test',
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  })
  children.push(child)
  let stderr = ''
  child.stderr!.on('data', (d: Buffer) => (stderr += d.toString()))
  await new Promise<void>((resolve, reject) => {
    child.stdout!.on('data', (d: Buffer) => {
      if (d.toString().includes('listening on')) resolve()
    })
    child.once('exit', (code) => reject(new Error(`the API on port ${port} exited early (${code}):\n${stderr.slice(-2000)}`)))
  })
  return { url: `http://127.0.0.1:${port}`, child }
}

beforeAll(async () => {
  pg = await privatePostgres('two-processes')
  smtp = await privateSmtp('two-processes')
  conn = createDb(pg.url)
  apis.push(...(await Promise.all([startApi(), startApi()])))
})
afterAll(async () => {
  for (const child of children) {
    if (child.exitCode !== null || child.signalCode !== null) continue
    const exited = new Promise((r) => child.once('exit', r))
    child.kill('SIGTERM')
    await exited
  }
  await conn?.pool.end()
  await smtp?.stop()
  pg?.destroy()
})

function deliverTo(url: string, event: object) {
  const body = JSON.stringify(event)
  const ts = Math.floor(Date.now() / 1000)
  return fetch(`${url}/api/webhooks/store`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', 'x-store-timestamp': String(ts), 'x-store-signature': signStoreDelivery(TEST_STORE_SECRET, ts, body) },
    body,
  })
}

describe('two API processes over one database and queue', () => {
  it('takes a session signed in on one process on the other', async () => {
    const [a, b] = apis
    const user = await insertUser(conn.db, { role: 'planner' })
    const signIn = await fetch(`${a!.url}/api/auth/sign-in`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ email: user.email, password: TEST_PASSWORD }),
    })
    expect(signIn.status).toBe(200)
    const cookie = signIn.headers
      .getSetCookie()
      .map((c) => c.split(';')[0])
      .join('; ')
    const me = await fetch(`${b!.url}/api/auth/me`, { headers: { cookie } })
    expect(me.status).toBe(200)
    expect(SessionSchema.parse(await me.json()).user).toMatchObject({ id: user.id, email: user.email })
    // And the list the planner reads answers alike on both.
    for (const api of apis) expect((await fetch(`${api.url}/api/orders`, { headers: { cookie } })).status).toBe(200)
  })

  it('makes one order of a webhook delivered to both at once, and sends each e-mail once across both', async () => {
    const events = Array.from({ length: 20 }, (_, i) => paidEvent(`MW-P-${1001 + i}`))
    const started = Date.now()
    const answers = await Promise.all(events.flatMap((e) => apis.map((api) => deliverTo(api.url, e).then((r) => r.status))))
    expect(
      answers.every((s) => s === 200),
      `answers: ${answers.join(',')}`,
    ).toBe(true)
    const numbers = events.map((e) => e.orderNumber)
    await waitFor(
      'every order',
      async () => ((await conn.db.select().from(orders).where(inArray(orders.number, numbers))).length === numbers.length ? true : undefined),
      30_000,
    )
    await waitFor(
      'every e-mail sent',
      async () => {
        const rows = await conn.db.select({ status: mailMessages.status }).from(mailMessages)
        return rows.length === numbers.length && rows.every((r) => r.status === 'sent') ? true : undefined
      },
      30_000,
    )
    const settled = Date.now() - started
    await waitForQueueIdle(conn.db) // every job done: a stray second send would have landed by now

    const rows = await conn.db.select({ number: orders.number }).from(orders).where(inArray(orders.number, numbers))
    expect(rows.map((r) => r.number).sort()).toEqual([...numbers].sort())
    expect(await conn.db.select().from(storeEvents)).toHaveLength(numbers.length)
    const mails = await conn.db.select({ attempts: mailMessages.attempts }).from(mailMessages)
    expect(mails.every((m) => m.attempts === 1)).toBe(true)
    const files = readdirSync(smtp.directory).filter((f) => f.endsWith('.eml'))
    const parsed = await Promise.all(files.map((f) => simpleParser(readFileSync(path.join(smtp.directory, f)))))
    const to = parsed.flatMap((m) => (Array.isArray(m.to) ? m.to : m.to ? [m.to] : []).flatMap((x) => x.value.map((v) => v.address)))
    expect(to.sort()).toEqual(numbers.map((n) => `${n.toLowerCase()}@buyer.example`).sort())
    console.log(
      `[two-processes] ${answers.length} deliveries (${events.length} events, each to both processes at once) → ${rows.length} orders, ${files.length} e-mails sent once each, settled in ${seconds(settled)}`,
    )
  })
})
