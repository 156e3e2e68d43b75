import { createServer, type Server } from 'node:http'
import Papa from 'papaparse'
import request from 'supertest'
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest'
import { inches } from '@kitwright/shared/domain/units'
import { ApiErrorBodySchema } from '@kitwright/shared/errors'
import { PackingListPreviewSchema, StockLedgerSchema, StockMovesResultSchema, StockPageSchema, type StockRow } from '@kitwright/shared/stock'
import { eq } from 'drizzle-orm'
import { offcuts, stockMoves, type PartRow } from '../../server/src/db/schema/index'
import { DEMO_PART_SKUS, seedDemoParts } from '../../server/src/seeds/catalog'
import { seedDemoStock } from '../../server/src/seeds/stock'
import { buildApp, signedInAs } from '../support/app'
import { insertPart, TEST_PASSWORD } from '../support/factories'
import { createTestDb, type TestDb } from '../support/test-db'

let t: TestDb
let app: ReturnType<typeof buildApp>['app']
beforeAll(async () => {
  t = await createTestDb()
  app = buildApp(t).app
})
afterEach(() => t.truncate())
afterAll(() => t.drop())

const TEN_FT = inches(120)
const TWENTY_FT = inches(240)

function insertPipe(overrides: Partial<PartRow> = {}) {
  return insertPart(t.db, {
    kind: 'stock_length',
    unitOfMeasure: 'stick',
    nominalSize: '1/2',
    outsideDiameter: inches(0.84),
    stickLengths: [TEN_FT, TWENTY_FT],
    ...overrides,
  })
}

async function stockRowOf(agent: request.Agent, partId: string): Promise<StockRow> {
  const res = await agent.get('/api/stock/moves').query({ partId })
  expect(res.status).toBe(200)
  return StockLedgerSchema.parse(res.body).balance
}

async function ledgerSums(partId: string) {
  const moves = await t.db.select().from(stockMoves).where(eq(stockMoves.partId, partId))
  const onHandKinds = ['receive', 'adjust', 'consume', 'offcut_in', 'offcut_out', 'ship']
  return {
    onHand: moves.filter((m) => onHandKinds.includes(m.kind) && m.offcutId === null).reduce((s, m) => s + m.quantity, 0),
    reserved: moves.filter((m) => m.kind === 'reserve' || m.kind === 'release').reduce((s, m) => s + m.quantity, 0),
    moves,
  }
}

