import type { Page } from 'playwright-core'
import { beforeEach, describe, inject, it } from 'vitest'
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
})
