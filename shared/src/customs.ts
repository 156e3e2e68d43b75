import countries from 'i18n-iso-countries'
import en from 'i18n-iso-countries/langs/en.json'
import { z } from 'zod'

countries.registerLocale(en)

/**
 * Codes the country list carries that ISO 3166-1 has not assigned: `XK` (Kosovo) is a user-assigned
 * code some lists add; customs declarations take only officially assigned codes.
 */
const NOT_ASSIGNED = new Set(['XK'])

/**
 * Whether `code` is an officially assigned ISO 3166-1 alpha-2 country code. The list is
 * i18n-iso-countries' (its codes.json follows ISO 3166-1); user-assigned codes such as `ZZ` are not on it.
 */
export function isCountryCode(code: string): boolean {
  return /^[A-Z]{2}$/.test(code) && !NOT_ASSIGNED.has(code) && countries.isValid(code)
}

/** The English name of an ISO 3166-1 alpha-2 code (`CA` → `Canada`), or the code itself when unknown. */
export function countryName(code: string): string {
  return countries.getName(code, 'en') ?? code
}

/**
 * A Harmonized System tariff number as a shop types it (`8413.70`, `3917 23`, `391740`): the 6-digit
 * HS subheading, optionally with a country's own extension up to 10 digits. Dots and spaces are
 * dropped; stored as digits only.
 */
export const HsCodeSchema = z
  .string()
  .trim()
  .transform((v) => v.replace(/[.\s]/g, ''))
  .pipe(z.string().regex(/^[0-9]{6,10}$/, 'Write the HS code as 6 to 10 digits, e.g. 8413.70 (the 6-digit subheading; dots and spaces are allowed)'))

/**
 * An ISO 3166-1 alpha-2 country code as a form or a file gives it: any case in, upper case out.
 * Checked against the officially assigned codes of i18n-iso-countries (see {@link isCountryCode}), so
 * a user-assigned code such as `ZZ` is refused with a message that says what to enter. `what`
 * finishes the message: "the country where the part was made", "the country it ships to", …
 */
export function countryCodeSchema(what: string) {
  return z
    .string({ error: 'Enter the two-letter country code, e.g. US' })
    .trim()
    .toUpperCase()
    .min(1, 'Enter the two-letter country code, e.g. US')
    .regex(/^[A-Z]{2}$/, 'Use the two-letter country code (ISO 3166-1 alpha-2), e.g. US, CA, GB')
    .superRefine((v, ctx) => {
      // Only a two-letter code reaches this check; the pattern above has already explained anything else.
      if (/^[A-Z]{2}$/.test(v) && !isCountryCode(v)) ctx.addIssue({ code: 'custom', message: `"${v}" is not an ISO 3166-1 country code; use the two letters of ${what}, e.g. US, CA, GB` })
    })
}

/** An ISO 3166-1 alpha-2 country of origin, any case in, upper case out. */
export const OriginCountrySchema = z
  .string()
  .trim()
  .transform((v) => v.toUpperCase())
  .superRefine((v, ctx) => {
    if (!isCountryCode(v)) ctx.addIssue({ code: 'custom', message: `"${v}" is not an ISO 3166-1 country code; use the two letters of the country where the part was made, e.g. US, CA, CN, DE` })
  })

/** An HS code for display: `841370` → `8413.70`, `8413700000` → `8413.70.0000`. */
export function formatHsCode(digits: string): string {
  if (digits.length <= 4) return digits
  const head = `${digits.slice(0, 4)}.${digits.slice(4, 6)}`
  return digits.length > 6 ? `${head}.${digits.slice(6)}` : head
}

/** The two UPU customs declaration forms. */
export const CUSTOMS_FORMS = ['CN 22', 'CN 23'] as const
/** A UPU customs declaration form. */
export type CustomsForm = (typeof CUSTOMS_FORMS)[number]

/** Which form a parcel's declaration is on: CN 22 up to 300 SDR, CN 23 above (see domain/customs.ts). */
export const CustomsFormSchema = z.enum(CUSTOMS_FORMS)

/**
 * Whether a shipment needs a customs declaration (it leaves the ship-from country), whether it can be
 * printed, what is missing, and per recorded parcel its form, value (cents of `currency`) and net weight.
 */
export const CustomsSummarySchema = z.object({
  required: z.boolean(),
  shipFromCountry: z.string().nullable(),
  shipToCountry: z.string(),
  currency: z.string(),
  ready: z.boolean(),
  problems: z.array(z.string()),
  parcels: z.array(z.object({ position: z.number().int(), form: CustomsFormSchema, valueCents: z.number().int(), netGrams: z.number().int() })),
})
/** A shipment's customs summary. */
export type CustomsSummary = z.infer<typeof CustomsSummarySchema>
