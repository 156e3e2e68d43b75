import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ApiErrorBodySchema } from '@kitwright/shared/errors'
import { PublicUnitRecordSchema } from '@kitwright/shared/public-record'
import { inches } from '@kitwright/shared/domain/units'
import { shopSettings } from '../../server/src/db/schema/index'
import { unitRecordLink } from '../../server/src/features/build/public-record'
import { issueToken } from '../../server/src/lib/auth'
import { buildApp, TEST_TOKENS } from '../support/app'
import { insertBuildRevision, insertBuildWorkOrder } from '../support/build-factories'
import { insertUser } from '../support/factories'
import { createTestDb, type TestDb } from '../support/test-db'

let t: TestDb
let app: ReturnType<typeof buildApp>['app']
let serial: string

beforeAll(async () => {
  t = await createTestDb()
  app = buildApp(t).app
  await t.db.insert(shopSettings).values({ id: 1, shopName: 'Test Tote Shop', kerf: inches(1 / 8), endTrim: 0, minOffcut: inches(6) })
  const { kit, revision } = await insertBuildRevision(t.db)
  serial = (await insertBuildWorkOrder(t.db, revision.id, kit.id, 'built')).serial
})
afterAll(() => t.drop())

const tokenOf = (link: string) => link.split('/record/')[1]!

describe("the customer's build-record link", () => {
  it('opens the record of its unit without signing in, and names no staff', async () => {
    const link = await unitRecordLink(TEST_TOKENS, 'https://shop.example', serial)
    expect(link).toMatch(/^https:\/\/shop\.example\/record\/[\w-]+\.[\w-]+\.[\w-]+$/)
    const res = await request(app).get(`/api/public/unit-records/${tokenOf(link)}`)
    expect(res.status).toBe(200)
    const record = PublicUnitRecordSchema.parse(res.body)
    expect(record).toMatchObject({ serial, shopName: 'Test Tote Shop', revisionCode: 'A' })
    expect(record.steps).toHaveLength(4)
    expect(JSON.stringify(res.body)).not.toMatch(/"by"|"name":"Test User/)
  })

  it('refuses a changed link and a session token, with a message that says what to do', async () => {
    const token = tokenOf(await unitRecordLink(TEST_TOKENS, 'https://shop.example', serial))
    const tampered = `${token.slice(0, -2)}xx`
    const bad = await request(app).get(`/api/public/unit-records/${tampered}`)
    expect(bad.status).toBe(404)
    expect(ApiErrorBodySchema.parse(bad.body).error.message).toMatch(/Copy the whole link/)
    // A sign-in token is signed with the same secret but for another audience: no use here.
    const user = await insertUser(t.db)
    expect((await request(app).get(`/api/public/unit-records/${await issueToken(TEST_TOKENS, user.id)}`)).status).toBe(404)
  })
})
