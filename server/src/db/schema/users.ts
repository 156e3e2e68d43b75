import { boolean, index, pgEnum, pgTable, text, timestamp } from 'drizzle-orm/pg-core'
import { ROLES } from '@kitwright/shared/roles'
import { createdAt, id, updatedAt } from './columns'

export const roleEnum = pgEnum('role', ROLES)

export const users = pgTable('users', {
  id: id(),
  email: text().notNull().unique(),
  name: text().notNull(),
  role: roleEnum().notNull(),
  active: boolean().notNull().default(true),
  passwordHash: text().notNull(),
  pinHash: text(),
  createdAt: createdAt(),
  updatedAt: updatedAt(),
})
export type UserRow = typeof users.$inferSelect
export type NewUserRow = typeof users.$inferInsert

/**
 * Failed sign-ins, kept in the database (not in memory) so the throttle holds across API processes.
 * Rows older than the throttle window are pruned on the next failure.
 */
export const signInFailures = pgTable(
  'sign_in_failures',
  {
    id: id(),
    email: text().notNull(),
    address: text().notNull(),
    failedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index().on(t.email, t.address, t.failedAt)],
)
