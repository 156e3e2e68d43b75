import { mkdirSync } from 'node:fs'
import path from 'node:path'
import type { Page } from 'playwright-core'
import { beforeEach, describe, expect, inject, it } from 'vitest'
import { DEMO_PART_SKUS } from '../../server/src/db/seed-catalog'
import { DEMO_USERS } from '../../server/src/db/seed'
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
  it('drafts purchase orders from shortages, sends the pumps order, receives it partly and sees it on order', async () => {
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Shortages' }).click()
    await page.getByRole('heading', { name: 'Shortages', exact: true }).waitFor()
    // The demo seed leaves the pump below its reorder point: it is listed with a suggestion.
    const pumpRow = () => page.getByRole('table', { name: 'Shortages' }).getByRole('row').filter({ hasText: DEMO_PART_SKUS.pump })
    await pumpRow().waitFor()
    await page.screenshot({ path: path.join(shots, 'shortages-before.png'), fullPage: true })
    await page.getByRole('button', { name: 'Draft purchase orders from shortages' }).click()
    await page.waitForURL(/\/purchasing\/orders/)

    const table = page.getByRole('table', { name: 'Purchase orders' })
    const pumpsOrder = table.getByRole('row').filter({ hasText: 'Brightwater Pumpworks' })
    await pumpsOrder.waitFor()
    expect(await pumpsOrder.getByRole('cell').nth(2).textContent()).toBe('Draft')
    const number = (await pumpsOrder.getByRole('button').textContent())!
    await pumpsOrder.getByRole('button', { name: number }).click()
    const editor = page.getByRole('region', { name: `Purchase order ${number}` })
    await editor.waitFor()
    // A negative price is refused with what to fix, and the draft stays as it was.
    await editor.getByLabel(`Unit price of ${DEMO_PART_SKUS.pump}`).fill('-3')
    await editor.getByRole('button', { name: 'Save the draft' }).click()
    await editor.getByText('A price cannot be negative: enter 0 or more').waitFor()
    await editor.getByLabel(`Quantity of ${DEMO_PART_SKUS.pump}`).fill('24')
    await editor.getByLabel(`Unit price of ${DEMO_PART_SKUS.pump}`).fill('20.83')
    await editor.getByLabel('Expected date').fill('2099-01-12')
    await editor.getByRole('button', { name: 'Save the draft' }).click()
    // 24 × $20.83 = $499.92
    await editor.getByText('Total $499.92').waitFor()
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
    await form.getByText(`${number} still expects 24 ${DEMO_PART_SKUS.pump}; 30 is 6 over: give a reason, or receive 24`).waitFor()
    await form.getByLabel(/^Quantity/).first().fill('10')
    await form.getByRole('button', { name: 'Receive into stock' }).click()
    await page.getByText('Received 1 line into stock').waitFor()
    await page.screenshot({ path: path.join(shots, 'receive-against-po.png'), fullPage: true })

    await page.goto(`${baseUrl}/purchasing/orders`)
    await table.getByRole('row').filter({ hasText: number }).getByText('Partly received').waitFor()

    // Shortages count the 14 still to come as on order, with the order's number and date.
    await page.goto(`${baseUrl}/shortages?only=all`)
    const onOrder = pumpRow().getByTestId('on-order')
    await onOrder.getByText(`${number}: 14, due`).waitFor()
    expect(await onOrder.textContent()).toContain('14')
    await page.screenshot({ path: path.join(shots, 'shortages-on-order.png'), fullPage: true })

    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Suppliers' }).click()
    await page.getByRole('region', { name: 'Brightwater Pumpworks' }).getByText(DEMO_PART_SKUS.pump).waitFor()
    await page.screenshot({ path: path.join(shots, 'suppliers.png'), fullPage: true })
  })
})
