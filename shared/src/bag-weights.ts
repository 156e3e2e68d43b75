import { z } from 'zod'
import { parseWeight } from './domain/bag-weight'

const uuid = z.string().uuid('Not a valid id')
/** No control characters (a NUL byte cannot be stored, and no scanner or person types one). */
const PRINTABLE = /^[^\u0000-\u001f\u007f]*$/

/** Where a part's spread came from: pieces weighed one by one, or a tolerance typed for the part. */
export const SPREAD_SOURCES = ['singles', 'typed'] as const
/** Where a bag's weight came from: typed at the bench, or read from a serial scale. */
export const WEIGHT_SOURCES = ['typed', 'scale'] as const

/**
 * A weight as typed (or read from a scale) with its unit: `212.4 g`, `7.5 oz`, `1 lb 2.5 oz`. Parsed to
 * whole milligrams; a number with no unit, or a negative one, is refused with what to fix.
 */
export const WeightTextSchema = z
  .string({ error: 'Enter a weight with its unit, e.g. 212.4 g' })
  .max(40, 'That is too long to be a weight')
  .transform((text, ctx) => {
    const parsed = parseWeight(text)
    if (!parsed.ok) {
      ctx.addIssue({ code: 'custom', message: parsed.message })
      return z.NEVER
    }
    return { mg: parsed.mg, text: text.trim() }
  })

/**
 * A counted sample weighed at the bench: how many pieces, what they weighed, and the spread — a few
 * pieces weighed one by one, or a tolerance per piece typed — and whether the part goes loose in a
 * built kit's hardware bag.
 */
export const RecordUnitWeightSchema = z
  .object({
    sampleCount: z
      .number({ error: 'Enter how many pieces are on the scale' })
      .int('Count whole pieces')
      .min(1, 'Count at least 1 piece onto the scale (20 or more gives a steadier unit weight)')
      .max(100_000, 'That is more pieces than a bench scale holds'),
    sampleWeight: WeightTextSchema,
    singles: z.array(WeightTextSchema).max(50, 'Weigh at most 50 single pieces').optional(),
    spread: WeightTextSchema.optional(),
    packedLoose: z.boolean().default(false),
  })
  .strict()
  .superRefine((v, ctx) => {
    const singles = v.singles?.length ?? 0
    if (singles === 0 && !v.spread) ctx.addIssue({ code: 'custom', path: ['spread'], message: 'Weigh 2 or more pieces one by one, or type the tolerance per piece (e.g. 0.05 g)' })
    if (singles === 1) ctx.addIssue({ code: 'custom', path: ['singles'], message: 'Weigh at least 2 pieces one by one to see their spread' })
    if (singles > 0 && v.spread) ctx.addIssue({ code: 'custom', path: ['spread'], message: 'Give single pieces or a typed tolerance, not both' })
  })
/** A counted sample, as sent. */
export type RecordUnitWeightInput = z.input<typeof RecordUnitWeightSchema>

/** A part's unit weight as recorded. Weights in whole milligrams. */
export const UnitWeightSchema = z.object({
  id: uuid,
  partId: uuid,
  sampleCount: z.number().int(),
  sampleMg: z.number().int(),
  unitMg: z.number().int(),
  spreadMg: z.number().int(),
  spreadSource: z.enum(SPREAD_SOURCES),
  singlesMg: z.array(z.number().int()),
  packedLoose: z.boolean(),
  /** The division in words: `50 × 2 in foam collar weigh 212.4 g → 4.248 g each, kept as 4.25 g`. */
  division: z.string(),
  recordedBy: z.object({ id: uuid, name: z.string() }),
  recordedAt: z.string(),
})
/** A part's unit weight as recorded. */
export type UnitWeight = z.infer<typeof UnitWeightSchema>

/** A small part and its unit weight (null until a sample is weighed). */
export const PartUnitWeightSchema = z.object({
  partId: uuid,
  sku: z.string(),
  name: z.string(),
  kind: z.string(),
  current: UnitWeightSchema.nullable(),
})
/** A small part and its unit weight. */
export type PartUnitWeight = z.infer<typeof PartUnitWeightSchema>

