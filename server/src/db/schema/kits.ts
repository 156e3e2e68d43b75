import { relations, sql } from 'drizzle-orm'
import { boolean, check, index, integer, jsonb, numeric, pgEnum, pgTable, text, timestamp, unique, uuid } from 'drizzle-orm/pg-core'
import { REVISION_STATUSES } from '@kitwright/shared/kits'
import { createdAt, id, updatedAt } from './columns'
import { parts } from './parts'
import { users } from './users'

export const revisionStatusEnum = pgEnum('revision_status', REVISION_STATUSES)

/** What the web store sells; `storeProductId` maps the store's product to it. */
export const kits = pgTable('kits', {
  id: id(),
  sku: text().notNull().unique(),
  name: text().notNull(),
  storeProductId: text().unique(),
  description: text(),
  /** The kit's list price in cents: a phone order's unit price starts from it. */
  priceCents: integer(),
  createdAt: createdAt(),
  updatedAt: updatedAt(),
}, (t) => [check('kits_price_not_negative', sql`${t.priceCents} >= 0`)])
export type KitRow = typeof kits.$inferSelect

/**
 * A kit revision freezes the bill of materials, cut parts, build steps and leak test protocol.
 * Only a draft may change; releasing it makes it read-only for good (editing starts a new draft).
 * Leak test pressures are in pascals; water volume in millilitres.
 */
export const kitRevisions = pgTable(
  'kit_revisions',
  {
    id: id(),
    kitId: uuid().notNull().references(() => kits.id),
    code: text().notNull(),
    status: revisionStatusEnum().notNull().default('draft'),
    notes: text(),
    /** The frame calculator's inputs (shared/domain/frame.ts FrameInputs), when the cut parts are derived. */
    frameInputs: jsonb(),
    leakTestMinPressurePa: integer(),
    leakTestMaxPressurePa: integer(),
    leakTestHoldMinutes: integer(),
    leakTestMaxDropPa: integer(),
    leakTestWaterVolumeMl: integer(),
    releasedAt: timestamp({ withTimezone: true }),
    releasedBy: uuid().references(() => users.id),
    retiredAt: timestamp({ withTimezone: true }),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [unique().on(t.kitId, t.code), index().on(t.kitId, t.status)],
)
export type KitRevisionRow = typeof kitRevisions.$inferSelect

/** One line of a revision's bill of materials (hardware and packaging; pipe comes in as cut parts). */
export const bomLines = pgTable(
  'bom_lines',
  {
    id: id(),
    revisionId: uuid().notNull().references(() => kitRevisions.id, { onDelete: 'cascade' }),
    partId: uuid().notNull().references(() => parts.id),
    quantity: integer().notNull(),
    position: integer().notNull(),
    note: text(),
  },
  (t) => [index().on(t.revisionId), check('bom_lines_quantity_positive', sql`${t.quantity} > 0`)],
)
export type BomLineRow = typeof bomLines.$inferSelect

/**
 * A piece of pipe cut from a stock_length part. `calculatedLength` is what the frame calculator
 * derived; when the planner overrides it, `length` differs and `overrideReason` says why.
 */
export const cutParts = pgTable(
  'cut_parts',
  {
    id: id(),
    revisionId: uuid().notNull().references(() => kitRevisions.id, { onDelete: 'cascade' }),
    partId: uuid().notNull().references(() => parts.id),
    frameKey: text(),
    label: text().notNull(),
    length: integer().notNull(),
    quantity: integer().notNull(),
    calculatedLength: integer(),
    overrideReason: text(),
    position: integer().notNull(),
  },
  (t) => [
    index().on(t.revisionId),
    check('cut_parts_length_positive', sql`${t.length} > 0`),
    check('cut_parts_quantity_positive', sql`${t.quantity} > 0`),
  ],
)
export type CutPartRow = typeof cutParts.$inferSelect

/** A step at the build bench, in order, with its caution and what it must record. */
export const buildSteps = pgTable(
  'build_steps',
  {
    id: id(),
    revisionId: uuid().notNull().references(() => kitRevisions.id, { onDelete: 'cascade' }),
    position: integer().notNull(),
    text: text().notNull(),
    caution: text(),
    photoRequired: boolean().notNull().default(false),
    measurementRequired: boolean().notNull().default(false),
    measurementUnit: text(),
    measurementMin: numeric(),
    measurementMax: numeric(),
    /** May be done at any point of the build; the other steps go in order. */
    freeOrder: boolean().notNull().default(false),
    /** A measurement outside the limits sends the unit to rework (otherwise it is flagged, with its reason). */
    outOfLimitsRework: boolean().notNull().default(false),
  },
  (t) => [index().on(t.revisionId)],
)
export type BuildStepRow = typeof buildSteps.$inferSelect

export const kitsRelations = relations(kits, ({ many }) => ({ revisions: many(kitRevisions) }))
export const kitRevisionsRelations = relations(kitRevisions, ({ one, many }) => ({
  kit: one(kits, { fields: [kitRevisions.kitId], references: [kits.id] }),
  bomLines: many(bomLines),
  cutParts: many(cutParts),
  buildSteps: many(buildSteps),
}))
export const bomLinesRelations = relations(bomLines, ({ one }) => ({
  revision: one(kitRevisions, { fields: [bomLines.revisionId], references: [kitRevisions.id] }),
  part: one(parts, { fields: [bomLines.partId], references: [parts.id] }),
}))
export const cutPartsRelations = relations(cutParts, ({ one }) => ({
  revision: one(kitRevisions, { fields: [cutParts.revisionId], references: [kitRevisions.id] }),
  part: one(parts, { fields: [cutParts.partId], references: [parts.id] }),
}))
export const buildStepsRelations = relations(buildSteps, ({ one }) => ({
  revision: one(kitRevisions, { fields: [buildSteps.revisionId], references: [kitRevisions.id] }),
}))
