import bcrypt from 'bcryptjs'
import { eq } from 'drizzle-orm'
import type { SignIn } from '@kitwright/shared/auth'
import type { Db } from '../../db/client'
import { users } from '../../db/schema/index'
import type { SessionUser } from '../../lib/auth'
import { Unauthenticated } from '../../lib/http-errors'
import { assertNotThrottled, clearFailures, recordFailure } from './sign-in-throttle'

// Compared against when the e-mail is unknown, so a wrong e-mail costs the same time as a wrong password.
const DUMMY_HASH = bcrypt.hashSync('kitwright-no-such-user', 10)

export async function signIn(db: Db, input: SignIn, address: string): Promise<SessionUser> {
  await assertNotThrottled(db, input.email, address)
  const [user] = await db.select().from(users).where(eq(users.email, input.email))
  const secret = 'password' in input ? input.password : input.pin
  const hash = 'password' in input ? user?.passwordHash : user?.pinHash
  const matches = await bcrypt.compare(secret, hash ?? DUMMY_HASH)
  if (!user || !hash || !matches) {
    await recordFailure(db, input.email, address)
    throw new Unauthenticated('pin' in input ? 'That e-mail and PIN do not match' : 'That e-mail and password do not match')
  }
  if (!user.active) throw new Unauthenticated('This account is deactivated; ask the owner to turn it back on')
  await clearFailures(db, input.email, address)
  return { id: user.id, email: user.email, name: user.name, role: user.role }
}
