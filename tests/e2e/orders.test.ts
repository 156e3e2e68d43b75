import { and, eq } from 'drizzle-orm'
import type { Page } from 'playwright-core'
import { beforeEach, describe, expect, inject, it } from 'vitest'
import { createDb } from '../../server/src/db/client'
import { buildSteps, kitRevisions, kits } from '../../server/src/db/schema/index'
import { DEMO_USERS } from '../../server/src/seeds/demo'
import { browserPerTest, signIn } from '../support/browser'
import { insertBuildWorkOrder } from '../support/build-factories'
import { testDatabaseUrl } from '../support/env'
import { buildNewOrder } from '../support/order-factories'

const baseUrl = inject('baseUrl')
let page: Page

const planner = DEMO_USERS.find((u) => u.role === 'planner')!

const chromium = browserPerTest({ width: 1366, height: 900 })
beforeEach(async () => {
  page = chromium.page
  await signIn(page, baseUrl, planner.email, planner.password)
  await page.getByRole('heading', { name: /Good day/ }).waitFor()
})

/** Keeps a picture of the page when KW_SHOTS names a folder (for a person to look at). */
async function shot(name: string) {
  if (process.env.KW_SHOTS) await page.screenshot({ path: `${process.env.KW_SHOTS}/${name}.png`, fullPage: true })
}

function ordersTable() {
  return page.getByRole('table', { name: 'Orders' })
}
function orderRow(number: string) {
  return ordersTable().getByRole('row').filter({ has: page.getByRole('link', { name: number, exact: true }) })
}

async function enterPhoneOrder(number: string, kitSku: string, quantity: number, price: string | null = '129.00') {
  await page.goto(`${baseUrl}/orders/new`)
  await page.getByRole('heading', { name: 'New phone order' }).waitFor()
  await page.getByLabel('Order number').fill(number)
  await page.getByLabel('Promised ship date (optional)').fill('2031-06-30')
  const customer = page.getByRole('group', { name: 'Customer' })
  await customer.getByLabel('Name').fill('Bramble Okonkwo-Hart')
  await customer.getByLabel('E-mail').fill('bramble@seedcellar.example')
  const shipTo = page.getByRole('group', { name: 'Ship to' })
  await shipTo.getByLabel('Name on the parcel').fill('Bramble Okonkwo-Hart')
  await shipTo.getByLabel('Street address').fill('88 Nettlefold Lane')
  await shipTo.getByLabel('City').fill('Wickham Cross')
  await shipTo.getByLabel('Postal code').fill('30301')
  await page.getByLabel('Kit, line 1').selectOption(kitSku)
  await page.getByLabel('Quantity').fill(String(quantity))
  if (price !== null) await page.getByLabel('Unit price ($)').fill(price)
  await page.getByRole('button', { name: 'Save order' }).click()
}

