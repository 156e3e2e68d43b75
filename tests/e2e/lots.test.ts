import { and, eq } from 'drizzle-orm'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, inject, it } from 'vitest'
import { createDb } from '../../server/src/db/client'
import { kitRevisions, kits, lotRecallNotices, mailMessages, orderEvents, parts, unitLots } from '../../server/src/db/schema/index'
import { DEMO_USERS } from '../../server/src/seeds/demo'
import { launchChromium, signIn } from '../support/browser'
import { insertBin, insertBuildWorkOrder } from '../support/build-factories'
import { testDatabaseUrl } from '../support/env'

const baseUrl = inject('baseUrl')
const demo = (role: string) => DEMO_USERS.find((u) => u.role === role)!
let browser: Browser
let context: BrowserContext
let page: Page
let conn: ReturnType<typeof createDb>

/** Where to keep screenshots of the lot prompt and the recall page when someone wants to look at them. */
const shots = process.env.LOTS_SHOTS

beforeAll(async () => {
  browser = await launchChromium()
  conn = createDb(testDatabaseUrl('e2e'))
})
afterAll(async () => {
  await browser.close()
  await conn.pool.end()
})
beforeEach(async () => {
  // A shop tablet in landscape.
  context = await browser.newContext({ viewport: { width: 1180, height: 820 } })
  page = await context.newPage()
})
afterEach(() => context.close())

/** A unit of the demo 12-site kit (one pump, twelve sprayers: both lot-tracked in the demo), cut and in a bin. */
async function unitInABin() {
  const [rev] = await conn.db
    .select({ id: kitRevisions.id, kitId: kits.id })
    .from(kitRevisions)
    .innerJoin(kits, eq(kits.id, kitRevisions.kitId))
    .where(and(eq(kits.sku, 'MW-TOTE-12'), eq(kitRevisions.code, 'A')))
  const wo = await insertBuildWorkOrder(conn.db, rev!.id, rev!.kitId, 'cut')
  const bin = await insertBin(conn.db, wo.id)
  return { wo, bin }
}

