import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ROLES, type Role } from '@kitwright/shared/roles'
import { SESSION_COOKIE } from '../../server/src/lib/auth'
import type { RouteRecord } from '../../server/src/lib/routes'
import { buildApp } from '../support/app'
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

// Public routes that check a signature of their own (the store webhook) answer an unsigned call with
// 401; that answer is theirs, not the access guard's, so for them only 403 and 5xx count as failures.
const SIGNED_PUBLIC_ROUTES = new Set(['post /api/webhooks/store'])

type Caller = Role | 'anonymous'
const CALLERS: Caller[] = ['anonymous', ...ROLES]

function expectedOutcome(route: RouteRecord, caller: Caller): 'allowed' | 401 | 403 {
  if (route.access === 'public') return 'allowed'
  if (caller === 'anonymous') return 401
  if (route.access === 'signed-in') return 'allowed'
  return route.access.includes(caller) ? 'allowed' : 403
}

/** Every route Express actually has, read from its router stack (not from our own records). */
function expressRoutes(app: ReturnType<typeof buildApp>['app']): string[] {
  type Layer = { route?: { path: string; methods: Record<string, boolean> }; handle?: { stack?: Layer[] }; matchers?: unknown }
  const found: string[] = []
  const walk = (stack: Layer[]) => {
    for (const layer of stack) {
      if (layer.route) for (const m of Object.keys(layer.route.methods)) found.push(`${m} ${layer.route.path}`)
      else if (layer.handle?.stack) walk(layer.handle.stack)
    }
  }
  walk((app as unknown as { router: { stack: Layer[] } }).router.stack)
  return found
}

describe('role matrix: every route, called as anonymous and as every role', () => {
  it('declares an access rule for every route Express has', () => {
    const declared = built.routes.records.map((r) => `${r.method} ${r.path.replace(/^\/api\/[^/]+/, '') || '/'}`)
    const actual = expressRoutes(built.app).filter((r) => !r.endsWith(' /*splat') && !r.startsWith('get /.*'))
    expect(actual.length).toBeGreaterThan(0)
    // The SPA fallback is not an API route; everything else must have been added through the route table.
    expect(actual.sort()).toEqual(declared.sort())
  })

  it('answers 401 to anonymous, 403 to the wrong role, and lets the right roles through', async () => {
    const failures: string[] = []
    for (const route of built.routes.records) {
      const path = route.path.replace(/:[a-zA-Z]+/g, '6f1c2a52-8d1e-4c55-9a55-0d1f6f3e2b11')
      for (const caller of CALLERS) {
        let req = request(built.app)[route.method](path)
        if (caller !== 'anonymous') req = req.set('Cookie', cookies.get(caller)!)
        const res = await (route.method === 'get' ? req : req.send({}))
        const expected = expectedOutcome(route, caller)
        const ownSignatureCheck = SIGNED_PUBLIC_ROUTES.has(`${route.method} ${route.path}`) && res.status === 401
        const ok = expected === 'allowed' ? (res.status !== 401 || ownSignatureCheck) && res.status !== 403 && res.status < 500 : res.status === expected
        if (!ok) failures.push(`${route.method.toUpperCase()} ${route.path} as ${caller}: got ${res.status}, expected ${expected}`)
      }
    }
    expect(failures).toEqual([])
    expect(built.routes.records.length).toBeGreaterThanOrEqual(6)
  })

  it('keeps the admin pages admin-only', () => {
    const adminOnly = built.routes.records.filter((r) => r.path.startsWith('/api/users'))
    expect(adminOnly.length).toBeGreaterThan(0)
    for (const r of adminOnly) expect(r.access).toEqual(['admin'])
  })
})
