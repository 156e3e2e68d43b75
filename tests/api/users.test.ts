import bcrypt from 'bcryptjs'
import { eq } from 'drizzle-orm'
import request from 'supertest'
import { z } from 'zod'
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest'
import { ApiErrorBodySchema } from '@kitwright/shared/errors'
import { UserSchema } from '@kitwright/shared/users'
import { users } from '../../server/src/db/schema/index'
import { buildApp, signedInAs } from '../support/app'
import { insertUser } from '../support/factories'
import { createTestDb, type TestDb } from '../support/test-db'

let t: TestDb
let app: ReturnType<typeof buildApp>['app']
beforeAll(async () => {
  t = await createTestDb()
  app = buildApp(t).app
})
afterEach(() => t.truncate())
afterAll(() => t.drop())

async function rowOf(id: string) {
  const [row] = await t.db.select().from(users).where(eq(users.id, id))
  return row!
}

describe('admin users', () => {
  it('lists users without their hashes', async () => {
    const { agent } = await signedInAs(app, t, 'admin')
    await insertUser(t.db, { role: 'cutter' })
    const res = await agent.get('/api/users')
    expect(res.status).toBe(200)
    const list = z.array(UserSchema).parse(res.body)
    expect(list).toHaveLength(2)
    expect(JSON.stringify(res.body)).not.toMatch(/hash|\$2[aby]\$/i)
  })

  it('creates a user who can then sign in with password and PIN', async () => {
    const { agent } = await signedInAs(app, t, 'admin')
    const res = await agent.post('/api/users').send({
      email: 'New.Hand@shop.example', name: 'New Hand', role: 'cutter', password: 'long-enough-pw', pin: '9753',
    })
    expect(res.status).toBe(201)
    const created = UserSchema.parse(res.body)
    expect(created).toMatchObject({ email: 'new.hand@shop.example', role: 'cutter', active: true, hasPin: true })
    const row = await rowOf(created.id)
    expect(await bcrypt.compare('long-enough-pw', row.passwordHash)).toBe(true)
    expect((await request(app).post('/api/auth/sign-in').send({ email: 'new.hand@shop.example', pin: '9753' })).status).toBe(200)
  })

  it('refuses a duplicate e-mail with 409 and a field hint, and keeps the first user as it was', async () => {
    const { agent } = await signedInAs(app, t, 'admin')
    const existing = await insertUser(t.db, { email: 'taken@shop.example', name: 'First' })
    const res = await agent.post('/api/users').send({ email: 'taken@shop.example', name: 'Second', role: 'packer', password: 'long-enough-pw' })
    expect(res.status).toBe(409)
    expect(ApiErrorBodySchema.parse(res.body).error.fields).toEqual({ email: 'Already in use' })
    expect((await rowOf(existing.id)).name).toBe('First')
  })

  it('answers a bad new user with 400 and says what to fix per field, creating nothing', async () => {
    const { agent } = await signedInAs(app, t, 'admin')
    const res = await agent.post('/api/users').send({ email: 'x', name: '', role: 'boss', password: 'short', pin: '12ab' })
    expect(res.status).toBe(400)
    const fields = ApiErrorBodySchema.parse(res.body).error.fields ?? {}
    expect(Object.keys(fields).sort()).toEqual(['email', 'name', 'password', 'pin', 'role'])
    expect(fields.password).toMatch(/at least 10/)
    expect(await t.db.select().from(users)).toHaveLength(1)
  })

  it('changes a role, deactivates and reactivates', async () => {
    const { agent } = await signedInAs(app, t, 'admin')
    const u = await insertUser(t.db, { role: 'assembler' })
    const role = await agent.patch(`/api/users/${u.id}`).send({ role: 'packer' })
    expect(role.status).toBe(200)
    expect(UserSchema.parse(role.body).role).toBe('packer')
    const off = await agent.patch(`/api/users/${u.id}`).send({ active: false })
    expect(UserSchema.parse(off.body).active).toBe(false)
    expect((await rowOf(u.id)).active).toBe(false)
    const on = await agent.patch(`/api/users/${u.id}`).send({ active: true })
    expect(UserSchema.parse(on.body).active).toBe(true)
  })

  it('resets a password and a PIN, and removes a PIN', async () => {
    const { agent } = await signedInAs(app, t, 'admin')
    const u = await insertUser(t.db)
    const res = await agent.post(`/api/users/${u.id}/credentials`).send({ password: 'brand-new-password', pin: '2580' })
    expect(res.status).toBe(200)
    const row = await rowOf(u.id)
    expect(await bcrypt.compare('brand-new-password', row.passwordHash)).toBe(true)
    expect(await bcrypt.compare('2580', row.pinHash!)).toBe(true)
    const cleared = await agent.post(`/api/users/${u.id}/credentials`).send({ pin: null })
    expect(UserSchema.parse(cleared.body).hasPin).toBe(false)
    const empty = await agent.post(`/api/users/${u.id}/credentials`).send({})
    expect(empty.status).toBe(400)
  })

  it('keeps the shop from locking itself out: no self-deactivation, at least one active admin', async () => {
    const { agent, user: me } = await signedInAs(app, t, 'admin')
    const self = await agent.patch(`/api/users/${me.id}`).send({ active: false })
    expect(self.status).toBe(409)
    const demote = await agent.patch(`/api/users/${me.id}`).send({ role: 'planner' })
    expect(demote.status).toBe(409)
    expect((await rowOf(me.id)).role).toBe('admin')
    const other = await insertUser(t.db, { role: 'admin' })
    expect((await agent.patch(`/api/users/${other.id}`).send({ active: false })).status).toBe(200)
  })

  it('answers 404 for an unknown user and 400 for a malformed id', async () => {
    const { agent } = await signedInAs(app, t, 'admin')
    expect((await agent.patch('/api/users/6f1c2a52-8d1e-4c55-9a55-0d1f6f3e2b11').send({ name: 'X' })).status).toBe(404)
    const bad = await agent.patch('/api/users/not-a-uuid').send({ name: 'X' })
    expect(bad.status).toBe(400)
    expect(ApiErrorBodySchema.parse(bad.body).error.fields).toHaveProperty('id')
  })
})
