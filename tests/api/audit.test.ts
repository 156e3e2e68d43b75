import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { AuditPageSchema } from '@kitwright/shared/audit'
import { inches } from '@kitwright/shared/domain/units'
import { seedDemo } from '../../server/src/seeds/demo'
import { buildApp, signedInAs } from '../support/app'
import { buildNewOrder } from '../support/order-factories'
import { insertUser, TEST_PASSWORD } from '../support/factories'
import { createTestDb, type TestDb } from '../support/test-db'

let t: TestDb
let app: ReturnType<typeof buildApp>['app']
let owner: Awaited<ReturnType<typeof signedInAs>>

beforeAll(async () => {
  t = await createTestDb()
  app = buildApp(t).app
  await seedDemo(t.db)
  owner = await signedInAs(app, t, 'admin')
})
afterAll(() => t.drop())

async function trail(query = '') {
  const res = await owner.agent.get(`/api/audit?pageSize=100${query}`)
  expect(res.status).toBe(200)
  return AuditPageSchema.parse(res.body)
}

describe('the audit trail', () => {
  it('records sign-ins, refused sign-ins with the address, and the bench they came from', async () => {
    const cutter = await insertUser(t.db, { role: 'cutter' })
    await request(app).post('/api/auth/sign-in').set('X-Kitwright-Bench', 'cut').send({ email: cutter.email, password: TEST_PASSWORD })
    await request(app).post('/api/auth/sign-in').set('X-Forwarded-For', '10.1.2.3').send({ email: cutter.email, password: 'wrong-guess' })
    const { items } = await trail('&action=auth.')
    const signIn = items.find((e) => e.action === 'auth.sign_in' && e.actorId === cutter.id)
    expect(signIn).toMatchObject({ bench: 'cut', entityType: 'user' })
    const refused = items.find((e) => e.action === 'auth.sign_in_refused')
    expect(refused).toMatchObject({ address: '10.1.2.3', entityId: cutter.email })
  })

  it('records user, catalog, stock and settings changes with who made them', async () => {
    const created = await owner.agent.post('/api/users').send({ email: 'new@shop.example', name: 'New Hand', role: 'packer', password: 'long-enough-pw' })
    await owner.agent.patch(`/api/users/${created.body.id}`).send({ role: 'assembler' })
    const part = await owner.agent.post('/api/parts').send({
      sku: 'AUD-PIPE', name: 'Test pipe', kind: 'stock_length', unitOfMeasure: 'stick', unitCostCents: 300, weightGrams: 700,
      reorderPoint: 0, reorderQuantity: 0, nominalSize: '1/2', outsideDiameter: inches(0.84), stickLengths: [inches(120)],
    })
    expect(part.status).toBe(201)
    await owner.agent.post('/api/stock/adjust').send({ partId: part.body.id, quantity: 4, stickLength: inches(120), reason: 'Found in the back' })
    await owner.agent.post('/api/kits').send({ sku: 'AUD-KIT', name: 'Audit kit' })
    await owner.agent.patch('/api/settings').send({ minOffcut: inches(8) })

    const { items } = await trail()
    const actions = items.map((e) => e.action)
    for (const a of ['user.create', 'user.update', 'part.create', 'stock.adjust', 'kit.create', 'settings.update']) expect(actions).toContain(a)
    for (const e of items.filter((i) => i.action !== 'auth.sign_in' && i.action !== 'auth.sign_in_refused')) {
      expect(e.actorId).toBe(owner.user.id)
    }
    expect(items.find((e) => e.action === 'stock.adjust')!.summary).toMatch(/Found in the back/)
  })

  it('records phone orders and releases into work orders, naming the serials', async () => {
    const order = await owner.agent.post('/api/orders').send(buildNewOrder({ lines: [{ kitSku: 'MW-SPARE-SPR6', quantity: 2, unitPriceCents: 900 }] }))
    expect(order.status).toBe(201)
    const release = await owner.agent.post('/api/orders/release').send({ orderIds: [order.body.id] })
    expect(release.status, JSON.stringify(release.body)).toBe(200)
    const { items } = await trail('&action=order.')
    expect(items.find((e) => e.action === 'order.create')?.entityId).toBe(order.body.id)
    const released = items.find((e) => e.action === 'order.release')!
    expect(released.entityId).toBe(order.body.id)
    expect(released.summary).toMatch(/into 2 work order\(s\): U-\d+, U-\d+/)
  })

  it('filters by kind of change and by words', async () => {
    const { items } = await trail('&action=part.')
    expect(items.length).toBeGreaterThan(0)
    expect(items.every((e) => e.action.startsWith('part.'))).toBe(true)
    const words = await trail('&q=AUD-KIT')
    expect(words.items.map((e) => e.action)).toEqual(['kit.create'])
  })

  it('is the owner’s page only', async () => {
    for (const role of ['planner', 'cutter', 'assembler', 'packer'] as const) {
      const { agent } = await signedInAs(app, t, role)
      expect((await agent.get('/api/audit')).status).toBe(403)
    }
    expect((await request(app).get('/api/audit')).status).toBe(401)
  })
})