describe('balances derived from the ledger', () => {
  it('sums hand-worked moves into on-hand, reserved and available, per stick length for pipe, with offcuts apart', async () => {
    const { agent, user } = await signedInAs(app, t, 'planner')
    const sprayer = await insertPart(t.db, { sku: 'SPR-T', name: 'Test sprayer', reorderPoint: 30, shelfLocation: 'A2-01' })
    const pipe = await insertPipe({ sku: 'PVC-T', reorderPoint: 10 })
    // Hardware, worked by hand: received 40 + 10, 3 damaged, 4 consumed → on hand 43;
    // reserved 12, 5 released → reserved 7; available 43 − 7 = 36, above the reorder point of 30.
    expect((await agent.post('/api/stock/receive').send({ lines: [{ partId: sprayer.id, quantity: 40, reference: 'PL-1001' }, { sku: 'spr-t', quantity: 10 }] })).status).toBe(201)
    expect((await agent.post('/api/stock/adjust').send({ partId: sprayer.id, quantity: -3, reason: 'Damaged' })).status).toBe(201)
    expect((await agent.post('/api/stock/reserve').send({ lines: [{ partId: sprayer.id, quantity: 12 }] })).status).toBe(201)
    expect((await agent.post('/api/stock/release').send({ lines: [{ partId: sprayer.id, quantity: 5 }] })).status).toBe(201)
    await t.db.insert(stockMoves).values({ partId: sprayer.id, kind: 'consume', quantity: -4, createdBy: user.id })

    // Pipe: 30 ten-foot and 5 twenty-foot sticks received, 4 ten-foot reserved;
    // one 30 in offcut kept, one 18 in offcut kept then used → offcuts: 1, 30 in.
    expect(
      (await agent.post('/api/stock/receive').send({ lines: [{ partId: pipe.id, quantity: 30, stickLength: TEN_FT }, { partId: pipe.id, quantity: 5, stickLength: TWENTY_FT }] })).status,
    ).toBe(201)
    expect((await agent.post('/api/stock/reserve').send({ lines: [{ partId: pipe.id, quantity: 4, stickLength: TEN_FT }] })).status).toBe(201)
    const [kept, used] = await t.db.insert(offcuts).values([{ partId: pipe.id, length: inches(30) }, { partId: pipe.id, length: inches(18) }]).returning()
    await t.db.insert(stockMoves).values([
      { partId: pipe.id, kind: 'offcut_in', quantity: 1, offcutId: kept!.id },
      { partId: pipe.id, kind: 'offcut_in', quantity: 1, offcutId: used!.id },
      { partId: pipe.id, kind: 'offcut_out', quantity: -1, offcutId: used!.id },
    ])

    const res = await agent.get('/api/stock')
    expect(res.status).toBe(200)
    const page = StockPageSchema.parse(res.body)
    expect(page.total).toBe(2)
    const s = page.items.find((r) => r.partId === sprayer.id)!
    expect(s).toMatchObject({ onHand: 43, reserved: 7, available: 36, reorderPoint: 30, low: false, shelfLocation: 'A2-01', sticks: [], offcuts: { count: 0, totalLength: 0 } })
    const p = page.items.find((r) => r.partId === pipe.id)!
    expect(p).toMatchObject({ onHand: 35, reserved: 4, available: 31, low: false, offcuts: { count: 1, totalLength: inches(30) } })
    expect(p.sticks).toEqual([
      { stickLength: TEN_FT, onHand: 30, reserved: 4, available: 26 },
      { stickLength: TWENTY_FT, onHand: 5, reserved: 0, available: 5 },
    ])
    // The same figures, summed straight from the table.
    expect(await ledgerSums(sprayer.id)).toMatchObject({ onHand: 43, reserved: 7 })
  })

  it('marks a part low when available is at or below its reorder point, and filters, searches, sorts and pages on the server', async () => {
    const { agent } = await signedInAs(app, t, 'planner')
    const a = await insertPart(t.db, { sku: 'AAA-1', name: 'Net cup', reorderPoint: 10 })
    const b = await insertPart(t.db, { sku: 'BBB-1', name: 'Foam collar', reorderPoint: 10 })
    const c = await insertPart(t.db, { sku: 'CCC-1', name: 'Carton', kind: 'packaging', reorderPoint: 5 })
    await agent.post('/api/stock/receive').send({ lines: [{ partId: a.id, quantity: 12 }, { partId: b.id, quantity: 10 }, { partId: c.id, quantity: 50 }] })
    await agent.post('/api/stock/reserve').send({ lines: [{ partId: a.id, quantity: 3 }] }) // available 9 ≤ 10: low
    const all = StockPageSchema.parse((await agent.get('/api/stock').query({ sort: 'available', dir: 'desc' })).body)
    expect(all.items.map((r) => [r.sku, r.available, r.low])).toEqual([
      ['CCC-1', 50, false],
      ['BBB-1', 10, true], // exactly at the reorder point counts as low
      ['AAA-1', 9, true],
    ])
    const low = StockPageSchema.parse((await agent.get('/api/stock').query({ lowOnly: 'true' })).body)
    expect(low.items.map((r) => r.sku)).toEqual(['AAA-1', 'BBB-1'])
    const packaging = StockPageSchema.parse((await agent.get('/api/stock').query({ kind: 'packaging' })).body)
    expect(packaging.items.map((r) => r.sku)).toEqual(['CCC-1'])
    const search = StockPageSchema.parse((await agent.get('/api/stock').query({ q: 'collar' })).body)
    expect(search.items.map((r) => r.sku)).toEqual(['BBB-1'])
    const paged = StockPageSchema.parse((await agent.get('/api/stock').query({ pageSize: 10, page: 1 })).body)
    expect(paged.total).toBe(3)
    const bad = await agent.get('/api/stock').query({ pageSize: 7, sort: 'price' })
    expect(bad.status).toBe(400)
    expect(Object.keys(ApiErrorBodySchema.parse(bad.body).error.fields ?? {}).sort()).toEqual(['pageSize', 'sort'])
  })
})