/** One line of a bag as the bench sees it; `unitMg` is null while the part has no unit weight. */
export const BagLineViewSchema = z.object({
  partId: uuid,
  sku: z.string(),
  name: z.string(),
  quantity: z.number().int(),
  unitMg: z.number().int().nullable(),
  spreadMg: z.number().int().nullable(),
  isBag: z.boolean(),
})
/** One line of a bag as the bench sees it. */
export type BagLineView = z.infer<typeof BagLineViewSchema>

/** One part of an explanation: pieces missing (negative count) or extra (positive). */
export const ExplainedPartSchema = z.object({ sku: z.string(), name: z.string(), count: z.number().int(), mg: z.number().int() })

/** A combination of parts that explains a refused bag's difference. */
export const ExplanationSchema = z.object({ parts: z.array(ExplainedPartSchema), residualMg: z.number().int(), words: z.string() })

/** One weighing of a bag, as recorded. */
export const BagWeighingSchema = z.object({
  id: uuid,
  itemKey: z.string(),
  workOrderId: uuid,
  measuredMg: z.number().int(),
  enteredAs: z.string(),
  source: z.enum(WEIGHT_SOURCES),
  expectedMg: z.number().int(),
  toleranceMg: z.number().int(),
  differenceMg: z.number().int(),
  accepted: z.boolean(),
  explanations: z.array(ExplanationSchema),
  words: z.string(),
  weighedBy: z.object({ id: uuid, name: z.string() }),
  weighedAt: z.string(),
})
/** One weighing of a bag, as recorded. */
export type BagWeighing = z.infer<typeof BagWeighingSchema>

/** A bag of an order at the pack bench: its contents, what it should weigh and why, its last weighing. */
export const BagCheckSchema = z.object({
  itemKey: z.string(),
  workOrderId: uuid,
  serial: z.string(),
  description: z.string(),
  lines: z.array(BagLineViewSchema),
  /** Null while a part has no unit weight (see `problem`). */
  expectation: z
    .object({
      expectedMg: z.number().int(),
      toleranceMg: z.number().int(),
      summedSpreadMg: z.number().int(),
      floorMg: z.number().int(),
      missingPartCouldPass: z.boolean(),
      reasoning: z.array(z.string()),
    })
    .nullable(),
  /** Why the bag cannot be weighed yet, in words, or null. */
  problem: z.string().nullable(),
  lastWeighing: BagWeighingSchema.nullable(),
})
/** A bag at the pack bench. */
export type BagCheck = z.infer<typeof BagCheckSchema>

/** Weigh one bag: which item of the packing list, the weight with its unit, typed or from the scale. */
export const WeighBagSchema = z
  .object({
    itemKey: z.string({ error: 'Say which bag' }).trim().min(1, 'Say which bag').max(120).regex(PRINTABLE, 'Not a packing list item'),
    weight: WeightTextSchema,
    source: z.enum(WEIGHT_SOURCES, { error: 'Say whether the weight was typed or read from the scale' }).default('typed'),
    /** A fresh id per weighing; sending it again (a retry) returns the first answer and records nothing new. */
    requestKey: uuid.optional(),
  })
  .strict()
/** A bag's weighing, as sent. */
export type WeighBagInput = z.input<typeof WeighBagSchema>

/** The answer to a weighing: the record and whether the bag is now confirmed on the packing list. */
export const WeighBagResultSchema = z.object({
  weighing: BagWeighingSchema,
  /** An accepted bag is confirmed on the packing list; why not, when it could not be. */
  confirmed: z.boolean(),
  confirmProblem: z.string().nullable(),
})
/** The answer to a weighing. */
export type WeighBagResult = z.infer<typeof WeighBagResultSchema>

/** Which bag's label to print. */
export const BagLabelQuerySchema = z.object({ itemKey: z.string({ error: 'Say which bag' }).trim().min(1, 'Say which bag').max(120).regex(PRINTABLE, 'Not a packing list item') })
