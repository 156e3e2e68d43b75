import { and, eq, inArray } from 'drizzle-orm'
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest'
import { z } from 'zod'
import { CandidateWorkOrderSchema, CutRunDetailSchema, PipeStockSchema, type CutRunDetail } from '@kitwright/shared/cut-runs'
import { inches } from '@kitwright/shared/domain/units'
import { ApiErrorBodySchema } from '@kitwright/shared/errors'
import { cutParts, cutRunCuts, offcuts, parts, stockMoves, workOrders } from '../../server/src/db/schema/index'
import { seedDemo } from '../../server/src/seeds/demo'
import { DEMO_PART_SKUS } from '../../server/src/seeds/catalog'
import { buildApp, signedInAs } from '../support/app'
import { insertOffcut, insertWorkOrders } from '../support/cut-run-factories'
import { createTestDb, type TestDb } from '../support/test-db'

let t: TestDb
let app: ReturnType<typeof buildApp>['app']
type Agent = Awaited<ReturnType<typeof signedInAs>>['agent']
let planner: Agent
let cutter: Agent
let pipeId: string

beforeAll(async () => {
  t = await createTestDb()
  app = buildApp(t).app
})
beforeEach(async () => {
  await t.truncate()
  await seedDemo(t.db)
  planner = (await signedInAs(app, t, 'planner')).agent
  cutter = (await signedInAs(app, t, 'cutter')).agent
  pipeId = (await t.db.select().from(parts).where(eq(parts.sku, DEMO_PART_SKUS.pipeHalfInch)))[0]!.id
})
afterAll(() => t.drop())

const TEN_FT = inches(120)
const TWENTY_FT = inches(240)

async function plan(body: Record<string, unknown>): Promise<CutRunDetail> {
  const res = await planner.post('/api/cut-runs').send({ timeLimitSeconds: 3, ...body })
  expect(res.status, JSON.stringify(res.body)).toBe(201)
  return CutRunDetailSchema.parse(res.body)
}

async function publish(id: string) {
  const res = await planner.post(`/api/cut-runs/${id}/publish`)
  expect(res.status, JSON.stringify(res.body)).toBe(200)
  return CutRunDetailSchema.parse(res.body)
}

/** Every piece a work order needs, from its revision's cut parts: `${workOrderId}|${cutPartId}` → quantity. */
async function piecesWanted(woIds: string[]) {
  const wos = await t.db.select().from(workOrders).where(inArray(workOrders.id, woIds))
  const wanted = new Map<string, number>()
  for (const wo of wos) {
    for (const cp of await t.db.select().from(cutParts).where(eq(cutParts.revisionId, wo.kitRevisionId))) wanted.set(`${wo.id}|${cp.id}`, cp.quantity)
  }
  return wanted
}

/** Live (not re-planned) cuts of a run, counted per work order and cut part. */
function piecesPlanned(run: CutRunDetail, status?: 'cut') {
  const got = new Map<string, number>()
  for (const s of run.sticks) {
    for (const c of s.cuts) {
      if (c.status === 'replanned' || (status && c.status !== status)) continue
      const key = `${c.workOrderId}|${c.cutPartId}`
      got.set(key, (got.get(key) ?? 0) + 1)
    }
  }
  return got
}

async function runMoves(number: string) {
  const moves = await t.db.select().from(stockMoves).where(eq(stockMoves.partId, pipeId))
  return moves.filter((m) => m.reason?.startsWith(`Cut run ${number}`))
}