describe('receiving', () => {
  it('checks the stick length of pipe against the lengths it is bought in, and saves no line of a refused receipt', async () => {
    const { agent } = await signedInAs(app, t, 'planner')
    const pipe = await insertPipe({ sku: 'PVC-R', name: 'Half-inch pipe' })
    const cup = await insertPart(t.db, { sku: 'CUP-R' })
    const noLength = await agent.post('/api/stock/receive').send({ lines: [{ partId: cup.id, quantity: 5 }, { partId: pipe.id, quantity: 5 }] })
    expect(noLength.status).toBe(400)
    const e1 = ApiErrorBodySchema.parse(noLength.body).error
    expect(e1.message).toBe('Line 2: PVC-R Half-inch pipe is pipe, kept by the stick: give the stick length (10 ft, 20 ft)')
    expect(e1.fields).toHaveProperty(['lines.1.stickLength'])
    const wrong = await agent.post('/api/stock/receive').send({ lines: [{ partId: pipe.id, quantity: 5, stickLength: inches(144) }] })
    expect(wrong.status).toBe(400)
    expect(ApiErrorBodySchema.parse(wrong.body).error.message).toMatch(/not bought in 12 ft sticks: use one of 10 ft, 20 ft/)
    const onHardware = await agent.post('/api/stock/receive').send({ lines: [{ partId: cup.id, quantity: 5, stickLength: TEN_FT }] })
    expect(ApiErrorBodySchema.parse(onHardware.body).error.message).toMatch(/is not pipe: leave the stick length empty/)
    const unknown = await agent.post('/api/stock/receive').send({ lines: [{ sku: 'NOPE-1', quantity: 1 }] })
    expect(unknown.status).toBe(400)
    expect(ApiErrorBodySchema.parse(unknown.body).error.fields).toEqual({ 'lines.0.sku': 'No part with SKU NOPE-1' })
    const zero = await agent.post('/api/stock/receive').send({ lines: [{ partId: cup.id, quantity: 0 }] })
    expect(ApiErrorBodySchema.parse(zero.body).error.fields).toEqual({ 'lines.0.quantity': 'Must be at least 1' })
    expect(await t.db.select().from(stockMoves)).toEqual([])

    const ok = await agent.post('/api/stock/receive').send({ lines: [{ partId: pipe.id, quantity: 12, stickLength: TWENTY_FT, reference: 'PL-77' }] })
    expect(ok.status).toBe(201)
    const [move] = StockMovesResultSchema.parse(ok.body).moves
    expect(move).toMatchObject({ kind: 'receive', quantity: 12, stickLength: TWENTY_FT, reference: 'PL-77' })
    expect((await stockRowOf(agent, pipe.id)).sticks).toEqual([
      { stickLength: TEN_FT, onHand: 0, reserved: 0, available: 0 },
      { stickLength: TWENTY_FT, onHand: 12, reserved: 0, available: 12 },
    ])
  })
})

