import { eq } from 'drizzle-orm'
import { NewOrderSchema, type NewOrderDraft, type OrderSource } from '@kitwright/shared/orders'
import { addOrderEvent, createOrder, releaseOrder, tables, type Actor, type Db } from './services'

const { orders } = tables

const DAY = 24 * 60 * 60 * 1000

interface DemoOrder {
  draft: Omit<NewOrderDraft, 'placedAt' | 'promisedShipDate'>
  source: OrderSource
  /** Days before today the order was placed; it is promised 14 days later (the demo shop's lead time). */
  placedDaysAgo: number
  then?: 'release' | 'cancel'
}

const ship = (name: string, line1: string, city: string, region: string | undefined, postalCode: string, country: string) => ({ name, line1, city, region, postalCode, country })

/**
 * Demo orders of Mistwell Tote Works. Customers, streets and towns are invented; e-mail addresses
 * use the reserved `.example` domain. Dates are relative to today so the late order stays late.
 */
const DEMO_ORDERS: DemoOrder[] = [
  {
    source: 'store',
    placedDaysAgo: 9,
    then: 'release',
    draft: {
      number: 'W-2401',
      paymentStatus: 'paid',
      customer: { name: 'Marigold Thistlewood', email: 'marigold@sprouthouse.example' },
      shipTo: ship('Marigold Thistlewood', '41 Quillon Lane', 'Ashgrove', 'OR', '97019', 'US'),
      lines: [
        { storeProductId: 'mw-store-2006', quantity: 1, unitPriceCents: 1450 },
        { storeProductId: 'mw-store-2012', quantity: 1, unitPriceCents: 2400 },
      ],
    },
  },
  {
    source: 'store',
    placedDaysAgo: 8,
    then: 'release',
    draft: {
      number: 'W-2402',
      paymentStatus: 'paid',
      customer: { name: 'Oren Bellwether', email: 'oren.b@kettlemail.example' },
      shipTo: ship('Oren Bellwether', '8 Pebblestone Court', 'Little Fenwick', 'VT', '05089', 'US'),
      lines: [{ storeProductId: 'mw-store-2012', quantity: 2, unitPriceCents: 2400 }],
    },
  },
  {
    source: 'store',
    placedDaysAgo: 20,
    draft: {
      number: 'W-2395',
      paymentStatus: 'paid',
      note: 'Customer asked twice where the order is.',
      customer: { name: 'Priya Lanternfield', email: 'priya@heronmoss.example', phone: '555-0187' },
      shipTo: ship('Priya Lanternfield', '117 Heronmoss Road', 'Copperbeck', 'ON', 'K0A 1A0', 'CA'),
      lines: [{ storeProductId: 'mw-store-1012', quantity: 2, unitPriceCents: 18900 }],
    },
  },
  {
    source: 'store',
    placedDaysAgo: 5,
    then: 'cancel',
    draft: {
      number: 'W-2403',
      paymentStatus: 'refunded',
      customer: { name: 'Tobias Fernsworth', email: 'tobias@windlestraw.example' },
      shipTo: ship('Tobias Fernsworth', '3 Windlestraw Mews', 'Dunmarsh', undefined, 'DM4 7QX', 'GB'),
      lines: [{ storeProductId: 'mw-store-1006', quantity: 1, unitPriceCents: 12900 }],
    },
  },
  {
    source: 'store',
    placedDaysAgo: 3,
    draft: {
      number: 'W-2404',
      paymentStatus: 'paid',
      customer: { name: 'Ines Halloway', email: 'ines.halloway@cinderwick.example' },
      shipTo: ship('Ines Halloway', '62 Cinderwick Avenue', 'Brackenridge', 'CO', '80421', 'US'),
      lines: [
        { storeProductId: 'mw-store-1012', quantity: 1, unitPriceCents: 18900 },
        { storeProductId: 'mw-store-2012', quantity: 2, unitPriceCents: 2400 },
      ],
    },
  },
  {
    source: 'store',
    placedDaysAgo: 2,
    draft: {
      number: 'W-2405',
      paymentStatus: 'pending',
      customer: { name: 'Calloway Reedsmith', email: 'calloway@otterbank.example' },
      shipTo: ship('Calloway Reedsmith', '19 Otterbank Way', 'Millhaven', 'WA', '98271', 'US'),
      lines: [{ storeProductId: 'mw-store-1006', quantity: 3, unitPriceCents: 12900 }],
    },
  },
  {
    source: 'phone',
    placedDaysAgo: 1,
    draft: {
      number: 'P-0301',
      note: 'Phoned in; gift for a school greenhouse club.',
      customer: { name: 'Noor Aldercott', email: 'noor@lamplighter.example', phone: '555-0123' },
      shipTo: ship('Saltmere Grammar Greenhouse Club', '5 Lamplighter Row', 'Saltmere', 'ME', '04011', 'US'),
      lines: [
        { kitSku: 'MW-TOTE-6C', quantity: 2, unitPriceCents: 11900 },
        { kitSku: 'MW-SPARE-CUP12', quantity: 2, unitPriceCents: 2400 },
      ],
    },
  },
  {
    source: 'store',
    placedDaysAgo: 0,
    draft: {
      number: 'W-2406',
      paymentStatus: 'paid',
      customer: { name: 'Wendell Pipperidge', email: 'wendell@gorsehill.example' },
      shipTo: ship('Wendell Pipperidge', '240 Gorse Hill Road', 'Tallow Creek', 'TX', '75931', 'US'),
      lines: [
        { storeProductId: 'mw-store-2006', quantity: 1, unitPriceCents: 1450 },
        { storeProductId: 'mw-store-3001', description: 'Gift card', quantity: 1, unitPriceCents: 2500 },
      ],
    },
  },
  {
    source: 'store',
    placedDaysAgo: 0,
    draft: {
      number: 'W-2407',
      paymentStatus: 'paid',
      note: 'Second order from this customer this month.',
      customer: { name: 'Ines Halloway', email: 'ines.halloway@cinderwick.example' },
      shipTo: ship('Ines Halloway', '62 Cinderwick Avenue', 'Brackenridge', 'CO', '80421', 'US'),
      lines: [
        { storeProductId: 'mw-store-2006', quantity: 1, unitPriceCents: 1450 },
        { storeProductId: 'mw-store-2012', quantity: 2, unitPriceCents: 2400 },
      ],
    },
  },
]

