import { z } from 'zod'

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
})
/** The shop's settings as the API shows them. */
export type ShopSettings = z.infer<typeof ShopSettingsSchema>

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
  })
  .partial()
  .strict()
/** What the admin may change in the shop's settings. */
export type UpdateShopSettings = z.infer<typeof UpdateShopSettingsSchema>
