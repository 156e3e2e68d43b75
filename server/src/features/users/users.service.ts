import bcrypt from 'bcryptjs'
import { and, asc, count, eq, ne } from 'drizzle-orm'
import type { CreateUser, ResetCredentials, UpdateUser, User } from '@kitwright/shared/users'
import type { Db, Tx } from '../../db/client'
import { users } from '../../db/schema/index'
import type { SessionUser } from '../../lib/auth'
import { Conflict, NotFound } from '../../lib/http-errors'
import { toUser } from './users.mapper'

const BCRYPT_ROUNDS = 10

export function hashSecret(secret: string) {
  return bcrypt.hash(secret, BCRYPT_ROUNDS)
}

export async function listUsers(db: Db): Promise<User[]> {
  const rows = await db.select().from(users).orderBy(asc(users.name))
  return rows.map(toUser)
}

export async function createUser(db: Db, input: CreateUser): Promise<User> {
  const [existing] = await db.select({ id: users.id }).from(users).where(eq(users.email, input.email))
  if (existing) throw new Conflict(`A user with the e-mail ${input.email} already exists`, { email: 'Already in use' })
  const [row] = await db
    .insert(users)
    .values({
      email: input.email,
      name: input.name,
      role: input.role,
      passwordHash: await hashSecret(input.password),
      pinHash: input.pin ? await hashSecret(input.pin) : null,
    })
    .returning()
  return toUser(row!)
}

async function lockUser(tx: Tx, id: string) {
  const [row] = await tx.select().from(users).where(eq(users.id, id)).for('update')
  if (!row) throw new NotFound('No such user')
  return row
}

async function otherActiveAdmins(tx: Tx, id: string) {
  const [row] = await tx
    .select({ n: count() })
    .from(users)
    .where(and(eq(users.role, 'admin'), eq(users.active, true), ne(users.id, id)))
  return row?.n ?? 0
}

export async function updateUser(db: Db, id: string, input: UpdateUser, actor: SessionUser): Promise<User> {
  return db.transaction(async (tx) => {
    // Lock every admin row first so two admins demoting each other at once cannot leave the shop with none.
    await tx.select({ id: users.id }).from(users).where(eq(users.role, 'admin')).orderBy(asc(users.id)).for('update')
    const row = await lockUser(tx, id)
    const losesAdmin = row.role === 'admin' && row.active && (input.active === false || (input.role && input.role !== 'admin'))
    if (losesAdmin && id === actor.id) {
      throw new Conflict('You cannot deactivate yourself or give up your own admin role; ask another admin')
    }
    if (losesAdmin && (await otherActiveAdmins(tx, id)) === 0) {
      throw new Conflict('The shop must keep at least one active admin')
    }
    const [updated] = await tx
      .update(users)
      .set({ ...input, updatedAt: new Date() })
      .where(eq(users.id, id))
      .returning()
    return toUser(updated!)
  })
}

export async function resetCredentials(db: Db, id: string, input: ResetCredentials): Promise<User> {
  const set: Partial<typeof users.$inferInsert> = { updatedAt: new Date() }
  if (input.password !== undefined) set.passwordHash = await hashSecret(input.password)
  if (input.pin !== undefined) set.pinHash = input.pin === null ? null : await hashSecret(input.pin)
  const [row] = await db.update(users).set(set).where(eq(users.id, id)).returning()
  if (!row) throw new NotFound('No such user')
  return toUser(row)
}
