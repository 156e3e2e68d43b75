import { randomBytes } from 'node:crypto'
import { mkdirSync } from 'node:fs'
import path from 'node:path'
import type { Page } from 'playwright-core'
import { beforeEach, describe, expect, inject, it } from 'vitest'
import { DEMO_USERS } from '../../server/src/seeds/demo'
import { browserPerTest, signIn } from '../support/browser'

const baseUrl = inject('baseUrl')
let page: Page

const planner = DEMO_USERS.find((u) => u.role === 'planner')!
// Pictures of the screens to look at after a run.
const shots = path.resolve(import.meta.dirname, '../.artifacts/purchase-orders')
mkdirSync(shots, { recursive: true })

const chromium = browserPerTest({ width: 1400, height: 1000 })
beforeEach(async () => {
  page = chromium.page
  await signIn(page, baseUrl, planner.email, planner.password)
  await page.getByRole('heading', { name: /Good day/ }).waitFor()
})

describe("the planner's purchase orders, in Chromium", () => {
  it('drafts purchase orders from shortages, sends one, receives it partly and sees it on order', async () => {
    // Its own part and supplier, so other browser tests' receipts on the shared demo shop change nothing here.
    const tag = randomBytes(3).toString('hex').toUpperCase()
    const sku = `TST-FV-${tag}`
    const supplierName = `Larkspur Valve Co. ${tag}`
    const part = await page.request.post(`${baseUrl}/api/parts`, {
      data: { sku, name: 'Test float valve', kind: 'hardware', unitOfMeasure: 'each', unitCostCents: 1000, weightGrams: 100, reorderPoint: 10, reorderQuantity: 7 },
    })
    expect(part.status(), await part.text()).toBe(201)
    const partId = ((await part.json()) as { id: string }).id
    const supplier = await page.request.post(
      `${baseUrl}/api/suppliers`,
      { data: { name: supplierName, email: `orders-${tag.toLowerCase()}@larkspur.example`, leadTimeDays: 9, minimumOrderCents: 12000 } },
    )
    expect(supplier.status()).toBe(201)
    const supplierId = ((await supplier.json()) as { id: string }).id
    const offer = await page.request.put(`${baseUrl}/api/suppliers/${supplierId}/parts/${partId}`, {
      data: { supplierSku: 'FV-77', packSize: 5, priceBreaks: [{ minQuantity: 1, unitPriceCents: 1000 }, { minQuantity: 10, unitPriceCents: 900 }] },
    })
    expect(offer.status()).toBe(200)

    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Shortages' }).click()
    await page.getByRole('heading', { name: 'Shortages', exact: true }).waitFor()
    // None on hand, reorder point 10: listed, with the reorder quantity (7) suggested.
    const partRow = () => page.getByRole('table', { name: 'Shortages' }).getByRole('row').filter({ hasText: sku })
    await partRow().getByText('7 each').waitFor()
    await page.screenshot({ path: path.join(shots, 'shortages-before.png'), fullPage: true })
    await page.getByRole('button', { name: 'Draft purchase orders from shortages' }).click()
    await page.waitForURL(/\/purchasing\/orders/)

    const table = page.getByRole('table', { name: 'Purchase orders' })
    const ours = table.getByRole('row').filter({ hasText: supplierName })
    await ours.waitFor()
    expect(await ours.getByRole('cell').nth(2).textContent()).toBe('Draft')
    // By hand: 7 → whole packs of 5: 10, at the 10+ break $9.00 = $90.00, under the $120.00 minimum;
    // one more pack: 15 × $9.00 = $135.00.
    expect(await ours.getByRole('cell').nth(4).textContent()).toBe('$135.00')
    const number = (await ours.getByRole('button').textContent())!
    await ours.getByRole('button', { name: number }).click()
    const editor = page.getByRole('region', { name: `Purchase order ${number}` })
    await editor.waitFor()
    // A negative price is refused with what to fix, and the draft stays as it was.
    await editor.getByLabel(`Unit price of ${sku}`).fill('-3')
    await editor.getByRole('button', { name: 'Save the draft' }).click()
    await editor.getByText('A price cannot be negative: enter 0 or more').waitFor()
    await editor.getByLabel(`Quantity of ${sku}`).fill('24')
    await editor.getByLabel(`Unit price of ${sku}`).fill('8.50')
    await editor.getByLabel('Expected date').fill('2099-01-12')
    await editor.getByRole('button', { name: 'Save the draft' }).click()
    // 24 × $8.50 = $204.00
    await editor.getByText('Total $204.00').waitFor()
    await page.screenshot({ path: path.join(shots, 'purchase-order-draft.png'), fullPage: true })
    await editor.getByRole('button', { name: 'Send to the supplier' }).click()
    await editor.getByTestId('po-status').getByText('Sent', { exact: true }).waitFor()

    // Receive 10 of the 24 against it on the receiving screen.
    await editor.getByRole('link', { name: `Receive against ${number}` }).click()
    const form = page.getByRole('form', { name: 'Receive stock' })
    await form.getByText(`${number}: 0 of 24 received, 24 still to come`).waitFor()
    expect(await form.getByLabel(/^Quantity/).first().inputValue()).toBe('24')
    // More than is due without a reason: refused with what to fix, nothing received.
    await form.getByLabel(/^Quantity/).first().fill('30')
    await form.getByRole('button', { name: 'Receive into stock' }).click()
    await form.getByText(`${number} still expects 24 ${sku}; 30 is 6 over: give a reason, or receive 24`).waitFor()
    await form.getByLabel(/^Quantity/).first().fill('10')
    await form.getByRole('button', { name: 'Receive into stock' }).click()
    await page.getByText('Received 1 line into stock').waitFor()
    await page.screenshot({ path: path.join(shots, 'receive-against-po.png'), fullPage: true })

    await page.goto(`${baseUrl}/purchasing/orders`)
    await table.getByRole('row').filter({ hasText: number }).getByText('Partly received').waitFor()

    // Shortages count the 14 still to come as on order, with the order's number and date
    // (10 free, at the reorder point 10, so the part is still listed).
    await page.goto(`${baseUrl}/shortages?only=all`)
    const onOrder = partRow().getByTestId('on-order')
    await onOrder.getByText(`${number}: 14, due`).waitFor()
    expect(await onOrder.textContent()).toMatch(/^14/)
    await page.screenshot({ path: path.join(shots, 'shortages-on-order.png'), fullPage: true })

    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Suppliers' }).click()
    await page.getByRole('region', { name: supplierName }).getByText(sku).waitFor()
    await page.screenshot({ path: path.join(shots, 'suppliers.png'), fullPage: true })
  })
})
