import { and, eq, inArray, isNotNull, isNull } from 'drizzle-orm'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { PNG } from 'pngjs'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { CutRunDetailSchema, type CutRunDetail } from '@kitwright/shared/cut-runs'
import { createDb } from '../../server/src/db/client'
import { auditEvents, buildSteps, buildStepTicks, cutRunCuts, kitRevisions, kits, packChecks, unitPhotos, workOrders } from '../../server/src/db/schema/index'
import { DEMO_USERS } from '../../server/src/seeds/demo'
import { launchChromium, signIn } from '../support/browser'
import { insertBin, insertBuildWorkOrder } from '../support/build-factories'
import { insertWorkOrders } from '../support/cut-run-factories'
import { insertPackOrder } from '../support/pack-factories'
import { testDatabaseUrl } from '../support/env'

/**
 * A shop's Wi-Fi is weakest at the saw and the sink: the benches keep working with the network cut
 * (`context.setOffline(true)`), and what was tapped lands once when it is back.
 */
const baseUrl = inject('baseUrl')
let browser: Browser
let conn: ReturnType<typeof createDb>
const contexts: BrowserContext[] = []

function demo(role: string) {
  const u = DEMO_USERS.find((d) => d.role === role)
  if (!u) throw new Error(`no demo ${role}`)
  return u
}

beforeAll(async () => {
  browser = await launchChromium()
  conn = createDb(testDatabaseUrl('e2e'))
})
afterAll(async () => {
  for (const c of contexts) await c.close()
  await browser.close()
  await conn.pool.end()
})

/** A tablet: its own browser context (cookies, service worker, IndexedDB), signed in as `role`. */
async function tablet(role: string): Promise<{ context: BrowserContext; page: Page }> {
  const context = await browser.newContext({ viewport: { width: 1180, height: 820 } })
  contexts.push(context)
  const page = await context.newPage()
  await signIn(page, baseUrl, demo(role).email, demo(role).password)
  await page.getByRole('navigation', { name: 'Main' }).waitFor()
  return { context, page }
}

/**
 * Opens `path` with the app's service worker in control, then loads it once more, so the bench's
 * reads go through the worker and are kept for a reload without the network.
 */
async function openForOffline(page: Page, path: string, ready: () => Promise<unknown>) {
  await page.goto(`${baseUrl}${path}`)
  await page.waitForFunction(() => navigator.serviceWorker.controller !== null, undefined, { timeout: 15_000 })
  await page.reload()
  await ready()
}

const banner = (page: Page) => page.getByRole('status', { name: 'Network' })

/** Pictures of the benches offline, for someone who wants to look at them (OFFLINE_BENCH_SHOTS=<folder>). */
async function shot(page: Page, name: string) {
  const folder = process.env.OFFLINE_BENCH_SHOTS
  if (folder) await page.screenshot({ path: `${folder}/${name}.png`, fullPage: true })
}

async function planPublishedRun(page: Page, workOrderIds: string[]): Promise<CutRunDetail> {
  const planned = await page.context().request.post(`${baseUrl}/api/cut-runs`, { data: { workOrderIds } })
  expect(planned.status(), await planned.text()).toBe(201)
  const run = CutRunDetailSchema.parse(await planned.json())
  const published = await page.context().request.post(`${baseUrl}/api/cut-runs/${run.id}/publish`, { data: {} })
  expect(published.status(), await published.text()).toBe(200)
  return CutRunDetailSchema.parse(await published.json())
}

/** A small green PNG, as a tablet camera might hand over. */
function photoPng(): Buffer {
  const png = new PNG({ width: 64, height: 48 })
  for (let i = 0; i < png.data.length; i += 4) png.data.set([40, 150, 90, 255], i)
  return PNG.sync.write(png)
}

