import { z } from 'zod'

/** The shop's settings as the API shows them; lengths in base units. */
export const ShopSettingsSchema = z.object({
  shopName: z.string(),
  displayUnit: z.enum(['in', 'mm']),
  kerf: z.number().int().min(0),
  endTrim: z.number().int().min(0),
  minOffcut: z.number().int().min(0),
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
  })
  .partial()
  .strict()
/** What the admin may change in the shop's settings. */
export type UpdateShopSettings = z.infer<typeof UpdateShopSettingsSchema>
