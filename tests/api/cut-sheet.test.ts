import { execFileSync } from 'node:child_process'
import { mkdirSync, mkdtempSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { CutRunDetailSchema, type CutRunDetail, type CutStick } from '@kitwright/shared/cut-runs'
import { foldRuns, runNumbers, samePieceRow } from '@kitwright/shared/domain/saw-order'
import { formatLength, inches } from '@kitwright/shared/domain/units'
import { PAPER } from '../../server/src/features/labels/pdf-document'
import { seedDemo } from '../../server/src/seeds/demo'
import { parts, stockMoves } from '../../server/src/db/schema/index'
import { eq } from 'drizzle-orm'
import { buildApp, signedInAs } from '../support/app'
import { insertCutKit, insertWorkOrders } from '../support/cut-run-factories'
import { removeDir } from '../support/decode-barcode'
import { createTestDb, type TestDb } from '../support/test-db'

let t: TestDb
let planner: Awaited<ReturnType<typeof signedInAs>>['agent']
let cutter: Awaited<ReturnType<typeof signedInAs>>['agent']
let small: CutRunDetail
let big: CutRunDetail
let rails: CutRunDetail
let pegs: CutRunDetail
const artifacts = path.resolve(import.meta.dirname, '../.artifacts')

async function planAndPublish(workOrderIds: string[], timeLimitSeconds: number, stock?: { partId: string; stickLength: number; maxSticks: number }[]) {
  const draft = await planner.post('/api/cut-runs').send({ workOrderIds, timeLimitSeconds, stock })
  expect(draft.status, JSON.stringify(draft.body)).toBe(201)
  const published = await planner.post(`/api/cut-runs/${draft.body.id}/publish`)
  expect(published.status).toBe(200)
  return CutRunDetailSchema.parse(published.body)
}

beforeAll(async () => {
  t = await createTestDb()
  const app = buildApp(t).app
  await seedDemo(t.db)
  planner = (await signedInAs(app, t, 'planner')).agent
  cutter = (await signedInAs(app, t, 'cutter')).agent
  const demo = [...(await insertWorkOrders(t.db, { kitSku: 'MW-TOTE-6C', count: 3 })), ...(await insertWorkOrders(t.db, { kitSku: 'MW-TOTE-12', count: 1 }))]
  small = await planAndPublish(demo.map((w) => w.id), 3)

  // A big run to force page breaks: a stick of 51 equal pegs per unit, many sticks of one rail
  // pattern, and units of mixed short pieces that share sticks.
  await insertCutKit(t.db, { sku: 'TST-PEG', cutParts: [{ label: 'peg', length: inches(4.25), quantity: 51 }] })
  await insertCutKit(t.db, { sku: 'TST-RAIL', cutParts: [{ label: 'rail', length: inches(58), quantity: 2 }] })
  await insertCutKit(t.db, {
    sku: 'TST-SPOKE',
    cutParts: [
      { label: 'spoke', length: inches(9.5), quantity: 6 },
      { label: 'stub', length: inches(6.75), quantity: 4 },
      { label: 'brace', length: inches(17), quantity: 2 },
    ],
  })
  const wos = [
    ...(await insertWorkOrders(t.db, { kitSku: 'TST-PEG', count: 2 })),
    ...(await insertWorkOrders(t.db, { kitSku: 'TST-RAIL', count: 20 })),
    ...(await insertWorkOrders(t.db, { kitSku: 'TST-SPOKE', count: 8 })),
  ]
  big = await planAndPublish(wos.map((w) => w.id), 5)
  const pipe = await t.db.select().from(parts).where(eq(parts.sku, 'PVC-050-S40'))
  // Rails alone: two 58 in rails fill a stick and three never fit, so every plan is one pattern cut
  // on 32 sticks (8 units × 8 rails), taller than a page whatever the engine's time allows.
  // Cut from 10 ft sticks only, received for it.
  await insertCutKit(t.db, { sku: 'TST-RAIL8', cutParts: [{ label: 'rail', length: inches(58), quantity: 8 }] })
  await t.db.insert(stockMoves).values({ partId: pipe[0]!.id, kind: 'receive', quantity: 40, stickLength: inches(120) })
  const railUnits = await insertWorkOrders(t.db, { kitSku: 'TST-RAIL8', count: 8 })
  rails = await planAndPublish(railUnits.map((w) => w.id), 5, [{ partId: pipe[0]!.id, stickLength: inches(120), maxSticks: 40 }])
  // One unit of 51 pegs on one 240 in stick: narrow pieces, numbered under the stick with leaders.
  const pegUnit = await insertWorkOrders(t.db, { kitSku: 'TST-PEG', count: 1 })
  pegs = await planAndPublish(pegUnit.map((w) => w.id), 3, [{ partId: pipe[0]!.id, stickLength: inches(240), maxSticks: 1 }])
}, 120_000)
afterAll(() => t.drop())

async function sheet(run: CutRunDetail, paper: string) {
  const res = await cutter.get(`/api/cut-runs/${run.id}/cut-sheet.pdf`).query({ paper }).buffer(true).parse((r, cb) => {
    const chunks: Buffer[] = []
    r.on('data', (c: Buffer) => chunks.push(c))
    r.on('end', () => cb(null, Buffer.concat(chunks)))
  })
  expect(res.status).toBe(200)
  expect(res.headers['content-type']).toBe('application/pdf')
  // Opens in the browser's viewer, with a name for when it is saved.
  expect(res.headers['content-disposition']).toBe(`inline; filename="cut-sheet-${run.number}-${paper}.pdf"`)
  // Chrome's PDF viewer is an internal <embed>: a policy with object-src 'none' would block it (crbug.com/271452).
  expect(res.headers['content-security-policy']).toBe("frame-ancestors 'self'")
  expect(res.headers['x-content-type-options']).toBe('nosniff')
  const dir = mkdtempSync(path.join(tmpdir(), 'kw-sheet-'))
  const file = path.join(dir, 's.pdf')
  writeFileSync(file, res.body as Buffer)
  mkdirSync(artifacts, { recursive: true })
  writeFileSync(path.join(artifacts, `cut-sheet-${run === big ? 'big' : run === pegs ? 'pegs' : run === rails ? 'rails' : 'small'}-${paper}.pdf`), res.body as Buffer)
  // poppler's pdftotext and pdfinfo read the PDF back: an outside reader, not our own code.
  const text = execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' })
  const info = execFileSync('pdfinfo', [file], { encoding: 'utf8' })
  const bbox = execFileSync('pdftotext', ['-bbox', file, '-'], { encoding: 'utf8' })
  removeDir(dir)
  return { text, info, pages: text.split('\f').filter((p) => p.trim() !== ''), bbox }
}

const len = (v: number) => formatLength(v, 'in')

/** What the cut list of a stick must say, row by row: cut numbers, length, quantity, part, work order. */
function expectedRows(stick: CutStick) {
  return foldRuns(stick.cuts, samePieceRow).map((r) => `${runNumbers(r)} | ${len(r.items[0]!.length)} | ${r.items.length} | ${r.items[0]!.label} | WO ${r.items[0]!.serial}`)
}

interface Read {
  /** Rows read back per stick position, in printed order. */
  rows: Map<number, string[]>
  /** Pages (1-based) on which each pattern's heading or rows appear. */
  pagesOf: Map<number, Set<number>>
  /** Pattern headings per page, in order, with whether each says "continued". */
  headings: { page: number; pattern: number; continued: boolean }[]
  /** Stick position → pattern number it was listed under. */
  patternOfStick: Map<number, number>
}

/** Reads the cut lists back from pdftotext's layout text. */
function readSheet(pages: string[]): Read {
  const read: Read = { rows: new Map(), pagesOf: new Map(), headings: [], patternOfStick: new Map() }
  let pattern = -1
  let stick = -1
  pages.forEach((text, i) => {
    const page = i + 1
    for (const ln of text.split('\n')) {
      const h = /Pattern (\d+): .* · cut \d+ sticks?.*?( \(continued\))?\s*$/.exec(ln)
      if (h) {
        pattern = Number(h[1])
        read.headings.push({ page, pattern, continued: h[2] !== undefined })
        read.pagesOf.set(pattern, (read.pagesOf.get(pattern) ?? new Set()).add(page))
        continue
      }
      const s = /^\s*Stick (\d+)/.exec(ln)
      if (s) {
        stick = Number(s[1])
        read.patternOfStick.set(stick, pattern)
        continue
      }
      const r = /^\s*(\d+(?:–\d+)?)\s+(\S+")\s+(\d+)\s+(.+?)\s+WO (\d+) · (?:bin \S+|bin at the bench)\s*$/.exec(ln)
      if (r) {
        read.rows.set(stick, [...(read.rows.get(stick) ?? []), `${r[1]} | ${r[2]} | ${r[3]} | ${r[4]} | WO ${r[5]}`])
        read.pagesOf.get(pattern)!.add(page)
      }
    }
  })
  return read
}

/** Words of one page from `pdftotext -bbox` (PDF points, y down from the top). */
function wordsOf(bbox: string) {
  return bbox.split('<page ').slice(1).map((page) =>
    [...page.matchAll(/<word xMin="([\d.]+)" yMin="([\d.]+)" xMax="([\d.]+)" yMax="([\d.]+)">([^<]*)<\/word>/g)].map((m) => ({ x0: Number(m[1]), y0: Number(m[2]), x1: Number(m[3]), text: m[5]! })),
  )
}

function checkSheet(run: CutRunDetail, paper: 'letter' | 'a4', got: Awaited<ReturnType<typeof sheet>>) {
  const read = readSheet(got.pages)
  const patterns = new Map<number, CutStick[]>()
  for (const s of run.sticks) patterns.set(s.patternIndex + 1, [...(patterns.get(s.patternIndex + 1) ?? []), s])

  // Every stick's list: the right rows, under the right pattern, in saw order.
  for (const s of run.sticks) {
    expect(read.rows.get(s.position), `stick ${s.position}`).toEqual(expectedRows(s))
    expect(read.patternOfStick.get(s.position)).toBe(s.patternIndex + 1)
    // Longest first, equal lengths together: the stop block is set once per distinct length.
    const lengths = s.cuts.map((c) => c.length)
    expect(lengths).toEqual([...lengths].sort((a, b) => b - a))
    // Physically right: each piece starts after the trim and every earlier piece plus one kerf.
    let at = s.trim
    for (const c of s.cuts) {
      expect(c.offset).toBe(at)
      at += c.length + run.kerf
    }
    // The stick holds it all: trim + pieces + a kerf between pieces fits (common practice: the last
    // cut may run off the end), and what is left is the remnant.
    const pieces = lengths.reduce((a, b) => a + b, 0)
    expect(s.trim + pieces + run.kerf * (lengths.length - 1)).toBeLessThanOrEqual(s.length)
    if (s.status !== 'damaged') expect(s.remnant).toBe(Math.max(0, s.length - s.trim - pieces - run.kerf * lengths.length))
  }

  // Never split: a pattern on more than one page starts at the top of a page and every further
  // page opens with its heading marked "continued" (its drawing repeated).
  for (const [pattern, pages] of read.pagesOf) {
    const own = read.headings.filter((h) => h.pattern === pattern)
    expect(own[0]!.continued).toBe(false)
    expect(own.slice(1).every((h) => h.continued)).toBe(true)
    expect(new Set(own.map((h) => h.page))).toEqual(pages)
    if (pages.size > 1) {
      const firstPage = Math.min(...pages)
      expect(read.headings.find((h) => h.page === firstPage)!.pattern, `pattern ${pattern} taller than a page starts its page`).toBe(pattern)
    }
  }

  // The numbers on each drawing: 1..n left to right, each inside (or under) its own piece.
  const [pw] = PAPER[paper]
  const width = pw - 80
  const pageWords = wordsOf(got.bbox)
  let drawings = 0
  pageWords.forEach((words) => {
    words.forEach((w, i) => {
      if (w.text !== 'Pattern') return
      const pattern = Number(words[i + 1]!.text.replace(':', ''))
      const stick = patterns.get(pattern)![0]!
      const header = words.find((o) => o.text === 'Order' && o.y0 > w.y0)!
      const numbers = words.filter((o) => /^\d+$/.test(o.text) && o.y0 > w.y0 + 28 && o.y0 < header.y0).sort((a, b) => a.x0 - b.x0)
      expect(numbers.map((n) => n.text), `drawing of pattern ${pattern}`).toEqual(stick.cuts.map((_, k) => String(k + 1)))
      const scale = width / stick.length
      stick.cuts.forEach((c, k) => {
        const centre = (numbers[k]!.x0 + numbers[k]!.x1) / 2
        expect(Math.abs(centre - (40 + (c.offset + c.length / 2) * scale)), `piece ${k + 1} of pattern ${pattern}`).toBeLessThan(Math.max(2, (c.length * scale) / 2))
      })
      drawings += 1
    })
  })
  expect(drawings).toBe(read.headings.length)
  return read
}

describe('the cut sheet PDF', () => {
  it('lists every pattern with its sticks, each stick a cut list in saw order with the right rows, every piece numbered on the drawing, and the cautions', async () => {
    const got = await sheet(small, 'letter')
    expect(got.info).toMatch(/Page size:\s+612 x 792 pts/)
    expect(got.text).toContain(`Cut sheet ${small.number}`)
    checkSheet(small, 'letter', got)
    const counts = new Map<number, number>()
    for (const s of small.sticks) counts.set(s.patternIndex + 1, (counts.get(s.patternIndex + 1) ?? 0) + 1)
    const found = [...got.text.matchAll(/Pattern (\d+): PVC-050-S40, [^·\n]*· cut (\d+) sticks?/g)].map((m) => [Number(m[1]), Number(m[2])] as const)
    expect(new Map(found)).toEqual(counts)
    expect(got.text).toMatch(/Order\s+Length\s+Qty\s+Part\s+Unit \/ bin\s+Done/)
    expect(got.text).toContain('Wear eye protection')
    expect(got.text).toContain('Clamp the work')
    expect(got.text).toContain('Keep hands clear of the blade')
    expect(got.text).toMatch(/saw maker's instructions and your shop's local safety practice/)
    // The legend in words.
    for (const words of ['Saw cut (kerf)', 'End trim', 'Offcut: label it, to the rack', 'Scrap: too short to keep']) expect(got.text).toContain(words)
  })

  it.each(['letter', 'a4'] as const)('a big run on %s: many patterns over several pages, none split; one taller than a page goes on, continued', async (paper) => {
    const got = await sheet(big, paper)
    const read = checkSheet(big, paper, got)
    expect(got.pages.length).toBeGreaterThanOrEqual(3)
    expect(read.pagesOf.size).toBeGreaterThanOrEqual(4)
    // A pattern taller than a page (the rails: one pattern on 32 sticks) goes on, "continued", with its drawing repeated.
    expect(new Set(rails.sticks.map((x) => x.patternIndex)).size).toBe(1)
    const tall = await sheet(rails, paper)
    const readTall = checkSheet(rails, paper, tall)
    expect(readTall.headings.some((h) => h.continued)).toBe(true)
  })

  it.each(['letter', 'a4'] as const)('a stick of 51 equal pegs on %s: one row of 51, all 51 pieces numbered on the drawing', async (paper) => {
    const got = await sheet(pegs, paper)
    checkSheet(pegs, paper, got)
    expect(pegs.sticks).toHaveLength(1)
    const stick = pegs.sticks[0]!
    expect(stick.cuts).toHaveLength(51)
    expect(readSheet(got.pages).rows.get(stick.position)).toEqual([`1–51 | 4-1/4" | 51 | peg | WO ${stick.cuts[0]!.serial}`])
    expect(got.text).toContain('stop block at 4-1/4" (1 setting)')
  })

  it('refuses other paper', async () => {
    const bad = await cutter.get(`/api/cut-runs/${small.id}/cut-sheet.pdf`).query({ paper: 'legal' })
    expect(bad.status).toBe(400)
  })
})