/** A unit of the demo 12-site kit, revision A, cut and waiting in a bin at the build bench. */
async function unitInABin() {
  const [rev] = await conn.db
    .select({ id: kitRevisions.id, kitId: kits.id })
    .from(kitRevisions)
    .innerJoin(kits, eq(kits.id, kitRevisions.kitId))
    .where(and(eq(kits.sku, 'MW-TOTE-12'), eq(kitRevisions.code, 'A')))
  const wo = await insertBuildWorkOrder(conn.db, rev!.id, rev!.kitId, 'cut')
  const bin = await insertBin(conn.db, wo.id)
  const steps = (await conn.db.select().from(buildSteps).where(eq(buildSteps.revisionId, rev!.id))).sort((a, b) => a.position - b.position)
  return { wo, bin, steps }
}

/** Ticks one build step as the assembler would: the measurement in the middle of its limits, if it takes one. */
async function tickStep(page: Page, step: Awaited<ReturnType<typeof unitInABin>>['steps'][number]) {
  const card = page.getByRole('listitem', { name: `Step ${step.position}`, exact: true })
  if (step.measurementRequired) {
    const middle = (Number(step.measurementMin) + Number(step.measurementMax)) / 2
    await card.getByLabel(`Measurement for step ${step.position} in ${step.measurementUnit}`).fill(String(middle))
  }
  await card.getByRole('button', { name: `Tick step ${step.position}` }).click()
  await card.getByRole('button', { name: `Undo step ${step.position}` }).waitFor()
}