describe('planning a cut run', () => {
  it('lists the work orders waiting to be cut, by due date and by kit, and the pipe on hand from the ledger', async () => {
    // The demo data may hold released work orders of its own: look only at this test's.
    const early = await insertWorkOrders(t.db, { kitSku: 'MW-TOTE-12', count: 2, dueDate: '2000-03-01' })
    const [late] = await insertWorkOrders(t.db, { kitSku: 'MW-TOTE-6C', count: 1, dueDate: '2000-04-01' })
    const [spare] = await insertWorkOrders(t.db, { kitSku: 'MW-SPARE-SPR6', count: 1 }) // no pipe: never a candidate
    const mine = new Set([...early, late!, spare!].map((w) => w.id))
    const all = z.array(CandidateWorkOrderSchema).parse((await planner.get('/api/cut-runs/candidates')).body).filter((w) => mine.has(w.id))
    expect(all.map((w) => w.kitSku)).toEqual(['MW-TOTE-12', 'MW-TOTE-12', 'MW-TOTE-6C']) // by due date
    const due = z.array(CandidateWorkOrderSchema).parse((await planner.get('/api/cut-runs/candidates').query({ dueBy: '2000-03-15' })).body)
    expect(due.map((w) => w.id).sort()).toEqual(early.map((w) => w.id).sort())
    const compact = all.find((w) => w.kitSku === 'MW-TOTE-6C')!
    const byKit = z.array(CandidateWorkOrderSchema).parse((await planner.get('/api/cut-runs/candidates').query({ kitId: compact.kitId })).body)
    expect(byKit.every((w) => w.kitSku === 'MW-TOTE-6C')).toBe(true)
    expect(byKit.map((w) => w.id)).toContain(compact.id)
    // On hand and reserved per stick length, summed straight from the ledger table.
    const moves = await t.db.select().from(stockMoves).where(eq(stockMoves.partId, pipeId))
    const sum = (length: number, kinds: string[]) => moves.filter((m) => m.stickLength === length && kinds.includes(m.kind)).reduce((a, m) => a + m.quantity, 0)
    const stock = z.array(PipeStockSchema).parse((await planner.get('/api/cut-runs/stock')).body)
    const onHandKinds = ['receive', 'adjust', 'consume', 'offcut_in', 'offcut_out', 'ship']
    expect(stock.find((p) => p.partId === pipeId)!.sticks).toEqual(
      [TEN_FT, TWENTY_FT].map((l) => ({ stickLength: l, onHand: sum(l, onHandKinds), available: sum(l, onHandKinds) - sum(l, ['reserve', 'release']) })),
    )
    expect(sum(TEN_FT, ['receive'])).toBe(40) // demo stock: 40 ten-foot sticks received (server/src/seeds/stock.ts)
  })

  it('nests every piece of the chosen work orders exactly once, within each stick, and reserves nothing until published', async () => {
    const wos = await insertWorkOrders(t.db, { kitSku: 'MW-TOTE-12', count: 3 })
    const run = await plan({ workOrderIds: wos.map((w) => w.id) })
    expect(run.status).toBe('draft')
    expect(run.number).toMatch(/^CR-\d{4}$/)
    expect(piecesPlanned(run)).toEqual(await piecesWanted(wos.map((w) => w.id)))
    // Each stick obeys the engine's stated rule (common practice at a chop saw, types.ts):
    // trim + pieces + kerf × (n − 1) ≤ length, and remnant = max(0, length − trim − pieces − kerf × n).
    for (const s of run.sticks) {
      const pieces = s.cuts.reduce((sum, c) => sum + c.length, 0)
      expect(s.trim + pieces + run.kerf * (s.cuts.length - 1)).toBeLessThanOrEqual(s.length)
      expect(s.remnant).toBe(Math.max(0, s.length - s.trim - pieces - run.kerf * s.cuts.length))
      expect(s.remnantIsOffcut).toBe(s.remnant >= run.minOffcut)
    }
    expect(run.totals.sticksUsed).toBe(run.sticks.length)
    expect(run.totals.sticksUsed).toBeGreaterThanOrEqual(run.totals.lowerBoundSticks)
    expect(run.totals.stockCost).toBeGreaterThanOrEqual(run.totals.lowerBoundCost)
    // Demo shop settings: kerf 1/8 in, trim 1/4 in, offcuts from 6 in (server/src/seeds/demo.ts).
    expect([run.kerf, run.endTrim, run.minOffcut]).toEqual([inches(1 / 8), inches(1 / 4), inches(6)])
    expect(await runMoves(run.number)).toEqual([])
  })

  it('refuses bad input with what to fix', async () => {
    const empty = await planner.post('/api/cut-runs').send({ workOrderIds: [] })
    expect(empty.status).toBe(400)
    expect(ApiErrorBodySchema.parse(empty.body).error.fields).toEqual({ workOrderIds: 'Choose at least one work order' })
    const [spare] = await insertWorkOrders(t.db, { kitSku: 'MW-SPARE-SPR6', count: 1 })
    const noPipe = await planner.post('/api/cut-runs').send({ workOrderIds: [spare!.id] })
    expect(noPipe.status).toBe(400)
    expect(ApiErrorBodySchema.parse(noPipe.body).error.message).toMatch(/has no pipe to cut/)
    const [wo] = await insertWorkOrders(t.db, { kitSku: 'MW-TOTE-12', count: 1 })
    const noStock = await planner.post('/api/cut-runs').send({ workOrderIds: [wo!.id], stock: [], useOffcuts: false })
    expect(noStock.status).toBe(400)
    expect(ApiErrorBodySchema.parse(noStock.body).error.message).toMatch(/No PVC-050-S40 .* to cut from/)
  })
})

