import { execFileSync } from 'node:child_process'
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { and, eq, sql } from 'drizzle-orm'
import { simpleParser, type ParsedMail } from 'mailparser'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ApiErrorBodySchema } from '@kitwright/shared/errors'
import { MailMessageSchema } from '@kitwright/shared/mail'
import { DraftFromShortagesResultSchema, PurchaseOrderSchema, SupplierSchema, type PurchaseOrder } from '@kitwright/shared/purchasing'
import { ShortagesSchema } from '@kitwright/shared/work-orders'
import { DEMO_SHOP_NAME, seedDemo } from '../../server/src/seeds/demo'
import { mailMessages, parts, purchaseOrderLines, purchaseOrders, stockMoves, supplierParts, suppliers } from '../../server/src/db/schema/index'
import { startWorkers } from '../../server/src/workers'
import { buildApp, signedInAs } from '../support/app'
import { insertPart } from '../support/factories'
import { waitForQueueIdle } from '../support/queue'
import { waitFor } from '../support/store-webhook'
import { createTestDb, type TestDb } from '../support/test-db'

let t: TestDb
let built: ReturnType<typeof buildApp>
let planner: Awaited<ReturnType<typeof signedInAs>>['agent']
let planner2: Awaited<ReturnType<typeof signedInAs>>['agent']

beforeAll(async () => {
  t = await createTestDb()
  await seedDemo(t.db)
  built = buildApp(t)
  await startWorkers(built.deps)
  planner = (await signedInAs(built.app, t, 'planner')).agent
  planner2 = (await signedInAs(built.app, t, 'planner')).agent
})
afterAll(() => t.drop())

