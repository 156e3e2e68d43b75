import { mkdirSync } from 'node:fs'
import path from 'node:path'
import type { Browser, Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { createDb } from '../../server/src/db/client'
import { DEMO_USERS } from '../../server/src/seeds/demo'
import { launchChromium, signIn } from '../support/browser'
import { insertWorkOrders } from '../support/cut-run-factories'
import { testDatabaseUrl } from '../support/env'

const baseUrl = inject('baseUrl')
const shots = path.resolve(import.meta.dirname, '../.artifacts')
let browser: Browser
let serials: string[]

function demo(role: string) {
  const u = DEMO_USERS.find((d) => d.role === role)
  if (!u) throw new Error(`no demo ${role}`)
  return u
}

beforeAll(async () => {
  mkdirSync(shots, { recursive: true })
  browser = await launchChromium()
  // Work orders as the release service makes them, straight into the e2e database.
  const { db, pool } = createDb(testDatabaseUrl('e2e'))
  try {
    serials = (await insertWorkOrders(db, { kitSku: 'MW-TOTE-6C', count: 2 })).map((w) => w.serial)
  } finally {
    await pool.end()
  }
})
afterAll(() => browser.close())

async function newPage(width: number, height: number): Promise<Page> {
  const context = await browser.newContext({ viewport: { width, height } })
  return context.newPage()
}

describe('cut runs in Chromium', () => {
  it('a planner plans and publishes a run; a cutter ticks a stick at the bench and fills a scanned bin', async () => {
    const planner = await newPage(1280, 900)
    await signIn(planner, baseUrl, demo('planner').email, demo('planner').password)
    await planner.getByRole('heading', { name: /Good day/ }).waitFor()

    // Bins first: a batch of two, numbered by the server.
    await planner.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Bins' }).click()
    await planner.getByRole('heading', { name: 'Bins', exact: true }).waitFor()
    const addBins = planner.getByRole('form', { name: 'Add bins' })
    await addBins.getByLabel('How many').fill('2')
    await addBins.getByRole('button', { name: 'Add bins' }).click()
    const toast = await planner.getByText(/^Added 2 bins: BIN-\d{4} to BIN-\d{4}$/).textContent()
    const binCode = /BIN-\d{4}/.exec(toast!)![0]

    // Plan: only this test's two work orders.
    await planner.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Cut runs' }).click()
    await planner.getByRole('heading', { name: 'Cut runs', exact: true }).waitFor()
    const form = planner.getByRole('form', { name: 'Plan a cut run' })
    await form.getByText(`WO ${serials[0]}`).waitFor()
    for (const box of await form.getByRole('listitem').all()) {
      const text = (await box.textContent()) ?? ''
      if (!serials.some((s) => text.includes(`WO ${s} `))) await box.getByRole('checkbox').uncheck()
    }
    await form.getByText('2 chosen').waitFor()
    await form.getByLabel('Time limit (seconds)').fill('3')
    await form.getByRole('button', { name: 'Run the engine' }).click()
    await planner.getByRole('status').getByText(/Nesting the pieces/).waitFor()
    await planner.waitForURL(/\/planning\/cut-runs\/[0-9a-f-]{36}$/, { timeout: 30_000 })
    const heading = await planner.getByRole('heading', { name: /^Cut run CR-\d{4}/ }).textContent()
    const runNumber = /CR-\d{4}/.exec(heading!)![0]
    expect(await planner.getByRole('img', { name: /^(Stick|Offcut) of / }).count()).toBeGreaterThan(0)
    await planner.getByText('Gap to the lower bound').waitFor()
    // Sticks and saw set-ups, with what the bound proves.
    const figures = (await planner.getByLabel('Sticks and patterns').textContent())!
    expect(figures).toMatch(/^\d+ sticks? in \d+ patterns? \(saw set-ups\)\. (Proven best|Every plan needs at least \d+ sticks)/)
    await planner.screenshot({ path: path.join(shots, 'cut-run-draft.png'), fullPage: true })
    await planner.getByRole('button', { name: 'Publish' }).click()
    await planner.getByRole('heading', { name: `Cut run ${runNumber} published` }).waitFor()
    await planner.getByRole('link', { name: 'Cut sheet (Letter)' }).waitFor()
    // The sheet opens in a new tab (the server sends it inline), not as a download.
    expect(await planner.getByRole('link', { name: 'Cut sheet (Letter)' }).getAttribute('target')).toBe('_blank')

    // The cutter, on a tablet.
    const cutter = await newPage(1024, 1366)
    await signIn(cutter, baseUrl, demo('cutter').email, demo('cutter').password)
    await cutter.getByRole('heading', { name: 'Cut bench' }).waitFor()
    // With several published runs the bench asks which one; with one it opens it. Wait for either (a
    // look before the list has loaded would see neither).
    const choose = cutter.getByRole('group', { name: 'Published runs' })
    const opened = cutter.getByText(`Run ${runNumber}`)
    await choose.or(opened).first().waitFor()
    if (!(await opened.isVisible())) await choose.getByRole('button', { name: new RegExp(`^${runNumber}`) }).click()
    await opened.waitFor()
    const stick = cutter.getByRole('region', { name: /^Stick \d+$/ })
    // Equal pieces fold into one row; each tap on a row's "Cut one" records one piece.
    const progress = (await stick.getByText(/^\d+ of \d+ pieces cut$/).textContent())!
    const pieces = Number(/of (\d+)/.exec(progress)![1])
    expect(pieces).toBeGreaterThan(0)
    const ticks = stick.getByRole('button', { name: /^Tick one / })
    for (let i = 0; i < pieces; i++) {
      await ticks.first().click()
      await stick.getByText(`${i + 1} of ${pieces} pieces cut`).waitFor({ timeout: 10_000 }).catch(async (e: unknown) => {
        await cutter.screenshot({ path: path.join(shots, 'cut-bench-failed.png'), fullPage: true })
        throw e
      })
    }
    expect(await ticks.count()).toBe(0)
    expect(await stick.getByText(/^Last cut by .* at /).count()).toBe(await stick.getByRole('list', { name: 'Pieces in saw order' }).getByRole('listitem').count())
    await stick.getByRole('button', { name: /^Undo / }).first().waitFor()

    // A keyboard-wedge scanner types the code and Enter into the scan field, which has the focus.
    const scan = cutter.getByLabel(/^Scan a free bin for WO \d+/)
    const scanLabel = (await cutter.getByText(/^Scan a free bin for WO \d+/).textContent())!
    const target = /WO (\d+)/.exec(scanLabel)![1]!
    await expect.poll(() => scan.evaluate((el) => el === document.activeElement), { timeout: 5_000 }).toBe(true)
    await cutter.keyboard.type(binCode.toLowerCase())
    await cutter.keyboard.press('Enter')
    const card = cutter.getByRole('region', { name: 'Bins' }).getByRole('listitem').filter({ hasText: `WO ${target} ` })
    await card.getByText(binCode, { exact: true }).waitFor()
    await card.getByRole('link', { name: 'Bin label' }).waitFor()
    await cutter.screenshot({ path: path.join(shots, 'cut-bench.png'), fullPage: true })
  })
})