describe('the cut bench with the network cut', () => {
  it('keeps pieces ticked offline through a reload and lands each once when the network is back', async () => {
    const [wo] = await insertWorkOrders(conn.db, { kitSku: 'MW-TOTE-6C', count: 1 })
    const { page: planner } = await tablet('planner')
    const run = await planPublishedRun(planner, [wo!.id])
    const stick1 = run.sticks[0]!
    const pieces = stick1.cuts.filter((c) => c.status === 'pending').length
    expect(pieces).toBeGreaterThanOrEqual(2)

    const { context, page } = await tablet('cutter')
    const stick = page.getByRole('region', { name: `Stick ${stick1.position}` })
    await openForOffline(page, `/bench/cut?run=${run.id}`, () => stick.getByText(`0 of ${pieces} pieces cut`).waitFor())

    await context.setOffline(true)
    await banner(page).getByText('Offline.').waitFor()
    const ticks = stick.getByRole('button', { name: /^Tick one / })
    await ticks.first().click()
    await stick.getByText(`1 of ${pieces} pieces cut`).waitFor()
    await ticks.first().click()
    await stick.getByText(`2 of ${pieces} pieces cut`).waitFor()
    await banner(page).getByText('2 actions waiting.').waitFor()
    expect(
      await conn.db
        .select()
        .from(cutRunCuts)
        .where(and(eq(cutRunCuts.stickId, stick1.id), eq(cutRunCuts.status, 'cut'))),
    ).toHaveLength(0)

    // The page loads again with no network: the app from the worker, the run as last read, the ticks from the queue.
    await page.reload()
    await stick.getByText(`2 of ${pieces} pieces cut`).waitFor()
    await banner(page).getByText('2 actions waiting.').waitFor()
    expect(await stick.getByText(/^Last cut by you \(not sent yet\)/).count()).toBeGreaterThan(0)
    // The unit's count beside the stick counts them too.
    await page.getByText(new RegExp(`^WO ${wo!.serial} .* · 2/\\d+ pieces cut$`)).waitFor()
    await shot(page, 'cut-bench-offline-reloaded')

    await context.setOffline(false)
    await banner(page).getByText('Back online.').waitFor()
    const landed = await conn.db
      .select()
      .from(cutRunCuts)
      .where(and(eq(cutRunCuts.stickId, stick1.id), eq(cutRunCuts.status, 'cut')))
    expect(landed).toHaveLength(2)
    // The audit trail has each once, with when it was tapped on the bench and when it reached the server.
    const trail = await conn.db
      .select()
      .from(auditEvents)
      .where(and(eq(auditEvents.entityId, run.id), eq(auditEvents.action, 'cut.tick')))
    expect(trail).toHaveLength(2)
    for (const e of trail) {
      expect(e.takenAt).not.toBeNull()
      expect(e.bench).toBe('cut')
      expect(e.at.getTime()).toBeGreaterThanOrEqual(e.takenAt!.getTime())
    }
    // Shown from the server now, nothing left on the tablet.
    await page.reload()
    await stick.getByText(`2 of ${pieces} pieces cut`).waitFor()
    expect(await stick.getByText(/not sent yet/).count()).toBe(0)
    expect(await banner(page).count()).toBe(0)
  })

  it('records once a piece two tablets ticked, one of them offline', async () => {
    const [wo] = await insertWorkOrders(conn.db, { kitSku: 'MW-TOTE-6C', count: 1 })
    const { page: planner } = await tablet('planner')
    const run = await planPublishedRun(planner, [wo!.id])
    const stick1 = run.sticks[0]!
    const first = stick1.cuts[0]!

    const offline = await tablet('cutter')
    const stickB = offline.page.getByRole('region', { name: `Stick ${stick1.position}` })
    await openForOffline(offline.page, `/bench/cut?run=${run.id}`, () => stickB.getByText(/^0 of \d+ pieces cut$/).waitFor())
    await offline.context.setOffline(true)
    await banner(offline.page).getByText('Offline.').waitFor()
    await stickB
      .getByRole('button', { name: /^Tick one / })
      .first()
      .click()
    await banner(offline.page).getByText('1 action waiting.').waitFor()

    // Meanwhile the planner, online at the saw, ticks the same piece.
    const stickA = planner.getByRole('region', { name: `Stick ${stick1.position}` })
    await planner.goto(`${baseUrl}/bench/cut?run=${run.id}`)
    await stickA.getByText(/^0 of \d+ pieces cut$/).waitFor()
    await stickA
      .getByRole('button', { name: /^Tick one / })
      .first()
      .click()
    await stickA.getByText(/^1 of \d+ pieces cut$/).waitFor()

    await offline.context.setOffline(false)
    await banner(offline.page).getByText('Back online.').waitFor()
    await stickB.getByText(/^1 of \d+ pieces cut$/).waitFor()
    // Not refused, not cut twice: one piece, ticked by the planner; the late tap is in the trail as changing nothing.
    expect(await offline.page.getByRole('alert', { name: 'Refused actions' }).count()).toBe(0)
    const cut = await conn.db
      .select()
      .from(cutRunCuts)
      .where(and(eq(cutRunCuts.stickId, stick1.id), eq(cutRunCuts.status, 'cut')))
    expect(cut.map((c) => c.id)).toEqual([first.id])
    const trail = await conn.db
      .select({ action: auditEvents.action, takenAt: auditEvents.takenAt })
      .from(auditEvents)
      .where(and(eq(auditEvents.entityId, run.id), inArray(auditEvents.action, ['cut.tick', 'cut.tick_again'])))
    expect(trail.map((e) => e.action).sort()).toEqual(['cut.tick', 'cut.tick_again'])
    expect(trail.find((e) => e.action === 'cut.tick_again')!.takenAt).not.toBeNull()
  })
})

