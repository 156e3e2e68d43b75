import type { Page } from 'playwright-core'
import { beforeEach, describe, expect, inject, it } from 'vitest'
import { DEMO_USERS } from '../../server/src/seeds/demo'
import { browserPerTest, signIn } from '../support/browser'

const baseUrl = inject('baseUrl')
let page: Page

const chromium = browserPerTest({ width: 1400, height: 1000 })
beforeEach(async () => {
  page = chromium.page
  const planner = DEMO_USERS.find((u) => u.role === 'planner')!
  await signIn(page, baseUrl, planner.email, planner.password)
  await page.getByRole('heading', { name: /Good day/ }).waitFor()
})

describe('a planner revises the 12-site kit for a new tote', () => {
  it('starts a revision from B, enters the new tote, sees the cut list and its derivation update, saves and releases it', async () => {
    await page.getByRole('link', { name: 'Kits', exact: true }).click()
    const row = page.getByRole('row', { name: /MW-TOTE-12/ })
    await row.getByRole('link', { name: /^B · Released$/ }).click()
    await page.getByRole('heading', { name: /Revision B/ }).waitFor()
    await page.getByRole('button', { name: 'Start a new revision from B' }).click()
    await page.getByRole('heading', { name: /Revision C/ }).waitFor()

    const calculated = page.getByRole('table', { name: 'Calculated cut list' })
    const crossRun = calculated.getByRole('row', { name: /^cross run/ })
    expect(await crossRun.getByRole('cell').nth(2).textContent()).toBe('14-3/16"')

    // The new tote is 1 in wider again: the cross runs grow by 1 in, as the derivation shows.
    await page.getByLabel('Tote inside width at the manifold').fill('18')
    await crossRun.getByRole('cell', { name: '15-3/16"', exact: true }).waitFor()
    expect(await crossRun.getByRole('cell').nth(3).textContent()).toMatch(/centreline width ≈16-3\/16"/)

    await page.getByRole('button', { name: 'Use this cut list' }).click()
    const cutParts = page.getByRole('table', { name: 'Cut parts' })
    await expect.poll(() => cutParts.getByLabel('Length of cut part 5').inputValue()).toBe('15-3/16"')

    await page.getByRole('button', { name: 'Save draft' }).click()
    await page.getByText('Saved').waitFor()
    await page.getByRole('button', { name: 'Release' }).click()
    await page.getByRole('heading', { name: 'Revision C released' }).waitFor()
    await page.getByRole('button', { name: 'Start a new revision from C' }).waitFor()

    // The roll-ups follow the saved cut list: 4 cross runs + the short sides grew.
    const rollups = page.getByRole('region', { name: 'Roll-ups per unit' })
    expect(await rollups.textContent()).toMatch(/Pieces to cut18/)
    await page.getByRole('link', { name: 'Kits', exact: true }).click()
    await page.getByRole('row', { name: /MW-TOTE-12/ }).getByRole('link', { name: 'C · released' }).waitFor()
  })

  it('asks for a reason when a cut length is changed by hand', async () => {
    await page.getByRole('link', { name: 'Kits', exact: true }).click()
    await page.getByRole('row', { name: /MW-TOTE-6C/ }).getByRole('link', { name: /^A · Released$/ }).click()
    await page.getByRole('button', { name: 'Start a new revision from A' }).click()
    await page.getByRole('heading', { name: /Revision B/ }).waitFor()
    const cutParts = page.getByRole('table', { name: 'Cut parts' })
    const labels = await cutParts.getByRole('textbox', { name: /^Label of cut part/ }).evaluateAll((els) => els.map((e) => (e as HTMLInputElement).value))
    const n = labels.indexOf('riser') + 1
    expect(n).toBeGreaterThan(0)
    await cutParts.getByLabel(`Length of cut part ${n}`, { exact: true }).fill('3-3/4"')
    await page.getByRole('button', { name: 'Save draft' }).click()
    await page.getByText(/Say why riser differs from the calculated 3-1\/2"/).first().waitFor()
    await cutParts.getByLabel(`Why cut part ${n} differs from the calculation`).fill('Pump on a 1/4 in pad')
    await page.getByRole('button', { name: 'Save draft' }).click()
    await page.getByText('Saved').waitFor()
  })
})
