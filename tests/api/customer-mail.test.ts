// What the shop says to its customers by e-mail: who it comes from (the shop's identity in the
// settings), where every link points (the public address), and the cancellation e-mail.
// Every message is read back as the SMTP catcher stored it and parsed by mailparser; the links of
// the HTML body are read by an HTML parser (happy-dom), those of the text body by a URL pattern.
import { readdirSync, readFileSync } from 'node:fs'
import path from 'node:path'
import { and, desc, eq } from 'drizzle-orm'
import { Window } from 'happy-dom'
import { simpleParser, type ParsedMail } from 'mailparser'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ApiErrorBodySchema } from '@kitwright/shared/errors'
import { OrderDetailSchema } from '@kitwright/shared/orders'
import { PackViewSchema, type PackView } from '@kitwright/shared/pack'
import { ShopIdentitySchema, type UpdateShopIdentity } from '@kitwright/shared/settings'
import { seedDemo } from '../../server/src/seeds/demo'
import { DEMO_MAIL_IDENTITY } from '../../server/src/seeds/shipping'
import { auditEvents, mailMessages, orders, storeEvents } from '../../server/src/db/schema/index'
import { startWorkers } from '../../server/src/workers'
import { buildApp, signedInAs } from '../support/app'
import { insertPackOrder, receivePlenty } from '../support/pack-factories'
import { deliver, paidEvent, waitFor } from '../support/store-webhook'
import { createTestDb, type TestDb } from '../support/test-db'
import { waitForQueueIdle } from '../support/queue'

/** Not the default `http://localhost:<port>`: links must follow the setting, not a guess. */
const PUBLIC_URL = 'https://totes.mistwell.example:8443'
const FALLBACK_FROM = 'orders@kitwright-test.example'

let t: TestDb
let built: ReturnType<typeof buildApp>
type Agent = Awaited<ReturnType<typeof signedInAs>>['agent']
let admin: Agent
let planner: Agent
let packer: Agent
let mailDir: string

beforeAll(async () => {
  const dir = process.env.FAKE_MAIL_DIR
  if (!dir) throw new Error('FAKE_MAIL_DIR is not set: run the suite with `npm test`')
  mailDir = dir
  t = await createTestDb()
  await seedDemo(t.db)
  await receivePlenty(t.db)
  built = buildApp(t)
  // The routers and jobs read the deps object when they run, so this is the address every link must start with.
  built.deps.publicUrl = PUBLIC_URL
  await startWorkers(built.deps)
  admin = (await signedInAs(built.app, t, 'admin')).agent
  planner = (await signedInAs(built.app, t, 'planner')).agent
  packer = (await signedInAs(built.app, t, 'packer')).agent
})
afterAll(() => t.drop())

/** Every message the catcher holds for `to`, parsed. */
async function caught(to: string): Promise<ParsedMail[]> {
  const files = readdirSync(mailDir).filter((f) => f.endsWith('.eml'))
  const parsed = await Promise.all(files.map((f) => simpleParser(readFileSync(path.join(mailDir, f)))))
  return parsed.filter((m) => (Array.isArray(m.to) ? m.to : m.to ? [m.to] : []).some((a) => a.value.some((v) => v.address === to)))
}

/** The message of `purpose` (exact, or a prefix ending in `:`) for the order, once the mail job sent it and the catcher has it. */
async function sentMail(orderNumber: string, purpose: string) {
  const row = await waitFor(`the ${purpose} e-mail of ${orderNumber} to be sent`, async () => {
    const rows = await t.db
      .select({ mail: mailMessages })
      .from(mailMessages)
      .innerJoin(orders, eq(orders.id, mailMessages.orderId))
      .where(eq(orders.number, orderNumber))
    const found = rows.map((r) => r.mail).find((m) => (purpose.endsWith(':') ? m.purpose.startsWith(purpose) : m.purpose === purpose))
    return found?.status === 'sent' ? found : undefined
  })
  const parsed = await waitFor(`the ${purpose} e-mail of ${orderNumber} in the catcher`, async () => {
    const all = await caught(row.to)
    return all.find((m) => m.headers.get('x-kitwright-mail-id') === row.id)
  })
  return { row, parsed }
}