describe('the build bench with the network cut', () => {
  it('keeps steps ticked offline through a reload and lands each once when the network is back', async () => {
    const { wo, bin, steps } = await unitInABin()
    const firstTwo = steps.slice(0, 2)
    expect(firstTwo.every((s) => !s.photoRequired)).toBe(true)
    const { context, page } = await tablet('assembler')
    await openForOffline(page, `/bench/build?code=${bin.code}`, () => page.getByRole('heading', { name: `Unit ${wo.serial}` }).waitFor())

    await context.setOffline(true)
    await banner(page).getByText('Offline.').waitFor()
    for (const step of firstTwo) await tickStep(page, step)
    await banner(page).getByText('2 actions waiting.').waitFor()
    // A photo needs the photo store: it is kept on the tablet and says so.
    await page.getByLabel('Photo of the unit').setInputFiles({ name: 'unit.png', mimeType: 'image/png', buffer: photoPng() })
    const forServer = banner(page).getByRole('list', { name: 'Waiting for the network' })
    await forServer.getByText('Photo of the unit').waitFor()
    expect(await forServer.getByText('waiting for the network').count()).toBe(1)
    await banner(page).getByText('3 actions waiting.').waitFor()
    await shot(page, 'build-bench-offline')

    await page.reload()
    await page.getByRole('heading', { name: `Unit ${wo.serial}` }).waitFor()
    for (const step of firstTwo)
      await page
        .getByRole('listitem', { name: `Step ${step.position}`, exact: true })
        .getByText(/Ticked by you \(not sent yet\)/)
        .waitFor()
    await forServer.getByText('Photo of the unit').waitFor()
    // The next step is open to tick: the bench goes on in order with no network.
    expect(await page.getByRole('button', { name: `Tick step ${steps[2]!.position}` }).isVisible()).toBe(true)

    await context.setOffline(false)
    await banner(page).getByText('Back online.').waitFor()
    const ticks = await conn.db
      .select()
      .from(buildStepTicks)
      .where(and(eq(buildStepTicks.workOrderId, wo.id), isNull(buildStepTicks.undoneAt)))
    expect(ticks.map((t) => t.buildStepId).sort()).toEqual(firstTwo.map((s) => s.id).sort())
    const trail = await conn.db
      .select()
      .from(auditEvents)
      .where(and(eq(auditEvents.entityId, wo.id), eq(auditEvents.action, 'build.tick'), isNotNull(auditEvents.takenAt)))
    expect(trail).toHaveLength(2)
    // The photo went to the store once the network was back, and the server confirmed it.
    const photos = await conn.db
      .select()
      .from(unitPhotos)
      .where(and(eq(unitPhotos.workOrderId, wo.id), isNotNull(unitPhotos.uploadedAt)))
    expect(photos).toHaveLength(1)
    for (const step of firstTwo)
      await page
        .getByRole('listitem', { name: `Step ${step.position}`, exact: true })
        .getByText(`Ticked by ${demo('assembler').name}`)
        .waitFor()
  })

  it('shows the person a step refused because the unit was cancelled while the tablet was offline', async () => {
    const { wo, bin, steps } = await unitInABin()
    const { context, page } = await tablet('assembler')
    await openForOffline(page, `/bench/build?code=${bin.code}`, () => page.getByRole('heading', { name: `Unit ${wo.serial}` }).waitFor())
    await context.setOffline(true)
    await banner(page).getByText('Offline.').waitFor()
    await tickStep(page, steps[0]!)

    // The planner cancels the order meanwhile.
    const { page: planner } = await tablet('planner')
    const cancelled = await planner
      .context()
      .request.post(`${baseUrl}/api/orders/${wo.orderId}/cancel`, { data: { reason: 'Customer moved house and asked to cancel' } })
    expect(cancelled.status(), await cancelled.text()).toBe(200)

    await context.setOffline(false)
    const refused = page.getByRole('alert', { name: 'Refused actions' })
    await refused.getByText(`Unit ${wo.serial} was cancelled; do not build it`).waitFor()
    expect(await refused.getByText(`Step ${steps[0]!.position} of unit ${wo.serial}`).count()).toBe(1)
    await shot(page, 'build-bench-refused')
    const [row] = await conn.db.select({ status: workOrders.status }).from(workOrders).where(eq(workOrders.id, wo.id))
    expect(row!.status).toBe('cancelled')
    expect(await conn.db.select().from(buildStepTicks).where(eq(buildStepTicks.workOrderId, wo.id))).toHaveLength(0)
    // Read and put away: it leaves the tablet.
    await refused.getByRole('button', { name: /^Seen: / }).click()
    await refused.waitFor({ state: 'detached' })
  })
})

