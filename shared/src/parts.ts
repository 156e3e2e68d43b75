import { z } from 'zod'
import { HsCodeSchema, OriginCountrySchema } from './customs'
import { MAX_LENGTH } from './domain/units'
import { PageNumberSchema, PageOf, PageSizeSchema, SortDirSchema } from './pagination'

/** The three kinds of part a shop stocks. */
export const PART_KINDS = ['stock_length', 'hardware', 'packaging'] as const
/** The kind of a part. */
export const PartKindSchema = z.enum(PART_KINDS)
/** The kind of a part. */
export type PartKind = z.infer<typeof PartKindSchema>

/** What each kind is called on screen. */
export const PART_KIND_LABELS: Record<PartKind, string> = {
  stock_length: 'Pipe (sticks)',
  hardware: 'Hardware',
  packaging: 'Packaging',
}

/** A length in the integer base unit of domain/units.ts. */
export const LengthSchema = z.number().int('Lengths are whole base units').positive('Must be longer than zero').max(MAX_LENGTH)

const optionalText = z
  .string()
  .trim()
  .max(200, 'Use at most 200 characters')
  .nullish()
  .transform((v) => (v ? v : null))

/** An optional field checked by `schema` when filled in; blank or missing is null. */
function blankOr(schema: z.ZodType<string, string>) {
  return z
    .string()
    .nullish()
    .transform((v, ctx) => {
      if (!v || v.trim() === '') return null
      const r = schema.safeParse(v)
      if (r.success) return r.data
      ctx.addIssue({ code: 'custom', message: r.error.issues[0]?.message ?? 'Not valid' })
      return z.NEVER
    })
}

/** The fields of a part a planner edits; pipe fields are required for `stock_length` only. */
export const PartInputSchema = z
  .object({
    sku: z.string().trim().min(1, 'Enter a SKU').max(40, 'Use at most 40 characters').regex(/^[A-Za-z0-9._-]+$/, 'Use letters, digits, dot, dash or underscore'),
    name: z.string().trim().min(1, 'Enter a name').max(120, 'Use at most 120 characters'),
    kind: PartKindSchema,
    unitOfMeasure: z.string().trim().min(1, 'Enter a unit such as each, stick or bag').max(20),
    unitCostCents: z.number().int('Whole cents').min(0, 'Cannot be negative').max(100_000_000),
    weightGrams: z.number().int('Whole grams').min(0, 'Cannot be negative').max(1_000_000),
    /** Runs on mains power (a pump, a timer): a box holding it gets the electrical cautions. Left out: unchanged (no, for a new part). */
    electrical: z.boolean({ error: 'Say yes or no: does it run on mains power?' }).optional(),
    /** Received and fitted by the supplier's lot, so a recall finds every unit built with a lot. Left out: unchanged (no, for a new part). */
    lotTracked: z.boolean({ error: "Say yes or no: is it tracked by the supplier's lot?" }).optional(),
    supplier: optionalText,
    leadTimeDays: z.number().int('Whole days').min(0, 'Cannot be negative').max(365).nullish().transform((v) => v ?? null),
    reorderPoint: z.number().int().min(0, 'Cannot be negative'),
    reorderQuantity: z.number().int().min(0, 'Cannot be negative'),
    shelfLocation: optionalText,
    nominalSize: optionalText,
    outsideDiameter: LengthSchema.nullish().transform((v) => v ?? null),
    stickLengths: z.array(LengthSchema).max(6, 'At most 6 stick lengths').default([]),
    /** Customs: HS tariff number (6–10 digits), ISO 3166-1 alpha-2 country of origin, plain words for the declaration. */
    hsCode: blankOr(HsCodeSchema),
    originCountry: blankOr(OriginCountrySchema),
    customsDescription: optionalText,
  })
  .strict()
  .superRefine((p, ctx) => {
    if (p.kind === 'stock_length') {
      if (p.stickLengths.length === 0) ctx.addIssue({ code: 'custom', path: ['stickLengths'], message: 'Pipe needs at least one stick length, e.g. 10 ft' })
      if (p.outsideDiameter === null) ctx.addIssue({ code: 'custom', path: ['outsideDiameter'], message: 'Pipe needs its outside diameter, e.g. 0.840 in' })
      if (!p.nominalSize) ctx.addIssue({ code: 'custom', path: ['nominalSize'], message: 'Pipe needs its nominal size, e.g. 1/2' })
    } else if (p.stickLengths.length > 0) {
      ctx.addIssue({ code: 'custom', path: ['stickLengths'], message: 'Only pipe (stock_length) has stick lengths' })
    }
  })
