import { z } from 'zod'
import { LEAK_PLACES, PRESSURE_UNITS } from './domain/leak-test'
import { LeakTestProtocolSchema } from './kits'
import { UnitLotNeedSchema } from './lots'
import { WorkOrderStatusSchema } from './orders'

const uuid = z.string().uuid('Not a valid id')

/** Work order statuses a unit can be worked on at the build bench. */
export const BUILDABLE_STATUSES = ['cut', 'building', 'rework'] as const

/** Photo types the bucket accepts: what tablet cameras and browsers make. */
export const PHOTO_CONTENT_TYPES = ['image/jpeg', 'image/png', 'image/webp'] as const
/** A photo type the bucket accepts. */
export type PhotoContentType = (typeof PHOTO_CONTENT_TYPES)[number]
/** The largest photo accepted: 10 MB (a tablet photo is 2–6 MB). */
export const MAX_PHOTO_BYTES = 10 * 1024 * 1024

/** A scanned bin code or serial, e.g. `BIN-0004` or `U-1001`. */
export const BuildLookupQuerySchema = z.object({
  code: z.string({ error: 'Scan a bin or type a serial' }).trim().min(1, 'Scan a bin or type a serial').max(60, 'That code is too long to be a bin or serial'),
})
/** A scanned bin code or serial. */
export type BuildLookupQuery = z.infer<typeof BuildLookupQuerySchema>

/**
 * Tick a build step. The measurement, when the step asks for one, as the bench typed it (`18 1/2`,
 * `18-1/2"`, `470 mm`; read by domain/measurement.ts into the step's unit) or as a number in the
 * step's unit. A value outside the step's limits needs `reason`.
 */
export const TickStepSchema = z
  .object({
    measurement: z
      .union([z.number({ error: 'Enter the measurement' }).finite(), z.string().trim().max(40, 'That measurement is too long: type the number and its unit')], {
        error: 'Enter the measurement as the shop writes it, e.g. 18 1/2 or 470 mm',
      })
      .nullish()
      .transform((v) => (v === '' || v === undefined ? null : v)),
    reason: z
      .string()
      .trim()
      .max(500, 'Use at most 500 characters')
      .nullish()
      .transform((v) => (v ? v : null)),
  })
  .strict()
/** Tick a build step. */
export type TickStep = z.infer<typeof TickStepSchema>
/** Tick a build step, as the bench sends it. */
export type TickStepInput = z.input<typeof TickStepSchema>

/** Ask for a presigned upload of one photo. */
export const PresignPhotoSchema = z
  .object({
    contentType: z.enum(PHOTO_CONTENT_TYPES, { error: 'Photos must be JPEG, PNG or WebP images' }),
    size: z
      .number({ error: 'Give the size of the photo in bytes' })
      .int('The size is a whole number of bytes')
      .min(1, 'The photo is empty')
      .max(MAX_PHOTO_BYTES, `The photo is larger than ${MAX_PHOTO_BYTES / 1024 / 1024} MB; take it at a lower resolution`),
    stepId: uuid.nullish().transform((v) => v ?? null),
  })
  .strict()
/** Ask for a presigned upload of one photo. */
export type PresignPhotoInput = z.input<typeof PresignPhotoSchema>

/** Where and how the browser uploads the photo: a PUT with exactly these headers. */
export const PresignedPhotoSchema = z.object({
  key: z.string(),
  url: z.string().url(),
  method: z.literal('PUT'),
  headers: z.record(z.string(), z.string()),
  expiresAt: z.string(),
})
/** A presigned photo upload. */
export type PresignedPhoto = z.infer<typeof PresignedPhotoSchema>

/** Record a photo once the browser's upload finished. */
export const ConfirmPhotoSchema = z.object({ key: z.string().trim().min(1, 'Give the key the upload was presigned for').max(300) }).strict()

