import { randomUUID } from 'node:crypto'
import request from 'supertest'
import type { StoreEventInput } from '@kitwright/shared/store-events'
import { signStoreDelivery } from '../../server/src/features/webhooks/store-signature'
import { TEST_STORE_SECRET, type buildApp } from './app'

type App = ReturnType<typeof buildApp>['app']

/** Posts one delivery the way the web store does: the exact body bytes signed with the timestamp. */
export function deliver(app: App, event: StoreEventInput | Record<string, unknown>, opts: { secret?: string; timestamp?: number; signature?: string } = {}) {
  const body = JSON.stringify(event)
  const timestamp = opts.timestamp ?? Math.floor(Date.now() / 1000)
  return request(app)
    .post('/api/webhooks/store')
    .set('Content-Type', 'application/json')
    .set('X-Store-Timestamp', String(timestamp))
    .set('X-Store-Signature', opts.signature ?? signStoreDelivery(opts.secret ?? TEST_STORE_SECRET, timestamp, body))
    .send(body)
}

/** A paid order as the store would send it (invented customer, `.example` address). */
export function paidEvent(orderNumber: string, overrides: Partial<Extract<StoreEventInput, { type: 'order.paid' }>> = {}): Extract<StoreEventInput, { type: 'order.paid' }> {
  return {
    eventId: `evt-${randomUUID()}`,
    type: 'order.paid',
    occurredAt: new Date(Date.now() - 60_000).toISOString(),
    orderNumber,
    order: {
      placedAt: new Date(Date.now() - 120_000).toISOString(),
      customer: { name: 'Rowan Testerby', email: `${orderNumber.toLowerCase()}@buyer.example` },
      shipTo: { name: 'Rowan Testerby', line1: '12 Fernhollow Lane', city: 'Brookmere', region: 'OR', postalCode: '97000', country: 'US' },
      currency: 'USD',
      lines: [
        { productId: 'mw-store-1012', title: '12-site aeroponic tote kit', quantity: 1, unitPriceCents: 18900 },
        { productId: 'mw-store-2012', title: 'Net cup spare pack', quantity: 2, unitPriceCents: 1200 },
      ],
    },
    ...overrides,
  }
}

/** Polls `check` until it returns a value other than undefined, or fails after `timeoutMs`. */
export async function waitFor<T>(what: string, check: () => Promise<T | undefined>, timeoutMs = 15_000): Promise<T> {
  const until = Date.now() + timeoutMs
  for (;;) {
    const value = await check()
    if (value !== undefined) return value
    if (Date.now() > until) throw new Error(`timed out after ${timeoutMs} ms waiting for ${what}`)
    await new Promise((r) => setTimeout(r, 100))
  }
}
