import { index, pgEnum, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import { sql } from 'drizzle-orm'
import { BIN_STATUSES } from '@kitwright/shared/cut-runs-status'
import { createdAt, id } from './columns'
import { workOrders } from './orders'

export const binStatusEnum = pgEnum('bin_status', BIN_STATUSES)

/**
 * A reusable tote with a Code 128 label. It is assigned to one work order at the cut bench (by a
 * scan) and travels with it to the pack bench, where it is freed for the next unit.
 */
export const bins = pgTable(
  'bins',
  {
    id: id(),
    code: text().notNull().unique(),
    status: binStatusEnum().notNull().default('free'),
    workOrderId: uuid().references(() => workOrders.id),
    assignedAt: timestamp({ withTimezone: true }),
    createdAt: createdAt(),
  },
  (t) => [index().on(t.status), index('bins_code_upper_index').on(sql`upper(${t.code})`), uniqueIndex('bins_one_per_work_order').on(t.workOrderId).where(sql`${t.workOrderId} is not null`)],
)
export type BinRow = typeof bins.$inferSelect
