import { mkdirSync } from 'node:fs'
import path from 'node:path'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { createDb } from '../../server/src/db/client'
import { DEMO_USERS } from '../../server/src/seeds/demo'
import { launchChromium, signIn } from '../support/browser'
import { testDatabaseUrl } from '../support/env'
import { insertPackOrder } from '../support/pack-factories'
import type { Browser } from 'playwright-core'

const baseUrl = inject('baseUrl')
const shots = path.resolve(import.meta.dirname, '../.artifacts')
let browser: Browser
let made: Awaited<ReturnType<typeof insertPackOrder>>

const packer = DEMO_USERS.find((d) => d.role === 'packer')!

beforeAll(async () => {
  mkdirSync(shots, { recursive: true })
  browser = await launchChromium()
  // A compact kit that passed its leak test, in its bin: its hardware bag holds 6 net cups and 6 collars.
  const { db, pool } = createDb(testDatabaseUrl('e2e'))
  try {
    made = await insertPackOrder(db, [{ kitSku: 'MW-TOTE-6C' }])
  } finally {
    await pool.end()
  }
})
afterAll(() => browser.close())

describe('weighing a hardware bag at the pack bench (Chromium, tablet)', () => {
  it('refuses a bag one collar short and names the collar; accepts it once the collar is in, and the bag is confirmed', async () => {
    const [unit] = made.units
    const context = await browser.newContext({ viewport: { width: 1024, height: 1366 } })
    const page = await context.newPage()
    await signIn(page, baseUrl, packer.email, packer.password)
    await page.getByRole('heading', { name: 'Pack bench' }).waitFor()
    await page.keyboard.type(unit!.binCode!)
    await page.keyboard.press('Enter')
    await page.getByRole('heading', { name: `Order ${made.order.number}` }).waitFor()

    const bag = page.getByLabel(`Weigh Bag ${unit!.wo.serial}`)
    // The demo's unit weights (server/src/seeds/unit-weights.ts), worked by hand: 6 × 6.10 + 6 × 4.25 + 3.20 = 65.30 g;
    // spread 6 × 0.07 + 6 × 0.05 + 0.10 = 0.82 g; half a collar 2.125 g; 65.30 g ÷ 28.349 523 125 g/oz = 2.30 oz.
    await bag.getByText('Should weigh 65.30 g (2.30 oz) ± 2.13 g').waitFor()
    await bag.getByRole('list', { name: `Why Bag ${unit!.wo.serial} should weigh this` }).getByText(/^Floor: half the lightest part, 2 in foam collar 4\.25 g ÷ 2 = ±2\.13 g$/).waitFor()

    // A number with no unit: the bench says what to fix before anything is sent.
    const input = bag.getByLabel(`Weight of Bag ${unit!.wo.serial} on the scale`)
    await input.fill('61.1')
    await bag.getByRole('button', { name: 'Weigh bag' }).click()
    await bag.getByRole('alert').getByText(/Give the weight's unit: g, kg, lb or oz/).waitFor()

    // One collar short: 65.30 − 4.25 = 61.05 g; the scale shows 61.1 g.
    await input.fill('61.1 g')
    await bag.getByRole('button', { name: 'Weigh bag' }).click()
    await bag.getByRole('alert').getByText(/^Refused: 61\.10 g is −4\.20 g from 65\.30 g, outside ±2\.13 g\. Likely 1 × 2 in foam collar missing/).waitFor()
    const list = page.getByRole('list', { name: 'Packing list' })
    const bagItem = list.getByRole('listitem', { name: `Bag ${unit!.wo.serial} bag` })
    await bagItem.getByRole('button', { name: 'In the box' }).waitFor()
    await page.screenshot({ path: path.join(shots, 'bag-weighing-refused.png'), fullPage: true })

    // The collar goes in: 65.4 g passes, the bag is confirmed on the packing list, its label can be printed.
    await input.fill('65.4 g')
    await bag.getByRole('button', { name: 'Weigh bag' }).click()
    await bag.getByRole('status').getByText('Accepted: 65.40 g is +0.10 g from 65.30 g, within ±2.13 g').waitFor()
    await bagItem.getByText(/^Ticked by/).waitFor()
    expect(await bag.getByRole('link', { name: 'Print bag label (2 × 1 in)' }).count()).toBe(1)
    const href = await bag.getByRole('link', { name: 'Print bag label (2 × 1 in)' }).getAttribute('href')
    const label = await page.request.get(`${baseUrl}${href}`)
    expect(label.status()).toBe(200)
    expect(label.headers()['content-type']).toBe('application/pdf')
    // Every button of the weighing panel is a big target (48 px or more) for gloved hands.
    for (const button of await bag.getByRole('button').all()) {
      const box = await button.boundingBox()
      expect(box!.height).toBeGreaterThanOrEqual(48)
    }
    await page.screenshot({ path: path.join(shots, 'bag-weighing-accepted.png'), fullPage: true })
    await context.close()
  })
})
