import { z } from 'zod'
import type { FrameInputs } from './domain/frame'
import type { EnclosureShape } from './domain/reservoir'
import { LengthSchema } from './parts'

/** A kit revision's life: drafts change, released ones are frozen, retired ones are no longer built. */
export const REVISION_STATUSES = ['draft', 'released', 'retired'] as const
/** A kit revision's status. */
export const RevisionStatusSchema = z.enum(REVISION_STATUSES)
/** A kit revision's status. */
export type RevisionStatus = z.infer<typeof RevisionStatusSchema>

const Text = (max: number, what: string) => z.string().trim().min(1, `Enter ${what}`).max(max, `Use at most ${max} characters`)
const OptionalText = (max: number) =>
  z
    .string()
    .trim()
    .max(max, `Use at most ${max} characters`)
    .nullish()
    .transform((v) => (v ? v : null))
const NonNegativeLength = z.number().int('Lengths are whole base units').min(0, 'Cannot be negative')
const Count = (max: number) => z.number().int('A whole number').min(0, 'Cannot be negative').max(max, `At most ${max}`)

const FittingAllowanceSchema = z.object({ socketDepth: NonNegativeLength, centreToSocketBottom: NonNegativeLength })

/** The frame calculator's inputs (see shared/src/domain/frame.ts), validated at the edge. */
export const FrameInputsSchema = z.object({
  enclosure: z.object({ insideWidth: LengthSchema, insideLength: LengthSchema, insideHeight: LengthSchema }),
  recessBelowRim: NonNegativeLength,
  wallClearance: NonNegativeLength,
  pipeOutsideDiameter: LengthSchema,
  elbow: FittingAllowanceSchema,
  tee: FittingAllowanceSchema,
  layout: z.object({ crossRuns: Count(20), riserSide: z.enum(['long', 'short']) }),
  sprayers: z.object({ perLongSide: Count(50), perShortSide: Count(50), perCrossRun: Count(50), minDistanceFromFitting: NonNegativeLength }),
  riser: z.object({
    pumpOutletHeight: NonNegativeLength,
    pumpAdapter: z.object({ socketDepth: NonNegativeLength, socketBottomAboveOutlet: z.number().int() }),
  }),
  cutPrecision: LengthSchema,
}) satisfies z.ZodType<FrameInputs>

/** A tote's inside shape, for the reservoir calculator. */
export const EnclosureShapeSchema = z.object({
  topInsideWidth: LengthSchema,
  topInsideLength: LengthSchema,
  bottomInsideWidth: LengthSchema,
  bottomInsideLength: LengthSchema,
  insideHeight: LengthSchema,
}) satisfies z.ZodType<EnclosureShape>

/** A revision's frame: which pipe it is cut from, the calculator's inputs, and the tote's shape. */
export const RevisionFrameSchema = z.object({
  pipePartId: z.string().uuid('Choose the pipe the frame is cut from'),
  inputs: FrameInputsSchema,
  tote: EnclosureShapeSchema.nullable(),
})
/** A revision's frame. */
export type RevisionFrame = z.infer<typeof RevisionFrameSchema>

/** A revision's leak test protocol; pressures in pascals, water volume in millilitres. */
export const LeakTestProtocolSchema = z
  .object({
    minPressurePa: z.number().int().positive('Must be above zero'),
    maxPressurePa: z.number().int().positive('Must be above zero'),
    holdMinutes: z.number().int().min(1, 'Hold at least 1 minute').max(240, 'At most 240 minutes'),
    maxDropPa: z.number().int().min(0, 'Cannot be negative'),
    waterVolumeMl: z.number().int().positive('Must be above zero'),
  })
  .refine((p) => p.maxPressurePa >= p.minPressurePa, { path: ['maxPressurePa'], message: 'Must be at least the lowest test pressure' })
/** A revision's leak test protocol. */
export type LeakTestProtocol = z.infer<typeof LeakTestProtocolSchema>

