// Malformed files at every CSV import of the route table, formula cells through every CSV export,
// and photo uploads that lie about their type or size.
import { and, eq, isNotNull } from 'drizzle-orm'
import Papa from 'papaparse'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { PresignedPhotoSchema } from '@kitwright/shared/build'
import { ApiErrorBodySchema } from '@kitwright/shared/errors'
import { unitPhotos } from '../../server/src/db/schema/index'
import { seedDemo } from '../../server/src/seeds/demo'
import { buildApp, signedInAs } from '../support/app'
import { insertBuildRevision, insertBuildWorkOrder } from '../support/build-factories'
import { changedTables, installRowChangeCounter } from '../support/row-changes'
import { createTestDb, type TestDb } from '../support/test-db'

let t: TestDb
let built: ReturnType<typeof buildApp>
let admin: Awaited<ReturnType<typeof signedInAs>>['agent']
let probe: Awaited<ReturnType<typeof installRowChangeCounter>>

beforeAll(async () => {
  t = await createTestDb()
  await seedDemo(t.db)
  built = buildApp(t)
  admin = (await signedInAs(built.app, t, 'admin')).agent
  probe = await installRowChangeCounter(t.pool)
})
afterAll(() => t.drop())

const FORMULA = '=HYPERLINK("http://x","y")'
/** A spreadsheet runs a cell starting with one of these as a formula (OWASP, "CSV Injection"). */
const FORMULA_START = /^[=+\-@\t\r]/

/** Text a user's file might hold after a wrong export or a wrong guess of its encoding. */
function malformedFiles(): Record<string, string> {
  const utf16 = Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from('sku,quantity\nMW-CUP,5\n', 'utf16le')]).toString('latin1')
  const cp1252AsUtf8 = Buffer.from([0x73, 0x6b, 0x75, 0x2c, 0x6e, 0x61, 0x6d, 0x65, 0x0a, 0x91, 0x92, 0xe9, 0x2c, 0x96, 0x0a]).toString('utf8')
  return {
    'wrong columns': 'colour,size,price\nred,9,1.00\n',
    'header only': 'sku,name,kind,unit_cost,weight_g\n',
    'blank lines only': '\n\n\r\n',
    'unterminated quote': 'sku,quantity,name\n"MW-CUP,5,cups\n',
    'UTF-16 read as Latin-1': utf16,
    'Windows-1252 read as UTF-8': cp1252AsUtf8,
    'NUL bytes': 'sku,quantity\nMW\u0000CUP,5\n',
    'a huge cell': `sku,quantity,name\nMW-CUP,5,${'x'.repeat(400_000)}\n`,
    '5000 columns': `${Array.from({ length: 5000 }, (_, i) => `c${i}`).join(',')}\n${Array.from({ length: 5000 }, () => '1').join(',')}\n`,
    'formula cells only': `${FORMULA},+1+1,@SUM(A1)\n-2+3,\t=1,\r=2\n`,
    'a row longer than the header': 'sku,quantity\nMW-CUP,5,extra,more\n',
  }
}

describe('CSV imports refuse malformed files', () => {
  it('answers every import and preview in the route table without a 5xx, in the error shape, writing nothing', async () => {
    const imports = built.routes.records.filter((r) => r.method === 'post' && /\/(import|import\/preview|receive\/csv|receive\/preview)$/.test(r.path))
    expect(imports.map((r) => r.path).sort()).toEqual([
      '/api/orders/import',
      '/api/orders/import/preview',
      '/api/parts/import',
      '/api/parts/import/preview',
      '/api/stock/receive/csv',
      '/api/stock/receive/preview',
    ])
    const wrong: string[] = []
    let calls = 0
    for (const route of imports) {
      for (const [name, csv] of Object.entries(malformedFiles())) {
        const before = await probe.read()
        const res = await admin.post(route.path).send({ csv })
        calls++
        const changed = changedTables(before, await probe.read())
        const preview = route.path.endsWith('preview')
        if (res.status >= 500) wrong.push(`${route.path} ${name}: ${res.status}`)
        if (!preview && res.status !== 400) wrong.push(`${route.path} ${name}: ${res.status}, expected 400`)
        if (res.status >= 400 && !ApiErrorBodySchema.safeParse(res.body).success) wrong.push(`${route.path} ${name}: no error shape`)
        if (res.status === 400 && !/\w{3,}/.test(ApiErrorBodySchema.parse(res.body).error.message)) wrong.push(`${route.path} ${name}: no message`)
        if (changed.length > 0) wrong.push(`${route.path} ${name}: wrote ${changed.join(', ')}`)
      }
    }
    console.log(`[bad-files] ${calls} malformed files at ${imports.length} import routes; ${wrong.length} wrong answers`)
    expect(wrong).toEqual([])
  })

  it('answers a file over the size limit with 413 or 400, saying so', async () => {
    const res = await admin.post('/api/parts/import').send({ csv: `sku\n${'y'.repeat(1_100_000)}` })
    expect(res.status).toBe(413)
    const big = await admin.post('/api/orders/import').send({ csv: `order_number\n${'y'.repeat(910_000)}` })
    expect(ApiErrorBodySchema.parse(big.body).error.message).toMatch(/too large/)
  })
})