describe('adjusting', () => {
  it('requires a reason', async () => {
    const { agent } = await signedInAs(app, t, 'admin')
    const part = await insertPart(t.db)
    for (const body of [{ partId: part.id, quantity: 2 }, { partId: part.id, quantity: 2, reason: '  ' }]) {
      const res = await agent.post('/api/stock/adjust').send(body)
      expect(res.status).toBe(400)
      expect(ApiErrorBodySchema.parse(res.body).error.fields?.reason).toMatch(/Say why the stock changes/)
    }
    expect(await t.db.select().from(stockMoves)).toEqual([])
  })

  it('refuses to take on-hand below zero or below what is reserved, and says by how much it could', async () => {
    const { agent } = await signedInAs(app, t, 'planner')
    const part = await insertPart(t.db, { sku: 'GRM-A', name: 'Grommet' })
    await agent.post('/api/stock/receive').send({ lines: [{ partId: part.id, quantity: 5 }] })
    const below = await agent.post('/api/stock/adjust').send({ partId: part.id, quantity: -6, reason: 'Count correction' })
    expect(below.status).toBe(409)
    expect(ApiErrorBodySchema.parse(below.body).error.message).toBe('Cannot take 6 off GRM-A Grommet: only 5 on hand. Count again, or adjust by at most -5.')
    await agent.post('/api/stock/reserve').send({ lines: [{ partId: part.id, quantity: 4 }] })
    const reserved = await agent.post('/api/stock/adjust').send({ partId: part.id, quantity: -2, reason: 'Damaged' })
    expect(reserved.status).toBe(409)
    expect(ApiErrorBodySchema.parse(reserved.body).error.message).toMatch(/4 are reserved for work orders and only 1 could go\. Release the reservation first/)
    const fine = await agent.post('/api/stock/adjust').send({ partId: part.id, quantity: -1, reason: 'Damaged' })
    expect(fine.status).toBe(201)
    expect(await stockRowOf(agent, part.id)).toMatchObject({ onHand: 4, reserved: 4, available: 0 })
    const found = await agent.post('/api/stock/adjust').send({ partId: part.id, quantity: 3, reason: 'Found stock' })
    expect(found.status).toBe(201)
    expect(await ledgerSums(part.id)).toMatchObject({ onHand: 7, reserved: 4 })
  })
})

describe('the ledger of one part', () => {
  it('lists moves newest first with who made each, and its running balances explain the balance', async () => {
    const { agent, user } = await signedInAs(app, t, 'planner')
    const part = await insertPart(t.db)
    await agent.post('/api/stock/receive').send({ lines: [{ partId: part.id, quantity: 20, reference: 'PL-5' }] })
    await agent.post('/api/stock/adjust').send({ partId: part.id, quantity: -2, reason: 'Count correction' })
    await agent.post('/api/stock/reserve').send({ lines: [{ partId: part.id, quantity: 6 }] })
    await agent.post('/api/stock/release').send({ lines: [{ partId: part.id, quantity: 1 }] })
    const res = await agent.get('/api/stock/moves').query({ partId: part.id })
    expect(res.status).toBe(200)
    const ledger = StockLedgerSchema.parse(res.body)
    expect(ledger.moves.map((m) => [m.kind, m.quantity, m.onHandAfter, m.reservedAfter])).toEqual([
      ['release', -1, 18, 5],
      ['reserve', 6, 18, 6],
      ['adjust', -2, 18, 0],
      ['receive', 20, 20, 0],
    ])
    expect(ledger.moves.every((m) => m.createdBy?.name === user.name)).toBe(true)
    expect(ledger.moves[2]!.reason).toBe('Count correction')
    expect(ledger.moves[3]!.reference).toBe('PL-5')
    expect(ledger.totalMoves).toBe(4)
    // The balance is the sum of the moves listed.
    const onHand = ledger.moves.filter((m) => !['reserve', 'release'].includes(m.kind)).reduce((s, m) => s + m.quantity, 0)
    const reserved = ledger.moves.filter((m) => ['reserve', 'release'].includes(m.kind)).reduce((s, m) => s + m.quantity, 0)
    expect(ledger.balance).toMatchObject({ onHand, reserved, available: onHand - reserved })
    expect(ledger.balance).toMatchObject({ onHand: 18, reserved: 5, available: 13 })
    expect((await agent.get('/api/stock/moves').query({ partId: '6f1c2a52-8d1e-4c55-9a55-0d1f6f3e2b11' })).status).toBe(404)
  })
})

