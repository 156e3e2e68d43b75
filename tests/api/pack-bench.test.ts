import { readdirSync, readFileSync } from 'node:fs'
import path from 'node:path'
import { and, eq, inArray, sql } from 'drizzle-orm'
import { simpleParser } from 'mailparser'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { hasValidCheckDigit } from '@kitwright/shared/domain/gs1'
import { ApiErrorBodySchema } from '@kitwright/shared/errors'
import { PackViewSchema, QuoteSchema, ShipResultSchema, type PackView } from '@kitwright/shared/pack'
import { seedDemo } from '../../server/src/seeds/demo'
import { DEMO_GS1_COMPANY_PREFIX } from '../../server/src/seeds/shipping'
import { auditEvents, bins, mailMessages, orders, parcels, stockMoves, workOrders } from '../../server/src/db/schema/index'
import { startWorkers } from '../../server/src/workers'
import { buildApp, signedInAs } from '../support/app'
import { insertPackOrder, receivePlenty } from '../support/pack-factories'
import { waitFor } from '../support/store-webhook'
import { createTestDb, type TestDb } from '../support/test-db'
import { waitForQueueIdle } from '../support/queue'

let t: TestDb
let built: ReturnType<typeof buildApp>
type Agent = Awaited<ReturnType<typeof signedInAs>>['agent']
let packer: Agent
let planner: Agent

beforeAll(async () => {
  t = await createTestDb()
  await seedDemo(t.db)
  await receivePlenty(t.db)
  built = buildApp(t)
  await startWorkers(built.deps)
  packer = (await signedInAs(built.app, t, 'packer')).agent
  planner = (await signedInAs(built.app, t, 'planner')).agent
})
afterAll(() => t.drop())

function view(res: { status: number; body: unknown }, status = 200): PackView {
  expect(res.status, JSON.stringify(res.body)).toBe(status)
  return PackViewSchema.parse(res.body)
}
function error(res: { status: number; body: unknown }, status: number) {
  expect(res.status, JSON.stringify(res.body)).toBe(status)
  return ApiErrorBodySchema.parse(res.body).error
}
const scan = (agent: Agent, orderId: string, code: string) => agent.post(`/api/pack/orders/${orderId}/scan`).send({ code })
const tick = (agent: Agent, orderId: string, itemKey: string) => agent.post(`/api/pack/orders/${orderId}/tick`).send({ itemKey })
const parcelsOfView = (v: PackView) => v.parcels.map((p) => ({ workOrderIds: p.workOrderIds, boxId: p.boxId!, scaleGrams: null }))

/** Scans every unit and ticks every bag and pack of the view. */
async function confirmAll(agent: Agent, v: PackView) {
  let current = v
  for (const item of v.items) {
    if (item.kind === 'unit') current = view(await scan(agent, v.order.id, item.binCode ?? item.serial))
    else current = view(await tick(agent, v.order.id, item.key))
  }
  return current
}

async function labelAndShip(agent: Agent, v: PackView) {
  const labelled = view(await agent.post(`/api/pack/orders/${v.order.id}/label`).send({ service: 'ground', parcels: parcelsOfView(v) }), 201)
  expect(labelled.shipment?.status).toBe('labelled')
  const shipped = await agent.post(`/api/pack/orders/${v.order.id}/ship`).send({})
  expect(shipped.status, JSON.stringify(shipped.body)).toBe(200)
  return { labelled, result: ShipResultSchema.parse(shipped.body) }
}

