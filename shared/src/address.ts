import { z } from 'zod'

/** A postal address as the API shows it: an order's ship-to, a recall's destination, a parcel's. */
export const PostalAddressSchema = z.object({
  name: z.string(),
  line1: z.string(),
  line2: z.string().nullable(),
  city: z.string(),
  region: z.string().nullable(),
  postalCode: z.string(),
  country: z.string(),
})
/** A postal address. */
export type PostalAddress = z.infer<typeof PostalAddressSchema>

/** An address as a label purchase keeps it (outbound or return): with the phone the carrier may ask for. */
export const LabelAddressSchema = PostalAddressSchema.extend({ phone: z.string().nullish() })
