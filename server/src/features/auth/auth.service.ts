import bcrypt from 'bcryptjs'
import { and, asc, eq, inArray, isNotNull } from 'drizzle-orm'
import type { BenchDevice, BenchPerson, SignIn } from '@kitwright/shared/auth'
import type { Role } from '@kitwright/shared/roles'
import type { Db } from '../../db/client'
import { users } from '../../db/schema/index'
import type { SessionUser } from '../../lib/auth'
import { Unauthenticated } from '../../lib/http-errors'
import { assertNotThrottled, clearFailures, recordFailure } from './sign-in-throttle'

// Compared against when the e-mail is unknown, so a wrong e-mail costs the same time as a wrong password.
const DUMMY_HASH = bcrypt.hashSync('kitwright-no-such-user', 10)

/** Who works at each bench. */
const BENCH_ROLES: Record<BenchDevice, Role> = { cut: 'cutter', build: 'assembler', pack: 'packer' }

/**
 * The names a bench's sign-in screen lists: active people of that bench's role (or of every bench
 * role) who have a PIN. Only the display name and the id to sign in with; nobody is signed in yet.
 */
export async function benchPeople(db: Db, bench: BenchDevice | undefined): Promise<BenchPerson[]> {
  const roles = bench ? [BENCH_ROLES[bench]] : Object.values(BENCH_ROLES)
  return db
    .select({ id: users.id, name: users.name })
    .from(users)
    .where(and(inArray(users.role, roles), eq(users.active, true), isNotNull(users.pinHash)))
    .orderBy(asc(users.name))
}

export async function signIn(db: Db, input: SignIn, address: string): Promise<SessionUser> {
  if ('userId' in input) return signInByName(db, input, address)
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

/**
 * A bench sign-in: the name picked from the list and the PIN. Failures count against the same
 * account as its e-mail sign-ins (one throttle per person and device), and the messages name the
 * person as the list did, never their e-mail.
 */
async function signInByName(db: Db, input: { userId: string; pin: string }, address: string): Promise<SessionUser> {
  const [user] = await db.select().from(users).where(eq(users.id, input.userId))
  const key = user?.email ?? `user:${input.userId}`
  await assertNotThrottled(db, key, address, new Date(), user?.name ?? 'that name')
  const matches = await bcrypt.compare(input.pin, user?.pinHash ?? DUMMY_HASH)
  if (!user || !user.pinHash || !matches) {
    await recordFailure(db, key, address)
    throw new Unauthenticated(user ? `That is not ${user.name}'s PIN; try again` : 'That name is not on this bench any more; pick yours from the list again')
  }
  if (!user.active) throw new Unauthenticated('This account is deactivated; ask the owner to turn it back on')
  await clearFailures(db, key, address)
  return { id: user.id, email: user.email, name: user.name, role: user.role }
}
