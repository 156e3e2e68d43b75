// What the customer reads: the "order received" e-mail promises a ship date only to a paid, open
// order, and the care sheet in the box carries the mains-power cautions only when the box holds a
// part that runs on mains power. No job workers run here, so each e-mail stays in the outbox as
// written until the test reads it.
import { execFileSync } from 'node:child_process'
import { mkdirSync, mkdtempSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { and, eq } from 'drizzle-orm'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { formatDayWithWeekday } from '@kitwright/shared/dates'
import { PackViewSchema } from '@kitwright/shared/pack'
import { PartSchema } from '@kitwright/shared/parts'
import { seedDemo } from '../../server/src/seeds/demo'
import { DEMO_PART_SKUS } from '../../server/src/seeds/catalog'
import { mailMessages, orders, parts, storeEvents } from '../../server/src/db/schema/index'
import { processStoreEvent } from '../../server/src/features/webhooks/store-event.processor'
import { buildApp, signedInAs } from '../support/app'
import { removeDir, renderPdfPages } from '../support/decode-barcode'
import { insertPackOrder, receivePlenty } from '../support/pack-factories'
import { deliver, paidEvent } from '../support/store-webhook'
import { createTestDb, type TestDb } from '../support/test-db'

const shots = path.resolve(import.meta.dirname, '../.artifacts')
let t: TestDb
let built: ReturnType<typeof buildApp>
type Agent = Awaited<ReturnType<typeof signedInAs>>['agent']
let planner: Agent
let packer: Agent

beforeAll(async () => {
  t = await createTestDb()
  await seedDemo(t.db)
  await receivePlenty(t.db)
  built = buildApp(t)
  planner = (await signedInAs(built.app, t, 'planner')).agent
  packer = (await signedInAs(built.app, t, 'packer')).agent
})
afterAll(() => t.drop())

/** Delivers the store's event and applies it the way the store-event job does. */
async function applyStoreEvent(event: Parameters<typeof deliver>[1] & { eventId: string }) {
  const res = await deliver(built.app, event)
  expect(res.status, JSON.stringify(res.body)).toBe(200)
  const [row] = await t.db.select().from(storeEvents).where(eq(storeEvents.eventId, event.eventId))
  await processStoreEvent(built.deps, row!.id)
}

async function receivedMail(orderNumber: string) {
  const [row] = await t.db
    .select({ mail: mailMessages })
    .from(mailMessages)
    .innerJoin(orders, eq(orders.id, mailMessages.orderId))
    .where(and(eq(orders.number, orderNumber), eq(mailMessages.purpose, 'order_received')))
  if (!row) throw new Error(`no "order received" e-mail for ${orderNumber}`)
  return row.mail
}

describe('the "order received" e-mail', () => {
  it('promises the ship date to a paid, open order, drops it while the order is on hold or once cancelled, and says what happens next', async () => {
    await applyStoreEvent(paidEvent('MW-W-5001'))
    const [order] = await t.db.select().from(orders).where(eq(orders.number, 'MW-W-5001'))
    expect(order!.promisedShipDate).not.toBeNull()
    const promise = `We plan to ship it by ${formatDayWithWeekday(order!.promisedShipDate!)}.`
    let mail = await receivedMail('MW-W-5001')
    expect(mail.status).toBe('queued')
    expect(mail.text).toContain(promise)
    expect(mail.html).toContain(promise)

    // On hold before the e-mail went out: no date, and no word of why it is held.
    expect((await planner.post(`/api/orders/${order!.id}/hold`).send({ reason: 'Address looks wrong, call customer' })).status).toBe(200)
    mail = await receivedMail('MW-W-5001')
    expect(mail.text).not.toMatch(/ship it by|Address looks wrong/)
    expect(mail.text).toContain('We are checking a detail of the order before it goes to the workshop; we will write again as soon as it is on its way.')

    // Off hold: the date is back.
    expect((await planner.delete(`/api/orders/${order!.id}/hold`)).status).toBe(200)
    expect((await receivedMail('MW-W-5001')).text).toContain(promise)

    // Cancelled by the store before the e-mail went out: no date, and a word that the cancellation e-mail follows.
    await applyStoreEvent({ eventId: 'evt-cancel-w-5001', type: 'order.cancelled', occurredAt: new Date().toISOString(), orderNumber: 'MW-W-5001' })
    mail = await receivedMail('MW-W-5001')
    expect(mail.text).not.toMatch(/ship it by|leak-tested/)
    expect(mail.text).toContain('This order has since been cancelled, so nothing will be made or shipped; we are sending you a separate e-mail about it.')
    const cancelled = await t.db.select().from(mailMessages).where(and(eq(mailMessages.orderId, order!.id), eq(mailMessages.purpose, 'order_cancelled')))
    expect(cancelled).toHaveLength(1)
  })

  it('leaves an e-mail already sent as it went out', async () => {
    await applyStoreEvent(paidEvent('MW-W-5002'))
    const sent = await receivedMail('MW-W-5002')
    await t.db.update(mailMessages).set({ status: 'sent', sentAt: new Date() }).where(eq(mailMessages.id, sent.id))
    const [order] = await t.db.select().from(orders).where(eq(orders.number, 'MW-W-5002'))
    expect((await planner.post(`/api/orders/${order!.id}/cancel`).send({ reason: 'Customer asked' })).status).toBe(200)
    expect((await receivedMail('MW-W-5002')).text).toBe(sent.text)
  })

  it('sends none for an order whose cancellation arrived before its payment, only the cancellation e-mail', async () => {
    await applyStoreEvent({ eventId: 'evt-early-cancel-5003', type: 'order.cancelled', occurredAt: new Date(Date.now() - 30_000).toISOString(), orderNumber: 'MW-W-5003' })
    await applyStoreEvent(paidEvent('MW-W-5003'))
    const [order] = await t.db.select().from(orders).where(eq(orders.number, 'MW-W-5003'))
    expect(order!.status).toBe('cancelled')
    const purposes = (await t.db.select().from(mailMessages).where(eq(mailMessages.orderId, order!.id))).map((m) => m.purpose)
    expect(purposes).toEqual(['order_cancelled'])
  })
})

describe('the care sheet with the packing slip', () => {
  function slipText(pdf: Buffer) {
    const dir = mkdtempSync(path.join(tmpdir(), 'kw-care-'))
    writeFileSync(path.join(dir, 'slip.pdf'), pdf)
    const text = execFileSync('pdftotext', ['-layout', path.join(dir, 'slip.pdf'), '-'], { encoding: 'utf8' })
    removeDir(dir)
    return text.replace(/\s+/g, ' ')
  }

  /** The slip's words; its pages kept as PNGs in tests/.artifacts for a person to look at. */
  async function slipOf(lines: Parameters<typeof insertPackOrder>[1], name: string) {
    const { units } = await insertPackOrder(t.db, lines)
    const v = PackViewSchema.parse((await packer.post(`/api/pack/orders/${units[0]!.wo.orderId}/scan`).send({ code: units[0]!.binCode ?? units[0]!.wo.serial })).body)
    const res = await packer
      .get(`/api/shipments/${v.shipment!.id}/packing-slip.pdf`)
      .buffer(true)
      .parse((r, cb) => {
        const chunks: Buffer[] = []
        r.on('data', (c: Buffer) => chunks.push(c))
        r.on('end', () => cb(null, Buffer.concat(chunks)))
      })
    expect(res.status).toBe(200)
    const { pages, dir } = renderPdfPages(res.body as Buffer, 100)
    mkdirSync(shots, { recursive: true })
    pages.forEach((p, i) => writeFileSync(path.join(shots, `care-sheet-${name}-${i + 1}.png`), p))
    removeDir(dir)
    return slipText(res.body as Buffer)
  }

  it('knows the demo pump as electrical and the cups, collars and sprayers as not', async () => {
    const rows = await t.db.select().from(parts)
    const electrical = rows.filter((p) => p.electrical).map((p) => p.sku)
    expect(electrical).toEqual([DEMO_PART_SKUS.pump])
    const res = await planner.get(`/api/parts/${rows.find((p) => p.sku === DEMO_PART_SKUS.pump)!.id}`)
    expect(PartSchema.parse(res.body).electrical).toBe(true)
  })

  it('prints the mains-power cautions for a tote kit with its pump, and none for a spare-parts pack', async () => {
    const kit = await slipOf([{ kitSku: 'MW-TOTE-12' }], 'tote-kit')
    expect(kit).toContain('Care and safety: read before you fill the tote and plug in the pump')
    expect(kit).toMatch(/Electricity and water \(Submersible pump/)
    expect(kit).toMatch(/ground-fault protected outlet/)
    expect(kit).toMatch(/local electrical codes/)

    const spares = await slipOf([{ kitSku: 'MW-SPARE-CUP12' }], 'spare-pack')
    expect(spares).toContain('Care: read before you fill the tote')
    expect(spares).not.toMatch(/ground-fault|drip loop|Electricity and water|electrical codes|plug in the pump/i)
    // The shop's identity heads the slip: its name, the return address and where to write.
    expect(spares).toContain('Mistwell Tote Works')
    expect(spares).toContain('Returns to')
    expect(spares).toContain('12 Foundry Lane, Unit 4')
    expect(spares).toContain('Questions: workshop@mistwell.example')
  })
})
