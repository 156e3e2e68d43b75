import Papa from 'papaparse'
import request from 'supertest'
import { eq } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ApiErrorBodySchema } from '@kitwright/shared/errors'
import { OrderDetailSchema, OrdersPageSchema, type NewOrderDraft } from '@kitwright/shared/orders'
import { OrderImportPreviewSchema, OrderImportResultSchema } from '@kitwright/shared/orders-csv'
import { orders } from '../../server/src/db/schema/index'
import { seedDemo } from '../../server/src/seeds/demo'
import { buildApp, signedInAs } from '../support/app'
import { buildNewOrder } from '../support/order-factories'
import { createTestDb, type TestDb } from '../support/test-db'

let t: TestDb
let app: ReturnType<typeof buildApp>['app']
let planner: Awaited<ReturnType<typeof signedInAs>>
let admin: Awaited<ReturnType<typeof signedInAs>>['agent']

beforeAll(async () => {
  t = await createTestDb()
  app = buildApp(t).app
  await seedDemo(t.db)
  planner = await signedInAs(app, t, 'planner')
  admin = (await signedInAs(app, t, 'admin')).agent
})
afterAll(() => t.drop())

async function postOrder(draft: NewOrderDraft) {
  const res = await planner.agent.post('/api/orders').send(draft)
  expect(res.status, JSON.stringify(res.body)).toBe(201)
  return OrderDetailSchema.parse(res.body)
}

async function list(query: string) {
  const res = await planner.agent.get(`/api/orders?${query}`)
  expect(res.status, JSON.stringify(res.body)).toBe(200)
  return OrdersPageSchema.parse(res.body)
}

describe('the orders list', () => {
  const prefix = 'LST-'
  beforeAll(async () => {
    // 12 orders placed a day apart; every third one for the 12-site kit; two cancelled.
    for (let i = 1; i <= 12; i++) {
      const day = String(i).padStart(2, '0')
      await postOrder(
        buildNewOrder({
          number: `${prefix}${String(i).padStart(3, '0')}`,
          customer: { name: i === 7 ? 'Juniper Oddfellow' : i === 8 ? 'Moss 100% Organic' : `Customer ${day}`, email: i === 7 ? 'juno@fernbox.example' : `c${day}@leafmail.example` },
          placedAt: `2026-04-${day}T12:00:00Z`,
          lines: [{ kitSku: i % 3 === 0 ? 'MW-TOTE-12' : 'MW-TOTE-6C', quantity: i, unitPriceCents: 1000 }],
        }),
      )
    }
    await t.db.update(orders).set({ status: 'cancelled' }).where(eq(orders.number, `${prefix}011`))
    await t.db.update(orders).set({ status: 'cancelled' }).where(eq(orders.number, `${prefix}012`))
  })

  it('pages on the server and counts every match', async () => {
    const first = await list(`q=${prefix}&pageSize=10&sort=number&dir=asc`)
    expect(first.total).toBe(12)
    expect(first.items.map((o) => o.number)).toEqual(Array.from({ length: 10 }, (_, i) => `${prefix}${String(i + 1).padStart(3, '0')}`))
    const second = await list(`q=${prefix}&pageSize=10&page=2&sort=number&dir=asc`)
    expect(second.items.map((o) => o.number)).toEqual([`${prefix}011`, `${prefix}012`])
    const beyond = await list(`q=${prefix}&pageSize=10&page=5`)
    expect(beyond).toMatchObject({ items: [], total: 12 })
  })

  it('sorts by placed date, total and customer either way', async () => {
    expect((await list(`q=${prefix}&sort=placedAt&dir=desc&pageSize=10`)).items[0]!.number).toBe(`${prefix}012`)
    expect((await list(`q=${prefix}&sort=total&dir=asc&pageSize=10`)).items.map((o) => o.totalCents).slice(0, 3)).toEqual([1000, 2000, 3000])
    const byName = (await list(`q=${prefix}&sort=customer&dir=asc`)).items.map((o) => o.customerName)
    expect(byName.slice(-3)).toEqual(['Customer 12', 'Juniper Oddfellow', 'Moss 100% Organic'])
    expect((await list(`q=${prefix}&sort=customer&dir=desc`)).items[0]!.customerName).toBe('Moss 100% Organic')
  })

  it('filters by status, placed dates (both ends included) and kit', async () => {
    expect((await list(`q=${prefix}&status=cancelled`)).items.map((o) => o.number).sort()).toEqual([`${prefix}011`, `${prefix}012`])
    expect((await list(`q=${prefix}&status=open`)).total).toBe(10)
    const april = await list(`q=${prefix}&from=2026-04-03&to=2026-04-05&sort=number&dir=asc`)
    expect(april.items.map((o) => o.number)).toEqual([`${prefix}003`, `${prefix}004`, `${prefix}005`])
    const kits = (await planner.agent.get('/api/kits')).body as { id: string; sku: string }[]
    const big = kits.find((k) => k.sku === 'MW-TOTE-12')!
    const byKit = await list(`q=${prefix}&kitId=${big.id}&sort=number&dir=asc`)
    expect(byKit.items.map((o) => o.number)).toEqual([`${prefix}003`, `${prefix}006`, `${prefix}009`, `${prefix}012`])
    expect(byKit.items[0]).toMatchObject({ summary: '3 × MW-TOTE-12', units: 3, unmappedLines: 0, workOrderCount: 0 })
  })

  it('searches number, customer name and e-mail, any case, with % taken literally', async () => {
    expect((await list('q=juniper')).items.map((o) => o.number)).toEqual([`${prefix}007`])
    expect((await list('q=FERNBOX')).items.map((o) => o.number)).toEqual([`${prefix}007`])
    // Unescaped, "0%" would match every order with a 0 in it.
    expect((await list('q=0%25')).items.map((o) => o.number)).toEqual([`${prefix}008`])
    expect((await list(`q=${prefix.toLowerCase()}00`)).total).toBe(9)
  })

  it('refuses a bad query with what to fix', async () => {
    const sort = await planner.agent.get('/api/orders?sort=colour')
    expect(sort.status).toBe(400)
    expect(ApiErrorBodySchema.parse(sort.body).error.fields?.sort).toContain('Sort by one of')
    const range = await planner.agent.get('/api/orders?from=2026-05-01&to=2026-04-01')
    expect(range.status).toBe(400)
    expect(ApiErrorBodySchema.parse(range.body).error.message).toContain('swap them')
    expect((await planner.agent.get('/api/orders?pageSize=7')).status).toBe(400)
  })

  it('flags an order past its promised ship date as late', async () => {
    await postOrder(buildNewOrder({ number: 'LATE-1', promisedShipDate: '2020-01-10' }))
    const [row] = (await list('q=LATE-1')).items
    expect(row!.late).toBe(true)
    expect((await list(`q=${prefix}001`)).items[0]!.late).toBe(false)
  })
})

