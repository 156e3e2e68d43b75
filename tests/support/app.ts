import request from 'supertest'
import type { Role } from '@kitwright/shared/roles'
import { createApp } from '../../server/src/app'
import type { Deps } from '../../server/src/deps'
import { createLogger } from '../../server/src/lib/logger'
import type { TestDb } from './test-db'
import { insertUser, TEST_PASSWORD } from './factories'

export const TEST_TOKENS: Deps['tokens'] = {
  secret: new TextEncoder().encode('kitwright-test-secret-0123456789abcdef'),
  lifetimeSeconds: 30 * 60,
  secureCookies: false,
}

export function buildApp(t: Pick<TestDb, 'db' | 'pool'>) {
  return createApp({ db: t.db, pool: t.pool, logger: createLogger('silent'), tokens: TEST_TOKENS })
}

/** A supertest agent that keeps cookies, signed in as a new user of `role`. */
export async function signedInAs(app: ReturnType<typeof buildApp>['app'], t: TestDb, role: Role) {
  const user = await insertUser(t.db, { role })
  const agent = request.agent(app)
  const res = await agent.post('/api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD })
  if (res.status !== 200) throw new Error(`sign-in as ${role} failed: ${res.status} ${JSON.stringify(res.body)}`)
  return { agent, user }
}