describe('supplier packing lists (CSV)', () => {
  const header = 'SKU,Qty,Stick length,Reference,Description'

  it('previews every row with its row number and problems, and applies all rows or none', async () => {
    const { agent } = await signedInAs(app, t, 'planner')
    const pipe = await insertPipe({ sku: 'PVC-C', name: 'Pipe' })
    const cup = await insertPart(t.db, { sku: 'CUP-C', name: 'Cup' })
    const bad = [header, 'CUP-C,100,,PL-9,net cups', 'PVC-C,20,10 ft,PL-9,pipe', '', 'PVC-C,4,12 ft,,pipe', 'NOPE-9,1,,,x', 'CUP-C,two,,,y', 'PVC-C,3,ten feet,,z'].join('\n')
    const preview = await agent.post('/api/stock/receive/preview').send({ csv: bad })
    expect(preview.status).toBe(200)
    const p = PackingListPreviewSchema.parse(preview.body)
    expect(p.ok).toBe(false)
    expect(p.rows.map((r) => r.row)).toEqual([2, 3, 5, 6, 7, 8]) // the blank line 4 is skipped, numbering kept
    expect(p.rows[1]).toMatchObject({ partId: pipe.id, quantity: 20, stickLength: TEN_FT, reference: 'PL-9', errors: [] })
    expect(p.errors).toEqual([
      'Row 5: PVC-C Pipe is not bought in 12 ft sticks: use one of 10 ft, 20 ft',
      'Row 6: No part with SKU NOPE-9: add the part first or correct the SKU',
      'Row 7: The quantity must be a whole number of at least 1 (found "two")',
      expect.stringMatching(/^Row 8: Stick length "ten feet": /),
    ])
    const refused = await agent.post('/api/stock/receive/csv').send({ csv: bad })
    expect(refused.status).toBe(400)
    const err = ApiErrorBodySchema.parse(refused.body).error
    expect(err.message).toMatch(/^Nothing was received: the packing list has 4 problems\. Row 5: /)
    expect(Object.keys(err.fields ?? {})).toEqual(['rows.5', 'rows.6', 'rows.7', 'rows.8'])
    expect(await t.db.select().from(stockMoves)).toEqual([]) // all or nothing: rows 2 and 3 were fine, yet not saved

    const good = [header, 'CUP-C,100,,PL-9,net cups', 'pvc-c,20,10 ft,,pipe', 'PVC-C,2,240,,pipe in inches'].join('\r\n')
    const applied = await agent.post('/api/stock/receive/csv').send({ csv: good, defaultReference: 'PL-10' })
    expect(applied.status).toBe(201)
    const moves = StockMovesResultSchema.parse(applied.body).moves
    expect(moves.map((m) => [m.quantity, m.stickLength, m.reference])).toEqual([
      [100, null, 'PL-9'],
      [20, TEN_FT, 'PL-10'],
      [2, TWENTY_FT, 'PL-10'], // a bare number is read in the shop's unit (inches when unset)
    ])
    expect(await stockRowOf(agent, cup.id)).toMatchObject({ onHand: 100 })
    expect(await stockRowOf(agent, pipe.id)).toMatchObject({ onHand: 22 })
  })

  it('says which columns are missing', async () => {
    const { agent } = await signedInAs(app, t, 'planner')
    const res = await agent.post('/api/stock/receive/preview').send({ csv: 'part number,count\nX,1\n' })
    const p = PackingListPreviewSchema.parse(res.body)
    expect(p.fileErrors).toEqual([
      'The packing list needs a header row with a "sku" column (found: part_number, count). Columns: sku, quantity, stick_length, reference.',
      'The packing list needs a header row with a "quantity" column (found: part_number, count). Columns: sku, quantity, stick_length, reference.',
    ])
    expect(p.ok).toBe(false)
  })
})

