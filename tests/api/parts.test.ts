import { count, eq } from 'drizzle-orm'
import Papa from 'papaparse'
import request from 'supertest'
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest'
import { inches } from '@kitwright/shared/domain/units'
import { ApiErrorBodySchema } from '@kitwright/shared/errors'
import { PartSchema, PartsPageSchema, type PartInputDraft } from '@kitwright/shared/parts'
import { csvErrorsFromFields } from '@kitwright/shared/csv'
import { PartImportPreviewSchema, PartImportResultSchema } from '@kitwright/shared/parts-csv'
import { parts, shopSettings, type NewPartRow } from '../../server/src/db/schema/index'
import { buildApp, signedInAs } from '../support/app'
import { createTestDb, type TestDb } from '../support/test-db'

let t: TestDb
let app: ReturnType<typeof buildApp>['app']
beforeAll(async () => {
  t = await createTestDb()
  app = buildApp(t).app
})
afterEach(() => t.truncate())
afterAll(() => t.drop())

// ASTM D1785: 1/2 in nominal Schedule 40 PVC has an outside diameter of 0.840 in.
const PIPE: PartInputDraft = {
  sku: 'PVC-050-S40', name: '1/2 in Schedule 40 PVC', kind: 'stock_length', unitOfMeasure: 'stick', unitCostCents: 348,
  weightGrams: 730, supplier: 'Test Pipe Yard', leadTimeDays: 3, reorderPoint: 20, reorderQuantity: 50, shelfLocation: 'RACK-P1',
  nominalSize: '1/2', outsideDiameter: inches(0.84), stickLengths: [inches(120), inches(240)],
}
const ELBOW: PartInputDraft = {
  sku: 'FIT-ELB-050', name: '1/2 in elbow', kind: 'hardware', unitOfMeasure: 'each', unitCostCents: 42, weightGrams: 11,
  reorderPoint: 100, reorderQuantity: 250,
}

async function seedParts(rows: Partial<NewPartRow>[]) {
  await t.db.insert(parts).values(rows.map((r, i) => ({ sku: `P-${String(i).padStart(3, '0')}`, name: `Part ${i}`, kind: 'hardware' as const, ...r })))
}
async function partCount() {
  const [row] = await t.db.select({ n: count() }).from(parts)
  return row!.n
}
async function storedBySku(sku: string) {
  const [row] = await t.db.select().from(parts).where(eq(parts.sku, sku))
  return row
}
const HEADER = 'sku,name,kind,unit_cost,weight_g,nominal_size,outside_diameter,stick_lengths'