describe('publishing', () => {
  it('reserves exactly the sticks used, per stick length, and the offcuts it uses, in the ledger', async () => {
    const offcut = await insertOffcut(t.db, DEMO_PART_SKUS.pipeHalfInch, inches(40))
    const wos = await insertWorkOrders(t.db, { kitSku: 'MW-TOTE-12', count: 2 })
    const draft = await plan({ workOrderIds: wos.map((w) => w.id) })
    const usesOffcut = draft.sticks.some((s) => s.source === 'offcut')
    const before = z.array(PipeStockSchema).parse((await planner.get('/api/cut-runs/stock')).body)
    const tenFtBefore = before.find((p) => p.partId === pipeId)!.sticks.find((s) => s.stickLength === TEN_FT)!.available
    const run = await publish(draft.id)
    expect(run.status).toBe('published')
    const reserves = await runMoves(run.number)
    const reservedBy = new Map<number, number>()
    for (const m of reserves) {
      expect(m.kind).toBe('reserve')
      reservedBy.set(m.stickLength!, (reservedBy.get(m.stickLength!) ?? 0) + m.quantity)
    }
    const used = new Map<number, number>()
    for (const s of run.sticks) if (s.stickLength) used.set(s.stickLength, (used.get(s.stickLength) ?? 0) + 1)
    expect(reservedBy).toEqual(used)
    const [after] = await t.db.select().from(offcuts).where(eq(offcuts.id, offcut.id))
    expect(after!.status).toBe(usesOffcut ? 'reserved' : 'in_stock')
    // The stock page reads the same reservation back from the ledger.
    const stock = z.array(PipeStockSchema).parse((await planner.get('/api/cut-runs/stock')).body)
    const tenFt = stock.find((p) => p.partId === pipeId)!.sticks.find((s) => s.stickLength === TEN_FT)!
    expect(tenFt.available).toBe(tenFtBefore - (used.get(TEN_FT) ?? 0))
    // Published once: a second publish is refused and reserves nothing more.
    expect((await planner.post(`/api/cut-runs/${run.id}/publish`)).status).toBe(409)
    expect((await runMoves(run.number)).length).toBe(reserves.length)
  })

  it('refuses with 409 saying what is short when the stock changed since the plan, and reserves nothing', async () => {
    const wos = await insertWorkOrders(t.db, { kitSku: 'MW-TOTE-12', count: 2 })
    const draft = await plan({ workOrderIds: wos.map((w) => w.id), stock: [{ partId: pipeId, stickLength: TEN_FT, maxSticks: 40 }], useOffcuts: false })
    const needed = draft.sticks.length
    const tenFtFree = z.array(PipeStockSchema).parse((await planner.get('/api/cut-runs/stock')).body).find((p) => p.partId === pipeId)!.sticks.find((s) => s.stickLength === TEN_FT)!.available
    // Someone writes off all but one ten-foot stick after the plan was made.
    expect((await planner.post('/api/stock/adjust').send({ partId: pipeId, stickLength: TEN_FT, quantity: -(tenFtFree - 1), reason: 'Water damage' })).status).toBe(201)
    const res = await planner.post(`/api/cut-runs/${draft.id}/publish`)
    expect(res.status).toBe(409)
    expect(ApiErrorBodySchema.parse(res.body).error.message).toMatch(new RegExp(`Not enough stock to reserve: .*10 ft sticks: wanted ${needed}, available 1`))
    expect(await runMoves(draft.number)).toEqual([])
    expect(CutRunDetailSchema.parse((await planner.get(`/api/cut-runs/${draft.id}`)).body).status).toBe('draft')
  })

  it('lets the cutter work the bench but not plan or publish', async () => {
    const wos = await insertWorkOrders(t.db, { kitSku: 'MW-TOTE-6C', count: 1 })
    expect((await cutter.post('/api/cut-runs').send({ workOrderIds: wos.map((w) => w.id) })).status).toBe(403)
    expect((await cutter.get('/api/cut-runs/candidates')).status).toBe(403)
    const draft = await plan({ workOrderIds: wos.map((w) => w.id) })
    expect((await cutter.post(`/api/cut-runs/${draft.id}/publish`)).status).toBe(403)
    const run = await publish(draft.id)
    expect((await cutter.get(`/api/cut-runs/${run.id}`)).status).toBe(200)
    expect((await cutter.post(`/api/cut-runs/${run.id}/cuts/${run.sticks[0]!.cuts[0]!.id}/tick`)).status).toBe(200)
    expect((await cutter.post(`/api/cut-runs/${run.id}/cancel`)).status).toBe(403)
  })
})

