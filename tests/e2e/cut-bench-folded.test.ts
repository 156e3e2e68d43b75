import { mkdirSync } from 'node:fs'
import path from 'node:path'
import { eq } from 'drizzle-orm'
import type { Page } from 'playwright-core'
import { beforeAll, beforeEach, describe, expect, inject, it } from 'vitest'
import { CutRunDetailSchema } from '@kitwright/shared/cut-runs'
import { inches } from '@kitwright/shared/domain/units'
import { createDb } from '../../server/src/db/client'
import { parts } from '../../server/src/db/schema/index'
import { DEMO_USERS } from '../../server/src/seeds/demo'
import { browserPerTest, signIn } from '../support/browser'
import { insertCutKit, insertWorkOrders } from '../support/cut-run-factories'
import { testDatabaseUrl } from '../support/env'

const baseUrl = inject('baseUrl')
const shots = path.resolve(import.meta.dirname, '../.artifacts')
const planner = DEMO_USERS.find((u) => u.role === 'planner')!
const cutter = DEMO_USERS.find((u) => u.role === 'cutter')!
let workOrderIds: string[]
let pipeId: string
let page: Page

// A shop tablet in portrait.
const chromium = browserPerTest({ width: 800, height: 1280 })
beforeEach(() => {
  page = chromium.page
})

beforeAll(async () => {
  mkdirSync(shots, { recursive: true })
  const { db, pool } = createDb(testDatabaseUrl('e2e'))
  try {
    const sku = `TST-PEG-${Date.now().toString(36).toUpperCase()}`
    // 51 pegs of 3-5/16 in for one unit: one 240 in stick holds them (51 × 3-5/16 + 50 kerfs of 1/8 + 1/4 trim = 175-5/8 in).
    await insertCutKit(db, { sku, cutParts: [{ label: 'peg', length: inches(3 + 5 / 16), quantity: 51 }] })
    workOrderIds = (await insertWorkOrders(db, { kitSku: sku, count: 1 })).map((w) => w.id)
    pipeId = (await db.select().from(parts).where(eq(parts.sku, 'PVC-050-S40')))[0]!.id
  } finally {
    await pool.end()
  }
})

describe('the cut bench folds equal pieces, in Chromium on a tablet', () => {
  it('a stick of 51 equal pegs is one row; each tap on "Cut one" records one piece; undo takes one back', { timeout: 150_000 }, async () => {
    // The planner plans and publishes the run (through the API, signed in in this browser).
    await signIn(page, baseUrl, planner.email, planner.password)
    await page.getByRole('heading', { name: /Good day/ }).waitFor()
    const draft = await page.request.post(
      `${baseUrl}/api/cut-runs`,
      { data: { workOrderIds, timeLimitSeconds: 3, useOffcuts: false, stock: [{ partId: pipeId, stickLength: inches(240), maxSticks: 1 }] } },
    )
    expect(draft.status(), await draft.text()).toBe(201)
    const runId = ((await draft.json()) as { id: string }).id
    expect((await page.request.post(`${baseUrl}/api/cut-runs/${runId}/publish`)).status()).toBe(200)
    await page.request.post(`${baseUrl}/api/auth/sign-out`)
    await page.context().clearCookies()

    await signIn(page, baseUrl, cutter.email, cutter.password)
    await page.getByRole('heading', { name: 'Cut bench' }).waitFor()
    await page.goto(`${baseUrl}/bench/cut?run=${runId}`)
    const stick = page.getByRole('region', { name: /^Stick \d+$/ })
    await stick.getByText('0 of 51 pieces cut').waitFor().catch(async (e: unknown) => {
      await page.screenshot({ path: path.join(shots, 'cut-bench-folded-failed.png'), fullPage: true })
      throw e
    })
    const rows = stick.getByRole('list', { name: 'Pieces in saw order' }).getByRole('listitem')
    expect(await rows.count()).toBe(1)
    const row = rows.first()
    await row.getByText('51 × 3-5/16"').waitFor()
    await row.getByText('1–51.').waitFor()
    // The drawing numbers every piece and says what its marks mean.
    await stick.getByRole('img', { name: /^Stick of 240": 1\. 3-5\/16" for \d+, .* 51\. 3-5\/16" for \d+; offcut / }).waitFor()
    await stick.getByRole('list', { name: 'Legend of the stick drawing' }).getByText('Saw cut (kerf)').waitFor()
    // No longer a page of identical rows: the whole bench fits in about two screens.
    expect(await page.evaluate(() => document.documentElement.scrollHeight)).toBeLessThan(2600)

    // Big touch targets (48 px or more) for gloved hands.
    const tick = row.getByRole('button', { name: 'Tick one 3-5/16" for WO', exact: false })
    const tickBox = (await tick.boundingBox())!
    expect(Math.min(tickBox.width, tickBox.height)).toBeGreaterThanOrEqual(48)

    // Four quick taps: four pieces, none lost, none doubled.
    for (let i = 0; i < 4; i++) await tick.click()
    await row.getByText('4/51', { exact: true }).waitFor()
    await stick.getByText('4 of 51 pieces cut').waitFor()
    await row.getByText(/^Last cut by .* at /).waitFor()
    const cutNow = async () => CutRunDetailSchema.parse(await (await page.request.get(`${baseUrl}/api/cut-runs/${runId}`)).json()).sticks[0]!.cuts.filter((c) => c.status === 'cut').length
    // The screen counts a tap at once; the server records it a moment later (the bench's queue sends in order).
    await expect.poll(cutNow).toBe(4)
    await page.screenshot({ path: path.join(shots, 'cut-bench-folded.png'), fullPage: true })

    // Undo takes back exactly one.
    const undo = row.getByRole('button', { name: /^Undo one 3-5\/16" for WO / })
    const undoBox = (await undo.boundingBox())!
    expect(Math.min(undoBox.width, undoBox.height)).toBeGreaterThanOrEqual(48)
    await undo.click()
    await row.getByText('3/51', { exact: true }).waitFor()
    await expect.poll(cutNow).toBe(3)
    // Progress for screen readers too.
    expect(await row.getByRole('progressbar').getAttribute('aria-valuenow')).toBe('3')

    // The damaged-stick form counts spoiled pieces per row instead of listing every piece.
    await stick.getByRole('button', { name: 'Stick damaged or miscut…' }).click()
    const form = stick.getByRole('form', { name: 'Damaged stick' })
    await form.getByText(/^1–51\. 3-5\/16" for WO \d+ \(3 cut\)$/).waitFor()
    await form.getByRole('button', { name: 'One spoiled piece more of 1–51' }).click()
    await form.getByText('1 spoiled', { exact: true }).waitFor()
    await form.getByRole('button', { name: 'Back' }).click()
  })
})
