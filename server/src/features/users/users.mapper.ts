import type { User } from '@kitwright/shared/users'
import type { UserRow } from '../../db/schema/index'

export function toUser(row: UserRow): User {
  return {
    id: row.id,
    email: row.email,
    name: row.name,
    role: row.role,
    active: row.active,
    hasPin: row.pinHash !== null,
    createdAt: row.createdAt.toISOString(),
  }
}
