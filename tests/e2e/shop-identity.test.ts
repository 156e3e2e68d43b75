import type { Page } from 'playwright-core'
import { beforeEach, describe, expect, inject, it } from 'vitest'
import { DEMO_USERS } from '../../server/src/seeds/demo'
import { browserPerTest, signIn } from '../support/browser'

const baseUrl = inject('baseUrl')
let page: Page
const admin = DEMO_USERS.find((u) => u.role === 'admin')!

const chromium = browserPerTest({ width: 1280, height: 1000 })
beforeEach(async () => {
  page = chromium.page
})

/** The one way Kitwright writes a moment: "Dec 3, 2026, 4:05 PM" (shared/src/dates.ts). */
const ONE_FORMAT = /^[A-Z][a-z]{2} \d{1,2}, \d{4}, \d{1,2}:\d{2}\s?[AP]M$/

describe('the shop identity on the settings page, in Chromium', () => {
  it('shows the public address read-only, refuses a bad reply-to with what to fix, and saves a new sender', async () => {
    const problems: string[] = []
    page.on('pageerror', (e) => problems.push(e.message))
    await signIn(page, baseUrl, admin.email, admin.password)
    await page.getByRole('heading', { name: /Good day/ }).waitFor()
    await page.goto(`${baseUrl}/admin/settings`)
    await page.getByRole('heading', { name: 'Settings' }).waitFor()
    expect(problems).toEqual([])
    const form = page.getByRole('form', { name: 'Shop identity' })
    await form.getByLabel('Sender e-mail').waitFor()
    expect(await form.getByLabel('Sender e-mail').inputValue()).toBe('orders@mistwell.example')
    expect(await form.getByLabel('Street address').inputValue()).toBe('12 Foundry Lane, Unit 4')
    // The public address is shown, not editable, with where it comes from.
    const publicUrl = (await page.getByTestId('public-url').textContent())!.trim()
    expect(() => new URL(publicUrl)).not.toThrow()
    expect(await form.getByRole('textbox', { name: /public address/i }).count()).toBe(0)
    expect(await form.textContent()).toMatch(/comes from PUBLIC_URL .*see the README/)
    if (process.env.KW_SHOTS) await page.screenshot({ path: `${process.env.KW_SHOTS}/settings-identity.png`, fullPage: true })

    await form.getByLabel('Reply-to e-mail').fill('workshop@')
    await form.getByRole('button', { name: 'Save shop identity' }).click()
    await form.getByText('Enter the reply-to e-mail as an address such as orders@your-shop.example, or leave it blank').waitFor()

    await form.getByLabel('Reply-to e-mail').fill('bench@mistwell.example')
    await form.getByLabel('Sender name').fill('Mistwell Tote Works workshop')
    await form.getByRole('button', { name: 'Save shop identity' }).click()
    await page.getByText('Shop identity saved').waitFor()
    await page.reload()
    await form.getByLabel('Sender name').waitFor()
    expect(await form.getByLabel('Sender name').inputValue()).toBe('Mistwell Tote Works workshop')
    expect(await form.getByLabel('Reply-to e-mail').inputValue()).toBe('bench@mistwell.example')

    // The change is in the audit trail, dated the one way every screen writes dates.
    await page.goto(`${baseUrl}/admin/audit`)
    const row = page.getByRole('row').filter({ hasText: "Changed the shop's identity" }).first()
    await row.waitFor()
    expect((await row.getByRole('cell').first().textContent())!.trim()).toMatch(ONE_FORMAT)

    // Put the demo's identity back for the other browser tests.
    await page.goto(`${baseUrl}/admin/settings`)
    await form.getByLabel('Sender name').waitFor()
    await form.getByLabel('Sender name').fill('Mistwell Tote Works')
    await form.getByLabel('Reply-to e-mail').fill('workshop@mistwell.example')
    await form.getByRole('button', { name: 'Save shop identity' }).click()
    await page.getByText('Shop identity saved').waitFor()
  })
})