function pdfText(bytes: Buffer): string {
  const dir = mkdtempSync(path.join(tmpdir(), 'kw-po-'))
  try {
    writeFileSync(path.join(dir, 'po.pdf'), bytes)
    return execFileSync('pdftotext', ['-layout', path.join(dir, 'po.pdf'), '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ')
  } finally {
    rmSync(dir, { recursive: true, force: true })
  }
}

async function caught(dir: string, to: string): Promise<ParsedMail[]> {
  const files = readdirSync(dir).filter((f) => f.endsWith('.eml'))
  const parsed = await Promise.all(files.map((f) => simpleParser(readFileSync(path.join(dir, f)))))
  return parsed.filter((m) => (Array.isArray(m.to) ? m.to : m.to ? [m.to] : []).some((a) => a.value.some((v) => v.address === to)))
}

async function counts() {
  return {
    moves: await t.db.$count(stockMoves),
    suppliers: await t.db.$count(suppliers),
    supplierParts: await t.db.$count(supplierParts),
    lines: await t.db.select({
      id: purchaseOrderLines.id,
      quantity: purchaseOrderLines.quantity,
      price: purchaseOrderLines.unitPriceCents,
      received: purchaseOrderLines.received,
    }).from(purchaseOrderLines).orderBy(purchaseOrderLines.id),
  }
}

/** A supplier with one part it sells: the part has `onHand` in stock at `costCents`, a reorder point and a reorder quantity of 7. */
async function supplierWithPart(name: string, email: string, onHand: number, costCents: number, reorderPoint = 10) {
  const res = await planner.post('/api/suppliers').send({ name, contactName: 'Wren Halloway', email, phone: '+1 555 0100', leadTimeDays: 9, minimumOrderCents: 12000 })
  expect(res.status, JSON.stringify(res.body)).toBe(201)
  const supplier = SupplierSchema.parse(res.body)
  const part = await insertPart(t.db, { name: `Test float valve for ${name}`, unitCostCents: costCents, reorderPoint, reorderQuantity: 7 })
  if (onHand > 0) await t.db.insert(stockMoves).values({ partId: part.id, kind: 'receive', quantity: onHand })
  const sp = await planner.put(`/api/suppliers/${supplier.id}/parts/${part.id}`).send({
    supplierSku: 'FV-77',
    packSize: 5,
    priceBreaks: [
      { minQuantity: 1, unitPriceCents: 1000 },
      { minQuantity: 10, unitPriceCents: 900 },
    ],
  })
  expect(sp.status, JSON.stringify(sp.body)).toBe(200)
  expect(SupplierSchema.parse(sp.body).parts).toEqual([expect.objectContaining({ partId: part.id, packSize: 5, preferred: true })])
  return { supplier, part }
}

describe('suppliers', () => {
  it('refuses a negative price break and a bad e-mail with what to fix, and writes nothing', async () => {
    const { supplier, part } = await supplierWithPart('Quillfeather Valve Co.', 'orders@quillfeather.example', 0, 500)
    const before = await counts()
    const res = await planner.put(`/api/suppliers/${supplier.id}/parts/${part.id}`).send({ supplierSku: 'X', packSize: 1, priceBreaks: [{ minQuantity: 1, unitPriceCents: -5 }] })
    expect(res.status).toBe(400)
    const body = ApiErrorBodySchema.parse(res.body)
    expect(body.error.fields?.['priceBreaks.0.unitPriceCents']).toBe('A price cannot be negative: enter 0 or more')
    const bad = await planner.post('/api/suppliers').send({ name: 'Nameless', email: 'not an address' })
    expect(bad.status).toBe(400)
    expect(ApiErrorBodySchema.parse(bad.body).error.fields?.email).toMatch(/orders@supplier\.example/)
    const dup = await planner.post('/api/suppliers').send({ name: 'quillfeather valve co.' })
    expect(dup.status).toBe(409)
    const after = await counts()
    expect(after).toEqual(before)
    const [stored] = await t.db.select().from(supplierParts).where(eq(supplierParts.partId, part.id))
    expect(stored!.priceBreaks).toEqual([
      { minQuantity: 1, unitPriceCents: 1000 },
      { minQuantity: 10, unitPriceCents: 900 },
    ])
  })

  it("links a part to the supplier its supplier name stands for, whatever the case, and unlinks it for a name of no supplier", async () => {
    const { supplier, part } = await supplierWithPart('Pennywhistle Fittings', 'orders@pennywhistle.example', 0, 500)
    const stored = async () => (await t.db.select().from(parts).where(eq(parts.id, part.id)))[0]!
    // Saving what the supplier sells made them the part's supplier, with their name.
    expect(await stored()).toMatchObject({ supplierId: supplier.id, supplier: 'Pennywhistle Fittings' })
    expect((await planner.patch(`/api/parts/${part.id}`).send({ supplier: 'Somebody Else Ltd' })).status).toBe(200)
    expect(await stored()).toMatchObject({ supplierId: null, supplier: 'Somebody Else Ltd' })
    expect((await planner.patch(`/api/parts/${part.id}`).send({ supplier: 'PENNYWHISTLE fittings' })).status).toBe(200)
    expect((await stored()).supplierId).toBe(supplier.id)
  })

  it('made the demo suppliers from the names the demo parts carried', async () => {
    const res = await planner.get('/api/suppliers')
    const list = SupplierSchema.array().parse(res.body)
    const pumps = list.find((s) => s.name === 'Brightwater Pumpworks')!
    expect(pumps.email).toMatch(/\.example$/)
    expect(pumps.parts.map((p) => p.sku)).toContain('PMP-400-GPH')
    const linked = await t.db.select({ n: sql<number>`count(*)::int` }).from(parts).where(sql`${parts.supplier} is not null and ${parts.supplierId} is null`)
    expect(linked[0]!.n).toBe(0)
  })
})

describe('purchase orders from shortages to receipt', () => {
  let po: PurchaseOrder
  let partId: string

  it('drafts one order per supplier, rounded to packs and the minimum order, priced by the breaks', async () => {
    const { supplier, part } = await supplierWithPart('Marrowby Valve Works', 'orders@marrowby.example', 4, 1000, 30)
    partId = part.id
    const res = await planner.post('/api/purchase-orders/from-shortages')
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    const result = DraftFromShortagesResultSchema.parse(res.body)
    po = result.created.find((p) => p.supplier.id === supplier.id)!
    // By hand: 4 free ≤ reorder point 30, so the suggestion is the reorder quantity, 7.
    // Packs of 5: 7 → 10 (2 packs); 10 reaches the 10+ break: 10 × $9.00 = $90.00, under the $120.00
    // minimum; one more pack: 15 × $9.00 = $135.00 ≥ $120.00.
    expect(po.status).toBe('draft')
    expect(po.lines).toEqual([expect.objectContaining({ partId: part.id, quantity: 15, unitPriceCents: 900, supplierSku: 'FV-77', received: 0 })])
    expect(po.totalCents).toBe(13500)
    // Each supplier at most once; a second tap finds the parts on drafts and makes nothing new.
    expect(new Set(result.created.map((p) => p.supplier.id)).size).toBe(result.created.length)
    const again = DraftFromShortagesResultSchema.parse((await planner.post('/api/purchase-orders/from-shortages')).body)
    expect(again.created).toEqual([])
    expect(again.skipped).toContainEqual({ sku: part.sku, reason: `Already on draft ${po.number}` })
  })

  it('edits a draft; a negative price is refused and changes nothing', async () => {
    const before = await counts()
    const bad = await planner.put(`/api/purchase-orders/${po.id}`).send({ expectedDate: '2099-01-15', note: null, lines: [{ partId, quantity: 20, unitPriceCents: -1 }] })
    expect(bad.status).toBe(400)
    expect(ApiErrorBodySchema.parse(bad.body).error.fields?.['lines.0.unitPriceCents']).toBe('A price cannot be negative: enter 0 or more')
    expect(await counts()).toEqual(before)
    const res = await planner.put(`/api/purchase-orders/${po.id}`).send({ expectedDate: '2099-01-15', note: 'Deliver to the back door.', lines: [{ partId, quantity: 20, unitPriceCents: 880 }] })
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    po = PurchaseOrderSchema.parse(res.body)
    expect(po).toMatchObject({ expectedDate: '2099-01-15', totalCents: 17600 })
  })

  it('prints the order as a PDF with the shop, the supplier, the lines and the total', async () => {
    const res = await planner.get(`/api/purchase-orders/${po.id}/pdf`).buffer(true).parse((r, cb) => {
      const chunks: Buffer[] = []
      r.on('data', (c: Buffer) => chunks.push(c))
      r.on('end', () => cb(null, Buffer.concat(chunks)))
    })
    expect(res.status).toBe(200)
    expect(res.headers['content-type']).toBe('application/pdf')
    const text = pdfText(res.body as Buffer)
    expect(text).toContain(DEMO_SHOP_NAME)
    expect(text).toContain(`Purchase order ${po.number}`)
    expect(text).toContain('Marrowby Valve Works')
    expect(text).toContain('orders@marrowby.example')
    expect(text).toContain('Wanted by 2099-01-15')
    // 20 × $8.80 = $176.00
    expect(text).toMatch(/FV-77 .* 20 \$8\.80 \$176\.00/)
    expect(text).toContain('Total $176.00')
  })

  it('is not on order while a draft; sending it e-mails the PDF once and counts it on order', async () => {
    const draftRow = ShortagesSchema.parse((await planner.get('/api/shortages?only=all')).body).rows.find((r) => r.partId === partId)!
    expect(draftRow).toMatchObject({ onOrder: 0, onOrderPurchaseOrders: [] })

    // Two taps at once: one e-mail, one 201 (the other finds it sent).
    const [a, b] = await Promise.all([planner.post(`/api/purchase-orders/${po.id}/send`), planner2.post(`/api/purchase-orders/${po.id}/send`)])
    expect([a.status, b.status].sort()).toEqual([200, 201])
    po = PurchaseOrderSchema.parse(a.body)
    expect(po.status).toBe('sent')
    const rows = await t.db.select().from(mailMessages).where(eq(mailMessages.purpose, `purchase_order:${po.id}`))
    expect(rows).toHaveLength(1)
    expect(rows[0]!.id).toBe(po.sentMailId)
    const mailDir = process.env.FAKE_MAIL_DIR
    if (!mailDir) throw new Error('FAKE_MAIL_DIR is not set: run the suite with `npm test`')
    await waitFor('the purchase order e-mail to be sent', async () => {
      const [row] = await t.db.select().from(mailMessages).where(eq(mailMessages.id, po.sentMailId!))
      return row?.status === 'sent' ? row : undefined
    })
    await waitForQueueIdle(t.db) // every job done: a stray second send would have landed by now
    // A third send later still sends nothing.
    expect((await planner.post(`/api/purchase-orders/${po.id}/send`)).status).toBe(200)
    await waitForQueueIdle(t.db)
    const mails = await caught(mailDir, 'orders@marrowby.example')
    expect(mails).toHaveLength(1)
    const mail = mails[0]!
    expect(mail.subject).toBe(`Purchase order ${po.number} from ${DEMO_SHOP_NAME}`)
    expect(mail.text).toContain('20 × FV-77')
    const attachment = mail.attachments.find((x) => x.contentType === 'application/pdf')!
    expect(attachment.filename).toBe(`${po.number}.pdf`)
    expect(pdfText(attachment.content)).toContain(`Purchase order ${po.number}`)
    // The outbox names the attachment.
    const outbox = MailMessageSchema.parse((await planner.get(`/api/mail/${po.sentMailId}`)).body)
    expect(outbox).toMatchObject({ status: 'sent', to: 'orders@marrowby.example' })
    expect(outbox.attachments).toEqual([{ filename: `${po.number}.pdf`, contentType: 'application/pdf', bytes: attachment.content.length }])

    const row = ShortagesSchema.parse((await planner.get('/api/shortages?only=all')).body).rows.find((r) => r.partId === partId)!
    // By hand: 20 ordered, none received → 20 on order; free 4 + 20 on order = 24, still at or below
    // the reorder point 30, so the reorder quantity (7) is still suggested; nothing is short.
    expect(row).toMatchObject({ available: 4, onOrder: 20, short: 0, belowReorderPoint: true, suggestedOrder: 7 })
    expect(row.onOrderPurchaseOrders).toEqual([{ number: po.number, expectedDate: '2099-01-15', outstanding: 20 }])
  })

  it('receives part of a line, updates the cost to the moving average, and is partly received', async () => {
    const res = await planner.post('/api/stock/receive').send({ purchaseOrderId: po.id, lines: [{ partId, quantity: 8 }] })
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    const after = PurchaseOrderSchema.parse((await planner.get(`/api/purchase-orders/${po.id}`)).body)
    expect(after.status).toBe('partly_received')
    expect(after.lines[0]).toMatchObject({ received: 8, outstanding: 12 })
    const [part] = await t.db.select().from(parts).where(eq(parts.id, partId))
    // Moving weighted average, by hand: 4 on hand at $10.00 and 8 received at $8.80:
    // (4 × 1000 + 8 × 880) / 12 = (4000 + 7040) / 12 = 11040 / 12 = 920 cents.
    expect(part!.unitCostCents).toBe(920)
    const [move] = await t.db.select().from(stockMoves).where(and(eq(stockMoves.partId, partId), eq(stockMoves.quantity, 8)))
    expect(move!.reference).toBe(po.number)
    const row = ShortagesSchema.parse((await planner.get('/api/shortages?only=all')).body).rows.find((r) => r.partId === partId)!
    // 20 ordered − 8 received = 12 still on order.
    expect(row.onOrder).toBe(12)
  })

  it('refuses more than is due without a reason, and writes nothing', async () => {
    const before = await counts()
    const res = await planner.post('/api/stock/receive').send({ purchaseOrderId: po.id, lines: [{ partId, quantity: 13 }] })
    expect(res.status).toBe(400)
    const body = ApiErrorBodySchema.parse(res.body)
    expect(body.error.message).toContain(`${po.number} still expects 12`)
    expect(body.error.fields?.['lines.0.reason']).toMatch(/give a reason, or receive 12/)
    expect(await counts()).toEqual(before)
    const [part] = await t.db.select().from(parts).where(eq(parts.id, partId))
    expect(part!.unitCostCents).toBe(920)
  })

  it('two planners receiving the same line at once: it is received once', async () => {
    const movesBefore = await t.db.$count(stockMoves, eq(stockMoves.partId, partId))
    const [a, b] = await Promise.all([
      planner.post('/api/stock/receive').send({ purchaseOrderId: po.id, lines: [{ partId, quantity: 12 }] }),
      planner2.post('/api/stock/receive').send({ purchaseOrderId: po.id, lines: [{ partId, quantity: 12 }] }),
    ])
    // The second waits for the first's lock, then finds the order received in full.
    expect([a.status, b.status].sort()).toEqual([201, 409])
    const loser = a.status === 409 ? a : b
    expect(ApiErrorBodySchema.parse(loser.body).error.message).toBe(`${po.number} is received in full already; nothing was received`)
    expect(await t.db.$count(stockMoves, eq(stockMoves.partId, partId))).toBe(movesBefore + 1)
    const after = PurchaseOrderSchema.parse((await planner.get(`/api/purchase-orders/${po.id}`)).body)
    expect(after.status).toBe('received')
    expect(after.lines[0]).toMatchObject({ received: 20, outstanding: 0 })
    const [part] = await t.db.select().from(parts).where(eq(parts.id, partId))
    // (12 × 920 + 12 × 880) / 24 = (11040 + 10560) / 24 = 21600 / 24 = 900 cents.
    expect(part!.unitCostCents).toBe(900)
    const row = ShortagesSchema.parse((await planner.get('/api/shortages?only=all')).body).rows.find((r) => r.partId === partId)!
    expect(row).toMatchObject({ onOrder: 0, onOrderPurchaseOrders: [] })
  })
})

describe('a packing list against a purchase order', () => {
  it('refuses an unknown supplier and takes more than ordered with a reason', async () => {
    const { supplier, part } = await supplierWithPart('Ashcombe Fittings', 'orders@ashcombe.example', 0, 1000)
    const draft = await planner.post('/api/purchase-orders/from-shortages')
    const po = DraftFromShortagesResultSchema.parse(draft.body).created.find((p) => p.supplier.id === supplier.id)!
    // By hand: 0 free → the reorder quantity 7 → packs of 5: 10 → 10 × $9.00 = $90.00 < $120.00 → 15.
    expect(po.lines[0]).toMatchObject({ quantity: 15, unitPriceCents: 900 })
    expect((await planner.post(`/api/purchase-orders/${po.id}/send`)).status).toBe(201)

    const before = await counts()
    const unknown = await planner.post('/api/stock/receive/csv').send({ csv: `sku,quantity,supplier,purchase_order\n${part.sku},15,Nobody Supply,${po.number}\n`, defaultReference: 'PL-1' })
    expect(unknown.status).toBe(400)
    const body = ApiErrorBodySchema.parse(unknown.body)
    expect(body.error.message).toContain('No supplier named "Nobody Supply": add it on the Suppliers page or correct the name')
    expect(body.error.fields?.['rows.2']).toContain('Nobody Supply')
    const over = await planner.post('/api/stock/receive/csv').send({ csv: `sku,quantity,supplier,purchase_order\n${part.sku},16,Ashcombe Fittings,${po.number}\n`, defaultReference: 'PL-1' })
    expect(over.status).toBe(400)
    expect(ApiErrorBodySchema.parse(over.body).error.fields?.['rows.2.reason']).toMatch(/1 over/)
    expect(await counts()).toEqual(before)

    const ok = await planner.post('/api/stock/receive/csv').send({
      csv: `sku,quantity,supplier,purchase_order,reason\n${part.sku},16,Ashcombe Fittings,${po.number},Supplier sent a full box\n`,
      defaultReference: 'PL-1',
    })
    expect(ok.status, JSON.stringify(ok.body)).toBe(201)
    const after = PurchaseOrderSchema.parse((await planner.get(`/api/purchase-orders/${po.id}`)).body)
    expect(after).toMatchObject({ status: 'received' })
    expect(after.lines[0]).toMatchObject({ received: 16, outstanding: 0 })
    // Nothing on hand before: the cost is what was paid, $9.00.
    const [p] = await t.db.select().from(parts).where(eq(parts.id, part.id))
    expect(p!.unitCostCents).toBe(900)
  })
})

describe('a line closed short', () => {
  it('needs a reason; with one, the order is received and nothing more is on order', async () => {
    const { supplier, part } = await supplierWithPart('Thistledown Seals', 'orders@thistledown.example', 0, 1000)
    const po = DraftFromShortagesResultSchema.parse((await planner.post('/api/purchase-orders/from-shortages')).body).created.find((p) => p.supplier.id === supplier.id)!
    expect((await planner.post(`/api/purchase-orders/${po.id}/send`)).status).toBe(201)
    const before = await counts()
    const bare = await planner.post('/api/stock/receive').send({ purchaseOrderId: po.id, lines: [{ partId: part.id, quantity: 10, closeShort: true }] })
    expect(bare.status).toBe(400)
    expect(ApiErrorBodySchema.parse(bare.body).error.fields?.['lines.0.reason']).toBe(`Say why the rest of ${part.sku} will not come (closing the line short)`)
    expect(await counts()).toEqual(before)
    const res = await planner.post('/api/stock/receive').send({ purchaseOrderId: po.id, lines: [{ partId: part.id, quantity: 10, closeShort: true, reason: 'Discontinued by the maker' }] })
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    const after = PurchaseOrderSchema.parse((await planner.get(`/api/purchase-orders/${po.id}`)).body)
    // 15 ordered, 10 received, the other 5 will not come: nothing is outstanding and the order is received.
    expect(after.status).toBe('received')
    expect(after.lines[0]).toMatchObject({ quantity: 15, received: 10, outstanding: 0, closedShortReason: 'Discontinued by the maker' })
    const row = ShortagesSchema.parse((await planner.get('/api/shortages?only=all')).body).rows.find((r) => r.partId === part.id)
    expect(row?.onOrder ?? 0).toBe(0)
    // A draft or a received order takes no receipts.
    expect((await planner.post('/api/stock/receive').send({ purchaseOrderId: po.id, lines: [{ partId: part.id, quantity: 1, reason: 'extra' }] })).status).toBe(409)
  })
})

describe('who may buy', () => {
  it('admins and planners; cutters, assemblers and packers get 403 on every purchasing route', async () => {
    const [anyPo] = await t.db.select().from(purchaseOrders).limit(1)
    const [anySupplier] = await t.db.select().from(suppliers).limit(1)
    const routes = built.routes.records.filter((r) => r.path.startsWith('/api/suppliers') || r.path.startsWith('/api/purchase-orders'))
    expect(routes.length).toBeGreaterThanOrEqual(12)
    for (const r of routes) expect(r.access, `${r.method} ${r.path}`).toEqual(['admin', 'planner'])
    for (const role of ['cutter', 'assembler', 'packer'] as const) {
      const { agent } = await signedInAs(built.app, t, role)
      for (const r of routes) {
        const url = r.path.replace(':id', r.path.startsWith('/api/suppliers') ? anySupplier!.id : anyPo!.id).replace(':partId', anySupplier!.id)
        const res = await agent[r.method](url).send({})
        expect(res.status, `${role} ${r.method} ${url}`).toBe(403)
      }
    }
    const { agent: admin } = await signedInAs(built.app, t, 'admin')
    expect((await admin.get('/api/purchase-orders')).status).toBe(200)
  })
})