/** The fields of a part a planner edits. */
export type PartInput = z.infer<typeof PartInputSchema>
/** The fields of a part a planner edits, as typed into a form before parsing. */
export type PartInputDraft = z.input<typeof PartInputSchema>

/** A part as the API shows it. */
export const PartSchema = z.object({
  id: z.string().uuid(),
  sku: z.string(),
  name: z.string(),
  kind: PartKindSchema,
  unitOfMeasure: z.string(),
  /** What the shop pays for one; null for a bench role (see `seesCosts` in roles.ts). */
  unitCostCents: z.number().int().nullable(),
  weightGrams: z.number().int(),
  /** Runs on mains power: the care sheet of a box holding it carries the electrical cautions. */
  electrical: z.boolean(),
  /** Received and fitted by the supplier's lot (receiving asks for it, the build bench records it). */
  lotTracked: z.boolean(),
  supplier: z.string().nullable(),
  leadTimeDays: z.number().int().nullable(),
  reorderPoint: z.number().int(),
  reorderQuantity: z.number().int(),
  shelfLocation: z.string().nullable(),
  nominalSize: z.string().nullable(),
  outsideDiameter: z.number().int().nullable(),
  stickLengths: z.array(z.number().int()),
  hsCode: z.string().nullable(),
  originCountry: z.string().nullable(),
  customsDescription: z.string().nullable(),
  active: z.boolean(),
  createdAt: z.string(),
  updatedAt: z.string(),
})
/** A part as the API shows it. */
export type Part = z.infer<typeof PartSchema>

/** One page of parts. */
export const PartsPageSchema = PageOf(PartSchema)
/** One page of parts. */
export type PartsPage = z.infer<typeof PartsPageSchema>

/**
 * A change to a part: any of its fields, and `active` to retire it from new kits or bring it back.
 * The server applies the change to the stored part and checks the result with {@link PartInputSchema},
 * so a change must still leave a valid part (pipe keeps its stick lengths, and so on).
 */
export const PartPatchSchema = z
  // Stick lengths without their default, so a change that leaves them out keeps them.
  .object({ ...PartInputSchema.shape, stickLengths: z.array(LengthSchema).max(6, 'At most 6 stick lengths'), active: z.boolean() })
  .partial()
  .strict()
  .refine((v) => Object.keys(v).length > 0, 'Change at least one field')
/** A change to a part. */
export type PartPatch = z.infer<typeof PartPatchSchema>

/** Columns the parts list sorts by. */
export const PART_SORT_FIELDS = ['sku', 'name', 'kind', 'unitCost', 'supplier', 'shelfLocation'] as const
/** A column the parts list sorts by. */
export type PartSortField = (typeof PART_SORT_FIELDS)[number]

/** Which parts the list shows by their active flag. */
export const PART_ACTIVE_FILTERS = ['true', 'false', 'all'] as const

/**
 * The parts list query: page, sort, filters and a free-text search over SKU, name and supplier.
 * The API parses it strictly (400 on bad values); the client reads its URL with
 * `querySearchWithDefaults` from pagination.ts, so a bad link falls back to defaults.
 */
export const PartListQuerySchema = z
  .object({
    page: PageNumberSchema,
    pageSize: PageSizeSchema,
    sort: z.enum(PART_SORT_FIELDS, { error: `Sort by one of ${PART_SORT_FIELDS.join(', ')}` }).default('sku'),
    dir: SortDirSchema.default('asc'),
    kind: PartKindSchema.optional(),
    active: z.enum(PART_ACTIVE_FILTERS, { error: 'Use true, false or all' }).default('true'),
    q: z
      .string()
      .trim()
      .max(100, 'Search for at most 100 characters')
      .optional()
      .transform((v) => (v ? v : undefined)),
  })
  .strict()
/** The parts list query. */
export type PartListQuery = z.infer<typeof PartListQuerySchema>