describe('parts: create and edit', () => {
  it('creates a pipe part and reads it back from the database', async () => {
    const { agent } = await signedInAs(app, t, 'planner')
    const res = await agent.post('/api/parts').send(PIPE)
    expect(res.status).toBe(201)
    const part = PartSchema.parse(res.body)
    expect(part).toMatchObject({ sku: 'PVC-050-S40', active: true, outsideDiameter: inches(0.84) })
    const row = await storedBySku('PVC-050-S40')
    expect(row?.stickLengths).toEqual([inches(120), inches(240)])
    expect(PartSchema.parse((await agent.get(`/api/parts/${part.id}`)).body).name).toBe(PIPE.name)
  })

  it('refuses pipe without stick lengths or outside diameter, and hardware with stick lengths, per field', async () => {
    const { agent } = await signedInAs(app, t, 'admin')
    const pipe = await agent.post('/api/parts').send({ ...PIPE, stickLengths: [], outsideDiameter: null, nominalSize: '' })
    expect(pipe.status).toBe(400)
    const fields = ApiErrorBodySchema.parse(pipe.body).error.fields ?? {}
    expect(Object.keys(fields).sort()).toEqual(['nominalSize', 'outsideDiameter', 'stickLengths'])
    expect(fields.stickLengths).toMatch(/10 ft/)
    const elbow = await agent.post('/api/parts').send({ ...ELBOW, stickLengths: [inches(120)] })
    expect(elbow.status).toBe(400)
    expect(ApiErrorBodySchema.parse(elbow.body).error.fields).toHaveProperty('stickLengths')
    expect(await partCount()).toBe(0)
  })

  it('answers a duplicate SKU with 409 and a sku hint, keeping the first part', async () => {
    const { agent } = await signedInAs(app, t, 'planner')
    expect((await agent.post('/api/parts').send(ELBOW)).status).toBe(201)
    const dup = await agent.post('/api/parts').send({ ...ELBOW, name: 'Another elbow' })
    expect(dup.status).toBe(409)
    expect(ApiErrorBodySchema.parse(dup.body).error.fields).toEqual({ sku: 'Already in use' })
    expect((await storedBySku(ELBOW.sku))?.name).toBe(ELBOW.name)
  })

  it('edits part of a part, checks the merged result against the kind rules, and deactivates', async () => {
    const { agent } = await signedInAs(app, t, 'planner')
    const pipe = PartSchema.parse((await agent.post('/api/parts').send(PIPE)).body)
    const renamed = await agent.patch(`/api/parts/${pipe.id}`).send({ name: 'Pipe, 1/2 in' })
    expect(renamed.status).toBe(200)
    // Leaving stick lengths out of a change keeps them.
    expect(PartSchema.parse(renamed.body)).toMatchObject({ name: 'Pipe, 1/2 in', stickLengths: [inches(120), inches(240)] })
    const toHardware = await agent.patch(`/api/parts/${pipe.id}`).send({ kind: 'hardware' })
    expect(toHardware.status).toBe(400)
    expect(ApiErrorBodySchema.parse(toHardware.body).error.fields).toHaveProperty('stickLengths')
    expect((await storedBySku(PIPE.sku))?.kind).toBe('stock_length')
    const noSticks = await agent.patch(`/api/parts/${pipe.id}`).send({ stickLengths: [] })
    expect(noSticks.status).toBe(400)
    const off = await agent.patch(`/api/parts/${pipe.id}`).send({ active: false })
    expect(PartSchema.parse(off.body).active).toBe(false)
    expect((await storedBySku(PIPE.sku))?.active).toBe(false)
    expect((await agent.patch(`/api/parts/${pipe.id}`).send({})).status).toBe(400)
  })

  it('refuses renaming a SKU onto another part with 409, and answers 404 for an unknown part', async () => {
    const { agent } = await signedInAs(app, t, 'admin')
    await agent.post('/api/parts').send(ELBOW)
    const pipe = PartSchema.parse((await agent.post('/api/parts').send(PIPE)).body)
    const clash = await agent.patch(`/api/parts/${pipe.id}`).send({ sku: ELBOW.sku })
    expect(clash.status).toBe(409)
    expect(ApiErrorBodySchema.parse(clash.body).error.fields).toEqual({ sku: 'Already in use' })
    expect((await agent.get('/api/parts/6f1c2a52-8d1e-4c55-9a55-0d1f6f3e2b11')).status).toBe(404)
  })
})

