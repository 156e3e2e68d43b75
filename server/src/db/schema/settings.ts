import { sql } from 'drizzle-orm'
import { boolean, check, integer, pgEnum, pgTable, text } from 'drizzle-orm/pg-core'
import { DIM_WEIGHT_SYSTEMS } from '@kitwright/shared/domain/weights'
import { updatedAt } from './columns'

export const displayUnitEnum = pgEnum('display_unit', ['in', 'mm'])
export const dimWeightSystemEnum = pgEnum('dim_weight_system', DIM_WEIGHT_SYSTEMS)

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
    /** The carrier's dimensional-weight divisor (139 in³/lb is a common figure) and how it is expressed. */
    dimWeightDivisor: integer().notNull().default(139),
    dimWeightSystem: dimWeightSystemEnum().notNull().default('in3_per_lb'),
    /** Ship-from address on labels and packing slips; null until the owner sets it. */
    senderName: text(),
    senderLine1: text(),
    senderLine2: text(),
    senderCity: text(),
    senderRegion: text(),
    senderPostalCode: text(),
    senderCountry: text(),
    senderPhone: text(),
    /** Who customer e-mail comes from (the From name and address); until set, the shop name and MAIL_FROM. */
    mailFromName: text(),
    mailFromAddress: text(),
    /** Where customers' replies go (Reply-To); null: replies go to the From address. */
    replyToAddress: text(),
    /**
     * The carrier the shop ships with, as its shipping service names it and as printed on labels,
     * mails and timelines; rates of other carriers are not offered. Null until the owner sets it.
     */
    carrierName: text(),
    /** The shop's GS1 Company Prefix for SSCCs (the demo's is invented), and the SSCC extension digit. */
    gs1CompanyPrefix: text(),
    ssccExtensionDigit: integer().notNull().default(0),
    /** Working days (Monday to Friday) from the order's placed date to the ship date promised when an order arrives without one. */
    leadTimeDays: integer().notNull().default(7),
    /** When on, the job that takes a paid store order in also releases it (short stock left as a shortage). */
    autoReleasePaid: boolean().notNull().default(false),
    /** How long the nesting engine may plan one cut run by default (ms); "take longer" on a run passes more. */
    nestingTimeLimitMs: integer().notNull().default(2000),
    /** The working day for promise dates: its start (hour, UTC) and length; Monday to Friday. */
    workdayStartHourUtc: integer().notNull().default(8),
    workdayHours: integer().notNull().default(8),
    /** Minutes one unit takes at each bench, until the benches' own history says otherwise. */
    cutMinutesPerUnit: integer().notNull().default(15),
    buildMinutesPerUnit: integer().notNull().default(60),
    packMinutesPerUnit: integer().notNull().default(15),
    updatedAt: updatedAt(),
  },
  (t) => [
    check('shop_settings_single_row', sql`${t.id} = 1`),
    check('shop_settings_lead_time_days_range', sql`${t.leadTimeDays} between 0 and 250`),
    check('shop_settings_workday_range', sql`${t.workdayStartHourUtc} between 0 and 23 and ${t.workdayHours} between 1 and 24`),
    check('shop_settings_minutes_per_unit_range', sql`${t.cutMinutesPerUnit} between 1 and 1440 and ${t.buildMinutesPerUnit} between 1 and 1440 and ${t.packMinutesPerUnit} between 1 and 1440`),
    check('shop_settings_nesting_time_limit_range', sql`${t.nestingTimeLimitMs} between 500 and 120000`),
  ],
)
export type ShopSettingsRow = typeof shopSettings.$inferSelect