/** One BOM line as saved. */
export const BomLineInputSchema = z.object({
  partId: z.string().uuid('Choose a part'),
  quantity: z.number().int('A whole number').min(1, 'At least 1').max(10_000),
  note: OptionalText(200),
})

/** One cut part as saved; `frameKey` ties it to a line of the frame calculator. */
export const CutPartInputSchema = z.object({
  partId: z.string().uuid('Choose the pipe it is cut from'),
  label: Text(80, 'a label such as "end spacer"'),
  length: LengthSchema,
  quantity: z.number().int('A whole number').min(1, 'At least 1').max(1000),
  frameKey: z.string().max(80).nullish().transform((v) => v ?? null),
  overrideReason: OptionalText(300),
})

/** One build step as saved. */
export const BuildStepInputSchema = z
  .object({
    text: Text(1000, 'what to do'),
    caution: OptionalText(500),
    photoRequired: z.boolean().default(false),
    measurementRequired: z.boolean().default(false),
    measurementUnit: OptionalText(20),
    measurementMin: z.number().nullish().transform((v) => v ?? null),
    measurementMax: z.number().nullish().transform((v) => v ?? null),
    /** May be done at any point of the build; the other steps go in order. */
    freeOrder: z.boolean().default(false),
    /** A measurement outside the limits sends the unit to rework, not only a flag with a reason. */
    outOfLimitsRework: z.boolean().default(false),
  })
  .superRefine((s, ctx) => {
    if (!s.measurementRequired) return
    if (!s.measurementUnit) ctx.addIssue({ code: 'custom', path: ['measurementUnit'], message: 'Give the unit of the measurement, e.g. psi or mm' })
    if (s.measurementMin !== null && s.measurementMax !== null && s.measurementMax < s.measurementMin) {
      ctx.addIssue({ code: 'custom', path: ['measurementMax'], message: 'Must be at least the lower limit' })
    }
  })

/** Everything a draft revision holds; saving replaces it whole. */
export const RevisionContentSchema = z
  .object({
    notes: OptionalText(2000),
    frame: RevisionFrameSchema.nullable(),
    leakTest: LeakTestProtocolSchema.nullable(),
    bomLines: z.array(BomLineInputSchema).max(200),
    cutParts: z.array(CutPartInputSchema).max(200),
    buildSteps: z.array(BuildStepInputSchema).max(100),
  })
  .strict()
/** Everything a draft revision holds. */
export type RevisionContent = z.infer<typeof RevisionContentSchema>
/** Everything a draft revision holds, as a form holds it before parsing. */
export type RevisionContentDraft = z.input<typeof RevisionContentSchema>

/** A kit's list price in cents, or null when it has none. */
const KitPriceSchema = z
  .number({ error: 'Enter the price in cents, e.g. 18900 for $189.00' })
  .int('Enter the price in whole cents')
  .min(0, 'A price cannot be negative')
  .max(100_000_000, 'That price is too large; check it')
  .nullable()

/** Create a kit; it starts with draft revision A, holding only the default build steps and their cautions (safety-cautions.ts). */
export const CreateKitSchema = z
  .object({
    sku: z.string().trim().min(1, 'Enter a SKU').max(40).regex(/^[A-Za-z0-9._-]+$/, 'Use letters, digits, dot, dash or underscore'),
    name: Text(120, 'a name'),
    storeProductId: OptionalText(80),
    description: OptionalText(2000),
    priceCents: KitPriceSchema.optional(),
  })
  .strict()
/** Create a kit. */
export type CreateKit = z.infer<typeof CreateKitSchema>

/** Change a kit's list price (null: no list price; phone orders then start with an empty price). */
export const UpdateKitPriceSchema = z.object({ priceCents: KitPriceSchema }).strict()
export type UpdateKitPrice = z.infer<typeof UpdateKitPriceSchema>

/** A revision in a kit's list of revisions. */
export const RevisionSummarySchema = z.object({
  id: z.string().uuid(),
  code: z.string(),
  status: RevisionStatusSchema,
  releasedAt: z.string().nullable(),
  createdAt: z.string(),
})

