import type { Page } from 'playwright-core'
import { afterAll, beforeAll, beforeEach, describe, expect, inject, it } from 'vitest'
import { createDb } from '../../server/src/db/client'
import { DEMO_USERS } from '../../server/src/seeds/demo'
import { browserPerTest, signIn } from '../support/browser'
import { revisionOf } from '../support/cut-run-factories'
import { testDatabaseUrl } from '../support/env'
import { insertReportOrder, insertReportUnit } from '../support/report-factories'

const baseUrl = inject('baseUrl')
let page: Page
let conn: ReturnType<typeof createDb>

const chromium = browserPerTest({ width: 1280, height: 900 })
beforeAll(() => {
  conn = createDb(testDatabaseUrl('e2e'))
})
afterAll(() => conn.pool.end())
beforeEach(async () => {
  page = chromium.page
})

const DAY = 86_400_000
const utcDay = (ms: number) => new Date(ms).toISOString().slice(0, 10)

describe("the owner's home page, in Chromium", () => {
  it('shows a planner the late orders and a chart whose numbers one click reveals', async () => {
    // An order of our own, promised 999 days ago, 3 units of which 1 has shipped: the page's figures for it are worked from these rows,
    // not read from the app's API.
    const rev = await revisionOf(conn.db, 'MW-TOTE-12')
    const promised = utcDay(Date.now() - 999 * DAY)
    const mine = await insertReportOrder(conn.db, rev.kitId, { status: 'partially_shipped', promisedShipDate: promised, placedAt: new Date(Date.now() - 1005 * DAY), quantity: 3 })
    for (const status of ['shipped', 'building', 'building'] as const) await insertReportUnit(conn.db, mine, rev.id, status)

    const planner = DEMO_USERS.find((u) => u.role === 'planner')!
    await signIn(page, baseUrl, planner.email, planner.password)
    await page.getByRole('heading', { name: 'Late orders' }).waitFor()
    await page.getByText('Dates and days on this page are in UTC.').waitFor()

    // "Today" as the page states it must be the UTC day of the test's own clock around the load (the
    // day before, only if a UTC midnight fell in between); days late are counted from that day.
    const panelText = page.getByText(/^Promised ship date before today \(\d{4}-\d{2}-\d{2}, UTC\)/)
    const pageToday = /\((\d{4}-\d{2}-\d{2}), UTC\)/.exec((await panelText.textContent()) ?? '')![1]!
    expect([utcDay(Date.now()), utcDay(Date.now() - DAY)]).toContain(pageToday)
    const daysLate = Math.round((Date.parse(`${pageToday}T00:00:00Z`) - Date.parse(`${promised}T00:00:00Z`)) / DAY)
    expect(daysLate === 999 || daysLate === 1000).toBe(true)
    const table = page.getByRole('table', { name: 'Late orders' })
    // Other browser tests may leave orders promised even longer ago: find ours by its number, and
    // check the list runs oldest promise first (days late never rise down the list).
    const mineRow = table.getByRole('row').filter({ has: page.getByRole('link', { name: mine.order.number, exact: true }) })
    await mineRow.waitFor()
    const daysColumn = (await table.getByRole('row').all()).slice(1).map(async (row) => Number((await row.getByRole('cell').nth(4).textContent()) ?? ''))
    const days = await Promise.all(daysColumn)
    expect(days).toEqual([...days].sort((x, y) => y - x))
    expect(await mineRow.getByRole('cell').allTextContents()).toEqual([mine.order.number, mine.order.customerName, 'Partly shipped', promised, String(daysLate), '1 of 3'])

    // The count on top is every late order in the database by the page's own words ("promised ship
    // date before today and not shipped or cancelled"), counted here with the test's own SQL.
    const { rows } = await conn.pool.query<{ n: number }>(
      `select count(*)::int as n from orders where promised_ship_date < $1::date and status not in ('shipped', 'cancelled')`,
      [pageToday],
    )
    expect(rows[0]!.n).toBeGreaterThanOrEqual(1)
    expect(await page.getByTestId('number-late-orders').textContent()).toBe(String(rows[0]!.n))

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