/** A leak test as the assembler reads it off the gauge, in psi or kPa. */
export const RecordLeakTestSchema = z
  .object({
    unit: z.enum(PRESSURE_UNITS, { error: 'Choose psi or kPa' }),
    startPressure: z.number({ error: 'Enter the start pressure' }).finite().positive('The start pressure must be above zero').max(1000, 'That pressure is beyond any gauge on the bench'),
    endPressure: z.number({ error: 'Enter the pressure after the hold' }).finite().min(0, 'Cannot be below zero').max(1000, 'That pressure is beyond any gauge on the bench'),
    holdMinutes: z.number({ error: 'Enter how many minutes it held' }).int('Whole minutes').min(0, 'Cannot be negative').max(1440, 'At most a day'),
    waterVolumeMl: z.number({ error: 'Enter the water volume in millilitres' }).int('Whole millilitres').positive('Must be above zero').max(500_000, 'At most 500 L'),
    leaks: z.array(z.enum(LEAK_PLACES, { error: 'Not a known leak place' })).max(LEAK_PLACES.length).default([]),
    leakNote: z.string().trim().max(500, 'Use at most 500 characters').nullish().transform((v) => (v ? v : null)),
  })
  .strict()
  .superRefine((t, ctx) => {
    if (t.leaks.includes('other') && !t.leakNote) ctx.addIssue({ code: 'custom', path: ['leakNote'], message: 'Say where the "other" leak was' })
  })
/** A leak test as entered. */
export type RecordLeakTestInput = z.input<typeof RecordLeakTestSchema>

const PersonSchema = z.object({ id: uuid, name: z.string() })

/** One tick of a step, standing or undone. */
export const StepTickSchema = z.object({
  id: uuid,
  stepId: uuid,
  by: PersonSchema,
  at: z.string(),
  measurement: z.number().nullable(),
  outOfLimits: z.boolean(),
  /** Why an out-of-limits value was recorded. */
  outOfLimitsReason: z.string().nullable(),
  undoneAt: z.string().nullable(),
  undoneBy: PersonSchema.nullable(),
})
/** One tick of a step. */
export type StepTick = z.infer<typeof StepTickSchema>

/** A photo of the unit, with a short-lived URL to show it. */
export const UnitPhotoSchema = z.object({
  id: uuid,
  stepId: uuid.nullable(),
  key: z.string(),
  contentType: z.string(),
  size: z.number().int(),
  /** A presigned GET, valid for an hour; null when no photo store is configured. */
  url: z.string().url().nullable(),
  by: PersonSchema,
  at: z.string(),
})
/** A photo of the unit. */
export type UnitPhoto = z.infer<typeof UnitPhotoSchema>

/** One leak test of a unit; pressures in pascals. */
export const LeakTestSchema = z.object({
  id: uuid,
  attempt: z.number().int(),
  startPressurePa: z.number().int(),
  endPressurePa: z.number().int(),
  dropPa: z.number().int(),
  holdMinutes: z.number().int(),
  waterVolumeMl: z.number().int(),
  leaks: z.array(z.enum(LEAK_PLACES)),
  leakNote: z.string().nullable(),
  unit: z.enum(PRESSURE_UNITS),
  passed: z.boolean(),
  reason: z.string().nullable(),
  by: PersonSchema,
  at: z.string(),
})
/** One leak test of a unit. */
export type LeakTest = z.infer<typeof LeakTestSchema>

/** A stay in rework: why, and when a passing retest resolved it. */
export const ReworkEntrySchema = z.object({
  id: uuid,
  reason: z.string(),
  /** What sent it: a failed leak test or an out-of-limits measurement. */
  cause: z.enum(['leak_test', 'measurement', 'other']),
  by: PersonSchema,
  at: z.string(),
  resolvedAt: z.string().nullable(),
  resolvedBy: PersonSchema.nullable(),
})
/** A stay in rework. */
export type ReworkEntry = z.infer<typeof ReworkEntrySchema>

