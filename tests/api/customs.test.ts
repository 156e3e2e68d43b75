import { execFileSync } from 'node:child_process'
import { mkdirSync, mkdtempSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { eq, inArray } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { CustomsSummarySchema } from '@kitwright/shared/customs'
import { ApiErrorBodySchema } from '@kitwright/shared/errors'
import { PackViewSchema, type PackView } from '@kitwright/shared/pack'
import { PartSchema } from '@kitwright/shared/parts'
import { seedDemo } from '../../server/src/seeds/demo'
import { DEMO_PART_SKUS } from '../../server/src/seeds/catalog'
import { orderLines, orders, parcels, parts } from '../../server/src/db/schema/index'
import { buildApp, signedInAs } from '../support/app'
import { removeDir, renderPdfPages } from '../support/decode-barcode'
import { insertPackOrder, receivePlenty } from '../support/pack-factories'
import { createTestDb, type TestDb } from '../support/test-db'

let t: TestDb
type Agent = Awaited<ReturnType<typeof signedInAs>>['agent']
let packer: Agent
let planner: Agent
const shots = path.resolve(import.meta.dirname, '../.artifacts')

beforeAll(async () => {
  t = await createTestDb()
  await seedDemo(t.db)
  await receivePlenty(t.db)
  const built = buildApp(t)
  packer = (await signedInAs(built.app, t, 'packer')).agent
  planner = (await signedInAs(built.app, t, 'planner')).agent
  mkdirSync(shots, { recursive: true })
})
afterAll(() => t.drop())

function view(res: { status: number; body: unknown }, status = 200): PackView {
  expect(res.status, JSON.stringify(res.body)).toBe(status)
  return PackViewSchema.parse(res.body)
}

/** Confirms every item of the order (scan units, tick bags and packs). */
async function confirmAll(orderId: string): Promise<PackView> {
  let v = view(await packer.get(`/api/pack/orders/${orderId}`))
  for (const item of v.items) {
    v = view(
      item.kind === 'unit'
        ? await packer.post(`/api/pack/orders/${orderId}/scan`).send({ code: item.binCode ?? item.serial })
        : await packer.post(`/api/pack/orders/${orderId}/tick`).send({ itemKey: item.key }),
    )
  }
  return v
}

async function buyLabel(orderId: string, parcelsIn: { workOrderIds: string[]; boxId: string }[]): Promise<PackView> {
  return view(
    await packer.post(`/api/pack/orders/${orderId}/label`).send({ service: 'ground', parcels: parcelsIn.map((p) => ({ ...p, scaleGrams: null })) }),
    201,
  )
}

async function pdf(url: string) {
  const res = await packer
    .get(url)
    .buffer(true)
    .parse((r, cb) => {
      const chunks: Buffer[] = []
      r.on('data', (c: Buffer) => chunks.push(c))
      r.on('end', () => cb(null, Buffer.concat(chunks)))
    })
  expect(res.status, String(res.body)).toBe(200)
  expect(res.headers['content-type']).toBe('application/pdf')
  return res.body as Buffer
}

/** poppler's pdftotext reads the PDF back: an outside reader, not our own code. One string per page. */
function pagesText(bytes: Buffer): string[] {
  const dir = mkdtempSync(path.join(tmpdir(), 'kw-customs-'))
  writeFileSync(path.join(dir, 'a.pdf'), bytes)
  const out = execFileSync('pdftotext', ['-layout', path.join(dir, 'a.pdf'), '-'], { encoding: 'utf8' })
  removeDir(dir)
  return out.split('\f').filter((p) => p.trim() !== '')
}

function saveShots(bytes: Buffer, name: string) {
  const { pages, dir } = renderPdfPages(bytes)
  pages.forEach((p, i) => writeFileSync(path.join(shots, `${name}-${i + 1}.png`), p))
  removeDir(dir)
}

describe('a US → Canada shipment', () => {
  it('gets a CN 23 with every part line and its totals, printed with the label', async () => {
    // Four spare cup-and-collar packs at $79.00 and two spare sprayer packs at $39.50, to Toronto.
    const { order, units } = await insertPackOrder(t.db, [
      { kitSku: 'MW-SPARE-CUP12', quantity: 4 },
      { kitSku: 'MW-SPARE-SPR6', quantity: 2 },
    ])
    await t.db
      .update(orders)
      .set({
        shipName: 'Noor Vantreight',
        shipLine1: '41 Quillfeather Row',
        shipCity: 'Toronto',
        shipRegion: 'ON',
        shipPostalCode: 'M5V 2T6',
        shipCountry: 'CA',
        currency: 'USD',
      })
      .where(eq(orders.id, order.id))
    const lines = await t.db.select().from(orderLines).where(eq(orderLines.orderId, order.id))
    for (const l of lines)
      await t.db
        .update(orderLines)
        .set({ unitPriceCents: l.sku === 'MW-SPARE-CUP12' ? 7900 : 3950 })
        .where(eq(orderLines.id, l.id))

    const v = await confirmAll(order.id)
    expect(v.blockers).toEqual([])
    const before = CustomsSummarySchema.parse((await packer.get(`/api/shipments/${v.shipment!.id}/customs`)).body)
    expect(before).toMatchObject({ required: true, ready: false, shipFromCountry: 'US', shipToCountry: 'CA', problems: [], parcels: [] })
    // Before the label there is nothing to print yet.
    expect((await packer.get(`/api/shipments/${v.shipment!.id}/customs-declaration.pdf`)).status).toBe(409)

    // The packs have no carton of their own: the bench proposes one parcel for all six.
    expect(v.parcels).toHaveLength(1)
    const labelled = await buyLabel(order.id, [{ workOrderIds: units.map((u) => u.wo.id), boxId: v.parcels[0]!.boxId! }])
    const summary = CustomsSummarySchema.parse((await packer.get(`/api/shipments/${labelled.shipment!.id}/customs`)).body)
    // Value by hand: 4 × 79.00 + 2 × 39.50 = 316.00 + 79.00 = 395.00 USD. UPU Convention Regulations: CN 22 up
    // to 300 SDR; 300 SDR × 1.30 USD/SDR (fixed figure, from memory) = 390.00 USD < 395.00 → CN 23.
    // Net weight by hand (demo part weights): a cup pack = 12 net cups × 6 g + 12 collars × 3 g = 72 + 36 = 108 g;
    // a sprayer pack = 6 sprayers × 4 g = 24 g; 4 × 108 + 2 × 24 = 432 + 48 = 480 g. The bags are packaging, not declared.
    expect(summary).toMatchObject({
      required: true,
      ready: true,
      currency: 'USD',
      parcels: [{ position: 1, form: 'CN 23', valueCents: 39_500, netGrams: 480 }],
    })

    const bytes = await pdf(`/api/shipments/${labelled.shipment!.id}/customs-declaration.pdf`)
    saveShots(bytes, 'customs-cn23')
    const [page, ...rest] = pagesText(bytes)
    expect(rest).toEqual([])
    const flat = page!.replace(/\s+/g, ' ')
    for (const s of [
      'CUSTOMS DECLARATION',
      'CN 23',
      'Parcel 1 of 1',
      'Mistwell Tote Works',
      'Noor Vantreight',
      'M5V 2T6',
      'CANADA',
      'Sale of goods',
      `order ${order.number}`,
      "Sender's signature",
    ])
      expect(flat).toContain(s)
    const [parcel] = await t.db.select().from(parcels).where(eq(parcels.shipmentId, labelled.shipment!.id))
    expect(flat).toContain(`tracking ${parcel!.trackingNumber ?? labelled.shipment!.trackingNumber}`)
    // Each line's value by hand: a cup pack's 79.00 split by the parts' cost, cups 12 × 0.12 = 1.44 and collars
    // 12 × 0.15 = 1.80 of 3.24: cups 7900 × 1.44 / 3.24 = 3511.11 → 3511 cents, collars 4388.89 → 4389 (the cent
    // left over goes to the larger remainder, 0.89); × 4 packs: cups 140.44, collars 175.56. Sprayers: 2 × 39.50 = 79.00.
    // Rows: description (SKU), quantity, net kg, value, HS code, origin.
    const row = (description: string) =>
      page!
        .split('\n')
        .find((l) => l.includes(description))
        ?.trim()
        .split(/\s{2,}|\s(?=\d)/)
        .slice(-5)
    expect(row('Plastic net cup for plants')).toEqual(['48', '0.288', '140.44', '3926.90', 'CN'])
    expect(row('Plastic foam plant collar')).toEqual(['48', '0.144', '175.56', '3926.90', 'CN'])
    expect(row('Plastic misting nozzle')).toEqual(['12', '0.048', '79.00', '8424.90', 'CN'])
    for (const sku of [DEMO_PART_SKUS.netCup, DEMO_PART_SKUS.collar, DEMO_PART_SKUS.sprayer]) expect(flat).toContain(`SKU ${sku}`)
    // Totals by hand: 140.44 + 175.56 + 79.00 = 395.00; 0.288 + 0.144 + 0.048 = 0.480 kg.
    expect(flat).toMatch(/Total 0\.480 395\.00/)
    expect(flat).toContain('Total value: USD 395.00')
    expect(flat).not.toContain('Zip hardware bag')
  })

  it('refuses the label while a part going abroad has no HS code or origin, and says which', async () => {
    const { order } = await insertPackOrder(t.db, [{ kitSku: 'MW-SPARE-SPR6' }])
    await t.db.update(orders).set({ shipCity: 'Halifax', shipRegion: 'NS', shipPostalCode: 'B3H 1A1', shipCountry: 'CA' }).where(eq(orders.id, order.id))
    await t.db.update(parts).set({ hsCode: null, originCountry: null }).where(eq(parts.sku, DEMO_PART_SKUS.sprayer))
    try {
      const v = await confirmAll(order.id)
      expect(v.canLabel).toBe(false)
      expect(v.blockers).toContainEqual(
        `This shipment goes abroad and needs a customs declaration: ${DEMO_PART_SKUS.sprayer} (360° misting sprayer, threaded) has no HS code and no country of origin. A planner sets them on the part (Catalog → Parts)`,
      )
    } finally {
      await t.db.update(parts).set({ hsCode: '842490', originCountry: 'CN' }).where(eq(parts.sku, DEMO_PART_SKUS.sprayer))
    }
  })
})

describe('a domestic shipment', () => {
  it('needs no customs declaration', async () => {
    const { order, units } = await insertPackOrder(t.db, [{ kitSku: 'MW-SPARE-SPR6' }])
    const v = await confirmAll(order.id)
    const labelled = await buyLabel(order.id, [{ workOrderIds: [units[0]!.wo.id], boxId: v.parcels[0]!.boxId! }])
    const summary = CustomsSummarySchema.parse((await packer.get(`/api/shipments/${labelled.shipment!.id}/customs`)).body)
    expect(summary).toMatchObject({ required: false, ready: false, problems: [], parcels: [] })
    const res = await packer.get(`/api/shipments/${labelled.shipment!.id}/customs-declaration.pdf`)
    expect(res.status).toBe(409)
    expect(ApiErrorBodySchema.parse(res.body).error.message).toBe(`Order ${order.number} ships within US: no customs declaration is needed`)
  })
})

describe('a two-parcel shipment', () => {
  it('has a slip with one section per parcel, each with its own tracking number and only its own units', async () => {
    // Two spare packs the bench would put in one parcel; the packer puts each in a parcel of its own.
    const { order, units } = await insertPackOrder(t.db, [{ kitSku: 'MW-SPARE-SPR6' }, { kitSku: 'MW-SPARE-CUP12' }])
    const v = await confirmAll(order.id)
    expect(v.parcels).toHaveLength(1)
    const box = v.parcels[0]!.boxId!
    const labelled = await buyLabel(order.id, [
      { workOrderIds: [units[1]!.wo.id], boxId: box },
      { workOrderIds: [units[0]!.wo.id], boxId: box },
    ])
    const stored = await t.db.select().from(parcels).where(eq(parcels.shipmentId, labelled.shipment!.id)).orderBy(parcels.position)
    expect(stored.map((p) => p.workOrderIds)).toEqual([[units[1]!.wo.id], [units[0]!.wo.id]])
    const tracking = stored.map((p) => p.trackingNumber)
    expect(tracking.every((n) => typeof n === 'string' && n.length > 0)).toBe(true)
    expect(new Set(tracking).size).toBe(2)

    const bytes = await pdf(`/api/shipments/${labelled.shipment!.id}/packing-slip.pdf?paper=letter`)
    saveShots(bytes, 'packing-slip-two-parcels')
    const text = pagesText(bytes).join('\n').replace(/\s+/g, ' ')
    const first = text.indexOf('Parcel 1 of 2')
    const second = text.indexOf('Parcel 2 of 2')
    expect(first).toBeGreaterThan(-1)
    expect(second).toBeGreaterThan(first)
    const section1 = text.slice(first, second)
    const section2 = text.slice(second)
    expect(section1).toContain(`Tracking ${tracking[0]}`)
    expect(section1).toContain(`serial ${units[1]!.wo.serial}`)
    expect(section1).not.toContain(`serial ${units[0]!.wo.serial}`)
    expect(section2).toContain(`Tracking ${tracking[1]}`)
    expect(section2).toContain(`serial ${units[0]!.wo.serial}`)
    expect(section2).not.toContain(`serial ${units[1]!.wo.serial}`)
    expect(text).not.toContain('In this parcel')
  })
})

describe('customs facts on parts', () => {
  const pump = {
    sku: 'PMP-TEST-CUSTOMS',
    name: 'Test pump',
    kind: 'hardware',
    unitOfMeasure: 'each',
    unitCostCents: 2450,
    weightGrams: 1200,
    reorderPoint: 0,
    reorderQuantity: 0,
  }

  it('refuses a bad HS code or origin ZZ with a clear message and writes nothing', async () => {
    const bad = await planner.post('/api/parts').send({ ...pump, hsCode: '8413.7', originCountry: 'ZZ' })
    expect(bad.status).toBe(400)
    const e = ApiErrorBodySchema.parse(bad.body).error
    expect(e.fields).toMatchObject({
      hsCode: 'Write the HS code as 6 to 10 digits, e.g. 8413.70 (the 6-digit subheading; dots and spaces are allowed)',
      originCountry: '"ZZ" is not an ISO 3166-1 country code; use the two letters of the country where the part was made, e.g. US, CA, CN, DE',
    })
    expect(await t.db.select().from(parts).where(eq(parts.sku, pump.sku))).toEqual([])

    const made = await planner
      .post('/api/parts')
      .send({ ...pump, hsCode: '8413.70', originCountry: 'cn', customsDescription: 'Submersible electric water pump' })
    expect(made.status, JSON.stringify(made.body)).toBe(201)
    const part = PartSchema.parse(made.body)
    expect(part).toMatchObject({ hsCode: '841370', originCountry: 'CN', customsDescription: 'Submersible electric water pump' })
    const patch = await planner.patch(`/api/parts/${part.id}`).send({ originCountry: 'ZZ' })
    expect(patch.status).toBe(400)
    expect(ApiErrorBodySchema.parse(patch.body).error.fields).toHaveProperty('originCountry')
    const [row] = await t.db.select().from(parts).where(eq(parts.id, part.id))
    expect(row).toMatchObject({ hsCode: '841370', originCountry: 'CN' })
  })

  it('travel through the parts CSV: exported with the dot, a bad row refuses the whole file', async () => {
    const csv = (await planner.get('/api/parts/export.csv')).text
    const header = csv.replace(/^\uFEFF/, '').split('\r\n')[0]!
    expect(header).toContain('hs_code,origin_country,customs_description')
    expect(csv).toMatch(/PMP-400-GPH,.*8413\.70,CN,Submersible electric water pump/)
    const file = [
      'sku,name,kind,unit_cost,weight_g,hs_code,origin_country',
      'CSV-OK-1,Fine part,hardware,1.00,10,3917.40,US',
      'CSV-BAD-2,Bad origin,hardware,1.00,10,3917.40,ZZ',
    ].join('\n')
    const res = await planner.post('/api/parts/import').send({ csv: file })
    expect(res.status).toBe(400)
    const e = ApiErrorBodySchema.parse(res.body).error
    expect(e.message).toMatch(/^Nothing was imported: row 3: "ZZ" is not an ISO 3166-1 country code/)
    expect(
      await t.db
        .select()
        .from(parts)
        .where(inArray(parts.sku, ['CSV-OK-1', 'CSV-BAD-2'])),
    ).toEqual([])
  })
})