describe('CSV export', () => {
  it('exports the filtered rows and neutralises cells a spreadsheet would run as formulas', async () => {
    // OWASP "CSV Injection": cells starting with = + - @ tab or CR get a leading apostrophe.
    const { agent } = await signedInAs(app, t, 'cutter')
    await insertPart(t.db, { sku: 'EVIL-1', name: '=HYPERLINK("http://bad.example","open")', shelfLocation: '+A1', reorderPoint: 4 })
    await insertPart(t.db, { sku: 'EVIL-2', name: '@SUM(1+1)', shelfLocation: '-2' })
    await insertPart(t.db, { sku: 'EVIL-3', name: '\tTabbed', shelfLocation: '\rCR' })
    await insertPart(t.db, { sku: 'PLAIN-1', name: 'Plain - name', kind: 'packaging' })
    const res = await agent.get('/api/stock/export.csv').query({ kind: 'hardware' })
    expect(res.status).toBe(200)
    expect(res.headers['content-type']).toMatch(/^text\/csv/)
    expect(res.headers['content-disposition']).toMatch(/^attachment; filename="?stock-\d{4}-\d{2}-\d{2}\.csv"?$/)
    const parsed = Papa.parse<string[]>(res.text.replace(/^\ufeff/, ''), { skipEmptyLines: true })
    const [head, ...rows] = parsed.data
    expect(head!.slice(0, 8)).toEqual(['SKU', 'Name', 'Kind', 'Shelf', 'Unit', 'On hand', 'Reserved', 'Available'])
    expect(rows.map((r) => [r[0], r[1], r[3], r[10]])).toEqual([
      ['EVIL-1', `'=HYPERLINK("http://bad.example","open")`, "'+A1", 'yes'],
      ['EVIL-2', "'@SUM(1+1)", "'-2", 'yes'],
      ['EVIL-3', "'\tTabbed", "'\rCR", 'yes'],
    ])
  })
})

describe('access', () => {
  it('lets every signed-in role read stock, only admin and planner change it, and nobody signed out', async () => {
    const part = await insertPart(t.db)
    for (const role of ['cutter', 'assembler', 'packer'] as const) {
      const { agent } = await signedInAs(app, t, role)
      expect((await agent.get('/api/stock')).status).toBe(200)
      expect((await agent.get('/api/stock/moves').query({ partId: part.id })).status).toBe(200)
      expect((await agent.post('/api/stock/receive').send({ lines: [{ partId: part.id, quantity: 1 }] })).status).toBe(403)
      expect((await agent.post('/api/stock/adjust').send({ partId: part.id, quantity: 1, reason: 'Found stock' })).status).toBe(403)
      expect((await agent.post('/api/stock/reserve').send({ lines: [{ partId: part.id, quantity: 1 }] })).status).toBe(403)
    }
    expect((await request(app).get('/api/stock')).status).toBe(401)
    expect((await request(app).get('/api/stock/export.csv')).status).toBe(401)
    expect(await t.db.select().from(stockMoves)).toEqual([])
  })
})

