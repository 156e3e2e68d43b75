import { mkdirSync } from 'node:fs'
import path from 'node:path'
import { eq } from 'drizzle-orm'
import { beforeAll, describe, expect, inject, it } from 'vitest'
import { createDb } from '../../server/src/db/client'
import { orderLines, orders } from '../../server/src/db/schema/index'
import { DEMO_USERS } from '../../server/src/seeds/demo'
import { browserPerTest, signIn } from '../support/browser'
import { testDatabaseUrl } from '../support/env'
import { insertPackOrder } from '../support/pack-factories'

const baseUrl = inject('baseUrl')
const shots = path.resolve(import.meta.dirname, '../.artifacts')
// A tablet standing at the pack bench.
const b = browserPerTest({ width: 1024, height: 1366 })
let made: Awaited<ReturnType<typeof insertPackOrder>>

beforeAll(async () => {
  mkdirSync(shots, { recursive: true })
  // Two spare packs to Vancouver at $45.00 each: the bench proposes one parcel for both (they have no carton of their own).
  const { db, pool } = createDb(testDatabaseUrl('e2e'))
  try {
    made = await insertPackOrder(db, [{ kitSku: 'MW-SPARE-SPR6' }, { kitSku: 'MW-SPARE-CUP12' }])
    await db.update(orders).set({ shipCity: 'Vancouver', shipRegion: 'BC', shipPostalCode: 'V6B 1A1', shipCountry: 'CA' }).where(eq(orders.id, made.order.id))
    await db.update(orderLines).set({ unitPriceCents: 4500 }).where(eq(orderLines.orderId, made.order.id))
  } finally {
    await pool.end()
  }
})

describe('parcels at the pack bench in Chromium', () => {
  it('a packer puts each pack in its own parcel, buys the label, and finds the customs declaration beside it', async () => {
    const page = b.page
    const packer = DEMO_USERS.find((u) => u.role === 'packer')!
    const [spr, cup] = made.units
    await signIn(page, baseUrl, packer.email, packer.password)
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Pack bench' }).click()
    await page.getByRole('heading', { name: 'Pack bench' }).waitFor()
    await page.keyboard.type(spr!.wo.serial)
    await page.keyboard.press('Enter')
    await page.getByRole('heading', { name: `Order ${made.order.number}` }).waitFor()
    const list = page.getByRole('list', { name: 'Packing list' })
    // The scan that opened the order also puts the scanned pack in the box (a second request, a moment later); the other is ticked by hand.
    await list.getByRole('listitem', { name: `Pack ${spr!.wo.serial}` }).getByText(/^Scanned /).waitFor()
    const cupRow = list.getByRole('listitem', { name: `Pack ${cup!.wo.serial}` })
    await cupRow.getByRole('button', { name: 'In the box' }).click()
    await cupRow.getByText(/^Ticked by/).waitFor()

    // The proposal, said on screen: both packs in parcel 1; the packer gives the cup pack a parcel of its own.
    await page.getByText(/^Proposed: one parcel per unit that has its own carton/).waitFor()
    const first = page.getByRole('group', { name: `Parcel 1: ${spr!.wo.serial}, ${cup!.wo.serial}` })
    await first.getByRole('listitem').filter({ hasText: cup!.wo.serial }).getByRole('button', { name: 'Own parcel' }).click()
    await page.getByRole('group', { name: `Parcel 1: ${spr!.wo.serial}` }).waitFor()
    const second = page.getByRole('group', { name: `Parcel 2: ${cup!.wo.serial}` })
    await second.getByText(/weighed again when you get prices/).waitFor()
    const move = second.getByRole('button', { name: 'Move to parcel 1' })
    expect((await move.boundingBox())!.height).toBeGreaterThanOrEqual(48)
    await page.screenshot({ path: path.join(shots, 'pack-parcels-moved.png'), fullPage: true })

    await page.getByRole('button', { name: 'Get prices' }).click()
    await page.getByRole('button', { name: /^Buy .+ label · \$\d+\.\d\d/ }).first().click()
    await page.getByText(/^Label bought:/).waitFor()
    const parcelsList = page.getByText(/^Parcel [12] \(/)
    await parcelsList.nth(1).waitFor()
    expect(await parcelsList.count()).toBe(2)

    // Each parcel is worth $45.00, well under 300 SDR: a CN 22 each, listed beside the label.
    const customs = page.getByRole('link', { name: 'Customs declaration CN 22 (4 × 6 in, print with the label)' })
    await customs.waitFor()
    await page.screenshot({ path: path.join(shots, 'pack-parcels-labelled.png'), fullPage: true })
    const res = await page.request.get(`${baseUrl}${await customs.getAttribute('href')}`)
    expect(res.status()).toBe(200)
    expect(res.headers()['content-type']).toBe('application/pdf')
    expect((await res.body()).subarray(0, 5).toString()).toBe('%PDF-')
  })
})
