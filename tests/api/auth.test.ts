import { SignJWT } from 'jose'
import request from 'supertest'
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest'
import { and, eq } from 'drizzle-orm'
import { MeSchema, SessionSchema } from '@kitwright/shared/auth'
import { ApiErrorBodySchema } from '@kitwright/shared/errors'
import { auditEvents, signInFailures, users } from '../../server/src/db/schema/index'
import { SESSION_COOKIE } from '../../server/src/lib/auth'
import { MAX_FAILURES } from '../../server/src/features/auth/sign-in-throttle'
import { buildApp, signedInAs, TEST_TOKENS } from '../support/app'
import { insertUser, TEST_PASSWORD, TEST_PIN } from '../support/factories'
import { createTestDb, type TestDb } from '../support/test-db'

let t: TestDb
let app: ReturnType<typeof buildApp>['app']
beforeAll(async () => {
  t = await createTestDb()
  app = buildApp(t).app
})
afterEach(() => t.truncate())
afterAll(() => t.drop())

/** The id of the user `/api/auth/me` names (it always answers 200), or null when nobody is signed in. */
async function whoIsSignedIn(call: request.Test): Promise<string | null> {
  const res = await call
  expect(res.status).toBe(200)
  return SessionSchema.parse(res.body).user?.id ?? null
}

function sessionCookie(res: request.Response): string | undefined {
  const raw = res.headers['set-cookie'] as unknown as string[] | undefined
  return raw?.find((c) => c.startsWith(`${SESSION_COOKIE}=`))
}

describe('sign-in', () => {
  it('signs in with e-mail and password, sets an httpOnly SameSite cookie, and /me answers', async () => {
    const user = await insertUser(t.db, { role: 'planner', email: 'tomas@shop.example' })
    const agent = request.agent(app)
    const res = await agent.post('/api/auth/sign-in').send({ email: ' Tomas@Shop.example ', password: TEST_PASSWORD })
    expect(res.status).toBe(200)
    expect(MeSchema.parse(res.body)).toEqual({ id: user.id, email: user.email, name: user.name, role: 'planner' })
    const cookie = sessionCookie(res)
    expect(cookie).toMatch(/HttpOnly/i)
    expect(cookie).toMatch(/SameSite=Lax/i)
    const me = await agent.get('/api/auth/me')
    expect(me.status).toBe(200)
    expect(SessionSchema.parse(me.body).user?.id).toBe(user.id)
  })

  it('signs in at a bench with a PIN', async () => {
    const user = await insertUser(t.db, { role: 'cutter' })
    const res = await request(app).post('/api/auth/sign-in').send({ email: user.email, pin: TEST_PIN })
    expect(res.status).toBe(200)
    expect(MeSchema.parse(res.body).role).toBe('cutter')
  })

  it('refuses a wrong password, a wrong PIN and an unknown e-mail with 401 and no cookie', async () => {
    const user = await insertUser(t.db)
    for (const body of [
      { email: user.email, password: 'not-the-password' },
      { email: user.email, pin: '0000' },
      { email: 'nobody@shop.example', password: TEST_PASSWORD },
    ]) {
      const res = await request(app).post('/api/auth/sign-in').send(body)
      expect(res.status).toBe(401)
      expect(ApiErrorBodySchema.parse(res.body).error.code).toBe('unauthenticated')
      expect(sessionCookie(res)).toBeUndefined()
    }
  })

  it('refuses a PIN for a user who has none', async () => {
    const user = await insertUser(t.db, { pinHash: null })
    const res = await request(app).post('/api/auth/sign-in').send({ email: user.email, pin: '1234' })
    expect(res.status).toBe(401)
  })

  it('answers a bad payload with 400 and a hint per field', async () => {
    const cases: [unknown, string][] = [
      [{ email: 'not-an-email', password: 'x' }, 'email'],
      [{ email: 'a@shop.example', pin: '12' }, 'pin'],
      [{ email: 'a@shop.example' }, 'password'],
    ]
    for (const [body, field] of cases) {
      const res = await request(app).post('/api/auth/sign-in').send(body as object)
      expect(res.status).toBe(400)
      const parsed = ApiErrorBodySchema.parse(res.body)
      expect(parsed.error.code).toBe('invalid')
      expect(Object.keys(parsed.error.fields ?? {})).toContain(field)
    }
  })

  it('answers malformed JSON with 400 in the same error shape', async () => {
    const res = await request(app).post('/api/auth/sign-in').set('content-type', 'application/json').send('{"email":')
    expect(res.status).toBe(400)
    expect(ApiErrorBodySchema.parse(res.body).error.code).toBe('invalid')
  })

  it('signs out: the cookie is cleared and /me answers that nobody is signed in', async () => {
    const { agent } = await signedInAs(app, t, 'packer')
    const out = await agent.post('/api/auth/sign-out')
    expect(out.status).toBe(204)
    expect(await whoIsSignedIn(agent.get('/api/auth/me'))).toBeNull()
  })

  it('answers /me with 200 and no user to a browser that never signed in (no failed request in its console)', async () => {
    const res = await request(app).get('/api/auth/me')
    expect(res.status).toBe(200)
    expect(SessionSchema.parse(res.body)).toEqual({ user: null })
  })
})