describe('parts: the list', () => {
  it('pages and sorts on the server, with ties broken by SKU', async () => {
    const { agent } = await signedInAs(app, t, 'planner')
    await seedParts(Array.from({ length: 27 }, (_, i) => ({ unitCostCents: (i * 37) % 10 * 100 })))
    const first = PartsPageSchema.parse((await agent.get('/api/parts?pageSize=10&sort=unitCost&dir=desc')).body)
    expect(first).toMatchObject({ total: 27, page: 1, pageSize: 10 })
    expect(first.items).toHaveLength(10)
    const costs = first.items.map((p) => p.unitCostCents)
    expect(costs).toEqual([...costs].sort((a, b) => b! - a!))
    const third = PartsPageSchema.parse((await agent.get('/api/parts?pageSize=10&page=3&sort=unitCost&dir=desc')).body)
    expect(third.items).toHaveLength(7)
    const all = [...first.items, ...PartsPageSchema.parse((await agent.get('/api/parts?pageSize=10&page=2&sort=unitCost&dir=desc')).body).items, ...third.items]
    expect(new Set(all.map((p) => p.sku)).size).toBe(27)
  })

  it('filters by kind and active, and searches SKU, name and supplier (wildcards typed literally)', async () => {
    const { agent } = await signedInAs(app, t, 'planner')
    await seedParts([
      { sku: 'PVC-050', name: 'Pipe', kind: 'stock_length', nominalSize: '1/2', outsideDiameter: inches(0.84), stickLengths: [inches(120)] },
      { sku: 'SPR-360', name: 'Misting sprayer', supplier: 'Fernhollow' },
      { sku: 'CUP-2', name: 'Net cup 100%', supplier: 'Fernhollow', active: false },
      { sku: 'CTN-L', name: 'Carton', kind: 'packaging' },
    ])
    const skus = async (qs: string) => PartsPageSchema.parse((await agent.get(`/api/parts?${qs}`)).body).items.map((p) => p.sku)
    expect(await skus('')).toEqual(['CTN-L', 'PVC-050', 'SPR-360'])
    expect(await skus('active=all')).toEqual(['CTN-L', 'CUP-2', 'PVC-050', 'SPR-360'])
    expect(await skus('active=false')).toEqual(['CUP-2'])
    expect(await skus('kind=stock_length')).toEqual(['PVC-050'])
    expect(await skus('q=fernhollow&active=all')).toEqual(['CUP-2', 'SPR-360'])
    expect(await skus('q=spr')).toEqual(['SPR-360'])
    expect(await skus('q=misting')).toEqual(['SPR-360'])
    expect(await skus('q=100%25&active=all')).toEqual(['CUP-2'])
    expect(await skus('q=_')).toEqual([])
  })

  it('answers 400 with the field for a bad list query instead of guessing', async () => {
    const { agent } = await signedInAs(app, t, 'planner')
    for (const [qs, field] of [['sort=price', 'sort'], ['page=0', 'page'], ['pageSize=7', 'pageSize'], ['kind=pump', 'kind'], ['colour=red', '_']] as const) {
      const res = await agent.get(`/api/parts?${qs}`)
      expect(res.status, qs).toBe(400)
      const fields = ApiErrorBodySchema.parse(res.body).error.fields ?? {}
      expect(Object.keys(fields).join(), qs).toContain(field)
    }
  })
})