describe('CSV exports neutralise formula cells', () => {
  it('prefixes a quote to every cell a spreadsheet would run, in every export of the route table', async () => {
    const parts = ['sku,name,kind,unit_cost,weight_g,supplier,shelf_location', `FX-1,"${FORMULA.replace(/"/g, '""')}",hardware,1.00,10,@SUM(A1),+1+1`].join('\n')
    expect((await admin.post('/api/parts/import').send({ csv: parts })).status).toBe(200)
    const orderHeader = 'order_number,placed_at,customer_name,customer_email,ship_line1,ship_city,ship_postal_code,ship_country,kit_sku,quantity,unit_price,note'
    const orderRow = `FX-100,2026-05-01,"${FORMULA.replace(/"/g, '""')}",fx@leafmail.example,-2+3 Mill Rd,@Oakmere,10001,US,MW-TOTE-12,1,189.00,+cmd`
    const imported = await admin.post('/api/orders/import').send({ csv: `${orderHeader}\n${orderRow}` })
    expect(imported.status, JSON.stringify(imported.body)).toBe(200)

    const exports = built.routes.records.filter((r) => r.method === 'get' && r.path.endsWith('.csv') && !r.path.includes(':'))
    expect(exports.length).toBeGreaterThanOrEqual(3)
    const risky: string[] = []
    const seen = new Set<string>()
    for (const route of exports) {
      const res = await admin.get(route.path).buffer(true).parse((r, done) => {
        let text = ''
        r.on('data', (c: Buffer) => (text += c.toString('utf8')))
        r.on('end', () => done(null, text))
      })
      if (res.status !== 200) continue // a report that needs a query answers 400; the rest are checked
      const rows = Papa.parse<string[]>(String(res.body).replace(/^\ufeff/, ''), { skipEmptyLines: true }).data
      for (const cell of rows.flat()) {
        if (FORMULA_START.test(cell) && !/^-\d+(\.\d+)?$/.test(cell)) risky.push(`${route.path}: ${cell.slice(0, 40)}`)
        if (cell.startsWith("'")) seen.add(`${route.path} ${cell}`)
      }
    }
    console.log(`[bad-files] ${exports.length} CSV exports read; ${seen.size} neutralised cells, ${risky.length} risky`)
    expect(risky).toEqual([])
    expect([...seen]).toEqual(expect.arrayContaining([`/api/parts/export.csv '${FORMULA}`, `/api/orders/export.csv '${FORMULA}`, `/api/stock/export.csv '${FORMULA}`]))
  })
})

describe('photo uploads that lie', () => {
  it('refuses wrong types and sizes at presign, a PUT of another type at the store, and a different size at confirm', async () => {
    const rev = await insertBuildRevision(t.db)
    const wo = await insertBuildWorkOrder(t.db, rev.revision.id, rev.kit.id)
    const url = `/api/build/${wo.id}/photos/presign`
    const before = await probe.read()
    for (const contentType of ['image/svg+xml', 'text/html', 'image/jpeg; charset=utf-8', 'IMAGE/JPEG', '', 'application/octet-stream']) {
      const res = await admin.post(url).send({ contentType, size: 1000 })
      expect(res.status, contentType).toBe(400)
      expect(ApiErrorBodySchema.parse(res.body).error.fields).toHaveProperty('contentType')
    }
    for (const size of [-1, 0, 1.5, 10 * 1024 * 1024 + 1, '1000', null]) {
      const res = await admin.post(url).send({ contentType: 'image/jpeg', size })
      expect(res.status, String(size)).toBe(400)
      expect(ApiErrorBodySchema.parse(res.body).error.fields).toHaveProperty('size')
    }
    expect(changedTables(before, await probe.read())).toEqual([])

    // Promised a JPEG, sends an HTML page as text/html. S3 refuses a PUT whose type is not the signed
    // one; s3rver does not check, so here the HEAD at confirm is what refuses it.
    const jpeg = PresignedPhotoSchema.parse((await admin.post(url).send({ contentType: 'image/jpeg', size: 20 })).body)
    const html = new TextEncoder().encode('<script>x</script>!!')
    const lying = await fetch(jpeg.url, { method: 'PUT', headers: { 'content-type': 'text/html' }, body: html })
    const typeCheck = await admin.post(`/api/build/${wo.id}/photos/confirm`).send({ key: jpeg.key })
    expect(typeCheck.status).toBe(400)
    expect(ApiErrorBodySchema.parse(typeCheck.body).error.fields).toEqual(lying.status === 200 ? { key: 'Wrong type' } : { key: 'Nothing uploaded under this key' })

    // Promised 20 bytes, sends 5 MB with the right type: the HEAD at confirm sees the size and refuses it.
    const big = new Uint8Array(5 * 1024 * 1024)
    await fetch(jpeg.url, { method: 'PUT', headers: jpeg.headers, body: big })
    const oversize = await admin.post(`/api/build/${wo.id}/photos/confirm`).send({ key: jpeg.key })
    expect(oversize.status).toBe(400)
    expect(ApiErrorBodySchema.parse(oversize.body).error.message).toMatch(/not the 20 promised/)
    expect((await request(built.app).post(`/api/build/${wo.id}/photos/confirm`).send({ key: jpeg.key })).status).toBe(401)
    // None of it recorded a photo as taken.
    expect(await t.db.$count(unitPhotos, and(eq(unitPhotos.workOrderId, wo.id), isNotNull(unitPhotos.uploadedAt)))).toBe(0)
  })
})