describe('a phone order and its detail', () => {
  it('creates a phone order (201) and shows lines, customer, ship-to and a timeline with who', async () => {
    const detail = await postOrder(
      buildNewOrder({
        number: 'PH-100',
        note: 'Leave at the side gate',
        lines: [
          { kitSku: 'mw-tote-12', quantity: 2, unitPriceCents: 18900 },
          { kitSku: 'MW-SPARE-CUP12', quantity: 1, unitPriceCents: 2400 },
        ],
      }),
    )
    expect(detail).toMatchObject({ number: 'PH-100', source: 'phone', status: 'open', units: 3, totalCents: 40200, note: 'Leave at the side gate' })
    expect(detail.lines.map((l) => [l.lineNo, l.kit?.sku, l.quantity])).toEqual([[1, 'MW-TOTE-12', 2], [2, 'MW-SPARE-CUP12', 1]])
    expect(detail.shipTo).toMatchObject({ line1: '27 Bramblecot Row', country: 'US' })
    expect(detail.events).toHaveLength(1)
    expect(detail.events[0]).toMatchObject({ kind: 'received', actorName: planner.user.name })
    const again = await planner.agent.get(`/api/orders/${detail.id}`)
    expect(OrderDetailSchema.parse(again.body)).toEqual(detail)
  })

  it('answers 409 naming the number when it is taken, and stores nothing new', async () => {
    const before = await t.db.$count(orders)
    const res = await planner.agent.post('/api/orders').send(buildNewOrder({ number: 'PH-100' }))
    expect(res.status).toBe(409)
    const body = ApiErrorBodySchema.parse(res.body)
    expect(body.error.fields).toEqual({ number: 'Already in use' })
    expect(body.error.message).toContain('PH-100 already exists')
    expect(await t.db.$count(orders)).toBe(before)
  })

  it('refuses a kit SKU that is no kit, and bad fields, saying which', async () => {
    const unknown = await planner.agent.post('/api/orders').send(buildNewOrder({ lines: [{ kitSku: 'MW-NOPE', quantity: 1, unitPriceCents: 1 }] }))
    expect(unknown.status).toBe(400)
    expect(ApiErrorBodySchema.parse(unknown.body).error.fields).toEqual({ 'lines.0.kitSku': 'No kit has the SKU MW-NOPE' })
    const bad = await planner.agent.post('/api/orders').send(buildNewOrder({ shipTo: { name: 'A', line1: 'B', city: 'C', postalCode: '1', country: 'USA' }, lines: [] }))
    expect(bad.status).toBe(400)
    const fields = ApiErrorBodySchema.parse(bad.body).error.fields!
    expect(fields['shipTo.country']).toContain('ISO 3166-1 alpha-2')
    expect(fields.lines).toBe('Add at least one line')
  })

  it('answers 404 for an order that does not exist', async () => {
    expect((await planner.agent.get('/api/orders/6f1c2a52-8d1e-4c55-9a55-0d1f6f3e2b11')).status).toBe(404)
  })
})

