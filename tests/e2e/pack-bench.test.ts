import { mkdirSync } from 'node:fs'
import path from 'node:path'
import type { Browser, Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { MailMessageSchema, MailPageSchema } from '@kitwright/shared/mail'
import { createDb } from '../../server/src/db/client'
import { DEMO_USERS } from '../../server/src/seeds/demo'
import { launchChromium, signIn } from '../support/browser'
import { testDatabaseUrl } from '../support/env'
import { insertPackOrder } from '../support/pack-factories'
import { waitFor } from '../support/store-webhook'

const baseUrl = inject('baseUrl')
const shots = path.resolve(import.meta.dirname, '../.artifacts')
let browser: Browser
let made: Awaited<ReturnType<typeof insertPackOrder>>

function demo(role: string) {
  const u = DEMO_USERS.find((d) => d.role === role)
  if (!u) throw new Error(`no demo ${role}`)
  return u
}

beforeAll(async () => {
  mkdirSync(shots, { recursive: true })
  browser = await launchChromium()
  // A compact kit that passed its leak test, in its bin, and a spare sprayer pack, as the build bench leaves them.
  const { db, pool } = createDb(testDatabaseUrl('e2e'))
  try {
    made = await insertPackOrder(db, [{ kitSku: 'MW-TOTE-6C' }, { kitSku: 'MW-SPARE-SPR6' }])
  } finally {
    await pool.end()
  }
})
afterAll(() => browser.close())

async function newPage(width: number, height: number): Promise<Page> {
  const context = await browser.newContext({ viewport: { width, height } })
  return context.newPage()
}

describe('the pack bench in Chromium', () => {
  it('a packer scans a built unit’s bin, confirms every item, prints both papers, buys the label and ships; the e-mail goes out', async () => {
    const [unit, pack] = made.units
    const page = await newPage(1024, 1366)
    await signIn(page, baseUrl, demo('packer').email, demo('packer').password)
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Pack bench' }).click()
    await page.getByRole('heading', { name: 'Pack bench' }).waitFor()

    // A wedge scanner types into whatever has focus: the scan field must have it without a tap.
    await page.keyboard.type(unit!.binCode!)
    await page.keyboard.press('Enter')
    await page.getByRole('heading', { name: `Order ${made.order.number}` }).waitFor()
    const list = page.getByRole('list', { name: 'Packing list' })
    await list.getByRole('listitem', { name: `Unit ${unit!.wo.serial}` }).getByText(`Scanned ${unit!.binCode}`).waitFor()

    // A bin of no order: the bench says what is wrong, in words, and records nothing.
    await page.keyboard.type('NO-SUCH-BIN')
    await page.keyboard.press('Enter')
    await page.getByRole('alert').getByText('No bin or serial "NO-SUCH-BIN": check the label and scan again').waitFor()

    // The hardware bag and the spare pack: one tap each.
    await list.getByRole('listitem', { name: `Bag ${unit!.wo.serial} bag` }).getByRole('button', { name: 'In the box' }).click()
    await list.getByRole('listitem', { name: `Bag ${unit!.wo.serial} bag` }).getByText(/^Ticked by/).waitFor()
    expect(await page.getByRole('alert').count()).toBe(0) // the problem is cleared once an action goes through
    await list.getByRole('listitem', { name: `Pack ${pack!.wo.serial}` }).getByRole('button', { name: 'In the box' }).click()
    await list.getByRole('listitem', { name: `Pack ${pack!.wo.serial}` }).getByText(/^Ticked by/).waitFor()
    // Every bench button is a big target (48 px or more), Sign out included.
    const measured: string[] = []
    for (const button of await page.getByRole('button').all()) {
      if (!(await button.isVisible())) continue
      const box = await button.boundingBox()
      const name = (await button.textContent())?.trim() ?? ''
      expect(box, name).not.toBeNull()
      expect(box!.height, `${name}: ${box!.height} px tall`).toBeGreaterThanOrEqual(48)
      measured.push(name)
    }
    expect(measured).toEqual(expect.arrayContaining(['Sign out', 'Undo', 'Get prices']))
    await page.screenshot({ path: path.join(shots, 'pack-bench-confirmed.png'), fullPage: true })

    // Print the packing slip, Letter and A4.
    for (const name of ['Packing slip (Letter)', 'Packing slip (A4)']) {
      const href = await page.getByRole('link', { name }).getAttribute('href')
      const res = await page.request.get(`${baseUrl}${href}`)
      expect(res.status()).toBe(200)
      expect(res.headers()['content-type']).toBe('application/pdf')
      expect((await res.body()).subarray(0, 5).toString()).toBe('%PDF-')
    }

    // The parcel: price it, buy the label, print it.
    await page.getByRole('group', { name: `Parcel 1: ${unit!.wo.serial}, ${pack!.wo.serial}` }).getByLabel(/Scale reading/).fill('16.5')
    await page.getByRole('button', { name: 'Get prices' }).click()
    await page.getByRole('button', { name: /^Buy Ground label · \$\d+\.\d\d · 5 days$/ }).click()
    const tracking = (await page.getByText(/^Label bought:/).textContent())!.match(/BP\d+/)![0]
    const labelHref = await page.getByRole('link', { name: 'Shipping label (4 × 6 in)' }).getAttribute('href')
    const label = await page.request.get(`${baseUrl}${labelHref}`)
    expect(label.headers()['content-type']).toBe('application/pdf')
    await page.screenshot({ path: path.join(shots, 'pack-bench-labelled.png'), fullPage: true })

    await page.getByRole('button', { name: `Ship order ${made.order.number}` }).click()
    await page.getByRole('status').getByText(`Order ${made.order.number} shipped · tracking ${tracking}`).waitFor()
    await page.getByText(/The shipped e-mail is queued to/).waitFor()
    await page.screenshot({ path: path.join(shots, 'pack-bench-shipped.png'), fullPage: true })

    // The outbox (office roles): the shipped e-mail, sent once, with the tracking number and the build record link.
    const office = await newPage(1280, 900)
    await signIn(office, baseUrl, demo('planner').email, demo('planner').password)
    await office.getByRole('heading', { name: /Good day/ }).waitFor()
    const mail = await waitFor(
      'the shipped e-mail to be sent',
      async () => {
        const res = await office.request.get(`${baseUrl}/api/mail?pageSize=50`)
        const found = MailPageSchema.parse(await res.json()).items.filter((m) => m.order?.number === made.order.number && m.purpose.startsWith('shipped:'))
        expect(found.length).toBeLessThanOrEqual(1)
        return found[0]?.status === 'sent' ? found[0] : undefined
      },
      20_000,
    )
    const full = MailMessageSchema.parse(await (await office.request.get(`${baseUrl}/api/mail/${mail.id}`)).json())
    expect(full.subject).toBe(`Mistwell Tote Works: your order ${made.order.number} has shipped`)
    expect(full.text).toContain(`Tracking number: ${tracking}`)
    expect(full.text).toMatch(/Build record \(steps, photos, leak test\): http:\/\/\S+\/record\/\S+/)
  })
  it('after shipping, a planner finds the shipment from the order page and voids a mistaken label with a reason; a packer cannot', async () => {
    // Follows the test above, which shipped the order.
    const packer = await newPage(1024, 1366)
    await signIn(packer, baseUrl, demo('packer').email, demo('packer').password)
    await packer.getByRole('heading', { name: 'Pack bench' }).waitFor()
    await packer.goto(`${baseUrl}/bench/pack?order=${made.order.id}`)
    const seenByPacker = packer.getByLabel('Shipped')
    await seenByPacker.getByText(/^Shipped .*tracking/).waitFor()
    await seenByPacker.getByText('A mistaken label on a shipped parcel is voided by a planner or the owner.').waitFor()
    expect(await seenByPacker.getByRole('button', { name: 'Void label…' }).count()).toBe(0)

    const office = await newPage(1280, 900)
    await signIn(office, baseUrl, demo('planner').email, demo('planner').password)
    await office.getByRole('heading', { name: /Good day/ }).waitFor()
    await office.goto(`${baseUrl}/orders/${made.order.id}`)
    await office.getByRole('heading', { name: `Order ${made.order.number}` }).waitFor()
    await office.getByRole('link', { name: 'Shipment: papers, label and tracking' }).click()
    const shipped = office.getByLabel('Shipped')
    const tracking = (await shipped.getByText(/^Shipped .*tracking/).textContent())!.match(/BP\d+/)![0]
    await shipped.getByRole('button', { name: 'Void label…' }).click()
    await office.getByLabel(/because…$/).fill('Printed for the wrong parcel size')
    await office.getByRole('form', { name: 'Void the label' }).getByRole('button', { name: 'Void label' }).click()
    await shipped.getByText(new RegExp(`^Voided ${tracking} .*: Printed for the wrong parcel size`)).waitFor()
    await office.screenshot({ path: path.join(shots, 'pack-bench-voided-after-shipping.png'), fullPage: true })
  })
})
