import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { HealthSchema } from '@kitwright/shared/users'
import { createDb } from '../../server/src/db/client'
import { buildApp } from '../support/app'
import { createTestDb, type TestDb } from '../support/test-db'

let t: TestDb
beforeAll(async () => {
  t = await createTestDb()
})
afterAll(() => t.drop())

describe('GET /api/health', () => {
  it('answers 200 with the database up', async () => {
    const res = await request(buildApp(t).app).get('/api/health')
    expect(res.status).toBe(200)
    expect(HealthSchema.parse(res.body)).toEqual({ ok: true, db: 'up' })
  })

  it('answers 503 with "db": "down" when PostgreSQL cannot be reached', async () => {
    // Port 9 on loopback (discard) has no PostgreSQL: connections are refused, as when the cluster is stopped.
    const down = createDb('postgres://app:x@127.0.0.1:9/kitwright')
    try {
      const res = await request(buildApp(down).app).get('/api/health')
      expect(res.status).toBe(503)
      expect(HealthSchema.parse(res.body)).toEqual({ ok: false, db: 'down' })
    } finally {
      await down.pool.end()
    }
  })

  it('answers other API requests with a clear 503 while the database is down', async () => {
    const down = createDb('postgres://app:x@127.0.0.1:9/kitwright')
    try {
      const res = await request(buildApp(down).app).post('/api/auth/sign-in').send({ email: 'a@shop.example', password: 'x' })
      expect(res.status).toBe(503)
      expect(res.body.error.code).toBe('unavailable')
    } finally {
      await down.pool.end()
    }
  })
})
