import { randomBytes, randomUUID } from 'node:crypto'
import { eq } from 'drizzle-orm'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { BUILDABLE_STATUSES, PresignedPhotoSchema } from '@kitwright/shared/build'
import { ApiErrorBodySchema } from '@kitwright/shared/errors'
import { WORK_ORDER_STATUSES } from '@kitwright/shared/orders-status'
import { ROLES, type Role } from '@kitwright/shared/roles'
import { auditEvents, mailMessages, unitPhotos } from '../../server/src/db/schema/index'
import { recordAudit } from '../../server/src/lib/audit'
import { SESSION_COOKIE } from '../../server/src/lib/auth'
import { declaredRoutes, expressRoutes, undeclaredRoutes } from '../../server/src/lib/route-inventory'
import type { Access, RouteRecord } from '../../server/src/lib/routes'
import { accessDifferences, withOneCallerTurned } from './access-compare'
import { CALLERS, EXPECTED_ACCESS, type Caller } from './access-expected'
import { buildApp } from '../support/app'
import { insertBuildRevision, insertBuildWorkOrder } from '../support/build-factories'
import { insertUser, TEST_PASSWORD } from '../support/factories'
import { createTestDb, type TestDb } from '../support/test-db'

let t: TestDb
let built: ReturnType<typeof buildApp>
const cookies = new Map<Role, string>()