describe('scan and verify at the pack bench', () => {
  it('opens the order from a bin: the unit, its hardware bag and the spare pack, each to confirm', async () => {
    const { order, units } = await insertPackOrder(t.db, [{ kitSku: 'MW-TOTE-12' }, { kitSku: 'MW-SPARE-SPR6' }])
    const v = view(await packer.get('/api/pack/lookup').query({ code: units[0]!.binCode!.toLowerCase() }))
    expect(v.order.number).toBe(order.number)
    expect(v.items.map((i) => i.kind)).toEqual(['unit', 'bag', 'pack'])
    expect(v.items.map((i) => i.serial)).toEqual([units[0]!.wo.serial, units[0]!.wo.serial, units[1]!.wo.serial])
    expect(v.items.every((i) => i.check === null && i.problem === null)).toBe(true)
    expect(v.canLabel).toBe(false)
    // One parcel: the tote's large carton, with the spare pack riding along.
    expect(v.parcels).toHaveLength(1)
    expect(v.parcels[0]!.boxName).toMatch(/Large carton/)
    expect(v.parcels[0]!.serials).toEqual([units[0]!.wo.serial, units[1]!.wo.serial])
    expect(v.parcels[0]!.billableGrams).toBe(Math.max(v.parcels[0]!.actualGrams, v.parcels[0]!.dimensionalGrams))
  })

  it("refuses another order's bin as the wrong box, and records nothing", async () => {
    const mine = await insertPackOrder(t.db, [{ kitSku: 'MW-TOTE-6C' }])
    const theirs = await insertPackOrder(t.db, [{ kitSku: 'MW-TOTE-6C' }])
    const e = error(await scan(packer, mine.order.id, theirs.units[0]!.binCode!), 409)
    expect(e.message).toBe(
      `Wrong box: bin ${theirs.units[0]!.binCode} holds unit ${theirs.units[0]!.wo.serial} of order ${theirs.order.number}, not of order ${mine.order.number}. Set it aside and scan this order's bins`,
    )
    const v = view(await packer.get(`/api/pack/orders/${mine.order.id}`))
    expect(v.shipment).toBeNull()
    expect(v.items.every((i) => i.check === null)).toBe(true)
  })

  it('blocks a unit that has not passed its leak test, whether it failed, has none, or is still in rework', async () => {
    const { order, units } = await insertPackOrder(t.db, [
      { kitSku: 'MW-TOTE-6C', leakTest: 'none' },
      { kitSku: 'MW-TOTE-6C', status: 'rework', leakTest: 'failed' },
    ])
    expect(error(await scan(packer, order.id, units[0]!.binCode!), 409).message).toBe(
      `Unit ${units[0]!.wo.serial} has not passed its leak test (none is recorded): it goes back to the build bench`,
    )
    expect(error(await scan(packer, order.id, units[1]!.wo.serial), 409).message).toMatch(/has not passed its leak test \(the last test failed\)/)
    const v = view(await packer.get(`/api/pack/orders/${order.id}`))
    expect(v.blockers).toEqual(expect.arrayContaining([expect.stringMatching(new RegExp(`^Unit ${units[0]!.wo.serial} has not passed its leak test`))]))
    expect(v.canLabel).toBe(false)
  })

  it('blocks the label while an item is missing, and says which', async () => {
    const { order, units } = await insertPackOrder(t.db, [{ kitSku: 'MW-TOTE-6C' }])
    const v = view(await scan(packer, order.id, units[0]!.binCode!))
    expect(v.items.find((i) => i.kind === 'unit')!.check).toMatchObject({ method: 'scan', code: units[0]!.binCode })
    expect(v.blockers).toEqual([expect.stringMatching(/^Not confirmed yet: Zip hardware bag, 6 × 9 in of loose parts for U-\d+/)])
    const refused = error(await packer.post(`/api/pack/orders/${order.id}/label`).send({ service: 'ground', parcels: parcelsOfView(v) }), 409)
    expect(refused.message).toMatch(/^Not ready for a label: Not confirmed yet: Zip hardware bag/)
    // A unit needs a scan: a tick is refused with what to do.
    expect(error(await tick(packer, order.id, v.items[0]!.key), 400).message).toMatch(/^Scan unit U-\d+'s bin or serial/)
    const done = view(await tick(packer, order.id, v.items[1]!.key))
    expect(done.blockers).toEqual([])
    expect(done.canLabel).toBe(true)
    // Undo takes it out again.
    expect(view(await packer.post(`/api/pack/orders/${order.id}/undo`).send({ itemKey: v.items[1]!.key })).canLabel).toBe(false)
  })
})

describe('partial shipments', () => {
  it('lets only a planner approve one; the rest is back-ordered and ships later', async () => {
    const { order, units } = await insertPackOrder(t.db, [{ kitSku: 'MW-TOTE-6C', quantity: 2 }])
    const [a, b] = units
    let v = view(await scan(packer, order.id, a!.binCode!))
    v = view(await tick(packer, order.id, v.items.find((i) => i.kind === 'bag' && i.serial === a!.wo.serial)!.key))
    expect(v.canLabel).toBe(false)
    expect(error(await packer.post(`/api/pack/orders/${order.id}/approve-partial`).send({ note: 'Customer wants the first now' }), 403).code).toBe('forbidden')
    expect(error(await planner.post(`/api/pack/orders/${order.id}/approve-partial`).send({ note: '' }), 400).fields).toHaveProperty('note')
    v = view(await planner.post(`/api/pack/orders/${order.id}/approve-partial`).send({ note: 'Customer wants the first now' }))
    expect(v.shipment!.partialApproval).toMatchObject({ note: 'Customer wants the first now' })
    expect(v.shippingSerials).toEqual([a!.wo.serial])
    expect(v.backOrderedSerials).toEqual([b!.wo.serial])
    expect(v.canLabel).toBe(true)
    const [audit] = await t.db
      .select()
      .from(auditEvents)
      .where(and(eq(auditEvents.action, 'shipment.approve_partial'), eq(auditEvents.entityId, order.id)))
    expect(audit?.summary).toContain(`${b!.wo.serial} back-ordered`)

    const { result } = await labelAndShip(packer, v)
    const [o] = await t.db.select().from(orders).where(eq(orders.id, order.id))
    expect(o!.status).toBe('partially_shipped')
    const statuses = await t.db.select({ serial: workOrders.serial, status: workOrders.status }).from(workOrders).where(eq(workOrders.orderId, order.id))
    expect(new Map(statuses.map((s) => [s.serial, s.status]))).toEqual(
      new Map([
        [a!.wo.serial, 'shipped'],
        [b!.wo.serial, 'built'],
      ]),
    )
    expect(result.view.alreadyShipped).toEqual([a!.wo.serial])

    // The back-order: a new shipment for the rest, then the order is shipped.
    let rest = view(await packer.get('/api/pack/lookup').query({ code: b!.wo.serial }))
    expect(rest.shipment).toBeNull()
    expect(rest.items.map((i) => i.serial)).toEqual([b!.wo.serial, b!.wo.serial])
    rest = await confirmAll(packer, rest)
    await labelAndShip(packer, rest)
    const [after] = await t.db.select().from(orders).where(eq(orders.id, order.id))
    expect(after!.status).toBe('shipped')
    expect(after!.shippedAt).not.toBeNull()
  })
})

describe('shipping', () => {
  it('quotes, buys the label, and ships in one transaction: statuses, bins, ledger, parcels, one e-mail', async () => {
    const { order, units } = await insertPackOrder(t.db, [{ kitSku: 'MW-TOTE-12' }, { kitSku: 'MW-SPARE-CUP12' }])
    let v = view(await packer.get('/api/pack/lookup').query({ code: units[0]!.binCode! }))
    v = await confirmAll(packer, v)
    expect(v.canLabel).toBe(true)
    // A scale reading overrides the estimate.
    const parcelsIn = [{ ...parcelsOfView(v)[0]!, scaleGrams: 16_250 }]
    const quotes = (await packer.post(`/api/pack/orders/${order.id}/quote`).send({ parcels: parcelsIn })).body as unknown[]
    expect(quotes.map((q) => QuoteSchema.parse(q).service)).toEqual(['ground', 'express'])
    const labelled = view(await packer.post(`/api/pack/orders/${order.id}/label`).send({ service: 'express', parcels: parcelsIn }), 201)
    expect(labelled.shipment).toMatchObject({ status: 'labelled', service: 'express' })
    const tracking = labelled.shipment!.trackingNumber!
    expect(tracking).toMatch(/^BP\d+$/)
    expect(error(await tick(packer, order.id, v.items[1]!.key), 409).message).toMatch(/label .* is bought/)

    const heldBefore = await t.db.execute<{ n: number }>(
      sql`select coalesce(sum(quantity), 0)::int as n from stock_moves where work_order_id in ${units.map((u) => u.wo.id)} and kind in ('reserve', 'release')`,
    )
    expect(heldBefore.rows[0]!.n).toBeGreaterThan(0)

    const shipped = await packer.post(`/api/pack/orders/${order.id}/ship`).send({})
    expect(shipped.status, JSON.stringify(shipped.body)).toBe(200)
    const result = ShipResultSchema.parse(shipped.body)
    expect(result.mailQueued).toBe(true)
    expect(result.view.shipment).toMatchObject({ status: 'shipped', trackingNumber: tracking })

    // Read back: units and order shipped, the bin free again.
    expect((await t.db.select().from(workOrders).where(eq(workOrders.orderId, order.id))).map((w) => w.status)).toEqual(['shipped', 'shipped'])
    expect((await t.db.select().from(orders).where(eq(orders.id, order.id)))[0]!.status).toBe('shipped')
    const [bin] = await t.db.select().from(bins).where(eq(bins.id, units[0]!.binId!))
    expect(bin).toMatchObject({ status: 'free', workOrderId: null })
    // The ledger: reservations released to zero, and one ship move per BOM line of each unit.
    const held = await t.db.execute<{ n: number }>(
      sql`select coalesce(sum(quantity), 0)::int as n from stock_moves where work_order_id in ${units.map((u) => u.wo.id)} and kind in ('reserve', 'release')`,
    )
    expect(held.rows[0]!.n).toBe(0)
    const shipMoves = await t.db
      .select()
      .from(stockMoves)
      .where(
        and(
          inArray(
            stockMoves.workOrderId,
            units.map((u) => u.wo.id),
          ),
          eq(stockMoves.kind, 'ship'),
        ),
      )
    const bom = await t.db.execute<{ n: number; q: number }>(
      sql`select count(*)::int as n, sum(b.quantity)::int as q from bom_lines b join work_orders w on w.kit_revision_id = b.revision_id where w.id in ${units.map((u) => u.wo.id)}`,
    )
    expect(shipMoves).toHaveLength(bom.rows[0]!.n)
    expect(shipMoves.reduce((s, m) => s + m.quantity, 0)).toBe(-bom.rows[0]!.q)
    expect(shipMoves.every((m) => m.reference === tracking)).toBe(true)
    // The parcel: the scale reading as the actual weight, billable the larger, an SSCC with its check digit.
    const [parcel] = await t.db.select().from(parcels).where(eq(parcels.shipmentId, result.view.shipment!.id))
    expect(parcel).toMatchObject({ scaleGrams: 16_250, actualGrams: 16_250 })
    expect(parcel!.billableGrams).toBe(Math.max(16_250, parcel!.dimensionalGrams))
    expect(parcel!.sscc.slice(1, 8)).toBe(DEMO_GS1_COMPANY_PREFIX)
    expect(hasValidCheckDigit(parcel!.sscc)).toBe(true)
    const [audit] = await t.db
      .select()
      .from(auditEvents)
      .where(and(eq(auditEvents.action, 'shipment.create'), eq(auditEvents.entityId, order.id)))
    expect(audit?.summary).toContain(tracking)

    // Shipping twice is refused; the e-mail is queued once and arrives in the SMTP catcher once.
    expect(error(await packer.post(`/api/pack/orders/${order.id}/ship`).send({}), 409).code).toBe('conflict')
    const mails = await t.db
      .select()
      .from(mailMessages)
      .where(and(eq(mailMessages.orderId, order.id), sql`${mailMessages.purpose} like 'shipped:%'`))
    expect(mails).toHaveLength(1)
    expect(mails[0]!.text).toContain(`Tracking number: ${tracking}`)
    // One signed build-record link, for the built unit; a spare pack has no build record.
    const links = [...mails[0]!.text.matchAll(/http:\/\/localhost:3000\/record\/(\S+)/g)]
    expect(links).toHaveLength(1)
    const record = await packer.get(`/api/public/unit-records/${links[0]![1]}`)
    expect(record.body.serial).toBe(units[0]!.wo.serial)

    const mailDir = process.env.FAKE_MAIL_DIR
    if (!mailDir) throw new Error('FAKE_MAIL_DIR is not set: run the suite with `npm test`')
    await waitFor('the shipped e-mail to be sent', async () =>
      (await t.db.select().from(mailMessages).where(eq(mailMessages.id, mails[0]!.id)))[0]?.status === 'sent' ? true : undefined,
    )
    await waitForQueueIdle(t.db) // every job done: a stray second send would have landed by now
    const caught = []
    for (const f of readdirSync(mailDir).filter((f) => f.endsWith('.eml'))) {
      const m = await simpleParser(readFileSync(path.join(mailDir, f)))
      const to = Array.isArray(m.to) ? m.to : m.to ? [m.to] : []
      if (to.some((a) => a.value.some((x) => x.address === order.customerEmail)) && m.subject?.includes('has shipped')) caught.push(m)
    }
    expect(caught).toHaveLength(1)
    expect(caught[0]!.text).toContain(tracking)
    expect(caught[0]!.html).toContain(`href="${links[0]![0]}"`)
  })

  it('refuses to ship before the label is bought', async () => {
    const { order, units } = await insertPackOrder(t.db, [{ kitSku: 'MW-SPARE-SPR6' }])
    view(await scan(packer, order.id, units[0]!.wo.serial))
    expect(error(await packer.post(`/api/pack/orders/${order.id}/ship`).send({}), 409).message).toMatch(/^Buy the label/)
  })
})

describe('bad input', () => {
  it('answers 400 with what to fix for a code or note with control characters, never a server error', async () => {
    const { order } = await insertPackOrder(t.db, [{ kitSku: 'MW-SPARE-SPR6' }])
    expect(error(await packer.get('/api/pack/lookup').query({ code: 'BIN-\u00000001' }), 400).message).toMatch(/characters no label carries/)
    expect(error(await scan(packer, order.id, '\u0000'), 400).fields).toHaveProperty('code')
    expect(error(await planner.post(`/api/pack/orders/${order.id}/approve-partial`).send({ note: 'why\u0000' }), 400).fields).toHaveProperty('note')
    expect(error(await packer.get('/api/pack/lookup'), 400).message).toMatch(/Scan a bin or type a serial/)
  })
})
