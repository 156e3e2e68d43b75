import { eq } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { NewOrderSchema, type NewOrderDraft } from '@kitwright/shared/orders'
import { orderEvents, orderLines, orders } from '../../server/src/db/schema/index'
import { seedDemo } from '../../server/src/seeds/demo'
import { createOrder } from '../../server/src/features/orders/orders.service'
import { createTestDb, type TestDb } from '../support/test-db'

let t: TestDb
beforeAll(async () => {
  t = await createTestDb()
  await seedDemo(t.db)
})
afterAll(() => t.drop())

const draft = (number: string, lines: NewOrderDraft['lines']): NewOrderDraft => ({
  number,
  customer: { name: 'Rowan Quillfeather', email: 'rowan@greenloft.example' },
  shipTo: { name: 'Rowan Quillfeather', line1: '14 Larkspur Bend', city: 'Fernhollow', postalCode: '99501', country: 'us' },
  placedAt: '2026-03-01T14:30:00Z',
  lines,
})

describe('createOrder', () => {
  it('maps lines by kit SKU or store product, flags an unmapped line, and stores a number once', async () => {
    const input = NewOrderSchema.parse(
      draft('CO-1', [
        { kitSku: 'mw-tote-12', quantity: 2, unitPriceCents: 18900 },
        { storeProductId: 'mw-store-2012', quantity: 1, unitPriceCents: 2400 },
        { storeProductId: 'mw-store-9999', description: 'Gift wrap', quantity: 1, unitPriceCents: 500 },
      ]),
    )
    const first = await t.db.transaction((tx) => createOrder(tx, input, 'store', null))
    expect(first.created).toBe(true)
    expect(first.order.totalCents).toBe(2 * 18900 + 2400 + 500)
    expect(first.order.shipCountry).toBe('US')
    const lines = await t.db.select().from(orderLines).where(eq(orderLines.orderId, first.order.id)).orderBy(orderLines.lineNo)
    expect(lines.map((l) => [l.sku, l.kitId !== null])).toEqual([['MW-TOTE-12', true], ['MW-SPARE-CUP12', true], ['mw-store-9999', false]])
    const events = await t.db.select().from(orderEvents).where(eq(orderEvents.orderId, first.order.id))
    expect(events.map((e) => e.kind).sort()).toEqual(['received', 'unmapped_line'])
    expect(events.find((e) => e.kind === 'unmapped_line')!.message).toContain('mw-store-9999 (Gift wrap) maps to no kit')

    const again = await t.db.transaction((tx) => createOrder(tx, { ...input, note: 'changed' }, 'store', null))
    expect(again).toMatchObject({ created: false, order: { id: first.order.id, note: null } })
    expect(await t.db.$count(orders, eq(orders.number, 'CO-1'))).toBe(1)
    expect(await t.db.$count(orderLines, eq(orderLines.orderId, first.order.id))).toBe(3)
  })

  it('creates one order when the same number arrives in many transactions at once', async () => {
    const input = NewOrderSchema.parse(draft('CO-2', [{ kitSku: 'MW-TOTE-6C', quantity: 1, unitPriceCents: 100 }]))
    const results = await Promise.all(Array.from({ length: 8 }, () => t.db.transaction((tx) => createOrder(tx, input, 'store', null))))
    expect(results.filter((r) => r.created)).toHaveLength(1)
    expect(new Set(results.map((r) => r.order.id)).size).toBe(1)
    const [row] = await t.db.select().from(orders).where(eq(orders.number, 'CO-2'))
    expect(await t.db.$count(orderLines, eq(orderLines.orderId, row!.id))).toBe(1)
  })
})
