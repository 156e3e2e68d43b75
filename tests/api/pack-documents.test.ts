import { execFileSync } from 'node:child_process'
import { mkdirSync, mkdtempSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { eq } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { gs1CheckDigit } from '@kitwright/shared/domain/gs1'
import { depthForVolume } from '@kitwright/shared/domain/reservoir'
import { formatLength, LENGTH_BASE_PER_MM } from '@kitwright/shared/domain/units'
import { RevisionFrameSchema } from '@kitwright/shared/kits'
import { PackViewSchema, type PackView } from '@kitwright/shared/pack'
import { seedDemo } from '../../server/src/seeds/demo'
import { kitRevisions, parcels } from '../../server/src/db/schema/index'
import { buildApp, signedInAs } from '../support/app'
import { decodeCode128, removeDir, renderPdfPages } from '../support/decode-barcode'
import { decodeGs1128 } from '../support/decode-gs1'
import { insertPackOrder, receivePlenty } from '../support/pack-factories'
import { createTestDb, type TestDb } from '../support/test-db'

let t: TestDb
let packer: Awaited<ReturnType<typeof signedInAs>>['agent']
let labelled: PackView
let units: Awaited<ReturnType<typeof insertPackOrder>>['units']
const shots = path.resolve(import.meta.dirname, '../.artifacts')

beforeAll(async () => {
  t = await createTestDb()
  await seedDemo(t.db)
  await receivePlenty(t.db)
  const built = buildApp(t)
  packer = (await signedInAs(built.app, t, 'packer')).agent
  // Two 12-site kits (two large cartons, two parcels) and a spare cup pack.
  const made = await insertPackOrder(t.db, [{ kitSku: 'MW-TOTE-12', quantity: 2 }, { kitSku: 'MW-SPARE-CUP12' }])
  units = made.units
  let v = PackViewSchema.parse((await packer.get('/api/pack/lookup').query({ code: units[0]!.binCode! })).body)
  for (const item of v.items) {
    const res =
      item.kind === 'unit'
        ? await packer.post(`/api/pack/orders/${v.order.id}/scan`).send({ code: item.binCode })
        : await packer.post(`/api/pack/orders/${v.order.id}/tick`).send({ itemKey: item.key })
    v = PackViewSchema.parse(res.body)
  }
  const res = await packer
    .post(`/api/pack/orders/${v.order.id}/label`)
    .send({ service: 'ground', parcels: v.parcels.map((p) => ({ workOrderIds: p.workOrderIds, boxId: p.boxId, scaleGrams: null })) })
  expect(res.status, JSON.stringify(res.body)).toBe(201)
  labelled = PackViewSchema.parse(res.body)
  mkdirSync(shots, { recursive: true })
})
afterAll(() => t.drop())

async function pdf(url: string) {
  const res = await packer
    .get(url)
    .buffer(true)
    .parse((r, cb) => {
      const chunks: Buffer[] = []
      r.on('data', (c: Buffer) => chunks.push(c))
      r.on('end', () => cb(null, Buffer.concat(chunks)))
    })
  expect(res.status).toBe(200)
  expect(res.headers['content-type']).toBe('application/pdf')
  return res.body as Buffer
}

function text(pdfBytes: Buffer) {
  const dir = mkdtempSync(path.join(tmpdir(), 'kw-slip-'))
  writeFileSync(path.join(dir, 'a.pdf'), pdfBytes)
  const out = execFileSync('pdftotext', ['-layout', path.join(dir, 'a.pdf'), '-'], { encoding: 'utf8' })
  const info = execFileSync('pdfinfo', [path.join(dir, 'a.pdf')], { encoding: 'utf8' })
  removeDir(dir)
  const m = /Page size:\s+([\d.]+) x ([\d.]+) pts/.exec(info)!
  return { text: out.replace(/\s+/g, ' '), size: [Number(m[1]), Number(m[2])] }
}

describe('the 4 × 6 in shipping label', () => {
  // Decoded by ZXing (@zxing/library), a general-purpose reader independent of the bwip-js encoder,
  // from the PDF rendered by poppler's pdftoppm at 203 dpi (a common thermal printer resolution).
  it('carries one SSCC per parcel in GS1-128 with AI (00), each with a check digit by GS1 §7.9.1', async () => {
    const label = await pdf(`/api/shipments/${labelled.shipment!.id}/label.pdf`)
    expect(text(label).size).toEqual([288, 432])
    const { pages, dir } = renderPdfPages(label)
    expect(pages).toHaveLength(2)
    pages.forEach((p, i) => writeFileSync(path.join(shots, `shipping-label-${i + 1}.png`), p))
    const stored = await t.db.select().from(parcels).where(eq(parcels.shipmentId, labelled.shipment!.id))
    const px = (pt: number) => Math.round((pt * 203) / 72)
    for (const [i, page] of pages.entries()) {
      // The SSCC band of the label (points 290 to 392) and the tracking band (200 to 262).
      const gs1 = decodeGs1128(page, { x: 0, y: px(290), w: px(288), h: px(102) })
      expect(gs1).toMatch(/^\]C100\d{18}$/)
      const digits = gs1.slice(5)
      expect(digits).toBe(stored.find((s) => s.position === i + 1)!.sscc)
      expect(Number(digits.at(-1))).toBe(gs1CheckDigit(digits.slice(0, 17)))
      // Each parcel's page carries that parcel's own tracking number.
      expect(decodeCode128(page, { x: 0, y: px(200), w: px(288), h: px(62) })).toBe(stored.find((s) => s.position === i + 1)!.trackingNumber)
    }
    removeDir(dir)
    const words = text(label).text
    for (const s of [
      'Mistwell Tote Works',
      '12 Foundry Lane',
      units[0]!.wo.serial,
      'GROUND',
      labelled.shipment!.trackingNumber!,
      labelled.order.shipTo.line1,
      'Parcel 1 of 2',
    ])
      expect(words).toContain(s)
  })
})

