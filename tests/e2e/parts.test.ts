import { randomBytes } from 'node:crypto'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, inject, it } from 'vitest'
import { inches } from '@kitwright/shared/domain/units'
import { PartsPageSchema } from '@kitwright/shared/parts'
import { DEMO_USERS } from '../../server/src/seeds/demo'
import { launchChromium, signIn } from '../support/browser'

const baseUrl = inject('baseUrl')
let browser: Browser
let context: BrowserContext
let page: Page

async function signInAsPlanner() {
  const planner = DEMO_USERS.find((d) => d.role === 'planner')!
  await signIn(page, baseUrl, planner.email, planner.password)
  await page.waitForURL((url) => url.pathname === '/')
}

beforeAll(async () => {
  browser = await launchChromium()
})
afterAll(() => browser.close())
beforeEach(async () => {
  context = await browser.newContext({ viewport: { width: 1280, height: 800 } })
  page = await context.newPage()
})
afterEach(() => context.close())

describe('parts pages, in Chromium', () => {
  it('lets a planner add a pipe part typing 10 ft and 0.840 in, then find it in the table', async () => {
    const sku = `PVC-E2E-${randomBytes(3).toString('hex').toUpperCase()}`
    await signInAsPlanner()
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Parts' }).click()
    await page.getByRole('heading', { name: 'Parts' }).waitFor()
    await page.getByRole('link', { name: 'New part' }).click()
    const form = page.getByRole('form', { name: 'Part' })
    await form.getByLabel('SKU').fill(sku)
    await form.getByLabel('Name').fill('3/4 in test pipe')
    await form.getByLabel('Kind').selectOption('stock_length')
    await form.getByLabel('Nominal size').fill('1/2')
    // ASTM D1785: 1/2 in Schedule 40 PVC is 0.840 in outside diameter.
    await form.getByLabel('Outside diameter').fill('0.840 in')
    await form.getByLabel('Stick lengths').fill('10 ft')
    await form.getByLabel('Unit cost ($)').fill('3.48')
    await form.getByLabel('Weight of one unit (g)').fill('730')
    await form.getByRole('button', { name: 'Add part' }).click()

    await page.waitForURL((url) => url.pathname === '/catalog/parts')
    await page.getByRole('searchbox', { name: 'Search' }).fill(sku)
    await page.waitForURL((url) => url.searchParams.get('q') === sku)
    const row = page.getByRole('table', { name: 'Parts' }).getByRole('row').filter({ hasText: sku })
    await row.waitFor()
    expect(await row.textContent()).toContain('$3.48 / each')
    expect(await row.textContent()).toContain('120"')

    const res = await page.request.get(`${baseUrl}/api/parts?q=${sku}`)
    const [part] = PartsPageSchema.parse(await res.json()).items
    expect(part).toMatchObject({ sku, kind: 'stock_length', outsideDiameter: inches(0.84), stickLengths: [inches(120)], unitCostCents: 348 })
  })

  it('previews an import with a bad row, shows its row number, and keeps Import disabled', async () => {
    await signInAsPlanner()
    await page.goto(`${baseUrl}/catalog/parts/import`)
    const csv = ['sku,name,kind,unit_cost,weight_g', 'E2E-GOOD-1,Good part,hardware,1.25,10', 'E2E-BAD-1,Bad part,hardware,a dollar,10'].join('\n')
    await page.getByLabel('…or paste it here').fill(csv)
    await page.getByRole('button', { name: 'Preview' }).click()
    const problems = page.getByRole('alert').filter({ hasText: 'Row 3' })
    await problems.waitFor()
    expect(await problems.textContent()).toMatch(/Row 3, unit_cost: Write the unit cost in dollars and cents, e\.g\. 12\.34/)
    expect(await page.getByRole('table', { name: 'Import preview' }).getByRole('row').count()).toBe(3)
    expect(await page.getByRole('button', { name: 'Import' }).isDisabled()).toBe(true)
    const res = await page.request.get(`${baseUrl}/api/parts?q=E2E-GOOD-1&active=all`)
    expect(PartsPageSchema.parse(await res.json()).total).toBe(0)
  })
})