describe('the cut bench', () => {
  it('ticks a piece with who and when, consumes the stick once as it starts, and undoes a tick', async () => {
    const wos = await insertWorkOrders(t.db, { kitSku: 'MW-TOTE-6C', count: 2 })
    const run = await publish((await plan({ workOrderIds: wos.map((w) => w.id), useOffcuts: false })).id)
    const stick = run.sticks[0]!
    const [first, second] = stick.cuts
    const res = await cutter.post(`/api/cut-runs/${run.id}/cuts/${first!.id}/tick`)
    expect(res.status).toBe(200)
    const ticked = CutRunDetailSchema.parse(res.body).sticks[0]!
    expect(ticked.status).toBe('in_progress')
    expect(ticked.cuts[0]).toMatchObject({ status: 'cut', cutBy: expect.stringMatching(/^Test User/) })
    expect(ticked.cuts[0]!.cutAt).not.toBeNull()
    await cutter.post(`/api/cut-runs/${run.id}/cuts/${second!.id}/tick`)
    const moves = await runMoves(run.number)
    const consumed = moves.filter((m) => m.kind === 'consume')
    expect(consumed).toEqual([expect.objectContaining({ quantity: -1, stickLength: stick.stickLength })])
    expect(moves.filter((m) => m.kind === 'release')).toEqual([expect.objectContaining({ quantity: -1, stickLength: stick.stickLength })])

    const undone = await cutter.post(`/api/cut-runs/${run.id}/cuts/${first!.id}/undo`)
    expect(undone.status).toBe(200)
    expect(CutRunDetailSchema.parse(undone.body).sticks[0]!.cuts[0]).toMatchObject({ status: 'pending', cutBy: null, cutAt: null })
    expect((await cutter.post(`/api/cut-runs/${run.id}/cuts/${first!.id}/undo`)).status).toBe(409)
    // The stick stays on the saw: still consumed once.
    expect((await runMoves(run.number)).filter((m) => m.kind === 'consume')).toHaveLength(1)
  })

  it('records a piece once when two cutters tick it at the same moment', async () => {
    const wos = await insertWorkOrders(t.db, { kitSku: 'MW-TOTE-6C', count: 1 })
    const run = await publish((await plan({ workOrderIds: wos.map((w) => w.id), useOffcuts: false })).id)
    const other = (await signedInAs(app, t, 'cutter')).agent
    const cut = run.sticks[0]!.cuts[0]!
    const results = await Promise.all([cutter.post(`/api/cut-runs/${run.id}/cuts/${cut.id}/tick`), other.post(`/api/cut-runs/${run.id}/cuts/${cut.id}/tick`)])
    expect(results.map((r) => r.status)).toEqual([200, 200])
    const [row] = await t.db.select().from(cutRunCuts).where(eq(cutRunCuts.id, cut.id))
    expect(row!.status).toBe('cut')
    const views = results.map((r) => CutRunDetailSchema.parse(r.body).sticks[0]!.cuts[0]!)
    expect(views[0]!.cutAt).toBe(views[1]!.cutAt) // one record, seen by both
    expect((await runMoves(run.number)).filter((m) => m.kind === 'consume')).toHaveLength(1)
  })

  it('stocks the remnant of a finished stick as an offcut with its label, when at or above the minimum', async () => {
    const wos = await insertWorkOrders(t.db, { kitSku: 'MW-TOTE-6C', count: 1 })
    const run = await publish((await plan({ workOrderIds: wos.map((w) => w.id), useOffcuts: false })).id)
    const stick = run.sticks.find((s) => s.remnantIsOffcut)
    expect(stick, 'one compact kit leaves a long remnant on its stick').toBeDefined()
    let last: CutRunDetail | undefined
    for (const c of stick!.cuts) last = CutRunDetailSchema.parse((await cutter.post(`/api/cut-runs/${run.id}/cuts/${c.id}/tick`)).body)
    const done = last!.sticks.find((s) => s.id === stick!.id)!
    expect(done.status).toBe('done')
    expect(done.offcutCode).toMatch(/^OC-\d{6,}$/)
    const [offcut] = await t.db.select().from(offcuts).where(eq(offcuts.id, done.offcutId!))
    expect(offcut).toMatchObject({ length: stick!.remnant, status: 'in_stock', partId: pipeId })
    const moves = await t.db.select().from(stockMoves).where(and(eq(stockMoves.offcutId, offcut!.id), eq(stockMoves.kind, 'offcut_in')))
    expect(moves).toHaveLength(1)
    const label = await cutter.get(`/api/cut-runs/${run.id}/sticks/${stick!.id}/offcut-label.pdf`).buffer(true)
    expect(label.status).toBe(200)
    expect(label.headers['content-type']).toBe('application/pdf')
    // Undoing the last cut takes the offcut back (the remnant is on the saw again).
    await cutter.post(`/api/cut-runs/${run.id}/cuts/${stick!.cuts.at(-1)!.id}/undo`)
    expect((await t.db.select().from(offcuts).where(eq(offcuts.id, offcut!.id)))[0]!.status).toBe('used')
  })

  it('re-plans only the pieces of a damaged stick from the remaining stock, and every piece is cut exactly once', async () => {
    const wos = await insertWorkOrders(t.db, { kitSku: 'MW-TOTE-12', count: 2 })
    const run = await publish((await plan({ workOrderIds: wos.map((w) => w.id), useOffcuts: false })).id)
    const wanted = await piecesWanted(wos.map((w) => w.id))
    const victim = run.sticks[0]!
    const spoiled = victim.cuts[0]!
    await cutter.post(`/api/cut-runs/${run.id}/cuts/${spoiled.id}/tick`)
    const others = run.sticks.slice(1).map((s) => s.id)
    const res = await cutter.post(`/api/cut-runs/${run.id}/sticks/${victim.id}/damage`).send({ reason: 'Miscut: blade wandered', spoiledCutIds: [spoiled.id], timeLimitSeconds: 2 })
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    const after = CutRunDetailSchema.parse(res.body)
    const damaged = after.sticks.find((s) => s.id === victim.id)!
    expect(damaged).toMatchObject({ status: 'damaged', damagedReason: 'Miscut: blade wandered' })
    expect(damaged.cuts.every((c) => c.status === 'replanned')).toBe(true)
    // Other sticks untouched; the new sticks carry exactly the damaged stick's pieces.
    for (const id of others) expect(after.sticks.find((s) => s.id === id)!.cuts).toEqual(run.sticks.find((s) => s.id === id)!.cuts)
    const added = after.sticks.filter((s) => s.replanned)
    expect(added.flatMap((s) => s.cuts.map((c) => `${c.workOrderId}|${c.cutPartId}|${c.length}`)).sort()).toEqual(
      victim.cuts.map((c) => `${c.workOrderId}|${c.cutPartId}|${c.length}`).sort(),
    )
    expect(piecesPlanned(after)).toEqual(wanted)
    // The damaged stick's material left the rack; the new sticks are reserved.
    const moves = await runMoves(run.number)
    expect(moves.filter((m) => m.kind === 'consume')).toHaveLength(1)
    expect(moves.filter((m) => m.kind === 'reserve' && m.reason?.includes('re-plan')).reduce((s, m) => s + m.quantity, 0)).toBe(added.filter((s) => s.source === 'stock').length)

    let final = after
    for (const s of after.sticks) for (const c of s.cuts) if (c.status === 'pending') final = CutRunDetailSchema.parse((await cutter.post(`/api/cut-runs/${run.id}/cuts/${c.id}/tick`)).body)
    expect(piecesPlanned(final, 'cut')).toEqual(wanted)
    expect(final.status).toBe('done')
  })
})

