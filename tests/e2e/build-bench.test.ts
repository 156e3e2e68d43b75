import { and, eq } from 'drizzle-orm'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { PNG } from 'pngjs'
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, inject, it } from 'vitest'
import { createDb } from '../../server/src/db/client'
import { buildSteps, kitRevisions, kits, unitPhotos, workOrders } from '../../server/src/db/schema/index'
import { DEMO_USERS } from '../../server/src/seeds/demo'
import { launchChromium, signIn } from '../support/browser'
import { insertBin, insertBuildWorkOrder } from '../support/build-factories'
import { testDatabaseUrl } from '../support/env'

const baseUrl = inject('baseUrl')
const assembler = DEMO_USERS.find((u) => u.role === 'assembler')!
let browser: Browser
let context: BrowserContext
let page: Page
let conn: ReturnType<typeof createDb>

/** Where to keep screenshots of the bench and the record when someone wants to look at them. */
const shots = process.env.BUILD_BENCH_SHOTS

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

/** A small green PNG, as a tablet camera might hand over (PNG is one of the accepted types). */
function photoPng(): Buffer {
  const png = new PNG({ width: 64, height: 48 })
  for (let i = 0; i < png.data.length; i += 4) png.data.set([40, 150, 90, 255], i)
  return PNG.sync.write(png)
}

/** The scan field has focus by itself: the wedge scanner just types the code and Enter. */
async function scan(code: string) {
  await page.getByRole('heading', { name: 'Build bench' }).waitFor()
  await page.waitForFunction(() => document.activeElement?.getAttribute('placeholder') === 'Scan or type a code, then Enter')
  await page.keyboard.type(code)
  await page.keyboard.press('Enter')
}

/** A unit of the demo 12-site kit, revision A, cut and waiting in a bin at the build bench. */
async function unitInABin() {
  const [rev] = await conn.db
    .select({ id: kitRevisions.id, kitId: kits.id })
    .from(kitRevisions)
    .innerJoin(kits, eq(kits.id, kitRevisions.kitId))
    .where(and(eq(kits.sku, 'MW-TOTE-12'), eq(kitRevisions.code, 'A')))
  const wo = await insertBuildWorkOrder(conn.db, rev!.id, rev!.kitId, 'cut')
  const bin = await insertBin(conn.db, wo.id)
  const steps = await conn.db.select().from(buildSteps).where(eq(buildSteps.revisionId, rev!.id))
  return { wo, bin, steps: steps.sort((a, b) => a.position - b.position) }
}

describe('the build bench, in Chromium', () => {
  it('scans a bin, ticks the steps, uploads a photo, passes the leak test and shows the unit built', async () => {
    const { wo, bin, steps } = await unitInABin()
    await signIn(page, baseUrl, assembler.email, assembler.password)
    await page.getByRole('heading', { name: 'Build bench' }).waitFor()

    await scan(bin.code)
    await page.getByRole('heading', { name: `Unit ${wo.serial}` }).waitFor()
    expect(await page.getByRole('status').textContent()).toMatch(/^Cut · left: /)
    // Steps carry their cautions where the work happens.
    const drill = page.getByRole('listitem', { name: 'Step 3', exact: true })
    expect(await drill.getByText(/wear eye protection/i).isVisible()).toBe(true)

    for (const step of steps) {
      const card = page.getByRole('listitem', { name: `Step ${step.position}`, exact: true })
      if (step.measurementRequired) {
        const middle = (Number(step.measurementMin) + Number(step.measurementMax)) / 2
        await card.getByLabel(`Measurement for step ${step.position} in ${step.measurementUnit}`).fill(String(middle))
      }
      if (step.photoRequired) {
        await card.getByLabel(`Photo for step ${step.position}`).setInputFiles({ name: 'unit.png', mimeType: 'image/png', buffer: photoPng() })
        await card.getByRole('img').waitFor()
      }
      await card.getByRole('button', { name: `Tick step ${step.position}` }).click()
      await card.getByRole('button', { name: `Undo step ${step.position}` }).waitFor()
    }
    // The pump and the sprayers are lot-tracked in the demo: tap the oldest lot in stock of each.
    for (const sku of ['PMP-400-GPH', 'SPR-360-THR']) {
      const card = page.getByRole('listitem', { name: `Lot of ${sku}` })
      await card.getByRole('button', { name: /^Lot / }).first().click()
      await card.getByRole('button', { name: /^Undo lot / }).waitFor()
    }
    expect(await page.getByRole('status').textContent()).toContain('left: the leak test to run')
    // The photo went to the bucket and was recorded once the server saw it there.
    const photos = await conn.db.select().from(unitPhotos).where(eq(unitPhotos.workOrderId, wo.id))
    expect(photos.map((p) => [p.contentType, p.uploadedAt !== null])).toEqual([['image/png', true]])
    const thumb = page.getByRole('listitem', { name: `Step ${steps.at(-1)!.position}`, exact: true }).getByRole('img')
    expect(await thumb.evaluate((img: HTMLImageElement) => img.naturalWidth)).toBe(64)

    const cautions = page.getByRole('group', { name: 'Water, mains power and pressure cautions' })
    expect(await cautions.textContent()).toMatch(/ground-fault protected outlet.*dry.*drip loop.*Unplug the pump before you reach into the water/s)
    expect(await cautions.textContent()).toContain('Local electrical codes and licensed practice come first')
    // Pressure tests with water only, never compressed air or gas (common practice; PVC makers print this warning).
    expect(await cautions.textContent()).toContain('Test with water only — never compressed air or gas')
    const form = page.getByRole('form', { name: 'Leak test' })
    await form.getByLabel('Start pressure (psi)').fill('15')
    await form.getByLabel('Pressure after the hold (psi)').fill('14.8')
    if (shots) await page.screenshot({ path: `${shots}/build-bench.png`, fullPage: true })
    await form.getByRole('button', { name: 'Record leak test' }).click()

    await page.getByRole('status').filter({ hasText: 'Built · next: the pack bench' }).waitFor()
    expect(await page.getByRole('list', { name: 'Leak tests' }).textContent()).toContain('Attempt 1: PASSED')
    const [row] = await conn.db.select({ status: workOrders.status }).from(workOrders).where(eq(workOrders.id, wo.id))
    expect(row!.status).toBe('built')

    await page.getByRole('link', { name: 'Build record' }).click()
    await page.getByRole('heading', { name: `Build record · Unit ${wo.serial}` }).waitFor()
    expect(await page.getByTestId('unit-status').textContent()).toBe('Built')
    expect(await page.getByText('Not cut through Kitwright').isVisible()).toBe(true)
    const stepRows = page.getByRole('table', { name: 'Build steps' }).getByRole('row')
    expect(await stepRows.count()).toBe(steps.length + 1)
    expect(await stepRows.nth(1).textContent()).toContain(assembler.name)
    if (shots) await page.screenshot({ path: `${shots}/build-record.png`, fullPage: true })
    if (shots) await page.pdf({ path: `${shots}/build-record.pdf` }).catch(() => undefined)

    // Scanning it again at the bench says it is done here and links its record.
    await page.goto(`${baseUrl}/bench/build`)
    await scan(wo.serial)
    expect(await page.getByRole('alert').textContent()).toContain('already built')
    await page.getByRole('link', { name: `Open the build record of ${wo.serial}` }).waitFor()
  })
})
