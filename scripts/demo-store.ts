// `npm run demo:store`: plays the shop's web store against a running Kitwright. Posts signed
// deliveries of paid orders (the demo kits and spare packs, invented customers), a few duplicate
// deliveries, one ship-to change and one cancellation, and prints one line per delivery.
//   npm run demo:store -- --orders 20
//   KITWRIGHT_URL=http://localhost:3100 npm run demo:store
// Without --url or KITWRIGHT_URL it posts to PUBLIC_URL, else to http://localhost:$PORT (as npm start
// serves it), and trusts the local certificate authority of `npm start -- --https` (.data/tls/ca.crt).
// The secret comes from STORE_WEBHOOK_SECRET, else from .data/store-webhook.secret (made by npm start).
// Every person, street and town below is invented; e-mail addresses use the reserved .example domain.
import { spawnSync } from 'node:child_process'
import { randomUUID } from 'node:crypto'
import { existsSync, readFileSync } from 'node:fs'
import path from 'node:path'
import { parseArgs } from 'node:util'
import type { StoreEventInput } from '@kitwright/shared/store-events'
import { signStoreDelivery } from '../server/src/features/webhooks/store-signature'

const { values } = parseArgs({ options: { orders: { type: 'string', default: '12' }, url: { type: 'string' } } })
const count = Number(values.orders)
if (!Number.isInteger(count) || count < 3 || count > 500) {
  console.error('--orders must be a whole number from 3 to 500, e.g. --orders 12')
  process.exit(1)
}
const base = (values.url ?? process.env.KITWRIGHT_URL ?? process.env.PUBLIC_URL ?? `http://localhost:${process.env.PORT ?? 3000}`).replace(/\/$/, '')
const localCa = path.resolve(import.meta.dirname, '../.data/tls/ca.crt')
if (base.startsWith('https:') && !process.env.NODE_EXTRA_CA_CERTS && existsSync(localCa)) {
  // Node reads extra authorities only at start: run again trusting the local one.
  const again = spawnSync(process.execPath, [...process.execArgv, ...process.argv.slice(1)], { stdio: 'inherit', env: { ...process.env, NODE_EXTRA_CA_CERTS: localCa } })
  process.exit(again.status ?? 1)
}
const secretFile = path.resolve(import.meta.dirname, '../.data/store-webhook.secret')
const secret = process.env.STORE_WEBHOOK_SECRET ?? (existsSync(secretFile) ? readFileSync(secretFile, 'utf8').trim() : '')
if (!secret) {
  console.error(`No webhook secret: set STORE_WEBHOOK_SECRET to the one Kitwright runs with, or run \`npm start\` once so it writes ${secretFile}`)
  process.exit(1)
}

// What the demo store sells: its product ids map to the demo kits (prices in cents, invented).
const PRODUCTS = [
  { productId: 'mw-store-1012', title: '12-site aeroponic tote kit', unitPriceCents: 18900 },
  { productId: 'mw-store-1006', title: '6-site compact tote kit', unitPriceCents: 12900 },
  { productId: 'mw-store-2006', title: 'Spare sprayer pack (6)', unitPriceCents: 2400 },
  { productId: 'mw-store-2012', title: 'Spare cups and collars pack (12)', unitPriceCents: 1800 },
] as const
const FIRST = ['Ansel', 'Brisa', 'Corwin', 'Delphine', 'Emrys', 'Fenna', 'Galen', 'Hollis', 'Ines', 'Jory', 'Kestrel', 'Liesel', 'Marek', 'Nessa', 'Orrin', 'Pella']
const LAST = ['Ashgrove', 'Brackwater', 'Cindervale', 'Dunmere', 'Eskerby', 'Fallowmere', 'Greystrand', 'Hazelwick', 'Ivesdale', 'Juniperholt', 'Kettleby', 'Loamfield']
const STREETS = ['Fernhollow Lane', 'Quillbank Road', 'Mossgate Street', 'Tallowmere Way', 'Sparrowdown Court', 'Briarstep Avenue']
const TOWNS = [
  { city: 'Brookmere', region: 'OR', postalCode: '97000', country: 'US' },
  { city: 'Hollowford', region: 'WA', postalCode: '98000', country: 'US' },
  { city: 'Larchton', region: 'ON', postalCode: 'K0A 1A0', country: 'CA' },
  { city: 'Fernwick', region: 'VT', postalCode: '05000', country: 'US' },
  { city: 'Quillbay', region: 'BC', postalCode: 'V0N 1B0', country: 'CA' },
]
const pick = <T>(list: readonly T[], i: number) => list[i % list.length]!