beforeAll(async () => {
  t = await createTestDb()
  built = buildApp(t)
  for (const role of ROLES) {
    const user = await insertUser(t.db, { role })
    const res = await request(built.app).post('/api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD })
    const raw = (res.headers['set-cookie'] as unknown as string[]).find((c) => c.startsWith(SESSION_COOKIE))!
    cookies.set(role, raw.split(';')[0]!)
  }
})
afterAll(() => t.drop())

// Public routes that check a signature of their own (the store, payment and carrier webhooks) answer an unsigned call with
// 401; that answer is theirs, not the access guard's, so for them only 403 and 5xx count as failures.
const SIGNED_PUBLIC_ROUTES = new Set(['post /api/webhooks/store', 'post /api/webhooks/payments', 'post /api/shipments/tracking-events'])

// What each caller should get, from the hand-written grid (tests/api/access-expected.ts), never from
// the route table under test.
function expectedOutcome(route: Pick<RouteRecord, 'method' | 'path'>, caller: Caller): 'allowed' | 401 | 403 {
  const who = EXPECTED_ACCESS.get(`${route.method} ${route.path}`)
  if (!who) throw new Error(`${route.method} ${route.path} is not in tests/api/access-expected.ts`)
  if (who.has(caller)) return 'allowed'
  return caller === 'signed-out' ? 401 : 403
}

describe('role matrix: every route, called signed out and as every role', () => {
  it('declares an access rule for every route Express has', () => {
    const actual = expressRoutes(built.app).filter((r) => !r.endsWith(' /*splat') && !r.startsWith('get /.*'))
    expect(actual.length).toBeGreaterThan(0)
    // The SPA fallback is not an API route; everything else must have been added through the route table.
    expect(actual.sort()).toEqual(declaredRoutes(built.routes).sort())
    expect(undeclaredRoutes(built.app, built.routes)).toEqual([])
  })

  it('gives every route the rule the shop expects, caller by caller (hand-written grid)', () => {
    expect(accessDifferences(built.routes.records, EXPECTED_ACCESS)).toEqual([])
    // The grid covers the whole table: every route Express has, every role, and signed out.
    expect(EXPECTED_ACCESS.size).toBe(built.routes.records.length)
    expect([...CALLERS].sort()).toEqual(['signed-out', ...ROLES].sort())
  })

  it('notices a rule changed in the route table alone: every route, every caller the rule language can turn', () => {
    let turned = 0
    for (const [i, route] of built.routes.records.entries()) {
      for (const caller of CALLERS) {
        const access = withOneCallerTurned(route.access, caller)
        if (access === null) continue
        const copy = built.routes.records.map((r, j) => (j === i ? { ...r, access } : r))
        const found = accessDifferences(copy, EXPECTED_ACCESS)
        expect(found.length, `${route.method} ${route.path} turned for ${caller}`).toBeGreaterThan(0)
        expect(found.every((d) => d.startsWith(`${route.method} ${route.path}: `) && d.includes(` ${caller}`)), found.join('\n')).toBe(true)
        turned++
      }
    }
    // Each route can be turned for at least one caller (a role list can always gain a role it lacks, or lose one of several).
    expect(turned).toBeGreaterThanOrEqual(built.routes.records.length)
    // Two slips a person could make, spelled out: the planner let into user accounts, a packer let into cut-run planning.
    const slip = (key: string, access: Access) => accessDifferences(built.routes.records.map((r) => (`${r.method} ${r.path}` === key ? { ...r, access } : r)), EXPECTED_ACCESS)
    expect(slip('patch /api/users/:id', ['admin', 'planner'])).toEqual(['patch /api/users/:id: the route table lets planner through; the shop expects a refusal'])
    expect(slip('post /api/cut-runs/:id/publish', 'signed-in')).toEqual([
      'post /api/cut-runs/:id/publish: the route table lets cutter through; the shop expects a refusal',
      'post /api/cut-runs/:id/publish: the route table lets assembler through; the shop expects a refusal',
      'post /api/cut-runs/:id/publish: the route table lets packer through; the shop expects a refusal',
    ])
    expect(slip('get /api/public/unit-records/:token', ['admin'])).toHaveLength(5)
  })

  it('answers 401 signed out, 403 to the wrong role, and lets the right roles through (the running server against the grid)', async () => {
    const failures: string[] = []
    for (const route of built.routes.records) {
      const path = route.path.replace(/:[a-zA-Z]+/g, '6f1c2a52-8d1e-4c55-9a55-0d1f6f3e2b11')
      for (const caller of CALLERS) {
        let req = request(built.app)[route.method](path)
        if (caller !== 'signed-out') req = req.set('Cookie', cookies.get(caller)!)
        const res = await (route.method === 'get' ? req : req.send({}))
        const expected = expectedOutcome(route, caller)
        const ownSignatureCheck = SIGNED_PUBLIC_ROUTES.has(`${route.method} ${route.path}`) && res.status === 401
        const ok = expected === 'allowed' ? (res.status !== 401 || ownSignatureCheck) && res.status !== 403 && res.status < 500 : res.status === expected
        if (!ok) failures.push(`${route.method.toUpperCase()} ${route.path} as ${caller}: got ${res.status}, expected ${expected}`)
      }
    }
    expect(failures).toEqual([])
  }, 120_000) // hundreds of requests (every route × every caller); a budget, not a speed check
})

describe('object level: guessing ids opens nothing', () => {
  it('answers the benches without a trace of admin data, whatever id they put in any route', async () => {
    // Admin data with a mark no other row carries: an owner, a customer e-mail in the outbox, an audit entry.
    const mark = `zq${randomBytes(4).toString('hex')}`
    const owner = await insertUser(t.db, { role: 'admin', email: `${mark}-owner@mistwell.example`, name: `Owner ${mark}` })
    const [mail] = await t.db.insert(mailMessages).values({ to: `${mark}@buyer.example`, subject: `Order ${mark}`, text: `Hello ${mark}`, purpose: `probe-${mark}` }).returning()
    await recordAudit(t.db, { actorId: owner.id, actorEmail: owner.email, bench: null, address: null }, { action: 'user.update', entityType: 'user', entityId: owner.id, summary: `Changed ${mark}` })
    const [audit] = await t.db.select().from(auditEvents).where(eq(auditEvents.entityId, owner.id))
    const ids = [owner.id, mail!.id, audit!.id]

    const leaks: string[] = []
    let calls = 0
    for (const caller of ['cutter', 'assembler', 'packer'] as const) {
      for (const route of built.routes.records) {
        for (const id of ids) {
          const path = route.path.replace(/:[a-zA-Z]+/g, id)
          let req = request(built.app)[route.method](path).query({ id, entityId: id, q: mark, actorId: owner.id }).set('Cookie', cookies.get(caller)!)
          const res = await (route.method === 'get' ? req : req.send({ id }))
          calls++
          const expected = expectedOutcome(route, caller)
          const text = res.text ?? ''
          if (expected === 403 && res.status !== 403) leaks.push(`${route.method} ${path} as ${caller}: ${res.status}, expected 403`)
          if (text.includes(mark)) leaks.push(`${route.method} ${path} as ${caller}: the answer (${res.status}) shows admin data`)
          if (res.status >= 500) leaks.push(`${route.method} ${path} as ${caller}: ${res.status}`)
          if (!route.path.includes(':')) break // one call is enough where no id goes into the path
        }
      }
    }
    console.log(`[access] ${calls} id-guessing calls by the bench roles; ${leaks.length} leaks`)
    expect(leaks).toEqual([])
    // The same ids do open the data for the admin: the probe would have seen a leak.
    const asAdmin = await request(built.app).get(`/api/mail/${mail!.id}`).set('Cookie', cookies.get('admin')!)
    expect(asAdmin.text).toContain(mark)
    const trail = await request(built.app).get('/api/audit').query({ q: mark }).set('Cookie', cookies.get('admin')!)
    expect(trail.status).toBe(200)
  }, 120_000) // a thousand calls or so (every route × three bench roles × three ids); a budget, not a speed check
})

describe('object level: photo uploads', () => {
  const PRESIGN = 'post /api/build/:workOrderId/photos/presign'

  it('presigns only for a role of the build bench, and only on a unit that may be built now', async () => {
    const route = built.routes.records.find((r) => `${r.method} ${r.path}` === PRESIGN)
    expect(route, 'the presign route is in the route table').toBeDefined()
    const rev = await insertBuildRevision(t.db)
    const units = await Promise.all(WORK_ORDER_STATUSES.map((status) => insertBuildWorkOrder(t.db, rev.revision.id, rev.kit.id, status)))
    const before = await t.db.select({ id: unitPhotos.id }).from(unitPhotos)
    const wrong: string[] = []
    let issued = 0
    for (const wo of [...units, { id: randomUUID(), status: 'none' as const }]) {
      for (const caller of CALLERS) {
        let req = request(built.app).post(`/api/build/${wo.id}/photos/presign`)
        if (caller !== 'signed-out') req = req.set('Cookie', cookies.get(caller)!)
        const res = await req.send({ contentType: 'image/jpeg', size: 2048 })
        const access = expectedOutcome(route!, caller)
        const expected = access !== 'allowed' ? access : wo.status === 'none' ? 404 : (BUILDABLE_STATUSES as readonly string[]).includes(wo.status) ? 201 : 409
        if (res.status !== expected) wrong.push(`${caller} on a ${wo.status} unit: ${res.status}, expected ${expected}`)
        if (res.status === 201) issued++
        else expect(ApiErrorBodySchema.safeParse(res.body).success, JSON.stringify(res.body)).toBe(true)
      }
    }
    expect(wrong).toEqual([])
    // Only the granted presigns left a (still unconfirmed) photo row, each on a buildable unit.
    const rows = await t.db.select({ workOrderId: unitPhotos.workOrderId }).from(unitPhotos)
    expect(rows.length - before.length).toBe(issued)
    const buildable = new Set(units.filter((u) => (BUILDABLE_STATUSES as readonly string[]).includes(u.status)).map((u) => u.id))
    expect(rows.every((r) => buildable.has(r.workOrderId))).toBe(true)
    expect(issued).toBe(BUILDABLE_STATUSES.length * CALLERS.filter((c) => expectedOutcome(route!, c) === 'allowed').length)
  })

  it('confirms a photo only on the unit it was presigned for', async () => {
    const rev = await insertBuildRevision(t.db)
    const [a, b] = [await insertBuildWorkOrder(t.db, rev.revision.id, rev.kit.id), await insertBuildWorkOrder(t.db, rev.revision.id, rev.kit.id)]
    const assembler = cookies.get('assembler')!
    const res = await request(built.app).post(`/api/build/${a.id}/photos/presign`).set('Cookie', assembler).send({ contentType: 'image/png', size: 16 })
    expect(res.status).toBe(201)
    const { key } = PresignedPhotoSchema.parse(res.body)
    const other = await request(built.app).post(`/api/build/${b.id}/photos/confirm`).set('Cookie', assembler).send({ key })
    expect(other.status).toBe(400)
    expect(ApiErrorBodySchema.parse(other.body).error.fields).toEqual({ key: 'Unknown key' })
  })
})
