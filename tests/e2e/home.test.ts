import type { Page } from 'playwright-core'
import { beforeEach, describe, expect, inject, it } from 'vitest'
import { LateOrdersReportSchema } from '@kitwright/shared/reports'
import { DEMO_USERS } from '../../server/src/seeds/demo'
import { browserPerTest, signIn } from '../support/browser'

const baseUrl = inject('baseUrl')
let page: Page

const chromium = browserPerTest({ width: 1280, height: 900 })
beforeEach(async () => {
  page = chromium.page
})

describe("the owner's home page, in Chromium", () => {
  it('shows a planner the late orders and a chart whose numbers one click reveals', async () => {
    const planner = DEMO_USERS.find((u) => u.role === 'planner')!
    await signIn(page, baseUrl, planner.email, planner.password)
    await page.getByRole('heading', { name: 'Late orders' }).waitFor()

    // The demo data has a late order; the page lists what the API reports, with the count on top.
    const late = LateOrdersReportSchema.parse(await (await page.request.get(`${baseUrl}/api/reports/late-orders`)).json())
    expect(late.total).toBeGreaterThan(0)
    const table = page.getByRole('table', { name: 'Late orders' })
    await table.getByRole('link', { name: late.rows[0]!.number }).waitFor()
    expect(await table.getByRole('row').count()).toBe(late.rows.length + 1)
    expect(await page.getByTestId('number-late-orders').textContent()).toBe(String(late.total))
    await page.getByText('Dates and days on this page are in UTC.').waitFor()

    // The throughput chart is drawn; its numbers are hidden until asked for.
    const panel = page.getByRole('region', { name: 'Units built and shipped per day' })
    await panel.getByRole('img', { name: /Units built and shipped per day/ }).waitFor()
    const numbers = panel.getByRole('table', { name: 'Units built and shipped per day' })
    expect(await numbers.count()).toBe(0)
    await panel.getByRole('button', { name: 'Show the numbers' }).click()
    await numbers.waitFor()
    // 30 days (the default range) and a total row, under the header.
    expect(await numbers.getByRole('row').count()).toBe(32)
    await panel.getByRole('button', { name: 'Hide the numbers' }).click()
    await numbers.waitFor({ state: 'detached' })

    // Each table offers its CSV.
    const csv = await panel.getByRole('link', { name: /Export CSV/ }).getAttribute('href')
    expect(csv).toBe('/api/reports/throughput/export.csv')
    const res = await page.request.get(`${baseUrl}${csv}`)
    expect(res.status()).toBe(200)
    expect((await res.text()).replace(/^\ufeff/, '').split('\r\n')[0]).toBe('Day (UTC),Units built,Units shipped')
  })
})