describe('reservations under concurrency', () => {
  let server: Server
  beforeAll(async () => {
    server = createServer(app)
    await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve))
  })
  afterAll(() => new Promise<void>((resolve) => server.close(() => resolve())))

  it('fires 50 reservations of 1 at a part with 20 available: exactly 20 succeed, 30 get 409, available ends at 0', async () => {
    const { agent: signIn, user } = await signedInAs(app, t, 'planner')
    const part = await insertPart(t.db, { sku: 'PMP-C', name: 'Pump' })
    await signIn.post('/api/stock/receive').send({ lines: [{ partId: part.id, quantity: 20 }] })
    // One listening server and one signed-in agent, so the 50 requests really overlap.
    const agent = request.agent(server)
    expect((await agent.post('/api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD })).status).toBe(200)
    const results = await Promise.all(
      Array.from({ length: 50 }, () => agent.post('/api/stock/reserve').send({ lines: [{ partId: part.id, quantity: 1 }] })),
    )
    const statuses = results.map((r) => r.status)
    expect(statuses.filter((s) => s === 201)).toHaveLength(20)
    expect(statuses.filter((s) => s === 409)).toHaveLength(30)
    for (const r of results.filter((x) => x.status === 409)) {
      expect(ApiErrorBodySchema.parse(r.body).error.message).toBe('Not enough stock to reserve: PMP-C Pump: wanted 1, available 0')
    }
    // Read the ledger back: 20 reserve moves of 1, never more reserved than on hand.
    const { onHand, reserved, moves } = await ledgerSums(part.id)
    expect(moves.filter((m) => m.kind === 'reserve')).toHaveLength(20)
    expect({ onHand, reserved, available: onHand - reserved }).toEqual({ onHand: 20, reserved: 20, available: 0 })
    expect(await stockRowOf(signIn, part.id)).toMatchObject({ onHand: 20, reserved: 20, available: 0 })
  })

  it('locks parts in one order, so reservations naming two parts in opposite orders neither deadlock nor oversell', async () => {
    const { agent } = await signedInAs(app, t, 'planner')
    const a = await insertPart(t.db)
    const b = await insertPart(t.db)
    await agent.post('/api/stock/receive').send({ lines: [{ partId: a.id, quantity: 10 }, { partId: b.id, quantity: 10 }] })
    const results = await Promise.all(
      Array.from({ length: 16 }, (_, i) =>
        agent.post('/api/stock/reserve').send({ lines: i % 2 ? [{ partId: a.id, quantity: 1 }, { partId: b.id, quantity: 1 }] : [{ partId: b.id, quantity: 1 }, { partId: a.id, quantity: 1 }] }),
      ),
    )
    expect(results.map((r) => r.status).sort()).toEqual([...Array(10).fill(201), ...Array(6).fill(409)])
    expect(await ledgerSums(a.id)).toMatchObject({ onHand: 10, reserved: 10 })
    expect(await ledgerSums(b.id)).toMatchObject({ onHand: 10, reserved: 10 })
  })

  it('releases what a work order holds, and refuses to release more than is held', async () => {
    const { agent } = await signedInAs(app, t, 'planner')
    const part = await insertPart(t.db, { sku: 'TEE-W', name: 'Tee' })
    const workOrderId = '3b0c7f0e-58a4-4a38-9d2b-6f7a3c1d2e4f'
    await agent.post('/api/stock/receive').send({ lines: [{ partId: part.id, quantity: 10 }] })
    expect((await agent.post('/api/stock/reserve').send({ workOrderId, lines: [{ partId: part.id, quantity: 4 }] })).status).toBe(201)
    expect((await agent.post('/api/stock/reserve').send({ lines: [{ partId: part.id, quantity: 2 }] })).status).toBe(201)
    const tooMuch = await agent.post('/api/stock/release').send({ lines: [{ partId: part.id, quantity: 3 }] })
    expect(tooMuch.status).toBe(409)
    expect(ApiErrorBodySchema.parse(tooMuch.body).error.message).toBe('Cannot release more than is reserved: TEE-W Tee: release 3, but the manual holds have only 2')
    const all = await agent.post('/api/stock/release').send({ workOrderId })
    expect(all.status).toBe(201)
    expect(StockMovesResultSchema.parse(all.body).moves.map((m) => [m.kind, m.quantity, m.workOrderId])).toEqual([['release', -4, workOrderId]])
    expect(await stockRowOf(agent, part.id)).toMatchObject({ onHand: 10, reserved: 2, available: 8 })
  })
})

describe('demo stock', () => {
  it('receives opening stock once, leaving the pump and the primer low and the rest above their reorder points', async () => {
    const { agent } = await signedInAs(app, t, 'planner')
    await seedDemoParts(t.db)
    await seedDemoStock(t.db)
    const count = (await t.db.select().from(stockMoves)).length
    await seedDemoStock(t.db)
    expect(await t.db.select().from(stockMoves)).toHaveLength(count) // idempotent
    const page = StockPageSchema.parse((await agent.get('/api/stock').query({ pageSize: 100 })).body)
    expect(page.items.filter((r) => r.low).map((r) => r.sku).sort()).toEqual([DEMO_PART_SKUS.primer, DEMO_PART_SKUS.pump].sort())
    const pipe = page.items.find((r) => r.sku === DEMO_PART_SKUS.pipeHalfInch)!
    expect(pipe.sticks.map((s) => [s.stickLength, s.onHand])).toEqual([[TEN_FT, 40], [TWENTY_FT, 12]])
    expect(page.items.find((r) => r.sku === DEMO_PART_SKUS.collar)).toMatchObject({ onHand: 988 })
  })
})
