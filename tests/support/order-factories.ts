import { randomBytes } from 'node:crypto'
import type { NewOrderDraft } from '@kitwright/shared/orders'

/**
 * A new order as the API takes it, for an invented customer (reserved `.example` domain). Lines
 * default to one 6-site demo kit.
 */
export function buildNewOrder(overrides: Partial<NewOrderDraft> = {}): NewOrderDraft {
  const tag = randomBytes(3).toString('hex').toUpperCase()
  return {
    number: `T-${tag}`,
    customer: { name: `Wren Ashdown ${tag}`, email: `wren-${tag.toLowerCase()}@leafmail.example`, phone: '555-0142' },
    shipTo: { name: `Wren Ashdown ${tag}`, line1: '27 Bramblecot Row', city: 'Millbrook Falls', region: 'OR', postalCode: '97001', country: 'US' },
    placedAt: '2026-03-02T09:15:00Z',
    // Two weeks from today, so a new order is never late by accident.
    promisedShipDate: new Date(Date.now() + 14 * 86_400_000).toISOString().slice(0, 10),
    lines: [{ kitSku: 'MW-TOTE-6C', quantity: 1, unitPriceCents: 12900 }],
    ...overrides,
  }
}
