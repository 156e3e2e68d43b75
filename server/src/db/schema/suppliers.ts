import { sql } from 'drizzle-orm'
import { boolean, check, integer, pgTable, text, uniqueIndex } from 'drizzle-orm/pg-core'
import { createdAt, id, updatedAt } from './columns'

/**
 * Someone the shop buys parts from. Purchase orders go to `email`; `leadTimeDays` is how long their
 * goods usually take to arrive; `minimumOrderCents` the least they accept on one order.
 */
export const suppliers = pgTable(
  'suppliers',
  {
    id: id(),
    name: text().notNull(),
    contactName: text(),
    email: text(),
    phone: text(),
    leadTimeDays: integer(),
    minimumOrderCents: integer().notNull().default(0),
    active: boolean().notNull().default(true),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [
    uniqueIndex('suppliers_name_lower_unique').on(sql`lower(${t.name})`),
    check('suppliers_minimum_not_negative', sql`${t.minimumOrderCents} >= 0`),
    check('suppliers_lead_time_not_negative', sql`${t.leadTimeDays} >= 0`),
  ],
)
export type SupplierRow = typeof suppliers.$inferSelect
export type NewSupplierRow = typeof suppliers.$inferInsert
