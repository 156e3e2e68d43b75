import type { Page } from 'playwright-core'
import { beforeEach, describe, expect, inject, it } from 'vitest'
import { DEMO_USERS } from '../../server/src/seeds/demo'
import { browserPerTest, signIn } from '../support/browser'

const baseUrl = inject('baseUrl')
let page: Page

const planner = DEMO_USERS.find((u) => u.role === 'planner')!
const admin = DEMO_USERS.find((u) => u.role === 'admin')!

const chromium = browserPerTest({ width: 1366, height: 900 })
beforeEach(async () => {
  page = chromium.page
})

/** Keeps a picture of the page when KW_SHOTS names a folder (for a person to look at). */
async function shot(name: string) {
  if (process.env.KW_SHOTS) await page.screenshot({ path: `${process.env.KW_SHOTS}/${name}.png`, fullPage: true })
}

/** A phone order of one spare pack through the API, as the signed-in planner; returns its id. */
async function phoneOrder(number: string): Promise<string> {
  const res = await page.request.post(`${baseUrl}/api/orders`, {
    data: {
      number,
      customer: { name: 'Tamsin Marrowby', email: 'tamsin@fernworks.example' },
      shipTo: { name: 'Tamsin Marrowby', line1: '4 Quillon Yard', city: 'Ashcombe Vale', postalCode: '30302', country: 'US' },
      placedAt: new Date().toISOString(),
      lines: [{ kitSku: 'MW-SPARE-SPR6', quantity: 1, unitPriceCents: 1900 }],
    },
  })
  expect(res.status(), await res.text()).toBe(201)
  return ((await res.json()) as { id: string }).id
}

describe('hold and cancel from the order page, in Chromium', () => {
  it('puts an order on hold with a reason, takes it off, releases it and cancels it, all on the timeline', async () => {
    await signIn(page, baseUrl, planner.email, planner.password)
    await page.getByRole('heading', { name: /Good day/ }).waitFor()
    const id = await phoneOrder('P-E2E-HOLD-1')
    await page.goto(`${baseUrl}/orders/${id}`)
    await page.getByRole('heading', { name: 'Order P-E2E-HOLD-1' }).waitFor()
    // Promised from the work ahead, never sooner than the shop's lead time (which binds in the demo shop), since the order came without a date.
    await page.getByRole('list', { name: 'Timeline' }).getByText(/promised to ship by [A-Z][a-z]{2} \d{1,2}, \d{4}: the shop's minimum lead time of 7 working days/).waitFor()

    await page.getByRole('button', { name: 'Put on hold…' }).click()
    const holdForm = page.getByRole('form', { name: 'Put on hold' })
    await holdForm.getByRole('button', { name: 'Put on hold' }).click()
    await holdForm.getByText('Say why the order is on hold').waitFor()
    await holdForm.getByLabel('Reason to hold').fill('Customer to confirm the colour of the tote')
    await holdForm.getByRole('button', { name: 'Put on hold' }).click()
    const banner = page.getByRole('status', { name: 'On hold' })
    await banner.getByText('On hold: Customer to confirm the colour of the tote').waitFor()
    expect(await banner.textContent()).toContain(`By ${planner.name}`)
    expect(await page.getByRole('button', { name: 'Release into work orders' }).count()).toBe(0)
    await page.getByRole('list', { name: 'Timeline' }).getByText('Put on hold: Customer to confirm the colour of the tote.', { exact: false }).waitFor()
    await shot('order-on-hold')

    // The list shows it on hold, with the reason, and filters by it.
    await page.goto(`${baseUrl}/orders?stage=on_hold`)
    const row = page.getByRole('table', { name: 'Orders' }).getByRole('row').filter({ has: page.getByRole('link', { name: 'P-E2E-HOLD-1', exact: true }) })
    await row.getByText('Customer to confirm the colour of the tote').waitFor()
    expect(await row.getByText('On hold', { exact: true }).isVisible()).toBe(true)
    await row.getByRole('link', { name: 'P-E2E-HOLD-1' }).click()

    await page.getByRole('button', { name: 'Take off hold' }).click()
    await banner.waitFor({ state: 'detached' })
    await page.getByLabel('Priority').selectOption('rush')
    await page.getByRole('list', { name: 'Timeline' }).getByText('Priority set to rush (was normal).').waitFor()
    await page.getByRole('button', { name: 'Release into work orders' }).click()
    await page.getByRole('table', { name: 'Work orders' }).waitFor()

    await page.getByRole('button', { name: 'Cancel order…' }).click()
    const cancelForm = page.getByRole('form', { name: 'Cancel the order' })
    expect(await cancelForm.textContent()).toContain('Its 1 unshipped work order will be cancelled')
    await cancelForm.getByLabel('Reason to cancel').fill('Customer bought the kit at a fair instead')
    await shot('order-cancel-form')
    await cancelForm.getByRole('button', { name: 'Cancel this order' }).click()
    await page
      .getByRole('list', { name: 'Timeline' })
      .getByText(new RegExp(`Cancelled by ${planner.name} \\(Customer bought the kit at a fair instead\\)\\. 1 work order cancelled \\(U-\\d+\\) and their reserved stock released\\.`))
      .waitFor()
    expect(await page.getByRole('table', { name: 'Work orders' }).getByRole('cell', { name: 'Cancelled' }).count()).toBe(1)
    expect(await page.getByRole('button', { name: 'Cancel order…' }).count()).toBe(0)
    expect(await page.getByRole('button', { name: 'Put on hold…' }).count()).toBe(0)
    await shot('order-cancelled')
  })

  it('lets the admin set the lead time and auto-release on the settings page', async () => {
    await signIn(page, baseUrl, admin.email, admin.password)
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Settings' }).click()
    const form = page.getByRole('form', { name: 'Shop settings' })
    await form.waitFor()
    expect(await form.getByLabel('Lead time (working days)').inputValue()).toBe('7')
    expect(await form.getByLabel('Kerf (saw blade width)').inputValue()).toBe('1/8"')
    await form.getByLabel('Kerf (saw blade width)').fill('1/8 foo')
    await form.getByRole('button', { name: 'Save settings' }).click()
    await form.getByText('"foo" is not a unit Kitwright knows', { exact: false }).waitFor()
    await form.getByLabel('Kerf (saw blade width)').fill('1/8')
    await form.getByLabel('Lead time (working days)').fill('6')
    await shot('settings')
    await form.getByRole('button', { name: 'Save settings' }).click()
    await page.getByText('Settings saved').waitFor()
    await page.reload()
    await form.waitFor()
    expect(await form.getByLabel('Lead time (working days)').inputValue()).toBe('6')
    expect(await form.getByLabel('Release paid orders automatically', { exact: false }).isChecked()).toBe(false)
    // Put it back for the other browser tests.
    await form.getByLabel('Lead time (working days)').fill('7')
    await form.getByRole('button', { name: 'Save settings' }).click()
    await page.getByText('Settings saved').first().waitFor()
  })
})