describe('tokens', () => {
  it('treats a tampered or foreign-signed token as no token', async () => {
    const user = await insertUser(t.db)
    const forged = await new SignJWT({}).setProtectedHeader({ alg: 'HS256' }).setSubject(user.id).setIssuedAt().setExpirationTime('10m')
      .sign(new TextEncoder().encode('some-other-secret-some-other-secret'))
    expect(await whoIsSignedIn(request(app).get('/api/auth/me').set('Cookie', `${SESSION_COOKIE}=${forged}`))).toBeNull()
    // …and a route that needs a user refuses it.
    expect((await request(app).get('/api/orders').set('Cookie', `${SESSION_COOKIE}=${forged}`)).status).toBe(401)
  })

  it('refuses an expired token', async () => {
    const user = await insertUser(t.db)
    const now = Math.floor(Date.now() / 1000)
    const expired = await new SignJWT({}).setProtectedHeader({ alg: 'HS256' }).setSubject(user.id).setIssuedAt(now - 3600).setExpirationTime(now - 60)
      .sign(TEST_TOKENS.secret)
    expect(await whoIsSignedIn(request(app).get('/api/auth/me').set('Cookie', `${SESSION_COOKIE}=${expired}`))).toBeNull()
    expect((await request(app).get('/api/orders').set('Cookie', `${SESSION_COOKIE}=${expired}`)).status).toBe(401)
  })

  it('renews a token past a quarter of its life (sliding session), not a fresh one', async () => {
    const user = await insertUser(t.db)
    const now = Math.floor(Date.now() / 1000)
    const aging = await new SignJWT({}).setProtectedHeader({ alg: 'HS256' }).setSubject(user.id).setIssuedAt(now - 20 * 60).setExpirationTime(now + 10 * 60)
      .sign(TEST_TOKENS.secret)
    const renewed = await request(app).get('/api/auth/me').set('Cookie', `${SESSION_COOKIE}=${aging}`)
    expect(renewed.status).toBe(200)
    expect(sessionCookie(renewed)).toBeDefined()
    const { agent } = await signedInAs(app, t, 'planner')
    const fresh = await agent.get('/api/auth/me')
    expect(sessionCookie(fresh)).toBeUndefined()
  })

  it("stops a deactivated user's token at the next request, and refuses their sign-in", async () => {
    const { agent, user } = await signedInAs(app, t, 'assembler')
    expect(await whoIsSignedIn(agent.get('/api/auth/me'))).toBe(user.id)
    await t.db.update(users).set({ active: false }).where(eq(users.id, user.id))
    expect(await whoIsSignedIn(agent.get('/api/auth/me'))).toBeNull()
    expect((await agent.get('/api/orders')).status).toBe(401)
    const again = await request(app).post('/api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD })
    expect(again.status).toBe(401)
    expect(again.body.error.message).toMatch(/deactivated/)
  })
})

describe('throttling repeated failures', () => {
  it(`refuses the account from the same address after ${MAX_FAILURES} failures, with a clear message, even with the right password`, async () => {
    const user = await insertUser(t.db)
    for (let i = 0; i < MAX_FAILURES; i++) {
      const res = await request(app).post('/api/auth/sign-in').set('X-Forwarded-For', '10.0.0.7').send({ email: user.email, password: 'wrong-guess' })
      expect(res.status).toBe(401)
    }
    const blocked = await request(app).post('/api/auth/sign-in').set('X-Forwarded-For', '10.0.0.7').send({ email: user.email, password: TEST_PASSWORD })
    expect(blocked.status).toBe(429)
    const body = ApiErrorBodySchema.parse(blocked.body)
    expect(body.error.code).toBe('too_many_requests')
    expect(body.error.message).toMatch(/Too many failed sign-ins .* Try again in \d+ minutes?/)

    // Another address is not punished for this one's guesses.
    const elsewhere = await request(app).post('/api/auth/sign-in').set('X-Forwarded-For', '10.0.0.8').send({ email: user.email, password: TEST_PASSWORD })
    expect(elsewhere.status).toBe(200)
  })

  it('forgets failures after a successful sign-in', async () => {
    const user = await insertUser(t.db)
    for (let i = 0; i < MAX_FAILURES - 1; i++) {
      await request(app).post('/api/auth/sign-in').set('X-Forwarded-For', '10.0.0.9').send({ email: user.email, password: 'wrong-guess' })
    }
    const ok = await request(app).post('/api/auth/sign-in').set('X-Forwarded-For', '10.0.0.9').send({ email: user.email, password: TEST_PASSWORD })
    expect(ok.status).toBe(200)
    const left = await t.db.select().from(signInFailures).where(eq(signInFailures.email, user.email))
    expect(left).toHaveLength(0)
  })
})

describe('signing in at a bench tablet by name and PIN', () => {
  it('lists the display names of a bench’s people with a PIN, and nothing else about them', async () => {
    const ines = await insertUser(t.db, { role: 'cutter', name: 'Ines Marrow' })
    const abel = await insertUser(t.db, { role: 'cutter', name: 'Abel Cord' })
    await insertUser(t.db, { role: 'cutter', name: 'No Pin Yet', pinHash: null })
    await insertUser(t.db, { role: 'cutter', name: 'Gone Away', active: false })
    const kofi = await insertUser(t.db, { role: 'assembler', name: 'Kofi Brandt' })
    await insertUser(t.db, { role: 'planner', name: 'Tomas Quillan' })
    const cut = await request(app).get('/api/auth/bench-people').query({ bench: 'cut' })
    expect(cut.status).toBe(200)
    // Exactly id and name: no e-mail, role or anything else.
    expect(cut.body).toEqual([
      { id: abel.id, name: 'Abel Cord' },
      { id: ines.id, name: 'Ines Marrow' },
    ])
    const all = await request(app).get('/api/auth/bench-people')
    expect((all.body as { name: string }[]).map((p) => p.name)).toEqual(['Abel Cord', 'Ines Marrow', 'Kofi Brandt'])
    expect(JSON.stringify(all.body)).not.toContain('@')
    expect((all.body as { id: string }[]).map((p) => p.id)).toContain(kofi.id)
    const bad = await request(app).get('/api/auth/bench-people').query({ bench: 'office' })
    expect(bad.status).toBe(400)
    expect(ApiErrorBodySchema.parse(bad.body).error.fields).toEqual({ bench: 'Choose the cut, build or pack bench' })
  })

  it('signs in by the picked name and the PIN, and the audit records the bench the tablet is at', async () => {
    const packer = await insertUser(t.db, { role: 'packer', name: 'Lena Okafor-Hale' })
    const res = await request(app).post('/api/auth/sign-in').set('x-kitwright-bench', 'pack').send({ userId: packer.id, pin: TEST_PIN })
    expect(res.status).toBe(200)
    expect(MeSchema.parse(res.body)).toMatchObject({ id: packer.id, role: 'packer' })
    expect(sessionCookie(res)).toBeDefined()
    const [event] = await t.db.select().from(auditEvents).where(and(eq(auditEvents.action, 'auth.sign_in'), eq(auditEvents.actorId, packer.id)))
    expect(event).toMatchObject({ bench: 'pack', summary: 'Lena Okafor-Hale signed in with a bench PIN' })
  })

  it('refuses a wrong PIN naming the person, never their e-mail, and throttles by person and device as the e-mail sign-in does', async () => {
    const user = await insertUser(t.db, { role: 'assembler', name: 'Kofi Brandt' })
    const wrong = await request(app).post('/api/auth/sign-in').send({ userId: user.id, pin: '0000' })
    expect(wrong.status).toBe(401)
    expect(ApiErrorBodySchema.parse(wrong.body).error.message).toBe("That is not Kofi Brandt's PIN; try again")
    expect(sessionCookie(wrong)).toBeUndefined()
    // The failures by name and by e-mail count together: one account, one device.
    for (let i = 1; i < MAX_FAILURES; i++) {
      const body = i % 2 ? { email: user.email, pin: '0000' } : { userId: user.id, pin: '0000' }
      expect((await request(app).post('/api/auth/sign-in').send(body)).status).toBe(401)
    }
    const throttled = await request(app).post('/api/auth/sign-in').send({ userId: user.id, pin: TEST_PIN })
    expect(throttled.status).toBe(429)
    const message = ApiErrorBodySchema.parse(throttled.body).error.message
    expect(message).toMatch(/^Too many failed sign-ins for Kofi Brandt from this device/)
    expect(message).not.toContain(user.email)
    expect(await t.db.select().from(signInFailures).where(eq(signInFailures.email, user.email))).toHaveLength(MAX_FAILURES)
    // An id nobody has, and a bad id, are refused the same careful way.
    const unknown = await request(app).post('/api/auth/sign-in').send({ userId: '00000000-0000-4000-8000-000000000000', pin: TEST_PIN })
    expect(unknown.status).toBe(401)
    expect(ApiErrorBodySchema.parse(unknown.body).error.message).toMatch(/not on this bench any more/)
    expect((await request(app).post('/api/auth/sign-in').send({ userId: 'kofi', pin: TEST_PIN })).status).toBe(400)
  })
})