const HEADER = 'order_number,placed_at,customer_name,customer_email,ship_line1,ship_city,ship_postal_code,ship_country,kit_sku,store_product_id,quantity,unit_price'

describe('CSV import of orders', () => {
  it('previews row-numbered errors and imports nothing while any row is wrong', async () => {
    const csv = [
      HEADER,
      'CSV-1,2026-05-01,Hazel Stonebrook,hazel@leafmail.example,3 Thistle Lane,Oakmere,10001,US,MW-TOTE-12,,1,189.00',
      'CSV-1,2026-05-01,Hazel Stonebrook,hazel@leafmail.example,3 Thistle Lane,Oakmere,10001,US,MW-SPARE-SPR6,,2,12.50',
      'CSV-2,2026-05-02,Basil Wetherby,not-an-email,9 Copper Way,Oakmere,10002,US,MW-TOTE-6C,,one,129',
      'CSV-3,2026-05-03,Sorrel Pike,sorrel@leafmail.example,1 Mill Rd,Oakmere,10003,US,MW-GHOST,,1,5',
      'CSV-4,2026-05-04,Tansy Hale,tansy@leafmail.example,2 Mill Rd,Oakmere,10004,US,MW-TOTE-6C,,1,129',
      'CSV-4,2026-05-04,Tansy Hale,other@leafmail.example,2 Mill Rd,Oakmere,10004,US,MW-TOTE-6C,,1,129',
    ].join('\n')
    const res = await planner.agent.post('/api/orders/import/preview').send({ csv })
    expect(res.status).toBe(200)
    const preview = OrderImportPreviewSchema.parse(res.body)
    expect(preview.errors.map((e) => [e.row, e.column])).toEqual([
      [4, 'quantity'],
      [4, 'customer_email'],
      [5, 'kit_sku'],
      [7, 'customer_email'],
    ])
    expect(preview.errors[0]!.message).toContain('whole number')
    expect(preview.errors[3]!.message).toContain('differs from row 6')
    expect(preview.orders.find((o) => o.number === 'CSV-1')).toMatchObject({ action: 'create', rows: [2, 3], units: 3, totalCents: 18900 + 2500 })
    expect(preview.orders.find((o) => o.number === 'CSV-2')!.action).toBeNull()

    const imported = await planner.agent.post('/api/orders/import').send({ csv })
    expect(imported.status).toBe(400)
    const body = ApiErrorBodySchema.parse(imported.body)
    expect(body.error.message).toMatch(/^Nothing was imported: row 4: /)
    expect(body.error.fields?.['rows.5.kit_sku']).toContain('MW-GHOST')
    expect(await t.db.$count(orders, eq(orders.number, 'CSV-1'))).toBe(0)
  })

  it('imports a clean file once; importing it again skips every order', async () => {
    const csv = [
      HEADER + ',ship_name,promised_ship_date',
      'CSV-10,2026-05-10T08:00:00Z,Hazel Stonebrook,hazel@leafmail.example,3 Thistle Lane,Oakmere,10001,us,MW-TOTE-12,,1,189.00,,2026-05-24',
      'CSV-11,2026-05-11,Basil Wetherby,basil@leafmail.example,9 Copper Way,Oakmere,10002,US,,mw-store-2006,2,$12.50,Basil at work,',
      'CSV-10,2026-05-10T08:00:00Z,Hazel Stonebrook,hazel@leafmail.example,3 Thistle Lane,Oakmere,10001,us,,mw-store-7777,1,4.00,,2026-05-24',
    ].join('\r\n')
    const preview = OrderImportPreviewSchema.parse((await planner.agent.post('/api/orders/import/preview').send({ csv })).body)
    expect(preview).toMatchObject({ creates: 2, skips: 0, errors: [] })
    expect(preview.warnings).toEqual([{ row: 4, column: 'store_product_id', message: expect.stringContaining('mw-store-7777 maps to no kit') }])

    const first = await planner.agent.post('/api/orders/import').send({ csv })
    expect(first.status, JSON.stringify(first.body)).toBe(200)
    expect(OrderImportResultSchema.parse(first.body)).toEqual({ created: ['CSV-10', 'CSV-11'], skipped: [] })
    const [row] = (await list('q=CSV-10')).items
    expect(row).toMatchObject({ source: 'csv', summary: '1 × MW-TOTE-12, 1 × mw-store-7777', unmappedLines: 1, shipCountry: 'US', promisedShipDate: '2026-05-24' })
    const detail = OrderDetailSchema.parse((await planner.agent.get(`/api/orders/${row!.id}`)).body)
    expect(detail.events.map((e) => e.kind)).toEqual(['received', 'unmapped_line'])
    expect(detail.shipTo.name).toBe('Hazel Stonebrook')

    const second = await planner.agent.post('/api/orders/import').send({ csv })
    expect(OrderImportResultSchema.parse(second.body)).toEqual({ created: [], skipped: ['CSV-10', 'CSV-11'] })
    expect(await t.db.$count(orders, eq(orders.number, 'CSV-10'))).toBe(1)
  })

  it('refuses a file without the columns it needs, on row 1', async () => {
    const res = await planner.agent.post('/api/orders/import/preview').send({ csv: 'order_number,colour\nX,red' })
    const preview = OrderImportPreviewSchema.parse(res.body)
    expect(preview.errors.every((e) => e.row === 1)).toBe(true)
    expect(preview.errors.some((e) => e.message.startsWith('Unknown column "colour" (column 2); use order_number'))).toBe(true)
    expect(preview.errors.some((e) => e.message === 'The header needs a "placed_at" column')).toBe(true)
  })
})

