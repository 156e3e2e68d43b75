import { relations } from 'drizzle-orm'
import { boolean, check, index, integer, pgEnum, pgTable, text, uuid } from 'drizzle-orm/pg-core'
import { sql } from 'drizzle-orm'
import { PART_KINDS } from '@kitwright/shared/parts'
import { createdAt, id, updatedAt } from './columns'
import { suppliers } from './suppliers'

export const partKindEnum = pgEnum('part_kind', PART_KINDS)

/**
 * Anything the shop stocks. Pipe (`stock_length`) is bought in sticks: its stick lengths, nominal
 * size and outside diameter are set; for other kinds they are null / empty.
 * Lengths are integers in the base unit of shared/domain/units.ts; money in cents; weight in grams.
 */
export const parts = pgTable(
  'parts',
  {
    id: id(),
    sku: text().notNull().unique(),
    name: text().notNull(),
    kind: partKindEnum().notNull(),
    unitOfMeasure: text().notNull().default('each'),
    unitCostCents: integer().notNull().default(0),
    /** Weight of one unit (one stick for pipe), in grams; used for shipping weight. */
    weightGrams: integer().notNull().default(0),
    /** The supplier's name as typed before suppliers were records; kept for the record, no longer edited. */
    supplier: text(),
    /** Who the shop buys it from (see suppliers); purchase orders from shortages go to them. */
    supplierId: uuid().references(() => suppliers.id),
    leadTimeDays: integer(),
    reorderPoint: integer().notNull().default(0),
    reorderQuantity: integer().notNull().default(0),
    shelfLocation: text(),
    nominalSize: text(),
    outsideDiameter: integer(),
    stickLengths: integer().array().notNull().default(sql`'{}'::integer[]`),
    /** Runs on mains power (a pump, a timer): a box holding one gets the electrical cautions on its care sheet. */
    electrical: boolean().notNull().default(false),
    /** Received and fitted by the supplier's lot (a pump, sprayers): receiving asks for the lot, the build bench records it, recalls find it. */
    lotTracked: boolean().notNull().default(false),
    /**
     * Customs: the Harmonized System tariff number (6-digit subheading, up to 10 digits with a
     * country's own extension, digits only), the ISO 3166-1 alpha-2 country of origin, and the plain
     * words for the declaration. Net weight is `weightGrams`; value comes from the order line price.
     */
    hsCode: text(),
    originCountry: text(),
    customsDescription: text(),
    active: boolean().notNull().default(true),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [
    index().on(t.kind),
    // The scan lookup matches SKUs whatever their case.
    index('parts_sku_upper_index').on(sql`upper(${t.sku})`),
    check('parts_cost_not_negative', sql`${t.unitCostCents} >= 0`),
    check('parts_weight_not_negative', sql`${t.weightGrams} >= 0`),
    check('parts_hs_code_digits', sql`${t.hsCode} ~ '^[0-9]{6,10}$'`),
    check('parts_origin_country_alpha2', sql`${t.originCountry} ~ '^[A-Z]{2}$'`),
  ],
)
export type PartRow = typeof parts.$inferSelect
export type NewPartRow = typeof parts.$inferInsert

export const partsRelations = relations(parts, () => ({}))