function shipTo(i: number, name: string) {
  return { name, line1: `${10 + ((i * 37) % 890)} ${pick(STREETS, i * 5)}`, ...pick(TOWNS, i * 3) }
}

const run = Date.now().toString(36).toUpperCase().slice(-5)
const orders = Array.from({ length: count }, (_, i) => {
  const name = `${pick(FIRST, i * 7 + 3)} ${pick(LAST, i * 5 + 1)}`
  const email = `${name.toLowerCase().replace(' ', '.')}@${pick(['mail', 'post', 'inbox'], i)}.example`
  // Most buy one tote kit; every third adds a spare pack; every fifth buys only spares.
  const lines =
    i % 5 === 4
      ? [{ ...pick(PRODUCTS.slice(2), i), quantity: 1 + (i % 3) }]
      : [{ ...pick(PRODUCTS.slice(0, 2), i), quantity: i % 7 === 0 ? 2 : 1 }, ...(i % 3 === 0 ? [{ ...pick(PRODUCTS.slice(2), i + 1), quantity: 1 }] : [])]
  const paid: StoreEventInput = {
    eventId: `evt_${randomUUID()}`,
    type: 'order.paid',
    occurredAt: new Date(Date.now() - (count - i) * 60_000).toISOString(),
    orderNumber: `WEB-${run}-${String(i + 1).padStart(3, '0')}`,
    order: {
      placedAt: new Date(Date.now() - (count - i) * 60_000 - 30_000).toISOString(),
      customer: { name, email },
      shipTo: shipTo(i, name),
      currency: 'USD',
      lines,
    },
  }
  return paid
})

const deliveries: StoreEventInput[] = []
orders.forEach((paid, i) => {
  deliveries.push(paid)
  // The store's own retries: every fourth delivery arrives twice.
  if (i % 4 === 1) deliveries.push(paid)
})
const moved = orders[1]!
deliveries.push({
  eventId: `evt_${randomUUID()}`,
  type: 'order.address_changed',
  occurredAt: new Date().toISOString(),
  orderNumber: moved.orderNumber,
  shipTo: { ...shipTo(99, moved.type === 'order.paid' ? moved.order.customer.name : 'Customer'), line2: 'Back door, by the greenhouse' },
})
const cancelled = orders[2]!
const cancel: StoreEventInput = {
  eventId: `evt_${randomUUID()}`,
  type: 'order.cancelled',
  occurredAt: new Date().toISOString(),
  orderNumber: cancelled.orderNumber,
  reason: 'customer asked to cancel',
}
deliveries.push(cancel, cancel)

async function post(event: StoreEventInput) {
  const body = JSON.stringify(event)
  const timestamp = Math.floor(Date.now() / 1000)
  const res = await fetch(`${base}/api/webhooks/store`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', 'X-Store-Timestamp': String(timestamp), 'X-Store-Signature': signStoreDelivery(secret, timestamp, body) },
    body,
  })
  const reply = (await res.json().catch(() => null)) as { duplicate?: boolean; error?: { message?: string } } | null
  const outcome = res.ok ? (reply?.duplicate ? 'duplicate, ignored' : 'received') : `refused: ${reply?.error?.message ?? res.statusText}`
  return { status: res.status, outcome }
}

console.log(`Web store → ${base}: ${deliveries.length} deliveries for ${count} orders (run ${run})`)
let failed = 0
for (const event of deliveries) {
  let line: string
  try {
    const { status, outcome } = await post(event)
    if (status !== 200) failed++
    line = `${status} ${outcome}`
  } catch (err) {
    const reason = err instanceof Error ? `${err.message}${err.cause instanceof Error ? `: ${err.cause.message}` : ''}` : String(err)
    console.error(`Kitwright is not answering at ${base} (${reason}). Start it with \`npm start\`, or set KITWRIGHT_URL (or PORT / PUBLIC_URL as Kitwright runs with).`)
    process.exit(1)
  }
  console.log(`  ${event.type.padEnd(22)} ${event.orderNumber.padEnd(18)} ${event.eventId.slice(0, 16)}…  ${line}`)
}
console.log(failed ? `${failed} deliveries were refused.` : 'All deliveries accepted; Kitwright processes them in the background (see the orders page and the outbox).')
process.exit(failed ? 1 : 0)
