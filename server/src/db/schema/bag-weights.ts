import { relations, sql } from 'drizzle-orm'
import { boolean, check, index, integer, jsonb, pgEnum, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core'
import { SPREAD_SOURCES, WEIGHT_SOURCES } from '@kitwright/shared/bag-weights'
import { id } from './columns'
import { orders, workOrders } from './orders'
import { parts } from './parts'
import { users } from './users'

export const spreadSourceEnum = pgEnum('spread_source', SPREAD_SOURCES)
export const weightSourceEnum = pgEnum('weight_source', WEIGHT_SOURCES)

/**
 * A part's unit weight, measured at the bench by weighing a counted sample. Each measurement is a new
 * row (who and when kept); the latest row of a part is its unit weight. Weights in whole milligrams;
 * the unit weight is kept to 10 mg. `spreadMg` is how far one piece may be from it (±), from a few
 * pieces weighed one by one (`singlesMg`) or typed as the part's tolerance. `packedLoose`: the part
 * goes loose in a built kit's hardware bag (net cups, collars) rather than being fitted at the build
 * bench (sprayers, fittings); in a pack with no build every part goes in the bag.
 */
export const unitWeightSamples = pgTable(
  'unit_weight_samples',
  {
    id: id(),
    partId: uuid().notNull().references(() => parts.id),
    sampleCount: integer().notNull(),
    sampleMg: integer().notNull(),
    unitMg: integer().notNull(),
    spreadMg: integer().notNull(),
    spreadSource: spreadSourceEnum().notNull(),
    singlesMg: integer().array().notNull().default(sql`'{}'::integer[]`),
    packedLoose: boolean().notNull().default(false),
    recordedBy: uuid().notNull().references(() => users.id),
    recordedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index().on(t.partId, t.recordedAt),
    check('unit_weight_samples_count_positive', sql`${t.sampleCount} > 0`),
    check('unit_weight_samples_weights_positive', sql`${t.sampleMg} > 0 and ${t.unitMg} > 0 and ${t.spreadMg} >= 0`),
  ],
)
export type UnitWeightSampleRow = typeof unitWeightSamples.$inferSelect

/**
 * One weighing of a hardware bag at the pack bench: what it should have weighed, the tolerance, what
 * the scale said, the verdict and its likely missing or extra parts. The contents are kept as they
 * were weighed. `requestKey` makes a retried weighing (a lost answer, an offline queue) land once.
 */
export const bagWeighings = pgTable(
  'bag_weighings',
  {
    id: id(),
    requestKey: uuid().unique(),
    orderId: uuid().notNull().references(() => orders.id),
    workOrderId: uuid().notNull().references(() => workOrders.id),
    itemKey: text().notNull(),
    measuredMg: integer().notNull(),
    enteredAs: text().notNull(),
    source: weightSourceEnum().notNull(),
    expectedMg: integer().notNull(),
    toleranceMg: integer().notNull(),
    differenceMg: integer().notNull(),
    accepted: boolean().notNull(),
    contents: jsonb().notNull(),
    explanations: jsonb().notNull(),
    words: text().notNull(),
    weighedBy: uuid().notNull().references(() => users.id),
    weighedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index().on(t.workOrderId, t.itemKey, t.weighedAt),
    index().on(t.orderId),
    check('bag_weighings_measured_not_negative', sql`${t.measuredMg} >= 0 and ${t.toleranceMg} >= 0 and ${t.expectedMg} > 0`),
  ],
)
export type BagWeighingRow = typeof bagWeighings.$inferSelect

export const unitWeightSamplesRelations = relations(unitWeightSamples, ({ one }) => ({
  part: one(parts, { fields: [unitWeightSamples.partId], references: [parts.id] }),
}))
export const bagWeighingsRelations = relations(bagWeighings, ({ one }) => ({
  workOrder: one(workOrders, { fields: [bagWeighings.workOrderId], references: [workOrders.id] }),
}))