describe('lots at the build bench and the recall page, in Chromium', () => {
  it('the bench asks for the pump and sprayer lots (a wrong scan is refused in words, the oldest lot is offered first); the planner recalls the lot and tells the customer once', async () => {
    const { wo, bin } = await unitInABin()
    await signIn(page, baseUrl, demo('assembler').email, demo('assembler').password)
    await page.getByRole('heading', { name: 'Build bench' }).waitFor()
    await page.waitForFunction(() => document.activeElement?.getAttribute('placeholder') === 'Scan or type a code, then Enter')
    await page.keyboard.type(bin.code)
    await page.keyboard.press('Enter')
    await page.getByRole('heading', { name: `Unit ${wo.serial}` }).waitFor()
    expect(await page.getByRole('status').first().textContent()).toContain('the lot of 2 parts to record')

    const pumpCard = page.getByRole('listitem', { name: 'Lot of PMP-400-GPH' })
    const sprayerCard = page.getByRole('listitem', { name: 'Lot of SPR-360-THR' })
    // The lots in stock, oldest first (the demo received BW-2609-114 before BW-2610-027).
    const choices = await pumpCard.getByRole('button', { name: /^Lot BW-/ }).evaluateAll((els) => els.map((e) => e.getAttribute('aria-label')))
    expect(choices[0]).toMatch(/^Lot BW-2609-114, \d+ free$/)
    expect(choices.findIndex((c) => c?.startsWith('Lot BW-2610-027'))).toBeGreaterThan(0)
    // Buttons big enough for a gloved finger.
    expect((await pumpCard.getByRole('button', { name: /^Lot BW-2609-114/ }).boundingBox())!.height).toBeGreaterThanOrEqual(48)

    // A lot that never came in: the scanner types it into the lot field and Enter; refused, saying what to do.
    await pumpCard.getByLabel('Lot of PMP-400-GPH').click()
    await page.keyboard.type('BW-9999-999')
    await page.keyboard.press('Enter')
    await pumpCard.getByRole('alert').getByText(/No lot "BW-9999-999" of PMP-400-GPH has been received.*oldest first: BW-2609-114/).waitFor()
    expect(await conn.db.select().from(unitLots).where(eq(unitLots.workOrderId, wo.id))).toHaveLength(0)
    if (shots) await page.screenshot({ path: `${shots}/build-bench-lot-refused.png`, fullPage: true })

    // Tap the oldest pump lot; scan the sprayer bag's lot (typed in lower case, as a scanner might).
    await pumpCard.getByRole('button', { name: /^Lot BW-2609-114/ }).click()
    await pumpCard.getByText(/Lot BW-2609-114 × 1/).waitFor()
    await sprayerCard.getByLabel('Lot of SPR-360-THR').fill('nz-2608-31')
    await sprayerCard.getByRole('button', { name: 'Record lot' }).click()
    await sprayerCard.getByText(/Lot NZ-2608-31 × 12/).waitFor()
    await page.getByRole('status').first().filter({ hasNotText: 'the lot of' }).waitFor()
    expect(await page.getByRole('status').first().textContent()).toContain('Building')
    if (shots) await page.screenshot({ path: `${shots}/build-bench-lots.png`, fullPage: true })
    const fits = await conn.db.select().from(unitLots).where(eq(unitLots.workOrderId, wo.id))
    expect(fits.map((f) => f.quantity).sort((a, b) => a - b)).toEqual([1, 12])

    // The build record lists the lots.
    await page.getByRole('link', { name: 'Build record' }).click()
    await page.getByRole('heading', { name: `Build record · Unit ${wo.serial}` }).waitFor()
    expect(await page.getByRole('list', { name: 'Lots fitted' }).textContent()).toMatch(/1 × lot BW-2609-114.*12 × lot NZ-2608-31/s)

    // The planner finds the pump lot and every unit built with it.
    await page.getByRole('button', { name: 'Sign out' }).click()
    await signIn(page, baseUrl, demo('planner').email, demo('planner').password)
    await page.getByRole('link', { name: 'Lots & recalls' }).click()
    await page.getByRole('heading', { name: 'Lots and recalls' }).waitFor()
    await page.getByLabel('Find a lot').fill('BW-2609')
    await page.getByRole('link', { name: 'BW-2609-114' }).click()
    await page.getByRole('heading', { name: /Lot BW-2609-114 of PMP-400-GPH/ }).waitFor()
    const units = page.getByRole('table', { name: 'Units built with this lot' })
    const row = units.getByRole('row').filter({ hasText: wo.serial })
    expect(await row.textContent()).toContain('Still in the shop')
    expect(await row.textContent()).toContain('Millbrook Falls')
    // The CSV of the same list, with the session cookie, as the link downloads it.
    const csv = await page.request.get(`${baseUrl}${await page.getByRole('link', { name: 'Download the recall list (CSV)' }).getAttribute('href')}`)
    expect(csv.status()).toBe(200)
    expect(await csv.text()).toContain(wo.serial)

    // Tell the customers: asked to confirm first, then queued once; the page shows who was told.
    const notices = async () => (await conn.db.select().from(lotRecallNotices)).length
    const before = await notices()
    await page.getByRole('button', { name: /^Tell the customers \(\d+\)$/ }).click()
    const dialog = page.getByRole('alertdialog', { name: 'Confirm the e-mails' })
    await dialog.getByText(/cannot be called back once sent/).waitFor()
    if (shots) await page.screenshot({ path: `${shots}/recall-confirm.png`, fullPage: true })
    await dialog.getByRole('button', { name: /^Yes, e-mail/ }).click()
    await page.getByRole('button', { name: 'Every customer has been told' }).waitFor()
    expect(await row.textContent()).not.toContain('—')
    expect(await notices()).toBeGreaterThan(before)
    const mails = await conn.db.select().from(mailMessages).where(eq(mailMessages.orderId, wo.orderId))
    expect(mails.filter((m) => m.purpose.startsWith('lot_recall:'))).toHaveLength(1)
    const events = await conn.db.select().from(orderEvents).where(and(eq(orderEvents.orderId, wo.orderId), eq(orderEvents.kind, 'recall')))
    expect(events).toHaveLength(1)
    if (shots) await page.screenshot({ path: `${shots}/recall-page.png`, fullPage: true })

    // The pump's part page says it is lot-tracked; its stock page shows stock by lot and adjusts by lot.
    const [pump] = await conn.db.select({ id: parts.id }).from(parts).where(eq(parts.sku, 'PMP-400-GPH'))
    await page.goto(`${baseUrl}/catalog/parts/${pump!.id}`)
    expect(await page.getByLabel(/Tracked by the supplier's lot/).isChecked()).toBe(true)
    await page.goto(`${baseUrl}/catalog/stock/${pump!.id}`)
    expect(await page.getByLabel('Stock by lot').textContent()).toMatch(/BW-2609-114: \d+ on hand, \d+ not yet fitted/)
    const adjust = page.getByRole('form', { name: 'Adjust stock' })
    expect(await adjust.getByLabel("Supplier's lot").locator('option').allTextContents()).toContain('BW-2610-027 (4 on hand)')
    if (shots) await page.screenshot({ path: `${shots}/pump-stock-by-lot.png`, fullPage: true })
  })
})
