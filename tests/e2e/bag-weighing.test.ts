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
const planner = DEMO_USERS.find((d) => d.role === 'planner')!

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

  it('a planner weighs a counted sample on Unit weights and sees the division and its rounding before keeping it', async () => {
    const context = await browser.newContext({ viewport: { width: 1366, height: 1024 } })
    const page = await context.newPage()
    await signIn(page, baseUrl, planner.email, planner.password)
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Unit weights' }).click()
    await page.getByRole('heading', { name: 'Unit weights' }).waitFor()
    const grommet = page.getByRole('listitem', { name: '3/4 in rubber grommet for drain' })
    await grommet.getByRole('button', { name: 'Weigh a sample' }).click()
    const form = grommet.getByRole('form', { name: 'Weigh a sample of 3/4 in rubber grommet for drain' })
    await form.getByLabel('Pieces on the scale').fill('0')
    await form.getByLabel('They weigh').fill('98.8 g')
    await form.getByRole('alert').getByText('Count at least 1 piece onto the scale').waitFor()
    // 98.8 g ÷ 20 = 4.94 g each, even; 101.3 g ÷ 20 = 5.065 g, kept as 5.07 g (half up, worked by hand).
    await form.getByLabel('Pieces on the scale').fill('20')
    await form.getByLabel('They weigh').fill('101.3 g')
    await form.getByLabel('Single pieces, weighed one by one').fill('5.01 g, 5.12 g, 5.05 g')
    await form.getByText('20 × 3/4 in rubber grommet for drain weigh 101.3 g → 5.065 g each, kept as 5.07 g').waitFor()
    await form.getByText('Spread: the farthest single piece is ±0.06 g from 5.07 g').waitFor()
    await page.screenshot({ path: path.join(shots, 'unit-weights-sample.png'), fullPage: true })
    await form.getByRole('button', { name: 'Keep this unit weight' }).click()
    await grommet.getByText(/^5\.07 g each \(0\.18 oz\) · spread ±0\.06 g from 3 single pieces/).waitFor()
    await grommet.getByText(new RegExp(`weighed by ${planner.name}`)).waitFor()
    await context.close()
  })
})