describe('CSV export of orders', () => {
  it('neutralises cells a spreadsheet would run as formulas, and imports back as all skipped', async () => {
    await postOrder(buildNewOrder({ number: 'EXP-1', customer: { name: '=HYPERLINK("http://x.example","pay")', email: 'exp@leafmail.example' }, note: '+1 call first' }))
    await postOrder(buildNewOrder({
      number: 'EXP-2',
      customer: { name: '@SUM(A1)', email: 'exp2@leafmail.example' },
      shipTo: { name: '-Dock 4', line1: '5 Quay St', city: 'Eelmouth', postalCode: '02101', country: 'US' },
    }))
    const res = await admin.get('/api/orders/export.csv?q=EXP-&sort=number&dir=asc')
    expect(res.status).toBe(200)
    expect(res.headers['content-type']).toContain('text/csv')
    const text = res.text.replace(/^\uFEFF/, '')
    const parsed = Papa.parse<Record<string, string>>(text.trim(), { header: true })
    // OWASP, CSV Injection: cells starting with = + - @ get a leading single quote.
    expect(parsed.data.map((r) => [r.order_number, r.customer_name, r.note, r.ship_name])).toEqual([
      ['EXP-1', `'=HYPERLINK("http://x.example","pay")`, "'+1 call first", expect.any(String)],
      ['EXP-2', "'@SUM(A1)", '', "'-Dock 4"],
    ])
    expect(parsed.data[0]).toMatchObject({ kit_sku: 'MW-TOTE-6C', quantity: '1', unit_price: '129.00' })
    // States in the words shown on screen, the codes beside them for a program reading the file.
    expect(parsed.data[0]).toMatchObject({ status: 'Received', status_code: 'open', source: 'Phone or counter', source_code: 'phone', payment: 'Payment pending', payment_status: 'pending' })
    for (const row of parsed.data) for (const word of [row.status, row.source, row.payment]) expect(word).not.toMatch(/_|^[a-z]/)

    const back = await planner.agent.post('/api/orders/import').send({ csv: res.text })
    expect(back.status, JSON.stringify(back.body)).toBe(200)
    expect(OrderImportResultSchema.parse(back.body)).toEqual({ created: [], skipped: ['EXP-1', 'EXP-2'] })
  })
})

describe('who may see and enter orders', () => {
  it('lets admins and planners in and keeps the benches and strangers out', async () => {
    expect((await admin.get('/api/orders')).status).toBe(200)
    for (const role of ['cutter', 'assembler', 'packer'] as const) {
      const { agent } = await signedInAs(app, t, role)
      expect((await agent.get('/api/orders')).status).toBe(403)
      expect((await agent.post('/api/orders').send(buildNewOrder())).status).toBe(403)
    }
    expect((await request(app).get('/api/orders')).status).toBe(401)
  })
})
