import { relations, sql } from 'drizzle-orm'
import { bigint, boolean, check, index, integer, pgEnum, pgSequence, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core'
import { CUT_RUN_STATUSES, CUT_STATUSES, CUT_STICK_STATUSES, PLAN_STATUSES } from '@kitwright/shared/cut-runs-status'
import { createdAt, id } from './columns'
import { cutParts } from './kits'
import { workOrders } from './orders'
import { parts } from './parts'
import { offcuts } from './stock'
import { users } from './users'

export const cutRunStatusEnum = pgEnum('cut_run_status', CUT_RUN_STATUSES)
export const cutStickStatusEnum = pgEnum('cut_stick_status', CUT_STICK_STATUSES)
export const cutStatusEnum = pgEnum('cut_status', CUT_STATUSES)
export const planStatusEnum = pgEnum('plan_status', PLAN_STATUSES)

/** Numbers of cut runs (CR-0001, …), shop-wide and never reused. */
export const cutRunNumberSeq = pgSequence('cut_run_number_seq', { startWith: 1 })

const length = () => bigint({ mode: 'number' }).notNull().default(0)

/**
 * One nesting of the cut parts of chosen work orders. The kerf, trim and minimum offcut it was
 * planned with are kept, and so are the plan's totals and lower bounds (summed over the pipe parts),
 * so the plan can be judged later. Publishing freezes it and reserves its sticks and offcuts.
 */
export const cutRuns = pgTable(
  'cut_runs',
  {
    id: id(),
    number: text().notNull().unique(),
    status: cutRunStatusEnum().notNull().default('draft'),
    kerf: integer().notNull(),
    endTrim: integer().notNull(),
    minOffcut: integer().notNull(),
    planStatus: planStatusEnum().notNull(),
    /** Cost of the new sticks (by default a stick costs its length). */
    stockCost: length(),
    lowerBoundCost: length(),
    sticksUsed: integer().notNull().default(0),
    lowerBoundSticks: integer().notNull().default(0),
    offcutsUsed: integer().notNull().default(0),
    offcutsMade: integer().notNull().default(0),
    lengthUsed: length(),
    pieceLength: length(),
    kerfLoss: length(),
    trimLoss: length(),
    offcutLength: length(),
    scrapLength: length(),
    solveMs: integer().notNull().default(0),
    /** Why the plan has no proof, when the LP solver could not be loaded (the greedy plan was kept). */
    solverNote: text(),
    createdBy: uuid().references(() => users.id),
    createdAt: createdAt(),
    publishedBy: uuid().references(() => users.id),
    publishedAt: timestamp({ withTimezone: true }),
    completedAt: timestamp({ withTimezone: true }),
    cancelledAt: timestamp({ withTimezone: true }),
  },
  (t) => [index().on(t.status, t.createdAt)],
)
export type CutRunRow = typeof cutRuns.$inferSelect
export type NewCutRunRow = typeof cutRuns.$inferInsert

/**
 * One stick of a cut run: a new stick of a stock length, or an existing offcut. `position` is the
 * order at the saw; sticks of one pattern share `patternIndex`. A remnant at or above the minimum
 * becomes an offcut in stock (`offcutId`) when the stick is done.
 */
export const cutRunSticks = pgTable(
  'cut_run_sticks',
  {
    id: id(),
    cutRunId: uuid().notNull().references(() => cutRuns.id, { onDelete: 'cascade' }),
    partId: uuid().notNull().references(() => parts.id),
    /** The stock length of a new stick; null when the stick is an existing offcut. */
    stickLength: integer(),
    sourceOffcutId: uuid().references(() => offcuts.id),
    length: integer().notNull(),
    trim: integer().notNull().default(0),
    patternIndex: integer().notNull(),
    position: integer().notNull(),
    status: cutStickStatusEnum().notNull().default('pending'),
    remnant: integer().notNull(),
    remnantIsOffcut: boolean().notNull(),
    /** The offcut this stick's remnant became. */
    offcutId: uuid().references(() => offcuts.id),
    /** Set on sticks added by a re-plan after a damaged stick. */
    replanOfStickId: uuid(),
    startedBy: uuid().references(() => users.id),
    startedAt: timestamp({ withTimezone: true }),
    finishedAt: timestamp({ withTimezone: true }),
    damagedReason: text(),
    damagedBy: uuid().references(() => users.id),
    damagedAt: timestamp({ withTimezone: true }),
  },
  (t) => [
    index().on(t.cutRunId, t.position),
    check('cut_run_sticks_one_source', sql`(${t.stickLength} is null) <> (${t.sourceOffcutId} is null)`),
    check('cut_run_sticks_length_positive', sql`${t.length} > 0`),
  ],
)
export type CutRunStickRow = typeof cutRunSticks.$inferSelect
export type NewCutRunStickRow = typeof cutRunSticks.$inferInsert

/** One piece cut from a stick, in cutting order, for one work order's cut part; ticked at the bench with who and when. */
export const cutRunCuts = pgTable(
  'cut_run_cuts',
  {
    id: id(),
    cutRunId: uuid().notNull().references(() => cutRuns.id, { onDelete: 'cascade' }),
    stickId: uuid().notNull().references(() => cutRunSticks.id, { onDelete: 'cascade' }),
    position: integer().notNull(),
    /** Distance from the stick's start to the start of the piece. */
    offset: integer().notNull(),
    length: integer().notNull(),
    workOrderId: uuid().notNull().references(() => workOrders.id),
    cutPartId: uuid().notNull().references(() => cutParts.id),
    status: cutStatusEnum().notNull().default('pending'),
    cutBy: uuid().references(() => users.id),
    cutAt: timestamp({ withTimezone: true }),
    /** The cut this one replaces after a re-plan. */
    replacesCutId: uuid(),
  },
  (t) => [index().on(t.stickId, t.position), index().on(t.cutRunId), index().on(t.workOrderId, t.status), check('cut_run_cuts_length_positive', sql`${t.length} > 0`)],
)
export type CutRunCutRow = typeof cutRunCuts.$inferSelect
export type NewCutRunCutRow = typeof cutRunCuts.$inferInsert

export const cutRunsRelations = relations(cutRuns, ({ many }) => ({ sticks: many(cutRunSticks), cuts: many(cutRunCuts) }))
export const cutRunSticksRelations = relations(cutRunSticks, ({ one, many }) => ({
  cutRun: one(cutRuns, { fields: [cutRunSticks.cutRunId], references: [cutRuns.id] }),
  cuts: many(cutRunCuts),
}))
export const cutRunCutsRelations = relations(cutRunCuts, ({ one }) => ({
  cutRun: one(cutRuns, { fields: [cutRunCuts.cutRunId], references: [cutRuns.id] }),
  stick: one(cutRunSticks, { fields: [cutRunCuts.stickId], references: [cutRunSticks.id] }),
}))
