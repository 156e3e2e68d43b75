import { randomBytes } from 'node:crypto'
import { mkdirSync } from 'node:fs'
import path from 'node:path'
import { describe, expect, inject, it } from 'vitest'
import { PartsPageSchema } from '@kitwright/shared/parts'
import { DEMO_USERS } from '../../server/src/seeds/demo'
import { browserPerTest, signIn } from '../support/browser'

const baseUrl = inject('baseUrl')
const shots = path.resolve(import.meta.dirname, '../.artifacts')
const b = browserPerTest({ width: 1280, height: 1000 })

describe('customs facts on the part form, in Chromium', () => {
  it('refuses a short HS code and origin ZZ with what to fix, then saves 8413.70 and CN', async () => {
    mkdirSync(shots, { recursive: true })
    const page = b.page
    const sku = `PMP-E2E-${randomBytes(3).toString('hex').toUpperCase()}`
    const planner = DEMO_USERS.find((d) => d.role === 'planner')!
    await signIn(page, baseUrl, planner.email, planner.password)
    await page.waitForURL((url) => url.pathname === '/')
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Parts' }).click()
    await page.getByRole('link', { name: 'New part' }).click()
    const form = page.getByRole('form', { name: 'Part' })
    await form.getByLabel('SKU').fill(sku)
    await form.getByLabel('Name').fill('Test pump')
    await form.getByLabel('Unit cost ($)').fill('24.50')
    await form.getByLabel('Weight of one unit (g)').fill('1200')
    await form.getByLabel('HS code').fill('8413.7')
    await form.getByLabel('Country of origin').fill('ZZ')
    await form.getByRole('button', { name: 'Add part' }).click()
    await form.getByText('Write the HS code as 6 to 10 digits, e.g. 8413.70').waitFor()
    await form.getByText('"ZZ" is not an ISO 3166-1 country code').waitFor()
    await page.screenshot({ path: path.join(shots, 'part-customs-refused.png'), fullPage: true })
    expect(PartsPageSchema.parse(await (await page.request.get(`${baseUrl}/api/parts?q=${sku}`)).json()).items).toEqual([])

    await form.getByLabel('HS code').fill('8413.70')
    await form.getByLabel('Country of origin').fill('cn')
    await form.getByLabel('Customs description').fill('Submersible electric water pump')
    await form.getByRole('button', { name: 'Add part' }).click()
    await page.waitForURL((url) => url.pathname === '/catalog/parts')
    const [part] = PartsPageSchema.parse(await (await page.request.get(`${baseUrl}/api/parts?q=${sku}`)).json()).items
    expect(part).toMatchObject({ sku, hsCode: '841370', originCountry: 'CN', customsDescription: 'Submersible electric water pump' })
  })
})