describe('parts: CSV import and export', () => {
  it('previews a file: what it creates and updates, and row-numbered errors counting the header as row 1', async () => {
    const { agent } = await signedInAs(app, t, 'planner')
    await agent.post('/api/parts').send(ELBOW)
    const csv = [
      HEADER,
      'PVC-050-S40,1/2 in pipe,stock_length,3.48,730,1/2,0.840 in,10 ft; 20 ft',
      'FIT-ELB-050,Elbow (new name),hardware,0.45,11,,,',
      '',
      'BAD SKU,Tee,hardware,12.5.0,14,,,',
      'PVC-075,3/4 in pipe,stock_length,4.10,900,3/4,,10 ft',
    ].join('\n')
    const res = await agent.post('/api/parts/import/preview').send({ csv })
    expect(res.status).toBe(200)
    const preview = PartImportPreviewSchema.parse(res.body)
    expect(preview.creates).toBe(1)
    expect(preview.updates).toBe(1)
    expect(preview.rows.map((r) => [r.row, r.action])).toEqual([[2, 'create'], [3, 'update'], [5, null], [6, null]])
    expect(preview.errors).toEqual([
      { row: 5, column: 'unit_cost', message: expect.stringMatching(/dollars and cents, e\.g\. 12\.34/) },
      { row: 5, column: 'sku', message: expect.stringMatching(/letters, digits/) },
      { row: 6, column: 'outside_diameter', message: expect.stringMatching(/outside diameter/) },
    ])
    expect(preview.rows[0]!.part?.outsideDiameter).toBe(inches(0.84))
    expect(await partCount()).toBe(1)
  })

  it('reports header problems on row 1 and a wrong number of cells on its row', async () => {
    const { agent } = await signedInAs(app, t, 'planner')
    const header = PartImportPreviewSchema.parse((await agent.post('/api/parts/import/preview').send({ csv: 'sku,name,colour\nA,B,red' })).body)
    expect(header.errors.map((e) => [e.row, e.column])).toEqual([[1, 'colour'], [1, 'kind'], [1, 'unit_cost'], [1, 'weight_g']])
    const cells = PartImportPreviewSchema.parse((await agent.post('/api/parts/import/preview').send({ csv: `${HEADER}\nA,B,hardware,1.00,5,,\n` })).body)
    expect(cells.errors).toEqual([{ row: 2, column: null, message: expect.stringMatching(/7 cells but the header has 8/) }])
  })

  it('imports all or nothing: one bad row leaves the parts exactly as they were', async () => {
    const { agent } = await signedInAs(app, t, 'planner')
    await agent.post('/api/parts').send(ELBOW)
    const before = await partCount()
    const csv = [HEADER, 'NEW-1,New one,hardware,1.00,5,,,', 'FIT-ELB-050,Renamed,hardware,0.50,11,,,', 'NEW-2,New two,hardware,lots,5,,,', 'NEW-1,Again,hardware,1.00,5,,,'].join('\n')
    const res = await agent.post('/api/parts/import').send({ csv })
    expect(res.status).toBe(400)
    const body = ApiErrorBodySchema.parse(res.body)
    expect(body.error.message).toMatch(/^Nothing was imported: row 4/)
    expect(csvErrorsFromFields(body.error.fields ?? {})).toEqual([
      { row: 4, column: 'unit_cost', message: expect.any(String) },
      { row: 5, column: 'sku', message: 'The SKU NEW-1 is already on row 2; keep one row per SKU' },
    ])
    expect(await partCount()).toBe(before)
    expect((await storedBySku('FIT-ELB-050'))?.name).toBe(ELBOW.name)
  })

  it('imports a good file, then a second import updates by SKU and keeps columns the file leaves out', async () => {
    const { agent } = await signedInAs(app, t, 'admin')
    const first = [
      `${HEADER},supplier,shelf_location`,
      'PVC-050-S40,Pipe,stock_length,3.48,730,1/2,0.840 in,10 ft;20 ft,Test Pipe Yard,RACK-P1',
      'FIT-ELB-050,Elbow,hardware,$0.42,11,,,,Test Pipe Yard,A1-01',
    ].join('\r\n')
    const res = await agent.post('/api/parts/import').send({ csv: first })
    expect(res.status).toBe(200)
    expect(PartImportResultSchema.parse(res.body)).toEqual({ created: 2, updated: 0 })
    const second = ['sku,name,kind,unit_cost,weight_g', 'FIT-ELB-050,Elbow 90°,hardware,0.45,12', 'FIT-TEE-050,Tee,hardware,0.48,14'].join('\n')
    expect(PartImportResultSchema.parse((await agent.post('/api/parts/import').send({ csv: second })).body)).toEqual({ created: 1, updated: 1 })
    expect(await partCount()).toBe(3)
    expect(await storedBySku('FIT-ELB-050')).toMatchObject({ name: 'Elbow 90°', unitCostCents: 45, weightGrams: 12, supplier: 'Test Pipe Yard', shelfLocation: 'A1-01', active: true })
    expect((await storedBySku('PVC-050-S40'))?.stickLengths).toEqual([inches(120), inches(240)])
  })

  it('exports every part so the file imports back unchanged, with formula cells neutralised', async () => {
    const { agent } = await signedInAs(app, t, 'planner')
    await t.db.insert(shopSettings).values({ id: 1, shopName: 'Test shop', displayUnit: 'mm', kerf: 0, endTrim: 0, minOffcut: 0 })
    await agent.post('/api/parts').send(PIPE)
    await agent.post('/api/parts').send({ ...ELBOW, name: '=HYPERLINK("http://x.example","click")', supplier: '+1 supplier', shelfLocation: '@A1' })
    const elbow = await storedBySku(ELBOW.sku)
    await agent.patch(`/api/parts/${elbow!.id}`).send({ active: false })
    const before = await t.db.select().from(parts).orderBy(parts.sku)

    const res = await agent.get('/api/parts/export.csv')
    expect(res.status).toBe(200)
    expect(res.headers['content-type']).toMatch(/^text\/csv/)
    expect(res.headers['content-disposition']).toMatch(/^attachment; filename="?parts-\d{4}-\d{2}-\d{2}\.csv"?$/)
    const rows = Papa.parse<Record<string, string>>(res.text.replace(/^\uFEFF/, ''), { header: true, skipEmptyLines: true }).data
    const exportedElbow = rows.find((r) => r.sku === ELBOW.sku)!
    // OWASP, CSV Injection: cells starting with = + - @ tab or CR get a leading single quote.
    expect(exportedElbow.name).toBe(`'=HYPERLINK("http://x.example","click")`)
    expect(exportedElbow.supplier).toBe("'+1 supplier")
    expect(exportedElbow.shelf_location).toBe("'@A1")
    // 1 in = 25.4 mm exactly: 0.840 in = 21.336 mm, 10 ft = 3048 mm.
    expect(rows.find((r) => r.sku === PIPE.sku)).toMatchObject({ outside_diameter: '21.336 mm', stick_lengths: '3048 mm; 6096 mm', unit_cost: '3.48' })

    await t.db.delete(parts)
    const back = await agent.post('/api/parts/import').send({ csv: res.text })
    expect(PartImportResultSchema.parse(back.body)).toEqual({ created: 2, updated: 0 })
    const after = await t.db.select().from(parts).orderBy(parts.sku)
    const strip = (r: (typeof before)[number]) => ({ ...r, id: '', createdAt: null, updatedAt: null })
    expect(after.map(strip)).toEqual(before.map(strip))
  })
})