/** A build step of the unit's revision with its ticks (newest last); `tick` is the one standing. */
export const BuildStepStateSchema = z.object({
  id: uuid,
  position: z.number().int(),
  text: z.string(),
  caution: z.string().nullable(),
  photoRequired: z.boolean(),
  measurementRequired: z.boolean(),
  measurementUnit: z.string().nullable(),
  measurementMin: z.number().nullable(),
  measurementMax: z.number().nullable(),
  /** May be ticked at any point; the other steps go in order. */
  freeOrder: z.boolean(),
  /** An out-of-limits measurement sends the unit to rework. */
  outOfLimitsRework: z.boolean(),
  tick: StepTickSchema.nullable(),
  history: z.array(StepTickSchema),
})
/** A build step of the unit with its ticks. */
export type BuildStepState = z.infer<typeof BuildStepStateSchema>

/** What still stands between the unit and the pack bench. */
export const BuildReadinessSchema = z.object({
  stepsLeft: z.number().int(),
  photosMissing: z.number().int(),
  /** `not_required` when the revision has no leak test protocol (spare-parts packs). */
  leakTest: z.enum(['not_required', 'none', 'passed', 'failed']),
  /** Rework entries not yet resolved (a failed leak test, an out-of-limits measurement). */
  openRework: z.number().int(),
  /** Lot-tracked parts still without their lot recorded (counted in parts, not pieces). */
  lotsMissing: z.number().int(),
  ready: z.boolean(),
})
/** What still stands between the unit and the pack bench. */
export type BuildReadiness = z.infer<typeof BuildReadinessSchema>

/** Everything the build bench shows for one unit. */
export const BuildPageSchema = z.object({
  workOrder: z.object({ id: uuid, serial: z.string(), status: WorkOrderStatusSchema, binCode: z.string().nullable() }),
  kit: z.object({ sku: z.string(), name: z.string() }),
  revision: z.object({ id: uuid, code: z.string() }),
  leakTestProtocol: LeakTestProtocolSchema.nullable(),
  steps: z.array(BuildStepStateSchema),
  photos: z.array(UnitPhotoSchema),
  leakTests: z.array(LeakTestSchema),
  rework: z.array(ReworkEntrySchema),
  /** Lot-tracked parts of the unit's bill of materials: the bench asks for the lot of each. */
  lots: z.array(UnitLotNeedSchema),
  readiness: BuildReadinessSchema,
})
/** Everything the build bench shows for one unit. */
export type BuildPage = z.infer<typeof BuildPageSchema>

/** One pipe piece of the unit and the stick it was cut from. */
export const UnitPieceSchema = z.object({
  label: z.string(),
  length: z.number().int(),
  cutRunNumber: z.string(),
  stickPosition: z.number().int(),
  /** A new stick of this stock length, or null for an offcut. */
  stickLength: z.number().int().nullable(),
  fromOffcut: z.boolean(),
  partSku: z.string(),
  status: z.string(),
  cutBy: PersonSchema.nullable(),
  cutAt: z.string().nullable(),
})
/** One pipe piece of the unit. */
export type UnitPiece = z.infer<typeof UnitPieceSchema>

/** The build record of one serial: everything the build bench recorded, and where its pieces came from. */
export const UnitRecordSchema = BuildPageSchema.extend({
  order: z.object({ number: z.string() }),
  /** False when none of its pieces went through a Kitwright cut run. */
  cutThroughKitwright: z.boolean(),
  pieces: z.array(UnitPieceSchema),
})
/** The build record of one serial. */
export type UnitRecord = z.infer<typeof UnitRecordSchema>

/** A serial in a URL. */
export const SerialParamsSchema = z.object({
  // No control characters: a NUL byte cannot be stored or looked up, and no label carries one.
  serial: z.string().trim().min(1).max(40).regex(/^[^\u0000-\u001f\u007f]*$/, 'A serial has no control characters; scan or type it again'),
})
/** A work order id in a URL. */
export const WorkOrderParamsSchema = z.object({ workOrderId: uuid })
/** A work order and one of its steps in a URL. */
export const StepParamsSchema = z.object({ workOrderId: uuid, stepId: uuid })