describe('the pack bench with the network cut', () => {
  it('marks what went in (or came out of) the box offline as waiting to send, through a reload, and as confirmed once the server has it', async () => {
    const made = await insertPackOrder(conn.db, [{ kitSku: 'MW-TOTE-6C' }, { kitSku: 'MW-SPARE-SPR6' }])
    const [unit, spare] = made.units
    const packer = demo('packer').name
    const standing = async () =>
      (
        await conn.db
          .select({ itemKey: packChecks.itemKey })
          .from(packChecks)
          .where(and(inArray(packChecks.workOrderId, [unit!.wo.id, spare!.wo.id]), isNull(packChecks.undoneAt)))
      )
        .map((c) => c.itemKey)
        .sort()
    const { context, page } = await tablet('packer')
    const list = page.getByRole('list', { name: 'Packing list' })
    const unitItem = list.getByRole('listitem', { name: `Unit ${unit!.wo.serial}` })
    const bagItem = list.getByRole('listitem', { name: `Bag ${unit!.wo.serial} bag` })
    const spareItem = list.getByRole('listitem', { name: `Pack ${spare!.wo.serial}` })
    await openForOffline(page, `/bench/pack?order=${made.order.id}`, () => page.getByRole('heading', { name: `Order ${made.order.number}` }).waitFor())
    // The spare pack went in while the network was up; the order is read again, so the service worker keeps it so for a reload.
    const reread = page.waitForResponse((r) => r.url().endsWith(`/api/pack/orders/${made.order.id}`) && r.request().method() === 'GET' && r.ok())
    await spareItem.getByRole('button', { name: 'In the box' }).click()
    await spareItem.getByText(`Ticked by ${packer}`).waitFor()
    await reread

    await context.setOffline(true)
    await banner(page).getByText('Offline.').waitFor()
    // The wedge scanner types into the scan field, which has the focus back after the tap.
    await page.keyboard.type(unit!.binCode!)
    await page.keyboard.press('Enter')
    await unitItem.getByText('In the box — waiting to send').waitFor()
    await bagItem.getByRole('button', { name: 'In the box' }).click()
    await bagItem.getByText('In the box — waiting to send').waitFor()
    await spareItem.getByRole('button', { name: 'Undo' }).click()
    await spareItem.getByText('Out of the box — waiting to send').waitFor()
    await banner(page).getByText('3 actions waiting.').waitFor()
    expect(await standing()).toEqual([`pack:${spare!.wo.serial}`])

    // The page loads again with no network: the list as last read, the marks from the queue.
    await page.reload()
    await unitItem.getByText('In the box — waiting to send').waitFor()
    await unitItem.getByText(`${unit!.binCode} scanned by you at`).waitFor()
    await bagItem.getByText('In the box — waiting to send').waitFor()
    await bagItem.getByText(/^You ticked it at/).waitFor()
    await spareItem.getByText('Out of the box — waiting to send').waitFor()
    await banner(page).getByText('3 actions waiting.').waitFor()
    // Not the server's confirmation: no "Ticked by" or "Scanned … by" on the items that wait.
    expect(await unitItem.getByText(`Scanned ${unit!.binCode} by`).count()).toBe(0)
    expect(await bagItem.getByText(/^Ticked by/).count()).toBe(0)
    await shot(page, 'pack-bench-offline-reloaded')

    await context.setOffline(false)
    await banner(page).getByText('Back online.').waitFor()
    await unitItem.getByText(`Scanned ${unit!.binCode} by ${packer}`).waitFor()
    await bagItem.getByText(`Ticked by ${packer}`).waitFor()
    await spareItem.getByRole('button', { name: 'In the box' }).waitFor()
    expect(await list.getByText(/waiting to send/).count()).toBe(0)
    // The bag and the unit in the box, the spare pack out of it: each landed once.
    const landed = await standing()
    expect(landed).toHaveLength(2)
    expect(landed[0]!.startsWith(`bag:${unit!.wo.serial}:`)).toBe(true)
    expect(landed[1]).toBe(`unit:${unit!.wo.serial}`)
  })
})
