import type { Browser, BrowserContext, Page } from 'playwright-core'
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, inject, it } from 'vitest'
import { createDb } from '../../server/src/db/client'
import { mailMessages } from '../../server/src/db/schema/index'
import { DEMO_USERS } from '../../server/src/seeds/demo'
import { orderReceivedContent } from '../../server/src/features/mail/order-received-mail'
import { launchChromium, signIn } from '../support/browser'
import { testDatabaseUrl } from '../support/env'

const baseUrl = inject('baseUrl')
let browser: Browser
let context: BrowserContext
let page: Page
const subjectMark = `E2E-${Date.now().toString(36).toUpperCase()}`

beforeAll(async () => {
  browser = await launchChromium()
  // A message as the mail job leaves it once sent, written straight into the app's database.
  const { db, pool } = createDb(testDatabaseUrl('e2e'))
  try {
    const content = orderReceivedContent({
      shopName: 'Mistwell Tote Works',
      customerName: 'Liesel Kettleby',
      orderNumber: subjectMark,
      standing: { status: 'open', paymentStatus: 'paid', onHold: false, promisedShipDate: '2026-03-14' },
      lines: [{ description: '12-site aeroponic tote kit', sku: 'MW-TOTE-12', quantity: 1 }],
    })
    await db.insert(mailMessages).values({ to: 'liesel.kettleby@post.example', ...content, status: 'sent', attempts: 1, sentAt: new Date(), purpose: `e2e-${subjectMark}` })
  } finally {
    await pool.end()
  }
})
afterAll(() => browser.close())
beforeEach(async () => {
  context = await browser.newContext({ viewport: { width: 1280, height: 900 } })
  page = await context.newPage()
})
afterEach(() => context.close())

describe('the outbox, in Chromium', () => {
  it('lets a planner open the Outbox from the menu and read a message as the customer sees it', async () => {
    const planner = DEMO_USERS.find((u) => u.role === 'planner')!
    await signIn(page, baseUrl, planner.email, planner.password)
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Outbox' }).click()
    await page.getByRole('heading', { name: 'Outbox' }).waitFor()
    const row = page.getByRole('row').filter({ hasText: subjectMark })
    await row.waitFor()
    expect(await row.textContent()).toContain('liesel.kettleby@post.example')
    // Dates the one way every screen writes them (shared/src/dates.ts), never the numeric 12/3/2026.
    expect(await row.textContent()).toMatch(/[A-Z][a-z]{2} \d{1,2}, \d{4}, \d{1,2}:\d{2}\s?[AP]M/)
    expect(await row.textContent()).not.toMatch(/\d{1,2}\/\d{1,2}\/\d{4}/)
    await row.getByRole('button', { name: new RegExp(subjectMark) }).click()
    const frame = page.frameLocator('iframe[title="Message as the customer sees it"]')
    await frame.getByText(`Thank you for your order ${subjectMark}`).waitFor()
    expect(await frame.locator('li').first().textContent()).toContain('12-site aeroponic tote kit')
    expect(await frame.getByText(/Saturday, Mar 14, 2026/).count()).toBe(1)
    expect(new URL(page.url()).searchParams.get('message')).not.toBeNull()
    await page.getByRole('button', { name: 'Close' }).click()
    await frame.locator('body').waitFor({ state: 'detached' })
  })

  it('is not in the menu of a bench role', async () => {
    const packer = DEMO_USERS.find((u) => u.role === 'packer')!
    await signIn(page, baseUrl, packer.email, packer.password)
    await page.getByRole('heading', { name: 'Pack bench' }).waitFor()
    expect(await page.getByRole('navigation', { name: 'Main' }).getByRole('link').allTextContents()).not.toContain('Outbox')
  })
})