describe('orders, in Chromium', () => {
  it('lets a planner filter the orders, open one, release it and see its work orders', async () => {
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Orders', exact: true }).click()
    await page.getByRole('heading', { name: 'Orders', exact: true }).waitFor()
    // Other browser tests add orders placed today, newest first: narrow the list to the demo's W- orders.
    await page.getByLabel('Search').fill('W-2')
    await page.waitForURL(/q=W-2/)
    await orderRow('W-2401').waitFor()
    // The demo's late order is flagged in the list.
    expect(await orderRow('W-2395').getAttribute('data-late')).toBe('true')
    await shot('orders-list')

    await page.getByLabel('Status').selectOption('received')
    await page.waitForURL(/stage=received/)
    await orderRow('W-2401').waitFor({ state: 'detached' })
    await page.getByLabel('Search').fill('halloway')
    await page.waitForURL(/q=halloway/)
    await expect.poll(() => ordersTable().getByRole('link').allTextContents()).toEqual(['W-2407', 'W-2404'])
    // Filters live in the URL: a reload shows the same rows.
    await page.reload()
    await orderRow('W-2407').waitFor()
    expect(await page.getByLabel('Status').inputValue()).toBe('received')

    // Her spare-parts order: released without touching the pump stock other tests count.
    await orderRow('W-2407').getByRole('link', { name: 'W-2407' }).click()
    await page.getByRole('heading', { name: 'Order W-2407' }).waitFor()
    expect(await page.getByRole('table', { name: 'Order lines' }).getByRole('row').count()).toBe(4) // header, 2 lines, total
    expect(await page.getByText('62 Cinderwick Avenue').isVisible()).toBe(true)
    expect(await page.getByText('No work orders yet').isVisible()).toBe(true)
    await shot('order-detail-open')

    await page.getByRole('button', { name: 'Release into work orders' }).click()
    const workOrders = page.getByRole('table', { name: 'Work orders' })
    await workOrders.waitFor()
    // 1 sprayer pack and 2 cup packs: three units, three serials.
    const serials = await workOrders.getByRole('row').filter({ hasNot: page.getByRole('columnheader') }).locator('td:first-child').allTextContents()
    expect(serials).toHaveLength(3)
    expect(new Set(serials).size).toBe(3)
    for (const s of serials) expect(s).toMatch(/^U-\d+$/)
    // Spare packs skip the benches: the order is ready to pack as soon as it is released.
    expect(await page.getByText('Ready to pack', { exact: true }).first().isVisible()).toBe(true)
    await page.getByRole('list', { name: 'Timeline' }).getByText(/Released into 3 work orders/).waitFor()
    expect(await page.getByRole('button', { name: 'Release into work orders' }).count()).toBe(0)
    await shot('order-detail-released')
  })

  it('enters a phone order through the form, and refuses its number a second time', async () => {
    await enterPhoneOrder('P-E2E-1', 'MW-TOTE-6C', 1)
    await page.getByRole('heading', { name: 'Order P-E2E-1' }).waitFor()
    await page.getByRole('list', { name: 'Timeline' }).getByText(/Entered as a phone order/).waitFor()
    expect(await page.getByText(planner.name).first().isVisible()).toBe(true)

    await enterPhoneOrder('P-E2E-1', 'MW-TOTE-6C', 1)
    await page.getByText('Already in use').waitFor()
    expect(page.url()).toMatch(/\/orders\/new$/)
    await shot('order-form-duplicate')
  })

  it('names what is short, releases anyway on request, and shows it on the shortages page', async () => {
    // A pack kit of our own whose one part has 2 in stock, so the demo stock other tests read stays as it is.
    const api = page.request
    const post = async (path: string, data: unknown, method: 'post' | 'put' = 'post') => {
      const res = await api[method](`${baseUrl}/api${path}`, { data })
      expect(res.status(), await res.text()).toBeLessThan(300)
      return (await res.json()) as { id: string; revisions: { id: string }[] }
    }
    const part = await post(
      '/parts',
      { sku: 'E2E-FLOAT-1', name: 'Float valve (test)', kind: 'hardware', unitOfMeasure: 'each', unitCostCents: 250, weightGrams: 30, reorderPoint: 0, reorderQuantity: 20 },
    )
    await post('/stock/receive', { lines: [{ partId: part.id, quantity: 2 }] })
    const kit = await post('/kits', { sku: 'E2E-PACK-FLOAT', name: 'Float valve pack (test)', storeProductId: null, description: null })
    const rev = kit.revisions[0]!.id
    const step = { text: 'Bag the valve.', caution: null, photoRequired: false, measurementRequired: false, measurementUnit: null, measurementMin: null, measurementMax: null }
    await post(`/revisions/${rev}`, { notes: null, frame: null, leakTest: null, bomLines: [{ partId: part.id, quantity: 1, note: null }], cutParts: [], buildSteps: [step] }, 'put')
    await post(`/revisions/${rev}/release`, {})

    await enterPhoneOrder('P-E2E-2', 'E2E-PACK-FLOAT', 3)
    await page.getByRole('heading', { name: 'Order P-E2E-2' }).waitFor()
    await page.getByRole('button', { name: 'Release into work orders' }).click()
    const short = page.getByRole('list', { name: 'Short parts' })
    await short.waitFor()
    expect(await short.textContent()).toBe('E2E-FLOAT-1: Needs 3, 2 free')
    await shot('order-release-short')
    await page.getByRole('button', { name: 'Release anyway with shortages' }).click()
    await page.getByRole('table', { name: 'Work orders' }).waitFor()
    await page.getByRole('list', { name: 'Timeline' }).getByText(/Released with parts short: E2E-FLOAT-1 Float valve \(test\) short 1 of 3/).waitFor()

    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Shortages' }).click()
    const row = page.getByRole('table', { name: 'Shortages' }).getByRole('row').filter({ hasText: 'E2E-FLOAT-1' })
    await row.waitFor()
    expect(await row.getAttribute('data-short')).toBe('true')
    // Needed 3, reserved 2, free 0, nothing on order: short 1; buy the reorder quantity of 20, being more.
    const cells = await row.getByRole('cell').allTextContents()
    expect(cells.slice(1, 6)).toEqual(['3 each', '2', '0', '—', '1 each'])
    expect(cells.at(-1)).toBe('20 each')
    await shot('shortages')
  })
  it('releases chosen orders by priority after a preview, and sums up the refusals in one place', async () => {
    // Our own pack kit with 2 valves in stock, 1 per pack, and three one-pack phone orders.
    const api = page.request
    const post = async (path: string, data: unknown, method: 'post' | 'put' = 'post') => {
      const res = await api[method](`${baseUrl}/api${path}`, { data })
      expect(res.status(), await res.text()).toBeLessThan(300)
      return (await res.json()) as { id: string; revisions: { id: string }[] }
    }
    const part = await post(
      '/parts',
      { sku: 'E2E-FLOAT-B', name: 'Float valve (bulk test)', kind: 'hardware', unitOfMeasure: 'each', unitCostCents: 250, weightGrams: 30, reorderPoint: 0, reorderQuantity: 0 },
    )
    await post('/stock/receive', { lines: [{ partId: part.id, quantity: 2 }] })
    const kit = await post('/kits', { sku: 'E2E-PACK-BULK', name: 'Float valve pack (bulk test)', storeProductId: null, description: null })
    const rev = kit.revisions[0]!.id
    const step = { text: 'Bag the valve.', caution: null, photoRequired: false, measurementRequired: false, measurementUnit: null, measurementMin: null, measurementMax: null }
    await post(`/revisions/${rev}`, { notes: null, frame: null, leakTest: null, bomLines: [{ partId: part.id, quantity: 1, note: null }], cutParts: [], buildSteps: [step] }, 'put')
    await post(`/revisions/${rev}/release`, {})
    const line = [{ kitSku: 'E2E-PACK-BULK', quantity: 1, unitPriceCents: 900 }]
    await post('/orders', buildNewOrder({ number: 'P-BULK-3', promisedShipDate: '2031-07-30', lines: line }))
    await post('/orders', buildNewOrder({ number: 'P-BULK-1', promisedShipDate: '2031-07-01', lines: line }))
    await post('/orders', buildNewOrder({ number: 'P-BULK-2', promisedShipDate: '2031-07-15', lines: line }))

    await page.goto(`${baseUrl}/orders?q=P-BULK`)
    for (const n of ['P-BULK-3', 'P-BULK-1', 'P-BULK-2']) await page.getByLabel(`Choose ${n} to release`).check()
    await page.getByRole('button', { name: 'Release chosen orders…' }).click()
    const preview = page.getByRole('table', { name: 'Release preview' })
    await preview.waitFor()
    // By hand: 2 free; P-BULK-1 (Jul 1) takes 1, P-BULK-2 (Jul 15) takes 1, P-BULK-3 (Jul 30) finds none.
    const rows = await preview.getByRole('row').allTextContents()
    expect(rows.slice(1).map((r) => r.match(/P-BULK-\d/)![0])).toEqual(['P-BULK-1', 'P-BULK-2', 'P-BULK-3'])
    expect(rows[3]).toContain('Will not be released')
    expect(rows[3]).toContain('needs 1, 0 free')
    await shot('orders-release-preview')

    await page.getByRole('button', { name: 'Release 2 order(s) as shown' }).click()
    const summary = page.getByRole('status', { name: 'Release summary' })
    await summary.getByText('Released 2 orders into 2 work orders.').waitFor()
    expect(await summary.getByRole('listitem').allTextContents()).toEqual([expect.stringContaining('P-BULK-3')])
    await shot('orders-release-summary')
    await summary.getByRole('button', { name: 'Close' }).click()
    await summary.waitFor({ state: 'detached' })
  })
  it('starts the unit price from the kit, and takes a phone payment in two parts until the order is paid', async () => {
    // The demo sprayer pack's list price is $18.00 (invented demo data); 2 packs = $36.00.
    await page.goto(`${baseUrl}/orders/new`)
    await page.getByLabel('Kit, line 1').selectOption('MW-SPARE-SPR6')
    await expect.poll(() => page.getByLabel('Unit price ($)').inputValue()).toBe('18.00')
    await enterPhoneOrder('P-PAY-1', 'MW-SPARE-SPR6', 2, null)
    await page.getByRole('heading', { name: 'Order P-PAY-1' }).waitFor()
    const payment = page.getByRole('region', { name: 'Payment' })
    await payment.getByText('$36.00 due').waitFor()

    await payment.getByLabel('How they paid').selectOption('cash')
    await payment.getByLabel('Amount ($)').fill('20')
    await payment.getByRole('button', { name: 'Record payment' }).click()
    await payment.getByText('$16.00 due').waitFor()
    // Too much is refused with the amount that may be entered, and nothing is recorded.
    await payment.getByLabel('Amount ($)').fill('50.00')
    await payment.getByRole('button', { name: 'Record payment' }).click()
    await payment.getByText('Order P-PAY-1 has $16.00 due; enter at most that').waitFor()
    // An empty amount takes what is due.
    await payment.getByLabel('Amount ($)').fill('')
    await payment.getByRole('button', { name: 'Record payment' }).click()
    await payment.getByText('nothing due').waitFor()
    expect(await payment.getByRole('list', { name: 'Payments received' }).getByRole('listitem').count()).toBe(2)
    await page.getByRole('list', { name: 'Timeline' }).getByText(/the order is paid in full/).waitFor()
    await shot('order-payment')
  })

  it('flags a unit whose measurement at the build bench was out of limits, with the step, value, limits, reason and who', async () => {
    // A unit of the demo 12-site kit, revision A, cut; its first step measures the tote and sends a tote outside the limits to rework.
    const { db, pool } = createDb(testDatabaseUrl('e2e'))
    const made = await (async () => {
      try {
        const [rev] = await db
          .select({ id: kitRevisions.id, kitId: kits.id })
          .from(kitRevisions)
          .innerJoin(kits, eq(kits.id, kitRevisions.kitId))
          .where(and(eq(kits.sku, 'MW-TOTE-12'), eq(kitRevisions.code, 'A')))
        const wo = await insertBuildWorkOrder(db, rev!.id, rev!.kitId, 'cut')
        const [step] = await db
          .select()
          .from(buildSteps)
          .where(and(eq(buildSteps.revisionId, rev!.id), eq(buildSteps.position, 1)))
        return { wo, step: step! }
      } finally {
        await pool.end()
      }
    })()
    const wide = Number(made.step.measurementMax) + 0.5
    const ticked = await page.request.post(`${baseUrl}/api/build/${made.wo.id}/steps/${made.step.id}/tick`, {
      data: { measurement: wide, reason: 'Tote from the wrong supplier batch' },
    })
    expect(ticked.status(), await ticked.text()).toBe(200)

    await page.goto(`${baseUrl}/orders/${made.wo.orderId}`)
    const row = page.getByRole('table', { name: 'Work orders' }).getByRole('row').filter({ hasText: made.wo.serial })
    await row.getByRole('link', { name: 'measurement out of limits' }).waitFor()
    const flags = page.getByRole('region', { name: 'Measurements out of limits (1)' }).getByRole('list', { name: 'Measurements out of limits' })
    const flag = flags.getByRole('listitem').filter({ hasText: `Unit ${made.wo.serial}` })
    await flag.getByText(`step 1: ${wide} in`, { exact: false }).waitFor()
    await flag.getByText(`limits ${Number(made.step.measurementMin)} – ${Number(made.step.measurementMax)} in`, { exact: false }).waitFor()
    await flag.getByText('in rework', { exact: true }).waitFor()
    await flag.getByText(`Step 1: ${made.step.text}`).waitFor()
    await flag.getByText(`“Tote from the wrong supplier batch” — ${planner.name}`, { exact: false }).waitFor()
    await shot('order-measurement-flags')
  })
})
