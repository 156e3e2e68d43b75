import { sql } from 'drizzle-orm'
import { check, integer, pgEnum, pgTable, text } from 'drizzle-orm/pg-core'
import { updatedAt } from './columns'

export const displayUnitEnum = pgEnum('display_unit', ['in', 'mm'])

/** The shop's settings: one row (id = 1). Lengths in base units. */
export const shopSettings = pgTable(
  'shop_settings',
  {
    id: integer().primaryKey().default(1),
    shopName: text().notNull(),
    displayUnit: displayUnitEnum().notNull().default('in'),
    kerf: integer().notNull(),
    endTrim: integer().notNull(),
    minOffcut: integer().notNull(),
    updatedAt: updatedAt(),
  },
  (t) => [check('shop_settings_single_row', sql`${t.id} = 1`)],
)
export type ShopSettingsRow = typeof shopSettings.$inferSelect
