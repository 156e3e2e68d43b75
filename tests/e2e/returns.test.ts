import { mkdirSync } from 'node:fs'
import path from 'node:path'
import type { Browser, Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { OrderDetailSchema } from '@kitwright/shared/orders'
import { createDb } from '../../server/src/db/client'
import { DEMO_USERS } from '../../server/src/seeds/demo'
import { launchChromium, signIn } from '../support/browser'
import { testDatabaseUrl } from '../support/env'
import { insertPackOrder } from '../support/pack-factories'

const baseUrl = inject('baseUrl')
const shots = path.resolve(import.meta.dirname, '../.artifacts')
let browser: Browser
let made: Awaited<ReturnType<typeof insertPackOrder>>
let refunded: Awaited<ReturnType<typeof insertPackOrder>>

function demo(role: string) {
  const u = DEMO_USERS.find((d) => d.role === role)
  if (!u) throw new Error(`no demo ${role}`)
  return u
}

beforeAll(async () => {
  mkdirSync(shots, { recursive: true })
  browser = await launchChromium()
  // A compact kit the customer has (shipped), as the pack bench leaves it.
  const { db, pool } = createDb(testDatabaseUrl('e2e'))
  try {
    made = await insertPackOrder(db, [{ kitSku: 'MW-TOTE-6C', status: 'shipped' }])
    refunded = await insertPackOrder(db, [{ kitSku: 'MW-TOTE-6C', status: 'shipped' }])
  } finally {
    await pool.end()
  }
})
afterAll(() => browser.close())

/** A tablet held upright (1024 × 1366 CSS px), as the pack bench and the office tablet are. */
async function tablet(role: string): Promise<Page> {
  const context = await browser.newContext({ viewport: { width: 1024, height: 1366 } })
  const page = await context.newPage()
  await signIn(page, baseUrl, demo(role).email, demo(role).password)
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Returns' }).click()
  await page.getByRole('heading', { name: 'Returns', level: 1 }).waitFor()
  return page
}

describe('returns in Chromium', () => {
  it('the office opens a return by scanning the serial, the packer receives it by scanning, the office sends it for repair', async () => {
    const unit = made.units[0]!.wo
    const planner = await tablet('planner')

    // A wedge scanner types into whatever has focus: the scan field has it without a tap.
    await planner.keyboard.type('U-NOSUCH')
    await planner.keyboard.press('Enter')
    await planner.getByRole('alert').getByText('No unit with serial "U-NOSUCH" and no order numbered "U-NOSUCH": check the label or the packing slip and scan again').waitFor()
    await planner.keyboard.type(unit.serial)
    await planner.keyboard.press('Enter')
    const item = planner.getByRole('list', { name: 'Units that can be returned' }).getByRole('listitem', { name: `Unit ${unit.serial}` })
    await item.waitFor()
    expect(await planner.getByRole('alert').count()).toBe(0)
    // Opening without a reason is refused with what to fix.
    await item.getByRole('button', { name: `Open return of ${unit.serial}` }).click()
    await item.getByRole('alert').getByText('Choose a reason').waitFor()
    await item.getByLabel('Reason').selectOption('Leaks')
    await item.getByLabel('Notes (what the customer says, what you see)').fill('Drips at the drain grommet after a day of running')
    await planner.screenshot({ path: path.join(shots, 'returns-open.png'), fullPage: true })
    await item.getByRole('button', { name: `Open return of ${unit.serial}` }).click()
    const heading = planner.getByRole('heading', { level: 1, name: /^Return R-\d+ · Waiting for the parcel$/ })
    await heading.waitFor()
    const number = /^Return (R-\d+)/.exec((await heading.textContent()) ?? '')![1]!
    const returnUrl = planner.url()
    // Not received yet: no decision to take.
    await planner.getByText('Decide once the parcel is back in the shop.').waitFor()
    await planner.screenshot({ path: path.join(shots, 'return-waiting.png'), fullPage: true })

    // The parcel comes in at the pack bench: the packer scans the serial on the unit.
    const packer = await tablet('packer')
    await packer.keyboard.type(unit.serial)
    await packer.keyboard.press('Enter')
    await packer.getByRole('status').getByText(`${number}: unit ${unit.serial} (MW-TOTE-6C) received back. Set it on the returns shelf for the office to decide.`).waitFor()
    // A second scan of the same parcel says so and changes nothing.
    await packer.keyboard.type(unit.serial)
    await packer.keyboard.press('Enter')
    await packer.getByRole('alert').getByText(new RegExp(`Return ${number} was already received on `)).waitFor()
    await packer.screenshot({ path: path.join(shots, 'returns-received.png'), fullPage: true })
    await packer.context().close()

    // Back at the office: decide repair, reopening one step.
    await planner.goto(returnUrl)
    await planner.getByRole('heading', { level: 1, name: `Return ${number} · Back in the shop` }).waitFor()
    const decision = planner.getByRole('form', { name: 'Decision' })
    await decision.getByRole('radio', { name: 'Repair' }).click()
    const firstStep = decision.getByRole('checkbox').first()
    await firstStep.check()
    await planner.screenshot({ path: path.join(shots, 'return-decide-repair.png'), fullPage: true })
    await decision.getByRole('button', { name: 'Decide: Repair' }).click()
    await planner.getByRole('heading', { level: 1, name: `Return ${number} · Sent for repair` }).waitFor()
    await planner.getByText('At the build bench: it needs a new leak test before it is ready again.').waitFor()
    await planner.getByText(/· Rework$/).waitFor()
    await planner.screenshot({ path: path.join(shots, 'return-repair.png'), fullPage: true })

    // The build record lists the return beside the build.
    await planner.getByRole('link', { name: unit.serial, exact: true }).click()
    const returnsOfUnit = planner.getByRole('list', { name: 'Returns of this unit' })
    await returnsOfUnit.getByRole('link', { name: number }).waitFor()
    await returnsOfUnit.getByText(/Sent for repair · Leaks/).first().waitFor()

    // The owner's view: returns per kit revision and reason on the home page.
    await planner.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Home' }).click()
    const perRevision = planner.getByRole('table', { name: 'Returns per kit revision and reason' })
    const row = perRevision.getByRole('row').filter({ hasText: 'MW-TOTE-6C rev A' }).filter({ hasText: 'Leaks' })
    await row.waitFor()
    expect(Number(await row.getByRole('cell').nth(2).textContent())).toBeGreaterThanOrEqual(1)
    await perRevision.screenshot({ path: path.join(shots, 'returns-per-revision.png') })
    await planner.context().close()
  })

  it('the packer scans a return on the Scan page and receives it there; after a refund the office scraps the unit once, with a reason', async () => {
    const unit = refunded.units[0]!.wo
    const planner = await tablet('planner')
    const opened = await planner.request.post(`${baseUrl}/api/returns`, { data: { serial: unit.serial, reason: 'Changed mind', notes: null } })
    expect(opened.status()).toBe(201)
    const { id, number } = (await opened.json()) as { id: string; number: string }

    // The parcel turns up: the packer scans its return number on the Scan page and lands on the return.
    const packer = await tablet('packer')
    await packer.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Scan', exact: true }).click()
    await packer.getByLabel('Bin, unit serial, order, offcut, part or return label').waitFor()
    await packer.keyboard.type(`${number}\n`)
    await packer.getByRole('heading', { level: 1, name: `Return ${number} · Waiting for the parcel` }).waitFor()
    await packer.getByRole('button', { name: 'Receive this parcel' }).click()
    await packer.getByRole('heading', { level: 1, name: `Return ${number} · Back in the shop` }).waitFor()
    await packer.getByText('Back in the shop: the office decides repair, replace or refund.').waitFor()
    await packer.screenshot({ path: path.join(shots, 'return-received-from-scan.png'), fullPage: true })
    await packer.context().close()

    // The office notes the refund, then records what becomes of the unit.
    await planner.goto(`${baseUrl}/returns/${id}`)
    const decision = planner.getByRole('form', { name: 'Decision' })
    await decision.getByRole('radio', { name: 'Refund noted' }).click()
    await decision.getByLabel('Amount refunded (USD)').fill('0')
    await decision.getByLabel('How the store refunded it').fill('Refunded in the store, ref 6120')
    await decision.getByRole('button', { name: 'Decide: Refund noted' }).click()
    await planner.getByRole('heading', { level: 1, name: `Return ${number} · Refund noted` }).waitFor()
    const unitForm = planner.getByRole('form', { name: 'The returned unit' })
    await unitForm.getByRole('radio', { name: 'Scrapped' }).click()
    await unitForm.getByRole('button', { name: 'Record: Scrapped' }).click()
    await unitForm.getByRole('alert').getByText(/^Say why the unit is scrapped/).waitFor()
    await unitForm.getByLabel('Why it is scrapped').fill('Tote split along the rim')
    // Typing a reason clears the refusal, which was about the empty field.
    await unitForm.getByRole('alert').waitFor({ state: 'detached' })
    await planner.screenshot({ path: path.join(shots, 'return-dispose.png'), fullPage: true })
    // A double tap records it once.
    await unitForm.getByRole('button', { name: 'Record: Scrapped' }).dblclick()
    await planner.getByText(/^Scrapped on .+: Tote split along the rim$/).waitFor()
    expect(await planner.getByRole('form', { name: 'The returned unit' }).count()).toBe(0)
    const order = await planner.request.get(`${baseUrl}/api/orders/${refunded.order.id}`)
    expect(order.status()).toBe(200)
    const timeline = OrderDetailSchema.parse(await order.json()).events
    expect(timeline.filter((e) => e.kind === 'return_unit_disposed').map((e) => e.message)).toEqual([`Return ${number}: unit ${unit.serial} scrapped: Tote split along the rim`])
    await planner.screenshot({ path: path.join(shots, 'return-scrapped.png'), fullPage: true })

    // The build record says what became of the unit.
    await planner.getByRole('link', { name: unit.serial, exact: true }).click()
    await planner.getByRole('list', { name: 'Returns of this unit' }).getByText(/^Scrapped .+: Tote split along the rim$/).waitFor()
    await planner.context().close()
  })

  it('the owner edits the shop\'s return reasons in settings', async () => {
    const context = await browser.newContext({ viewport: { width: 1024, height: 1366 } })
    const page = await context.newPage()
    await signIn(page, baseUrl, demo('admin').email, demo('admin').password)
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Settings' }).click()
    const form = page.getByRole('form', { name: 'Return reasons' })
    await form.getByRole('textbox', { name: 'Reason 4', exact: true }).waitFor()
    expect(await form.getByRole('textbox', { name: 'Reason 1', exact: true }).inputValue()).toBe('Leaks')
    // A reason typed twice (any case) is refused with what to fix; nothing is saved.
    await form.getByRole('button', { name: 'Add a reason' }).click()
    await form.getByRole('textbox', { name: 'Reason 5', exact: true }).fill('leaks')
    await form.getByRole('button', { name: 'Save reasons' }).click()
    await form.getByRole('alert').getByText('Each reason once').waitFor()
    await form.getByRole('textbox', { name: 'Reason 5', exact: true }).fill('Pump dead on arrival')
    await form.getByRole('button', { name: 'Move reason 5 up' }).click()
    await form.getByRole('button', { name: 'Save reasons' }).click()
    await form.getByRole('status').getByText('Reasons saved.').waitFor()
    await page.reload()
    await form.getByRole('textbox', { name: 'Reason 5', exact: true }).waitFor()
    expect(await form.getByRole('textbox', { name: 'Reason 4', exact: true }).inputValue()).toBe('Pump dead on arrival')
    expect(await form.getByRole('textbox', { name: 'Reason 5', exact: true }).inputValue()).toBe('Changed mind')
    await form.screenshot({ path: path.join(shots, 'return-reasons-settings.png') })
    await context.close()
  })
})