/** Every link of a message: each `href` of the HTML (parsed as HTML), and each address written in the text. */
function linksOf(mail: ParsedMail): { html: string[]; text: string[] } {
  const window = new Window()
  try {
    const doc = new window.DOMParser().parseFromString(typeof mail.html === 'string' ? mail.html : '', 'text/html')
    const html = [...doc.querySelectorAll('[href], [src]')].map((el) => el.getAttribute('href') ?? el.getAttribute('src') ?? '')
    // Anything with a scheme, or starting www., counts as a link in a text body (mail readers make those clickable).
    const text = [...(mail.text ?? '').matchAll(/\b(?:[a-z][a-z0-9+.-]*:\/\/|www\.)[^\s<>"')]+/gi)].map((m) => m[0])
    return { html, text }
  } finally {
    void window.happyDOM.close()
  }
}

function expectLinksOnPublicAddress(mail: ParsedMail) {
  const { html, text } = linksOf(mail)
  for (const href of [...html, ...text]) expect(href.startsWith(`${PUBLIC_URL}/`), `${href} in "${mail.subject}"`).toBe(true)
  return { html, text }
}

function error(res: { status: number; body: unknown }, status: number) {
  expect(res.status, JSON.stringify(res.body)).toBe(status)
  return ApiErrorBodySchema.parse(res.body).error
}

const SHIP_FROM = {
  name: 'Mistwell Tote Works',
  line1: '12 Foundry Lane, Unit 4',
  line2: null,
  city: 'Millbrook Falls',
  region: 'OR',
  postalCode: '97001',
  country: 'US',
  phone: '555-0100',
}

describe('the shop identity in the settings', () => {
  it('shows the owner the demo shop’s sender, reply-to, ship-from and the public address from PUBLIC_URL', async () => {
    const res = await admin.get('/api/settings/identity')
    expect(res.status).toBe(200)
    const identity = ShopIdentitySchema.parse(res.body)
    expect(identity).toEqual({
      shopName: 'Mistwell Tote Works',
      ...DEMO_MAIL_IDENTITY,
      shipFrom: SHIP_FROM,
      carrierName: 'Brindlepost',
      publicUrl: PUBLIC_URL,
      mailFromFallback: FALLBACK_FROM,
    })
    expect((await planner.get('/api/settings/identity')).status).toBe(403)
    expect((await planner.put('/api/settings/identity').send({ ...identity })).status).toBe(403)
  })

  it('lets the owner name the carrier the shop ships with, kept when left out, in the audit when changed', async () => {
    const identity = ShopIdentitySchema.parse((await admin.get('/api/settings/identity')).body)
    const { publicUrl: _p, mailFromFallback: _f, ...update } = identity
    try {
      const renamed = ShopIdentitySchema.parse((await admin.put('/api/settings/identity').send({ ...update, carrierName: 'Harrowgate Freight' })).body)
      expect(renamed.carrierName).toBe('Harrowgate Freight')
      const { carrierName: _c, ...withoutCarrier } = update
      expect(ShopIdentitySchema.parse((await admin.put('/api/settings/identity').send(withoutCarrier)).body).carrierName).toBe('Harrowgate Freight')
      const [entry] = await t.db.select().from(auditEvents).where(eq(auditEvents.action, 'settings.identity')).orderBy(desc(auditEvents.at)).limit(1)
      expect(entry!.summary).toContain('carrier')
      expect(error(await admin.put('/api/settings/identity').send({ ...update, carrierName: 'Two\nlines' }), 400).fields).toMatchObject({
        carrierName: 'Keep the carrier name on one line',
      })
    } finally {
      await admin.put('/api/settings/identity').send(update)
    }
  })

  it('refuses a bad sender, reply-to or address with what to fix, and keeps what was saved', async () => {
    const bad = await admin.put('/api/settings/identity').send({
      shopName: '  ',
      mailFromName: 'Mistwell\r\nBcc: everyone@list.example',
      mailFromAddress: 'orders at mistwell',
      replyToAddress: 'workshop@',
      shipFrom: { ...SHIP_FROM, country: 'USA', postalCode: '' },
      publicUrl: 'https://elsewhere.example',
    })
    const e = error(bad, 400)
    expect(e.fields).toMatchObject({
      shopName: 'Enter the shop name',
      mailFromName: 'Keep the sender name on one line',
      mailFromAddress: expect.stringMatching(/^Enter the sender e-mail as an address such as/),
      replyToAddress: expect.stringMatching(/^Enter the reply-to e-mail as an address such as/),
      'shipFrom.country': expect.stringMatching(/two-letter country code/),
      'shipFrom.postalCode': 'Enter the postal code',
    })
    // The public address is not the settings' to change: it must match how the app is served.
    expect(JSON.stringify(e)).toMatch(/publicUrl/)
    const after = ShopIdentitySchema.parse((await admin.get('/api/settings/identity')).body)
    expect(after.mailFromAddress).toBe(DEMO_MAIL_IDENTITY.mailFromAddress)
    expect(after.shipFrom).toEqual(SHIP_FROM)
  })

  it('puts a changed sender name and reply-to in the headers of the next e-mail, as the SMTP catcher received it, and audits the change', async () => {
    const change: UpdateShopIdentity = {
      shopName: 'Mistwell Tote Works',
      mailFromName: 'Ada at Mistwell',
      mailFromAddress: 'Hello@Mistwell.example',
      replyToAddress: 'ada.workbench@mistwell.example',
      shipFrom: { ...SHIP_FROM, line2: 'Dock door 2' },
    }
    const res = await admin.put('/api/settings/identity').send(change)
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    expect(ShopIdentitySchema.parse(res.body)).toMatchObject({
      mailFromName: 'Ada at Mistwell',
      mailFromAddress: 'hello@mistwell.example',
      replyToAddress: 'ada.workbench@mistwell.example',
    })
    const [audit] = await t.db.select().from(auditEvents).where(eq(auditEvents.action, 'settings.identity')).orderBy(desc(auditEvents.at)).limit(1)
    expect(audit?.summary).toBe("Changed the shop's identity: sender name, sender e-mail, reply-to e-mail, ship-from address")
    expect(audit?.data).toMatchObject({
      mailFromName: { from: 'Mistwell Tote Works', to: 'Ada at Mistwell' },
      replyToAddress: { from: DEMO_MAIL_IDENTITY.replyToAddress, to: 'ada.workbench@mistwell.example' },
    })

    await deliver(built.app, paidEvent('MW-ID-2001'))
    const { parsed } = await sentMail('MW-ID-2001', 'order_received')
    expect(parsed.from?.value).toEqual([{ name: 'Ada at Mistwell', address: 'hello@mistwell.example' }])
    expect(parsed.replyTo?.value).toEqual([{ name: '', address: 'ada.workbench@mistwell.example' }])

    // Cleared, the sender falls back to the shop name and MAIL_FROM, and replies go to the From address.
    const cleared = await admin.put('/api/settings/identity').send({ ...change, mailFromName: '', mailFromAddress: null, replyToAddress: '' })
    expect(cleared.status, JSON.stringify(cleared.body)).toBe(200)
    await deliver(built.app, paidEvent('MW-ID-2002'))
    const fallback = (await sentMail('MW-ID-2002', 'order_received')).parsed
    expect(fallback.from?.value).toEqual([{ name: 'Mistwell Tote Works', address: FALLBACK_FROM }])
    expect(fallback.replyTo).toBeUndefined()
    await admin.put('/api/settings/identity').send({ ...change, ...DEMO_MAIL_IDENTITY, shipFrom: SHIP_FROM })
  })
})

describe('every link in every e-mail starts with the public address', () => {
  async function packAndShip(lines: Parameters<typeof insertPackOrder>[1]) {
    const { order, units } = await insertPackOrder(t.db, lines)
    let v: PackView = PackViewSchema.parse((await packer.get('/api/pack/lookup').query({ code: units[0]!.binCode ?? units[0]!.wo.serial })).body)
    for (const item of v.items) {
      const res =
        item.kind === 'unit'
          ? await packer.post(`/api/pack/orders/${order.id}/scan`).send({ code: item.binCode ?? item.serial })
          : await packer.post(`/api/pack/orders/${order.id}/tick`).send({ itemKey: item.key })
      expect(res.status, JSON.stringify(res.body)).toBe(200)
      v = PackViewSchema.parse(res.body)
    }
    const labelled = await packer.post(`/api/pack/orders/${order.id}/label`).send({
      service: 'ground',
      parcels: v.parcels.map((p) => ({ workOrderIds: p.workOrderIds, boxId: p.boxId, scaleGrams: null })),
    })
    expect(labelled.status, JSON.stringify(labelled.body)).toBe(201)
    const shipped = await packer.post(`/api/pack/orders/${order.id}/ship`).send({})
    expect(shipped.status, JSON.stringify(shipped.body)).toBe(200)
    return { order, units }
  }

  it('order received, shipped (with build-record links), cancelled by a planner and by the store', async () => {
    const kinds: { what: string; mail: ParsedMail }[] = []
    // Received: the store's paid event.
    await deliver(built.app, paidEvent('MW-LNK-3001'))
    kinds.push({ what: 'order received', mail: (await sentMail('MW-LNK-3001', 'order_received')).parsed })

    // Shipped: two built totes (each with its build record) and a spare pack, through the pack bench.
    const { order, units } = await packAndShip([{ kitSku: 'MW-TOTE-12', quantity: 2 }, { kitSku: 'MW-SPARE-CUP12' }])
    const shipped = (await sentMail(order.number, 'shipped:')).parsed
    kinds.push({ what: 'shipped', mail: shipped })
    const recordLinks = linksOf(shipped).html.filter((h) => h.includes('/record/'))
    expect(recordLinks).toHaveLength(2)
    // Each record link carries a token that opens the customer's build record of one of the units.
    const serials = new Set<string>()
    for (const href of recordLinks) {
      const record = await packer.get(`/api/public/unit-records/${new URL(href).pathname.split('/').at(-1)}`)
      expect(record.status, href).toBe(200)
      for (const u of units) if (JSON.stringify(record.body).includes(u.wo.serial)) serials.add(u.wo.serial)
    }
    expect(serials.size).toBe(2)

    // Cancelled by a planner.
    await deliver(built.app, paidEvent('MW-LNK-3002'))
    await sentMail('MW-LNK-3002', 'order_received')
    const [toCancel] = await t.db.select().from(orders).where(eq(orders.number, 'MW-LNK-3002'))
    expect((await planner.post(`/api/orders/${toCancel!.id}/cancel`).send({ reason: 'Customer asked by phone' })).status).toBe(200)
    kinds.push({ what: 'cancelled by a planner', mail: (await sentMail('MW-LNK-3002', 'order_cancelled')).parsed })

    // Cancelled by the store's event.
    await deliver(built.app, paidEvent('MW-LNK-3003'))
    await sentMail('MW-LNK-3003', 'order_received')
    await deliver(built.app, {
      eventId: 'evt-cancel-lnk-3003',
      type: 'order.cancelled',
      occurredAt: new Date().toISOString(),
      orderNumber: 'MW-LNK-3003',
      reason: 'Payment disputed',
    })
    kinds.push({ what: 'cancelled by the store', mail: (await sentMail('MW-LNK-3003', 'order_cancelled')).parsed })

    let links = 0
    for (const { what, mail } of kinds) {
      expect(mail.html, what).toBeTruthy()
      const { html, text } = expectLinksOnPublicAddress(mail)
      links += html.length + text.length
    }
    // The shipped e-mail's two record links, in the HTML and in the text.
    expect(links).toBeGreaterThanOrEqual(4)

    // Every message in the outbox of this run, whatever its kind, and its stored bodies.
    const outbox = await t.db.select().from(mailMessages)
    expect(new Set(outbox.map((m) => m.purpose.split(':')[0]))).toEqual(new Set(['order_received', 'shipped', 'order_cancelled']))
    for (const m of outbox) {
      const parsed = await simpleParser(`Content-Type: text/html; charset=utf-8\r\n\r\n${m.html ?? ''}`)
      expectLinksOnPublicAddress({ ...parsed, text: m.text })
    }
  })
})

describe('the cancellation e-mail', () => {
  it('goes once when a planner cancels, is in the outbox and on the order’s timeline, and promises nothing', async () => {
    await deliver(built.app, paidEvent('MW-CXL-4001'))
    await sentMail('MW-CXL-4001', 'order_received')
    const [order] = await t.db.select().from(orders).where(eq(orders.number, 'MW-CXL-4001'))
    expect((await planner.post(`/api/orders/${order!.id}/cancel`).send({ reason: 'Duplicate order, internal note' })).status).toBe(200)
    // A second cancel is refused and queues nothing more; the store's cancel afterwards changes nothing either.
    expect((await planner.post(`/api/orders/${order!.id}/cancel`).send({ reason: 'again' })).status).toBe(409)
    await deliver(built.app, { eventId: 'evt-cancel-cxl-4001', type: 'order.cancelled', occurredAt: new Date().toISOString(), orderNumber: 'MW-CXL-4001' })
    const { row, parsed } = await sentMail('MW-CXL-4001', 'order_cancelled')
    expect(parsed.subject).toBe('Mistwell Tote Works: your order MW-CXL-4001 is cancelled')
    expect(parsed.text).toContain('Nothing of it will be made or shipped')
    expect(parsed.text).toMatch(/1 × .*\(MW-TOTE-12\)/)
    expect(parsed.text).not.toMatch(/ship it by|internal note/)
    await waitFor('the store event to be applied', async () => {
      const [event] = await t.db.select().from(storeEvents).where(eq(storeEvents.eventId, 'evt-cancel-cxl-4001'))
      return event?.processedAt ?? undefined
    })
    await waitForQueueIdle(t.db) // every job done: a stray second send would have landed by now
    const rows = await t.db
      .select()
      .from(mailMessages)
      .where(and(eq(mailMessages.orderId, order!.id), eq(mailMessages.purpose, 'order_cancelled')))
    expect(rows).toHaveLength(1)
    expect((await caught(row.to)).filter((m) => m.subject?.includes('is cancelled'))).toHaveLength(1)
    const outbox = await planner.get('/api/mail').query({ pageSize: 100 })
    expect(
      outbox.body.items.filter(
        (m: { purpose: string; order: { number: string } | null }) => m.purpose === 'order_cancelled' && m.order?.number === 'MW-CXL-4001',
      ),
    ).toHaveLength(1)
    const detail = OrderDetailSchema.parse((await planner.get(`/api/orders/${order!.id}`)).body)
    const mailEvents = detail.events.filter((e) => (e.kind === 'mail_queued' || e.kind === 'mail_sent') && e.message.includes('is cancelled'))
    expect(mailEvents.map((e) => e.kind).sort()).toEqual(['mail_queued', 'mail_sent'])
  })
})