/** A kit with its revisions. */
export const KitSchema = z.object({
  id: z.string().uuid(),
  sku: z.string(),
  name: z.string(),
  storeProductId: z.string().nullable(),
  description: z.string().nullable(),
  /** List price in cents; a phone order's unit price starts from it. */
  priceCents: z.number().int().nullable(),
  revisions: z.array(RevisionSummarySchema),
})
/** A kit with its revisions. */
export type Kit = z.infer<typeof KitSchema>

const PartRefSchema = z.object({
  sku: z.string(),
  name: z.string(),
  kind: z.enum(['stock_length', 'hardware', 'packaging']),
  /** Null for a bench role (see `seesCosts` in roles.ts). */
  unitCostCents: z.number().int().nullable(),
  weightGrams: z.number().int(),
})

/** Cost, shipping weight and pipe use of one unit built to a revision. */
export const RevisionRollupSchema = z.object({
  /** Hardware and packaging at unit cost, plus pipe prorated by length over its shortest stick; null for a bench role. */
  costCents: z.number().int().nullable(),
  /** Parts and packaging, plus pipe prorated by length. */
  weightGrams: z.number().int(),
  /** Sum of cut lengths × quantities. */
  cutLength: z.number().int(),
  /** Cut lengths plus one kerf per cut (shop setting): the stick length a unit uses. */
  stickLengthUsed: z.number().int(),
  pieceCount: z.number().int(),
  /** Lines that could not be rolled up, e.g. pipe with no stick length. */
  problems: z.array(z.string()),
})
/** Roll-ups of one revision. */
export type RevisionRollup = z.infer<typeof RevisionRollupSchema>

/** A revision with everything it holds, its parts' names, and its roll-ups. */
export const RevisionDetailSchema = z.object({
  id: z.string().uuid(),
  kit: z.object({ id: z.string().uuid(), sku: z.string(), name: z.string() }),
  code: z.string(),
  status: RevisionStatusSchema,
  notes: z.string().nullable(),
  frame: RevisionFrameSchema.nullable(),
  leakTest: LeakTestProtocolSchema.nullable(),
  bomLines: z.array(z.object({ id: z.string().uuid(), partId: z.string().uuid(), part: PartRefSchema, quantity: z.number().int(), note: z.string().nullable() })),
  cutParts: z.array(
    z.object({
      id: z.string().uuid(),
      partId: z.string().uuid(),
      part: PartRefSchema,
      label: z.string(),
      length: z.number().int(),
      quantity: z.number().int(),
      frameKey: z.string().nullable(),
      calculatedLength: z.number().int().nullable(),
      overrideReason: z.string().nullable(),
    }),
  ),
  buildSteps: z.array(
    z.object({
      id: z.string().uuid(),
      position: z.number().int(),
      text: z.string(),
      caution: z.string().nullable(),
      photoRequired: z.boolean(),
      measurementRequired: z.boolean(),
      measurementUnit: z.string().nullable(),
      measurementMin: z.number().nullable(),
      measurementMax: z.number().nullable(),
      freeOrder: z.boolean(),
      outOfLimitsRework: z.boolean(),
    }),
  ),
  rollup: RevisionRollupSchema,
  releasedAt: z.string().nullable(),
  releasedBy: z.string().nullable(),
  createdAt: z.string(),
  updatedAt: z.string(),
})
/** A revision with everything it holds. */
export type RevisionDetail = z.infer<typeof RevisionDetailSchema>

/** Start a new draft revision, copied from an existing one of the same kit (or new, holding only the default build steps and their cautions). */
export const NewRevisionSchema = z.object({ copyFrom: z.string().uuid().nullish() }).strict()

/** Pressure units the leak test accepts. 1 psi = 6894.757 Pa (NIST SP 811, Appendix B.8). */
export const PASCALS_PER_PSI = 6894.757293168
