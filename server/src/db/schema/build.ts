import { relations, sql } from 'drizzle-orm'
import { boolean, check, index, integer, numeric, pgEnum, pgTable, text, timestamp, unique, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import { LEAK_PLACES, PRESSURE_UNITS } from '@kitwright/shared/domain/leak-test'
import { createdAt, id } from './columns'
import { buildSteps } from './kits'
import { workOrders } from './orders'
import { users } from './users'

export const leakPlaceEnum = pgEnum('leak_place', LEAK_PLACES)
export const pressureUnitEnum = pgEnum('pressure_unit', PRESSURE_UNITS)

/**
 * A build step ticked for one unit, with who and when and the measurement it took. An undo sets
 * `undoneAt`; rows are never deleted, so the build record keeps every tick and every undo. At most
 * one tick per step and unit stands (is not undone) at a time.
 */
export const buildStepTicks = pgTable(
  'build_step_ticks',
  {
    id: id(),
    workOrderId: uuid().notNull().references(() => workOrders.id),
    buildStepId: uuid().notNull().references(() => buildSteps.id),
    tickedBy: uuid().notNull().references(() => users.id),
    tickedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    /** In the step's measurement unit. */
    measurement: numeric(),
    /** The measurement fell outside the step's limits; recorded all the same. */
    outOfLimits: boolean().notNull().default(false),
    /** Why an out-of-limits measurement was recorded all the same (required with one). */
    outOfLimitsReason: text(),
    undoneAt: timestamp({ withTimezone: true }),
    undoneBy: uuid().references(() => users.id),
  },
  (t) => [
    index().on(t.workOrderId),
    // Units built per day (reports): the standing ticks of a range, read from the index alone.
    index('build_step_ticks_standing_at').on(t.tickedAt, t.workOrderId).where(sql`${t.undoneAt} is null`),
    uniqueIndex('build_step_ticks_one_standing').on(t.workOrderId, t.buildStepId).where(sql`${t.undoneAt} is null`),
    check('build_step_ticks_undo_has_who', sql`(${t.undoneAt} is null) = (${t.undoneBy} is null)`),
  ],
)
export type BuildStepTickRow = typeof buildStepTicks.$inferSelect

/**
 * A photo of a unit in the S3 bucket, for a step or for the unit as a whole. The row is written when
 * the upload is presigned (what was promised: type and size); `uploadedAt` is set only once a HEAD
 * found the object as promised. Rows with no `uploadedAt` are uploads that never finished.
 */
export const unitPhotos = pgTable(
  'unit_photos',
  {
    id: id(),
    workOrderId: uuid().notNull().references(() => workOrders.id),
    buildStepId: uuid().references(() => buildSteps.id),
    key: text().notNull().unique(),
    contentType: text().notNull(),
    size: integer().notNull(),
    uploadedBy: uuid().notNull().references(() => users.id),
    uploadedAt: timestamp({ withTimezone: true }),
    createdAt: createdAt(),
  },
  (t) => [index().on(t.workOrderId), check('unit_photos_size_positive', sql`${t.size} > 0`)],
)
export type UnitPhotoRow = typeof unitPhotos.$inferSelect

/**
 * One leak test of one unit. A retest after rework is a new row with the next attempt number, so
 * first-pass yield is the share of units whose attempt 1 passed. Pressures in pascals; `passed` and
 * `reason` are computed on the server from the revision's protocol (shared/domain/leak-test.ts).
 */
export const leakTests = pgTable(
  'leak_tests',
  {
    id: id(),
    workOrderId: uuid().notNull().references(() => workOrders.id),
    attempt: integer().notNull(),
    startPressurePa: integer().notNull(),
    endPressurePa: integer().notNull(),
    holdMinutes: integer().notNull(),
    waterVolumeMl: integer().notNull(),
    leaks: leakPlaceEnum().array().notNull().default(sql`'{}'`),
    leakNote: text(),
    /** The unit the gauge was read in, to show the readings back the same way. */
    enteredUnit: pressureUnitEnum().notNull(),
    passed: boolean().notNull(),
    /** Why it failed (every failed check), null when it passed. */
    reason: text(),
    testedBy: uuid().notNull().references(() => users.id),
    testedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    unique().on(t.workOrderId, t.attempt),
    // Units built per day and first-pass yield (reports): the tests of a range.
    index().on(t.testedAt, t.workOrderId),
    check('leak_tests_attempt_positive', sql`${t.attempt} > 0`),
  ],
)
export type LeakTestRow = typeof leakTests.$inferSelect

/** A unit sent to rework, with why; resolved when a later leak test passes. */
export const reworkEntries = pgTable(
  'rework_entries',
  {
    id: id(),
    workOrderId: uuid().notNull().references(() => workOrders.id),
    /** The failed leak test that sent it, when one did. */
    leakTestId: uuid().references(() => leakTests.id),
    /** The out-of-limits measurement that sent it, when one did; resolved when that tick is undone. */
    stepTickId: uuid().references(() => buildStepTicks.id),
    reason: text().notNull(),
    createdBy: uuid().notNull().references(() => users.id),
    createdAt: createdAt(),
    resolvedAt: timestamp({ withTimezone: true }),
    resolvedBy: uuid().references(() => users.id),
  },
  (t) => [index().on(t.workOrderId)],
)
export type ReworkEntryRow = typeof reworkEntries.$inferSelect

export const buildStepTicksRelations = relations(buildStepTicks, ({ one }) => ({
  workOrder: one(workOrders, { fields: [buildStepTicks.workOrderId], references: [workOrders.id] }),
  step: one(buildSteps, { fields: [buildStepTicks.buildStepId], references: [buildSteps.id] }),
}))
export const unitPhotosRelations = relations(unitPhotos, ({ one }) => ({
  workOrder: one(workOrders, { fields: [unitPhotos.workOrderId], references: [workOrders.id] }),
}))
export const leakTestsRelations = relations(leakTests, ({ one }) => ({
  workOrder: one(workOrders, { fields: [leakTests.workOrderId], references: [workOrders.id] }),
}))
export const reworkEntriesRelations = relations(reworkEntries, ({ one }) => ({
  workOrder: one(workOrders, { fields: [reworkEntries.workOrderId], references: [workOrders.id] }),
}))
