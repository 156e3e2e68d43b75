// A day at the benches on a shop tablet in portrait (820 × 1180): quick scans that all land,
// worklists in order, build checks that hold, and the name + PIN sign-in at a bench tablet.
import path from 'node:path'
import { and, asc, desc, eq, sql } from 'drizzle-orm'
import type { Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { createDb } from '../../server/src/db/client'
import { auditEvents, buildSteps, cutParts, cutRunCuts, cutRuns, cutRunSticks, orders, parts, users, workOrders } from '../../server/src/db/schema/index'
import { DEMO_USERS } from '../../server/src/seeds/demo'
import { browserPerTest, signIn } from '../support/browser'
import { insertBin, insertBuildWorkOrder } from '../support/build-factories'
import { insertWorkOrders, revisionOf } from '../support/cut-run-factories'
import { testDatabaseUrl } from '../support/env'

const baseUrl = inject('baseUrl')
const shots = path.resolve(import.meta.dirname, '../.artifacts')
const tablet = browserPerTest({ width: 820, height: 1180 })
let conn: ReturnType<typeof createDb>

function demo(role: string) {
  const u = DEMO_USERS.find((d) => d.role === role)
  if (!u) throw new Error(`no demo ${role}`)
  return u
}

beforeAll(() => {
  conn = createDb(testDatabaseUrl('e2e'))
})
afterAll(() => conn.pool.end())

/** The scan field has the focus by itself; the wedge scanner just types. */
async function scanFieldFocused(page: Page) {
  await page.waitForFunction(() => document.activeElement?.getAttribute('placeholder') === 'Scan or type a code, then Enter')
}

/** A published cut run of two units of the compact demo kit, one stick, nothing cut yet. */
async function publishedRun() {
  const wos = await insertWorkOrders(conn.db, { kitSku: 'MW-TOTE-6C', count: 2 })
  const rev = await revisionOf(conn.db, 'MW-TOTE-6C')
  const [part] = await conn.db.select().from(cutParts).where(eq(cutParts.revisionId, rev.id)).orderBy(asc(cutParts.position)).limit(1)
  const [pipe] = await conn.db.select().from(parts).where(eq(parts.id, part!.partId))
  const stickLength = pipe!.stickLengths![0]!
  const [run] = await conn.db
    .insert(cutRuns)
    .values({ number: sql`'CR-E' || nextval('cut_run_number_seq')`, status: 'published', kerf: 0, endTrim: 0, minOffcut: 0, planStatus: 'optimal', publishedAt: new Date() })
    .returning()
  const [stick] = await conn.db
    .insert(cutRunSticks)
    .values({ cutRunId: run!.id, partId: pipe!.id, stickLength, length: stickLength, patternIndex: 0, position: 1, remnant: stickLength - 2 * part!.length, remnantIsOffcut: false })
    .returning()
  await conn.db.insert(cutRunCuts).values(wos.map((wo, i) => ({
    cutRunId: run!.id,
    stickId: stick!.id,
    position: i + 1,
    offset: i * part!.length,
    length: part!.length,
    workOrderId: wo.id,
    cutPartId: part!.id,
  })))
  return { run: run!, wos }
}

/** A unit of the demo 12-site kit, revision A, cut and in a bin, for an order that is rush or not and promised `promised`. */
async function unitInABin(rush = false, promised: string | null = null) {
  const rev = await revisionOf(conn.db, 'MW-TOTE-12')
  const wo = await insertBuildWorkOrder(conn.db, rev.id, rev.kitId, 'cut')
  await conn.db.update(orders).set({ priority: rush ? 'rush' : 'normal', promisedShipDate: promised }).where(eq(orders.id, wo.orderId))
  const bin = await insertBin(conn.db, wo.id)
  const steps = await conn.db.select().from(buildSteps).where(eq(buildSteps.revisionId, rev.id)).orderBy(asc(buildSteps.position))
  return { wo, bin, steps }
}

/** A length in inches as the shop writes it, in sixteenths: 17 3/16. */
function sixteenths(value: number): string {
  const whole = Math.floor(value)
  const n = Math.round((value - whole) * 16)
  return n === 0 ? String(whole) : `${whole} ${n}/16`
}

describe('the benches on a tablet', () => {
  it('cut bench: two bins scanned in quick succession both land, each on its own unit', async () => {
    const page = tablet.page
    const { run, wos } = await publishedRun()
    const binA = await insertBin(conn.db, null)
    const binB = await insertBin(conn.db, null)
    await signIn(page, baseUrl, demo('cutter').email, demo('cutter').password)
    await page.getByRole('heading', { name: 'Cut bench' }).waitFor()
    await page.goto(`${baseUrl}/bench/cut?run=${run.id}`)
    await page.getByText(`Run ${run.number}`).waitFor()
    await scanFieldFocused(page)
    // The wedge scanner types both codes and Enter without waiting for the first answer.
    await page.keyboard.type(binA.code)
    await page.keyboard.press('Enter')
    await page.keyboard.type(binB.code)
    await page.keyboard.press('Enter')
    const cards = page.getByRole('region', { name: 'Bins' }).getByRole('listitem')
    await cards.filter({ hasText: `WO ${wos[0]!.serial} ` }).getByText(binA.code, { exact: true }).waitFor()
    await cards.filter({ hasText: `WO ${wos[1]!.serial} ` }).getByText(binB.code, { exact: true }).waitFor()
    // And the field still has the focus for the next scan.
    await scanFieldFocused(page)
    await page.getByText('Every unit of this run has its bin').waitFor()
    await page.screenshot({ path: path.join(shots, 'tablet-cut-bench.png'), fullPage: true })
  })

  it('build bench: the worklist puts rush first, then the promised date', async () => {
    const page = tablet.page
    const late = await unitInABin(false, '2020-01-02')
    const rush = await unitInABin(true, '2099-12-30')
    const soon = await unitInABin(false, '2099-01-05')
    await signIn(page, baseUrl, demo('assembler').email, demo('assembler').password)
    const list = page.getByRole('region', { name: 'Ready to build' })
    await list.getByRole('button', { name: `Unit ${soon.wo.serial}` }).waitFor()
    const names = (await list.getByRole('button').evaluateAll((els) => els.map((e) => e.getAttribute('aria-label')))) as string[]
    const order = [rush, late, soon].map((u) => names.indexOf(`Unit ${u.wo.serial}`))
    expect(order.every((i) => i >= 0)).toBe(true)
    expect(order).toEqual([...order].sort((a, b) => a - b))
    expect(await list.getByRole('button', { name: `Unit ${rush.wo.serial}` }).getByText('RUSH').isVisible()).toBe(true)
    expect(await list.getByRole('button', { name: `Unit ${late.wo.serial}` }).getByText('LATE').isVisible()).toBe(true)
    // Rows are big enough for a gloved finger.
    const box = await list.getByRole('button', { name: `Unit ${late.wo.serial}` }).boundingBox()
    expect(box!.height).toBeGreaterThanOrEqual(48)
    await page.screenshot({ path: path.join(shots, 'tablet-build-worklist.png'), fullPage: true })
    // Picking from the list opens the unit, as a scan would.
    await list.getByRole('button', { name: `Unit ${late.wo.serial}` }).click()
    await page.getByRole('heading', { name: `Unit ${late.wo.serial}` }).waitFor()
  })

  it('build bench: fractions are accepted, out of limits needs a reason, and the leak test waits for every step', async () => {
    const page = tablet.page
    const { wo, bin, steps } = await unitInABin()
    const measure = steps[0]!
    const min = Number(measure.measurementMin)
    const max = Number(measure.measurementMax)
    await signIn(page, baseUrl, demo('assembler').email, demo('assembler').password)
    await page.getByRole('heading', { name: 'Build bench' }).waitFor()
    await scanFieldFocused(page)
    await page.keyboard.type(bin.code)
    await page.keyboard.press('Enter')
    await page.getByRole('heading', { name: `Unit ${wo.serial}` }).waitFor()

    // The leak test is refused before the steps: said beside the form, and the button does not go.
    const leak = page.getByRole('form', { name: 'Leak test' })
    await leak.getByText(/The leak test comes after every build step: tick steps 1, 2, .* first/).waitFor()
    expect(await leak.getByRole('button', { name: 'Record leak test' }).isDisabled()).toBe(true)
    // Steps go in order.
    const step2 = page.getByRole('listitem', { name: 'Step 2', exact: true })
    expect(await step2.getByText('Do step 1 first').isVisible()).toBe(true)
    expect(await step2.getByRole('button', { name: 'Tick step 2' }).isDisabled()).toBe(true)

    // Out of limits, typed as a fraction: refused until a reason is given.
    const step1 = page.getByRole('listitem', { name: 'Step 1', exact: true })
    const outside = sixteenths(max + 0.5)
    await step1.getByLabel(/^Measurement for step 1/).fill(outside)
    await step1.getByRole('button', { name: 'Tick step 1' }).click()
    await step1.getByRole('alert').getByText(/is outside the limits .* measure again, or say why it is recorded/).waitFor()
    expect(await conn.db.select().from(workOrders).where(and(eq(workOrders.id, wo.id), eq(workOrders.status, 'cut')))).toHaveLength(1)
    await step1.getByLabel('Reason for step 1').fill('Tote from the new supplier runs wide')
    await step1.getByRole('button', { name: 'Tick step 1' }).click()
    await step1.getByText(/Out of limits .*: Tote from the new supplier runs wide/).waitFor()
    // This revision sends a wrong tote to rework.
    await page.getByRole('status').filter({ hasText: 'Rework' }).waitFor()
    await page.screenshot({ path: path.join(shots, 'tablet-build-out-of-limits.png'), fullPage: true })

    // Undo, measure again in a fraction inside the limits: accepted as typed.
    await step1.getByRole('button', { name: 'Undo step 1' }).click()
    const inside = sixteenths((min + max) / 2)
    await step1.getByLabel(/^Measurement for step 1/).fill(inside)
    await step1.getByRole('button', { name: 'Tick step 1' }).click()
    await step1.getByText(`measured ${(min + max) / 2} in`).waitFor()
    await page.getByRole('status').filter({ hasText: 'Building' }).waitFor()
    expect(await step2.getByRole('button', { name: 'Tick step 2' }).isDisabled()).toBe(false)
  })

  it('pack bench tablet: the person picks their name and types the PIN, and the audit records the pack bench', async () => {
    const page = tablet.page
    const packer = demo('packer')
    await page.goto(`${baseUrl}/sign-in`)
    // The owner made this tablet the pack bench once; the browser remembers it.
    await page.evaluate(() => window.localStorage.setItem('kitwright.bench', 'pack'))
    await page.reload()
    expect(await page.getByRole('tab', { name: 'Bench PIN' }).getAttribute('aria-selected')).toBe('true')
    await page.getByText('Who is at the pack bench?').waitFor()
    expect(await page.getByLabel('E-mail').count()).toBe(0)
    await page.screenshot({ path: path.join(shots, 'tablet-sign-in-names.png'), fullPage: true })
    const names = page.getByRole('group', { name: 'Your name' })
    expect(await names.getByRole('button', { name: demo('cutter').name }).count()).toBe(0)
    await names.getByRole('button', { name: packer.name, exact: true }).click()
    await page.getByLabel('Bench PIN').fill(packer.pin!)
    await page.getByRole('button', { name: 'Sign in at the bench' }).click()
    await page.getByRole('heading', { name: 'Pack bench' }).waitFor()
    expect(await page.getByRole('button', { name: 'This tablet is the pack bench' }).getAttribute('aria-pressed')).toBe('true')
    await page.getByRole('region', { name: 'Ready to pack' }).waitFor()
    await page.screenshot({ path: path.join(shots, 'tablet-pack-bench.png'), fullPage: true })
    const [user] = await conn.db.select().from(users).where(eq(users.email, packer.email))
    const [event] = await conn.db
      .select()
      .from(auditEvents)
      .where(and(eq(auditEvents.action, 'auth.sign_in'), eq(auditEvents.actorId, user!.id)))
      .orderBy(desc(auditEvents.at))
      .limit(1)
    expect(event).toMatchObject({ bench: 'pack', summary: `${packer.name} signed in with a bench PIN` })
  })
})
