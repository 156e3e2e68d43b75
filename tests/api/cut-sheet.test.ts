import { execFileSync } from 'node:child_process'
import { mkdtempSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { CutRunDetailSchema, type CutRunDetail } from '@kitwright/shared/cut-runs'
import { seedDemo } from '../../server/src/db/seed'
import { buildApp, signedInAs } from '../support/app'
import { insertWorkOrders } from '../support/cut-run-factories'
import { removeDir } from '../support/decode-barcode'
import { createTestDb, type TestDb } from '../support/test-db'

let t: TestDb
let planner: Awaited<ReturnType<typeof signedInAs>>['agent']
let cutter: Awaited<ReturnType<typeof signedInAs>>['agent']
let run: CutRunDetail

beforeAll(async () => {
  t = await createTestDb()
  const app = buildApp(t).app
  await seedDemo(t.db)
  planner = (await signedInAs(app, t, 'planner')).agent
  cutter = (await signedInAs(app, t, 'cutter')).agent
  const wos = [...(await insertWorkOrders(t.db, { kitSku: 'MW-TOTE-6C', count: 3 })), ...(await insertWorkOrders(t.db, { kitSku: 'MW-TOTE-12', count: 1 }))]
  const draft = await planner.post('/api/cut-runs').send({ workOrderIds: wos.map((w) => w.id), timeLimitSeconds: 3 })
  expect(draft.status).toBe(201)
  run = CutRunDetailSchema.parse((await planner.post(`/api/cut-runs/${draft.body.id}/publish`)).body)
})
afterAll(() => t.drop())

async function sheet(paper: string) {
  const res = await cutter.get(`/api/cut-runs/${run.id}/cut-sheet.pdf`).query({ paper }).buffer(true).parse((r, cb) => {
    const chunks: Buffer[] = []
    r.on('data', (c: Buffer) => chunks.push(c))
    r.on('end', () => cb(null, Buffer.concat(chunks)))
  })
  expect(res.status).toBe(200)
  expect(res.headers['content-type']).toBe('application/pdf')
  const dir = mkdtempSync(path.join(tmpdir(), 'kw-sheet-'))
  writeFileSync(path.join(dir, 's.pdf'), res.body as Buffer)
  // poppler's pdftotext and pdfinfo read the PDF back: an outside reader, not our own code.
  const text = execFileSync('pdftotext', ['-layout', path.join(dir, 's.pdf'), '-'], { encoding: 'utf8' })
  const info = execFileSync('pdfinfo', [path.join(dir, 's.pdf')], { encoding: 'utf8' })
  removeDir(dir)
  return { text, info }
}

describe('the cut sheet PDF', () => {
  it('lists every pattern with how many times to cut it, the cut order, every stick with its work orders, and the cautions', async () => {
    const { text, info } = await sheet('letter')
    expect(info).toMatch(/Page size:\s+612 x 792 pts/)
    expect(text).toContain(`Cut sheet ${run.number}`)
    const counts = new Map<number, number>()
    for (const s of run.sticks) counts.set(s.patternIndex, (counts.get(s.patternIndex) ?? 0) + 1)
    const found = [...text.matchAll(/Pattern (\d+): PVC-050-S40, [^\n]*\n\s*Cut (\d+) times?/g)].map((m) => [Number(m[1]) - 1, Number(m[2])])
    expect(new Map(found.map(([i, n]) => [i!, n!]))).toEqual(counts)
    expect(text.match(/Cut order: 1/g)).toHaveLength(counts.size)
    for (const s of run.sticks) {
      expect(text).toContain(`Stick ${s.position}:`)
      for (const serial of new Set(s.cuts.map((c) => c.serial))) expect(text).toMatch(new RegExp(`Stick ${s.position}:[^\\n]*WO ${serial}|WO ${serial}`))
    }
    expect(text).toContain('Wear eye protection')
    expect(text).toContain('Clamp the work')
    expect(text).toContain('Keep hands clear of the blade')
    expect(text).toMatch(/saw maker's instructions and your shop's local safety practice/)
  })

  it('prints on A4 too, and refuses other paper', async () => {
    const { info, text } = await sheet('a4')
    expect(info).toMatch(/Page size:\s+595\.2\d* x 841\.8\d* pts/)
    expect(text).toContain('Pattern 1:')
    const bad = await cutter.get(`/api/cut-runs/${run.id}/cut-sheet.pdf`).query({ paper: 'legal' })
    expect(bad.status).toBe(400)
  })
})
