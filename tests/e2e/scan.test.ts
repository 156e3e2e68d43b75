import type { Page } from 'playwright-core'
import { beforeEach, describe, expect, inject, it } from 'vitest'
import { DEMO_PART_SKUS } from '../../server/src/seeds/catalog'
import { DEMO_USERS } from '../../server/src/seeds/demo'
import { browserPerTest, signIn } from '../support/browser'

const baseUrl = inject('baseUrl')
let page: Page

const chromium = browserPerTest({ width: 1024, height: 768 })
beforeEach(async () => {
  page = chromium.page
})

describe('the scan page', () => {
  it('tells a packer what a scanned part is and where it is shelved, and says plainly when a code is unknown', async () => {
    const packer = DEMO_USERS.find((u) => u.role === 'packer')!
    await signIn(page, baseUrl, packer.email, packer.password)
    await page.getByRole('link', { name: 'Scan', exact: true }).click()
    await page.getByLabel('Bin, unit serial, order, offcut, part or return label').waitFor()
    // A keyboard-wedge scanner types the code and Enter into the focused field.
    await page.keyboard.type(`${DEMO_PART_SKUS.sprayer}\n`)
    await page.getByRole('region', { name: 'Scanned' }).getByText('Shelf A2-01').waitFor()
    await page.keyboard.type('NOPE-123\n')
    await page.getByRole('alert').getByText(/No bin, unit, order, offcut, part or return has the code "NOPE-123"/).waitFor()
  })

  it('keeps a code scanned while the page is still loading, before its scan field exists, and handles it once the field is there', async () => {
    // The Scan page's code is held back until the scan is typed (no service worker, so every request
    // goes through the test's route): the scanner is faster than a slow tablet on the shop's Wi-Fi.
    const context = await page.context().browser()!.newContext({ viewport: { width: 1024, height: 768 }, serviceWorkers: 'block' })
    try {
      const tablet = await context.newPage()
      const planner = DEMO_USERS.find((u) => u.role === 'planner')!
      await signIn(tablet, baseUrl, planner.email, planner.password)
      await tablet.getByRole('heading', { name: /Good day/ }).waitFor()
      let letGo!: () => void
      const held = new Promise<void>((resolve) => (letGo = resolve))
      let asked = false
      await tablet.route(/\/assets\/scan-[\w-]{8}\.js$/, async (route) => {
        asked = true
        await held
        await route.continue()
      })
      await tablet.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Scan', exact: true }).click()
      await tablet.keyboard.type(`${DEMO_PART_SKUS.sprayer}\n`)
      expect(await tablet.getByLabel('Bin, unit serial, order, offcut, part or return label').count()).toBe(0)
      expect(asked).toBe(true)
      letGo()
      await tablet.getByRole('region', { name: 'Scanned' }).getByText('Shelf A2-01').waitFor()
      expect(await tablet.getByLabel('Bin, unit serial, order, offcut, part or return label').inputValue()).toBe('')
    } finally {
      await context.close()
    }
  })
})