describe('bins at the cut bench', () => {
  it('assigns a scanned bin to a work order, which is cut once all its pieces are, and refuses a bin in use', async () => {
    const bins = (await planner.post('/api/bins').send({ count: 3 })).body as { id: string; code: string }[]
    // The demo shop already has its batch of bins; a new batch carries on the numbering.
    const [first, second, third] = bins.map((b) => b.code) as [string, string, string]
    const n = Number(first.slice(4))
    expect([first, second, third]).toEqual([n, n + 1, n + 2].map((k) => `BIN-${String(k).padStart(4, '0')}`))
    const wos = await insertWorkOrders(t.db, { kitSku: 'MW-TOTE-6C', count: 2 })
    const run = await publish((await plan({ workOrderIds: wos.map((w) => w.id), useOffcuts: false })).id)
    const [a, b] = wos
    const assign = (workOrderId: string, code: string) => cutter.post(`/api/cut-runs/${run.id}/bins`).send({ workOrderId, code })
    const unknown = await assign(a!.id, 'BIN-9999')
    expect(unknown.status).toBe(404)
    expect(ApiErrorBodySchema.parse(unknown.body).error.message).toBe('No bin BIN-9999: check the label, or add the bin on the bins page')
    // A bin early: the work order is not cut until its last piece is.
    const early = CutRunDetailSchema.parse((await assign(a!.id, ` ${second.toLowerCase()} `)).body)
    expect(early.workOrders.find((w) => w.id === a!.id)).toMatchObject({ bin: { code: second }, status: 'waiting_cut' })
    const inUse = await assign(b!.id, second)
    expect(inUse.status).toBe(409)
    expect(ApiErrorBodySchema.parse(inUse.body).error.message).toBe(`Bin ${second} already holds work order ${a!.serial}; scan a free bin`)
    let view = early
    for (const s of run.sticks) for (const c of s.cuts) if (c.workOrderId === a!.id) view = CutRunDetailSchema.parse((await cutter.post(`/api/cut-runs/${run.id}/cuts/${c.id}/tick`)).body)
    expect(view.workOrders.find((w) => w.id === a!.id)).toMatchObject({ status: 'cut', cut: view.workOrders.find((w) => w.id === a!.id)!.pieces })
    expect((await t.db.select().from(workOrders).where(eq(workOrders.id, a!.id)))[0]!.status).toBe('cut')
    // All of b's pieces cut first, then its bin scanned: cut at the scan.
    for (const s of run.sticks) for (const c of s.cuts) if (c.workOrderId === b!.id && c.status === 'pending') await cutter.post(`/api/cut-runs/${run.id}/cuts/${c.id}/tick`)
    expect((await t.db.select().from(workOrders).where(eq(workOrders.id, b!.id)))[0]!.status).toBe('waiting_cut')
    const scanned = CutRunDetailSchema.parse((await assign(b!.id, third)).body)
    expect(scanned.workOrders.find((w) => w.id === b!.id)).toMatchObject({ status: 'cut', bin: { code: third } })
    const again = await assign(b!.id, first)
    expect(again.status).toBe(409)
    expect(ApiErrorBodySchema.parse(again.body).error.message).toMatch(new RegExp(`already has bin ${third}`))
  })
})
