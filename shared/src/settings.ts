import { z } from 'zod'
import { countryCodeSchema } from './customs'

/** The shop's settings as the API shows them; lengths in base units. */
export const ShopSettingsSchema = z.object({
  shopName: z.string(),
  displayUnit: z.enum(['in', 'mm']),
  kerf: z.number().int().min(0),
  endTrim: z.number().int().min(0),
  minOffcut: z.number().int().min(0),
  /** Working days from an order's placed date to the ship date promised when it arrives without one. */
  leadTimeDays: z.number().int().min(0),
  /** Whether the job that takes a paid store order in also releases it (allowing a shortage). */
  autoReleasePaid: z.boolean(),
  /** How long the nesting engine may plan one cut run unless the planner asks for longer, in seconds. */
  nestingTimeLimitSeconds: z.number(),
  /** The working day promise dates count in: its start (hour, UTC) and length in hours. */
  workdayStartHourUtc: z.number().int(),
  workdayHours: z.number().int(),
  /** Minutes one unit takes at each bench until the benches' history says otherwise. */
  cutMinutesPerUnit: z.number().int(),
  buildMinutesPerUnit: z.number().int(),
  packMinutesPerUnit: z.number().int(),
})
/** The shop's settings as the API shows them. */
export type ShopSettings = z.infer<typeof ShopSettingsSchema>

const minutesPerUnit = (bench: string) =>
  z.number({ error: `Enter the minutes one unit takes at the ${bench} bench` }).int('Whole minutes').min(1, 'At least 1 minute').max(1440, 'At most a day (1440 minutes)')

/** What the admin may change in the shop's settings. */
export const UpdateShopSettingsSchema = z
  .object({
    shopName: z.string().trim().min(1, 'Enter the shop name').max(120),
    displayUnit: z.enum(['in', 'mm']),
    kerf: z.number().int().min(0, 'Cannot be negative'),
    endTrim: z.number().int().min(0, 'Cannot be negative'),
    minOffcut: z.number().int().min(0, 'Cannot be negative'),
    leadTimeDays: z.number({ error: 'Enter the lead time in working days' }).int('Use a whole number of working days').min(0, 'Cannot be negative').max(250, 'At most 250 working days (about a year)'),
    autoReleasePaid: z.boolean({ error: 'Say yes or no' }),
    nestingTimeLimitSeconds: z
      .number({ error: 'Enter the planning time in seconds' })
      .min(0.5, 'At least half a second')
      .max(120, 'At most 120 seconds'),
    workdayStartHourUtc: z.number({ error: 'Enter the hour the working day starts (0–23, UTC)' }).int('A whole hour').min(0, 'From 0').max(23, 'At most 23'),
    workdayHours: z.number({ error: 'Enter the hours in a working day' }).int('Whole hours').min(1, 'At least 1 hour').max(24, 'At most 24 hours'),
    cutMinutesPerUnit: minutesPerUnit('cut'),
    buildMinutesPerUnit: minutesPerUnit('build'),
    packMinutesPerUnit: minutesPerUnit('pack'),
  })
  .partial()
  .strict()
/** What the admin may change in the shop's settings. */
export type UpdateShopSettings = z.infer<typeof UpdateShopSettingsSchema>

/** Free text on one line (names go into mail headers and labels: no line breaks). */
const oneLine = (what: string, max: number) =>
  z
    .string({ error: `Enter the ${what}` })
    .trim()
    .min(1, `Enter the ${what}`)
    .max(max, `Use at most ${max} characters`)
    .regex(/^[^\r\n]*$/, `Keep the ${what} on one line`)
/** Optional one-line text: blank means none (null). */
const optionalLine = (what: string, max: number) =>
  z
    .string()
    .trim()
    .max(max, `Use at most ${max} characters`)
    .regex(/^[^\r\n]*$/, `Keep the ${what} on one line`)
    .nullish()
    .transform((v) => (v ? v : null))
/** An e-mail address, or blank for none (null). */
const optionalEmail = (what: string) =>
  z
    .string()
    .trim()
    .toLowerCase()
    .max(254, 'Use at most 254 characters')
    .nullish()
    .transform((v) => (v ? v : null))
    .pipe(z.email(`Enter the ${what} as an address such as orders@your-shop.example, or leave it blank`).nullable())

/** The shop's ship-from address: on every shipping label, and on the packing slip as the return address. */
export const ShipFromAddressSchema = z
  .object({
    name: oneLine('name on the ship-from address', 120),
    line1: oneLine('street address', 200),
    line2: optionalLine('second address line', 200),
    city: oneLine('city', 100),
    region: optionalLine('state or region', 100),
    postalCode: oneLine('postal code', 20),
    country: countryCodeSchema('the country the shop ships from'),
    phone: optionalLine('phone number', 40),
  }, { error: 'Give the ship-from address (name, street address, city, postal code, country), or null for none' })
  .strict()
/** The shop's ship-from (and return) address. */
export type ShipFromAddress = z.infer<typeof ShipFromAddressSchema>

/**
 * Who the shop is to its customers (admin only): the name on every mail, slip and label, the sender
 * and reply-to of every e-mail, the ship-from address, and the public address every link starts with.
 */
export const ShopIdentitySchema = z.object({
  shopName: z.string(),
  /** The From name of every e-mail; null: the shop name. */
  mailFromName: z.string().nullable(),
  /** The From address of every e-mail; null: {@link ShopIdentitySchema.shape.mailFromFallback}. */
  mailFromAddress: z.string().nullable(),
  /** Where customers' replies go; null: to the From address. */
  replyToAddress: z.string().nullable(),
  /** The ship-from / return address; null until the owner sets it (no label can be bought before). */
  shipFrom: ShipFromAddressSchema.nullable(),
  /** The carrier the shop ships with, as its shipping service names it; printed on labels, mails and timelines. */
  carrierName: z.string().nullable(),
  /** Read-only: the address people and customers reach Kitwright by (PUBLIC_URL in the environment). */
  publicUrl: z.string(),
  /** Read-only: the sender address used until the owner sets one (MAIL_FROM in the environment). */
  mailFromFallback: z.string(),
})
/** Who the shop is to its customers. */
export type ShopIdentity = z.infer<typeof ShopIdentitySchema>

/** What the admin sets of the shop's identity: every field, each time (blank optional fields mean none). */
export const UpdateShopIdentitySchema = z
  .object({
    shopName: oneLine('shop name', 120),
    mailFromName: optionalLine('sender name', 120),
    mailFromAddress: optionalEmail('sender e-mail'),
    replyToAddress: optionalEmail('reply-to e-mail'),
    shipFrom: ShipFromAddressSchema.nullable(),
    /** Left out: unchanged. */
    carrierName: optionalLine('carrier name', 80).optional(),
  })
  .strict()
/** What the admin sets of the shop's identity. */
export type UpdateShopIdentity = z.input<typeof UpdateShopIdentitySchema>
