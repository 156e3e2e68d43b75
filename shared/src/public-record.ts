import { z } from 'zod'

/**
 * A unit's build record as its customer sees it, through the link in the shipping e-mail: what was
 * built, the steps done and when, the photos and the leak tests. No staff names.
 */
export const PublicUnitRecordSchema = z.object({
  serial: z.string(),
  shopName: z.string(),
  kit: z.object({ name: z.string() }),
  revisionCode: z.string(),
  steps: z.array(z.object({ position: z.number().int(), text: z.string(), doneAt: z.string().nullable() })),
  /** The supplier's lot of each lot-tracked part fitted (the pump, the sprayers), so a recall notice can be matched to the unit. */
  lots: z.array(z.object({ sku: z.string(), name: z.string(), lotCode: z.string(), quantity: z.number().int() })).default([]),
  photos: z.array(z.object({ url: z.string().url().nullable(), at: z.string() })),
  leakTests: z.array(
    z.object({
      attempt: z.number().int(),
      passed: z.boolean(),
      startPressurePa: z.number().int(),
      endPressurePa: z.number().int(),
      holdMinutes: z.number().int(),
      at: z.string(),
    }),
  ),
})
/** A unit's build record as its customer sees it. */
export type PublicUnitRecord = z.infer<typeof PublicUnitRecordSchema>

/** The token in a customer's build-record link. */
export const PublicRecordParamsSchema = z.object({ token: z.string().min(20, 'This link is incomplete').max(1000) })