describe('the packing slip', () => {
  it('prints on Letter and A4 with the order number as Code 128, the serials, the fill line and the cautions', async () => {
    for (const paper of ['letter', 'a4'] as const) {
      const slip = await pdf(`/api/shipments/${labelled.shipment!.id}/packing-slip.pdf?paper=${paper}`)
      const { text: words, size } = text(slip)
      expect(size).toEqual(paper === 'letter' ? [612, 792] : [595.28, 841.89])
      const { pages, dir } = renderPdfPages(slip)
      pages.forEach((p, i) => writeFileSync(path.join(shots, `packing-slip-${paper}-${i + 1}.png`), p))
      // The order number's Code 128 in the top right corner (page width less 260 pt, top 120 pt), read by ZXing at 203 dpi.
      const px = (pt: number) => Math.round((pt * 203) / 72)
      expect(decodeCode128(pages[0]!, { x: px(size[0]! - 260), y: 0, w: px(260) - 1, h: px(120) })).toBe(labelled.order.number)
      removeDir(dir)
      expect(words).toContain('Mistwell Tote Works')
      expect(words).toContain(`Order ${labelled.order.number}`)
      for (const u of units) expect(words).toContain(`serial ${u.wo.serial}`)
      expect(words).toMatch(/ground-fault protected outlet/)
      expect(words).toMatch(/drip loop/)
      expect(words).toMatch(/Unplug the pump before reaching into the water/)
      expect(words).toMatch(/Keep the cord and the plug dry/)
      expect(words).toMatch(/local electrical codes.*licensed electrician/)
      // The fill line from the reservoir calculator for the revision's tote and leak-test water volume.
      const [rev] = await t.db.select().from(kitRevisions).where(eq(kitRevisions.id, units[0]!.wo.kitRevisionId))
      const tote = RevisionFrameSchema.parse(rev!.frameInputs).tote!
      const litres = rev!.leakTestWaterVolumeMl! / 1000
      const depth = depthForVolume(tote, litres, 'L')
      if (!depth.ok) throw new Error(depth.message)
      expect(words).toContain(
        `fill to ${formatLength(depth.depth, 'in')} (${formatLength(depth.depth, 'mm')}) above the floor of the tote, ${litres.toFixed(1)} L`,
      )
      // A check independent of the frustum formula: the water stands between volume ÷ rim area and volume ÷ floor area.
      const mm = (v: number) => v / LENGTH_BASE_PER_MM
      const cubicMm = litres * 1e6
      expect(mm(depth.depth)).toBeGreaterThan(cubicMm / (mm(tote.topInsideWidth) * mm(tote.topInsideLength)))
      expect(mm(depth.depth)).toBeLessThan(cubicMm / (mm(tote.bottomInsideWidth) * mm(tote.bottomInsideLength)))
    }
  })

  it('answers 409 for the label of a shipment with no label bought, and 404 for an unknown one', async () => {
    const { units: other } = await insertPackOrder(t.db, [{ kitSku: 'MW-SPARE-SPR6' }])
    const v = PackViewSchema.parse((await packer.post(`/api/pack/orders/${other[0]!.wo.orderId}/scan`).send({ code: other[0]!.wo.serial })).body)
    expect((await packer.get(`/api/shipments/${v.shipment!.id}/label.pdf`)).status).toBe(409)
    expect((await packer.get('/api/shipments/6f1c2a52-8d1e-4c55-9a55-0d1f6f3e2b11/label.pdf')).status).toBe(404)
  })
})