function isoDay(date: Date) {
  return date.toISOString().slice(0, 10)
}

/**
 * Seeds the demo orders: some open, two released through the release service (so their work orders
 * and reservations are real; short parts are recorded, not refused), one late, one cancelled, one
 * with a gift-card line that maps to no kit. The released ones are spare-parts packs: they reserve
 * no pump and wait for no cutting, so the demo's pump stock and cut-run candidates start untouched. Orders already stored are left as they are, so running
 * it twice changes nothing.
 */
export async function seedDemoOrders(db: Db, owner: Actor) {
  const now = Date.now()
  for (const demo of DEMO_ORDERS) {
    const placed = new Date(now - demo.placedDaysAgo * DAY)
    placed.setUTCHours(15, 20, 0, 0)
    const input = NewOrderSchema.parse({ ...demo.draft, placedAt: placed.toISOString(), promisedShipDate: isoDay(new Date(placed.getTime() + 14 * DAY)) })
    await db.transaction(async (tx) => {
      const { order, created } = await createOrder(tx, input, demo.source, demo.source === 'phone' ? owner : null)
      if (!created) return
      if (demo.then === 'release') await releaseOrder(tx, order.id, { allowShort: true }, owner)
      if (demo.then === 'cancel') {
        await tx.update(orders).set({ status: 'cancelled', cancelledAt: new Date(), updatedAt: new Date() }).where(eq(orders.id, order.id))
        await addOrderEvent(tx, { orderId: order.id, kind: 'cancelled', message: 'Cancelled by the customer in the web store; payment refunded', actor: null })
      }
    })
  }
}
