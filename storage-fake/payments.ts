import { randomBytes } from 'node:crypto'
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import { createServer, type IncomingMessage, type ServerResponse } from 'node:http'
import type { AddressInfo } from 'node:net'
import path from 'node:path'
import Stripe from 'stripe'

/**
 * The local stand-in for the hosted payment service: it answers the calls Kitwright makes through
 * the service's official SDK (creating a checkout, reading it back, registering a webhook endpoint),
 * serves a plain "pay" page for each checkout, and when someone pays there it posts a signed
 * `checkout.session.completed` event to every webhook endpoint, retrying until it is accepted — as
 * the real service does. Checkouts and idempotency keys are kept in `directory`, so a restart
 * neither forgets a checkout nor hands out an id twice.
 */
export interface PaymentsFakeOptions {
  port: number
  directory: string
  /** Signs every event; Kitwright checks it with PAYMENT_WEBHOOK_SECRET. */
  webhookSecret: string
  /** Where events go (more can be registered through the API). */
  webhookUrls?: string[]
  address?: string
}

interface Session {
  id: string
  object: 'checkout.session'
  amount_total: number
  currency: string
  customer_email: string | null
  client_reference_id: string | null
  metadata: Record<string, string>
  mode: 'payment'
  payment_intent: string | null
  payment_status: 'unpaid' | 'paid'
  status: 'open' | 'complete'
  success_url: string | null
  url: string
  created: number
}

interface Store {
  sessions: Record<string, Session>
  /** Idempotency key → the id of the checkout it made. */
  keys: Record<string, string>
  events: Record<string, { id: string; payload: string }>
  endpoints: string[]
}

const token = (prefix: string) => `${prefix}_${randomBytes(12).toString('hex')}`

/** `line_items[0][price_data][currency]=usd` → nested objects, as the SDK form-encodes its parameters. */
export function parseForm(body: string): Record<string, unknown> {
  const out: Record<string, unknown> = {}
  for (const [key, value] of new URLSearchParams(body)) {
    const parts = key.replace(/\]/g, '').split('[')
    let node = out as Record<string, unknown>
    parts.forEach((part, i) => {
      if (i === parts.length - 1) node[part] = value
      else node = (node[part] ??= {}) as Record<string, unknown>
    })
  }
  return out
}

