import { execFileSync } from 'node:child_process'
import { mkdtempSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { z } from 'zod'
import { BinSchema } from '@kitwright/shared/bins'
import { binCode } from '@kitwright/shared/bins'
import { DEMO_BIN_COUNT, seedDemo } from '../../server/src/seeds/demo'
import { buildApp, signedInAs } from '../support/app'
import { decodeCode128, pngSize, removeDir, renderPdfPages } from '../support/decode-barcode'
import { createTestDb, type TestDb } from '../support/test-db'

let t: TestDb
let app: ReturnType<typeof buildApp>['app']
let planner: Awaited<ReturnType<typeof signedInAs>>['agent']
let bins: z.infer<typeof BinSchema>[]

beforeAll(async () => {
  t = await createTestDb()
  app = buildApp(t).app
  await seedDemo(t.db)
  planner = (await signedInAs(app, t, 'planner')).agent
  const res = await planner.post('/api/bins').send({ count: 4 })
  expect(res.status).toBe(201)
  bins = z.array(BinSchema).parse(res.body)
})
afterAll(() => t.drop())

async function labels(query: Record<string, string>) {
  const res = await planner.get('/api/bins/labels.pdf').query(query).buffer(true).parse((r, cb) => {
    const chunks: Buffer[] = []
    r.on('data', (c: Buffer) => chunks.push(c))
    r.on('end', () => cb(null, Buffer.concat(chunks)))
  })
  expect(res.status).toBe(200)
  expect(res.headers['content-type']).toBe('application/pdf')
  return res.body as Buffer
}

/** Page size in points as pdfinfo (poppler) reads it. */
function pageSize(pdf: Buffer) {
  const dir = mkdtempSync(path.join(tmpdir(), 'kw-info-'))
  writeFileSync(path.join(dir, 'a.pdf'), pdf)
  const info = execFileSync('pdfinfo', [path.join(dir, 'a.pdf')], { encoding: 'utf8' })
  removeDir(dir)
  const m = /Page size:\s+([\d.]+) x ([\d.]+) pts/.exec(info)!
  return [Number(m[1]), Number(m[2])]
}

/** The code of the n-th bin of this test's batch, numbered on after the demo shop's rack. */
const ours = (n: number) => binCode(DEMO_BIN_COUNT + n)

describe('bin labels', () => {
  it('starts the demo shop with a rack of free labelled bins', async () => {
    const res = await planner.get('/api/bins')
    const all = z.array(BinSchema).parse(res.body)
    const demo = all.filter((b) => b.code <= binCode(DEMO_BIN_COUNT))
    expect(demo.map((b) => b.code)).toEqual(Array.from({ length: DEMO_BIN_COUNT }, (_, i) => binCode(i + 1)))
    expect(demo.every((b) => b.status === 'free')).toBe(true)
    // Seeding again adds no second rack.
    await seedDemo(t.db)
    expect(z.array(BinSchema).parse((await planner.get('/api/bins')).body)).toHaveLength(all.length)
  })

  it('numbers a new batch on from the highest code', async () => {
    const more = z.array(BinSchema).parse((await planner.post('/api/bins').send({ count: 2 })).body)
    expect(more.map((b) => b.code)).toEqual([ours(5), ours(6)])
    const bad = await planner.post('/api/bins').send({ count: 0 })
    expect(bad.status).toBe(400)
  })

  // Decoded by ZXing (@zxing/library), an independent Code 128 reader (ISO/IEC 15417), from the PDF
  // rendered by poppler's pdftoppm at 203 dpi, as a thermal printer would print it.
  it('prints 2 × 1 in labels whose Code 128 decodes back to the bin code', async () => {
    const pdf = await labels({ size: '2x1', ids: bins.slice(0, 2).map((b) => b.id).join(',') })
    expect(pageSize(pdf)).toEqual([144, 72])
    const { pages, dir } = renderPdfPages(pdf)
    expect(pages).toHaveLength(2)
    expect(pngSize(pages[0]!)).toEqual({ width: 406, height: 203 }) // 2 × 1 in at 203 dpi
    expect(pages.map((p) => decodeCode128(p))).toEqual([ours(1), ours(2)])
    removeDir(dir)
  })

  it('prints one batch in one go, by its first and last code', async () => {
    const pdf = await labels({ size: '2x1', from: bins[0]!.code.toLowerCase(), to: bins[3]!.code })
    const { pages, dir } = renderPdfPages(pdf)
    expect(pages.map((p) => decodeCode128(p))).toEqual([ours(1), ours(2), ours(3), ours(4)])
    removeDir(dir)
    const bad = await planner.get('/api/bins/labels.pdf').query({ size: '2x1', from: 'B-12' })
    expect(bad.status).toBe(400)
    expect(bad.body.error.fields).toEqual({ from: 'A bin code looks like BIN-0012' })
  })

  it('prints 4 × 6 in labels that decode too', async () => {
    const pdf = await labels({ size: '4x6', ids: bins[2]!.id })
    expect(pageSize(pdf)).toEqual([288, 432])
    const { pages, dir } = renderPdfPages(pdf)
    expect(pages.map((p) => decodeCode128(p))).toEqual([ours(3)])
    removeDir(dir)
  })

  it('prints a Letter sheet of many, each label decodable on its own', async () => {
    const pdf = await labels({ size: 'letter' })
    expect(pageSize(pdf)).toEqual([612, 792])
    const { pages, dir } = renderPdfPages(pdf)
    expect(pages).toHaveLength(1)
    // The sheet: 0.5 in margins, 3 labels across and 10 down; crop each of the first row's labels.
    const dpi = 203
    const w = Math.floor(((612 - 72) / 3 / 72) * dpi)
    const h = Math.floor(((792 - 72) / 10 / 72) * dpi)
    const left = Math.round(0.5 * dpi)
    const decoded = [0, 1, 2].map((col) => decodeCode128(pages[0]!, { x: left + col * w, y: left, w, h }))
    expect(decoded).toEqual(['BIN-0001', 'BIN-0002', 'BIN-0003'])
    removeDir(dir)
  })
})