describe('parts: who may do what', () => {
  it('lets every signed-in bench read parts, without their costs, but not change them', async () => {
    const { agent: planner } = await signedInAs(app, t, 'planner')
    const pipe = PartSchema.parse((await planner.post('/api/parts').send(PIPE)).body)
    expect(pipe.unitCostCents).toBe(PIPE.unitCostCents)
    const { agent: cutter } = await signedInAs(app, t, 'cutter')
    const page = PartsPageSchema.parse((await cutter.get('/api/parts')).body)
    expect(page.total).toBe(1)
    // What the shop pays is the office's business: the bench gets the part with its cost blank.
    expect(page.items[0]).toMatchObject({ sku: PIPE.sku, shelfLocation: pipe.shelfLocation, unitCostCents: null })
    const one = await cutter.get(`/api/parts/${pipe.id}`)
    expect(one.status).toBe(200)
    expect(PartSchema.parse(one.body).unitCostCents).toBeNull()
    const sortByCost = await cutter.get('/api/parts?sort=unitCost')
    expect(sortByCost.status).toBe(400)
    expect(ApiErrorBodySchema.parse(sortByCost.body).error.message).toBe('Unit costs are shown to the office only: sort by another column')
    const benchCsv = (await cutter.get('/api/parts/export.csv')).text
    const officeCsv = (await planner.get('/api/parts/export.csv')).text
    expect(officeCsv).toContain('3.48')
    expect(benchCsv).not.toContain('3.48')
    expect(benchCsv.split('\n')[0]).toBe(officeCsv.split('\n')[0])
    expect((await cutter.post('/api/parts').send(ELBOW)).status).toBe(403)
    expect((await cutter.patch(`/api/parts/${pipe.id}`).send({ name: 'x' })).status).toBe(403)
    expect((await cutter.post('/api/parts/import').send({ csv: HEADER })).status).toBe(403)
    expect((await request(app).get('/api/parts')).status).toBe(401)
    expect(await partCount()).toBe(1)
  })
})