export async function startPaymentsFake(opts: PaymentsFakeOptions) {
  mkdirSync(opts.directory, { recursive: true })
  const file = path.join(opts.directory, 'payments.json')
  const store: Store = (() => {
    try {
      return JSON.parse(readFileSync(file, 'utf8')) as Store
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code !== 'ENOENT') throw err
      return { sessions: {}, keys: {}, events: {}, endpoints: [] }
    }
  })()
  for (const url of opts.webhookUrls ?? []) if (!store.endpoints.includes(url)) store.endpoints.push(url)
  const save = () => writeFileSync(file, JSON.stringify(store, null, 1))
  const stripe = new Stripe('sk_test_stand_in')
  let baseUrl = ''

  async function deliver(eventId: string) {
    const event = store.events[eventId]!
    await Promise.all(
      store.endpoints.map(async (url) => {
        for (let attempt = 0; attempt < 6; attempt++) {
          const header = stripe.webhooks.generateTestHeaderString({ payload: event.payload, secret: opts.webhookSecret })
          try {
            const res = await fetch(url, { method: 'POST', headers: { 'content-type': 'application/json', 'stripe-signature': header }, body: event.payload })
            if (res.ok) return
          } catch (err) {
            console.error(`[payments] delivering ${eventId} to ${url} failed: ${err instanceof Error ? err.message : err}`)
          }
          await new Promise((r) => setTimeout(r, 200 * 2 ** attempt))
        }
        console.error(`[payments] gave up delivering ${eventId} to ${url}`)
      }),
    )
  }

  function json(res: ServerResponse, status: number, body: unknown) {
    res.writeHead(status, { 'content-type': 'application/json' }).end(JSON.stringify(body))
  }
  function apiError(res: ServerResponse, status: number, message: string) {
    json(res, status, { error: { type: 'invalid_request_error', message } })
  }

  async function handle(req: IncomingMessage, res: ServerResponse) {
    const url = new URL(req.url ?? '/', baseUrl)
    const chunks: Buffer[] = []
    for await (const c of req) chunks.push(c as Buffer)
    const body = Buffer.concat(chunks).toString('utf8')

    // The customer's side: the pay page and its button.
    const pay = /^\/pay\/(cs_test_[0-9a-f]+)$/.exec(url.pathname)
    if (pay) {
      const session = store.sessions[pay[1]!]
      if (!session) return res.writeHead(404, { 'content-type': 'text/plain' }).end('No such checkout')
      if (req.method === 'GET') {
        const amount = new Intl.NumberFormat('en-US', { style: 'currency', currency: session.currency.toUpperCase() }).format(session.amount_total / 100)
        const done = session.payment_status === 'paid'
        return res
          .writeHead(200, { 'content-type': 'text/html; charset=utf-8' })
          .end(
            `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>Pay ${amount}</title></head><body style="font-family:sans-serif;max-width:30rem;margin:3rem auto">` +
              `<h1>Payment stand-in</h1><p>Local stand-in for the payment service: no money moves.</p><p>${session.metadata.orderNumber ? `Order ${session.metadata.orderNumber}: ` : ''}${amount}</p>` +
              (done
                ? '<p>Paid.</p>'
                : `<form method="post"><button type="submit" style="font-size:1.25rem;padding:.75rem 1.5rem">Pay ${amount}</button></form>`) +
              '</body></html>',
          )
      }
      if (req.method === 'POST') {
        if (session.payment_status !== 'paid') {
          Object.assign(session, { payment_status: 'paid', status: 'complete', payment_intent: token('pi') })
          const eventId = token('evt')
          const payload = JSON.stringify({
            id: eventId,
            object: 'event',
            type: 'checkout.session.completed',
            created: Math.floor(Date.now() / 1000),
            data: { object: session },
            livemode: false,
            api_version: null,
            pending_webhooks: store.endpoints.length,
            request: null,
          })
          store.events[eventId] = { id: eventId, payload }
          save()
          void deliver(eventId)
        }
        return res.writeHead(303, { location: session.success_url ?? `${baseUrl}/pay/${session.id}` }).end()
      }
    }

    // Re-sends a stored event to every endpoint, as the real service lets an operator do.
    const resend = /^\/v1\/events\/(evt_[0-9a-f]+)\/resend$/.exec(url.pathname)
    if (resend && req.method === 'POST') {
      if (!store.events[resend[1]!]) return apiError(res, 404, 'No such event')
      await deliver(resend[1]!)
      return json(res, 200, { id: resend[1], resent: true })
    }
    if (req.method === 'GET' && url.pathname === '/v1/events') {
      return json(res, 200, { object: 'list', data: Object.values(store.events).map((e) => JSON.parse(e.payload) as unknown), has_more: false })
    }

    // The API the SDK calls.
    if (!/^Bearer sk_(test|live)_\w+/.test(req.headers.authorization ?? '')) return apiError(res, 401, 'Invalid API key provided')
    if (req.method === 'POST' && url.pathname === '/v1/checkout/sessions') {
      const key = req.headers['idempotency-key']
      if (typeof key === 'string' && store.keys[key]) return json(res, 200, store.sessions[store.keys[key]!])
      const p = parseForm(body) as {
        line_items?: Record<string, { quantity?: string; price_data?: { currency?: string; unit_amount?: string } }>
        customer_email?: string
        client_reference_id?: string
        metadata?: Record<string, string>
        success_url?: string
      }
      const items = Object.values(p.line_items ?? {})
      if (items.length === 0) return apiError(res, 400, 'line_items is required')
      const amount = items.reduce((s, i) => s + Number(i.price_data?.unit_amount ?? NaN) * Number(i.quantity ?? 1), 0)
      if (!Number.isInteger(amount) || amount <= 0) return apiError(res, 400, 'Each line item needs a whole positive unit_amount')
      const id = token('cs_test')
      const session: Session = {
        id,
        object: 'checkout.session',
        amount_total: amount,
        currency: items[0]!.price_data?.currency ?? 'usd',
        customer_email: p.customer_email ?? null,
        client_reference_id: p.client_reference_id ?? null,
        metadata: p.metadata ?? {},
        mode: 'payment',
        payment_intent: null,
        payment_status: 'unpaid',
        status: 'open',
        success_url: p.success_url ?? null,
        url: `${baseUrl}/pay/${id}`,
        created: Math.floor(Date.now() / 1000),
      }
      store.sessions[id] = session
      if (typeof key === 'string') store.keys[key] = id
      save()
      return json(res, 200, session)
    }
    const read = /^\/v1\/checkout\/sessions\/(cs_test_[0-9a-f]+)$/.exec(url.pathname)
    if (req.method === 'GET' && read) {
      const session = store.sessions[read[1]!]
      return session ? json(res, 200, session) : apiError(res, 404, `No such checkout.session: '${read[1]}'`)
    }
    if (req.method === 'POST' && url.pathname === '/v1/webhook_endpoints') {
      const p = parseForm(body) as { url?: string }
      if (!p.url) return apiError(res, 400, 'url is required')
      if (!store.endpoints.includes(p.url)) store.endpoints.push(p.url)
      save()
      return json(res, 200, { id: token('we'), object: 'webhook_endpoint', url: p.url, secret: opts.webhookSecret, status: 'enabled' })
    }
    return apiError(res, 404, `Unrecognized request URL (${req.method}: ${url.pathname})`)
  }

  const server = createServer((req, res) => {
    handle(req, res).catch((err: unknown) => {
      console.error(`[payments] ${err instanceof Error ? err.stack : err}`)
      if (!res.headersSent) apiError(res, 500, 'stand-in error')
    })
  })
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject)
    server.listen(opts.port, opts.address ?? '127.0.0.1', () => resolve())
  })
  const { port } = server.address() as AddressInfo
  baseUrl = `http://${opts.address && opts.address !== '0.0.0.0' ? opts.address : '127.0.0.1'}:${port}`
  return {
    url: baseUrl,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  }
}
