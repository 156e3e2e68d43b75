import { randomBytes } from 'node:crypto'
import bcrypt from 'bcryptjs'
import type { Db } from '../../server/src/db/client'
import { parts, users, type NewPartRow, type NewUserRow } from '../../server/src/db/schema/index'

export const TEST_PASSWORD = 'test-password-123'
export const TEST_PIN = '4321'
// Hashed once: bcrypt is slow on purpose.
const PASSWORD_HASH = bcrypt.hashSync(TEST_PASSWORD, 4)
const PIN_HASH = bcrypt.hashSync(TEST_PIN, 4)

export function buildUser(overrides: Partial<NewUserRow> = {}): NewUserRow {
  const tag = randomBytes(4).toString('hex')
  return {
    email: `user-${tag}@shop.example`,
    name: `Test User ${tag}`,
    role: 'assembler',
    passwordHash: PASSWORD_HASH,
    pinHash: PIN_HASH,
    ...overrides,
  }
}

export async function insertUser(db: Db, overrides: Partial<NewUserRow> = {}) {
  const [row] = await db.insert(users).values(buildUser(overrides)).returning()
  return row!
}

export function buildPart(overrides: Partial<NewPartRow> = {}): NewPartRow {
  const tag = randomBytes(4).toString('hex').toUpperCase()
  return { sku: `TST-${tag}`, name: `Test part ${tag}`, kind: 'hardware', unitOfMeasure: 'each', reorderPoint: 0, reorderQuantity: 0, ...overrides }
}

export async function insertPart(db: Db, overrides: Partial<NewPartRow> = {}) {
  const [row] = await db.insert(parts).values(buildPart(overrides)).returning()
  return row!
}
