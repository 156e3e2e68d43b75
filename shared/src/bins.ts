import { z } from 'zod'
import { BIN_STATUSES } from './cut-runs-status'

/** A reusable bin and the work order it travels with. */
export const BinSchema = z.object({
  id: z.string().uuid(),
  code: z.string(),
  status: z.enum(BIN_STATUSES),
  workOrder: z.object({ id: z.string().uuid(), serial: z.string() }).nullable(),
  assignedAt: z.string().nullable(),
})
/** A reusable bin. */
export type Bin = z.infer<typeof BinSchema>

/** A batch of new bins, numbered on from the highest code (BIN-0001, BIN-0002, …). */
export const CreateBinsSchema = z
  .object({ count: z.number({ error: 'Enter how many bins' }).int('Use a whole number').min(1, 'At least 1').max(500, 'At most 500 at once') })
  .strict()
/** A batch of new bins. */
export type CreateBins = z.infer<typeof CreateBinsSchema>

const BinCodeSchema = z
  .string()
  .trim()
  .toUpperCase()
  .regex(/^BIN-\d{4,}$/, 'A bin code looks like BIN-0012')

/** Label stock for bin labels: 2 × 1 in and 4 × 6 in thermal labels, or a Letter sheet of many. */
export const BIN_LABEL_SIZES = ['2x1', '4x6', 'letter'] as const
/** Which bins to print and on what. */
export const BinLabelQuerySchema = z.object({
  size: z.enum(BIN_LABEL_SIZES).default('2x1'),
  /** Comma-separated bin ids; omitted: every bin. */
  ids: z
    .string()
    .optional()
    .transform((v) => (v ? v.split(',').filter((s) => s !== '') : undefined))
    .pipe(z.array(z.string().uuid('Not a valid bin id')).max(1000).optional()),
  /** A batch by its codes, both included: `from=BIN-0011&to=BIN-0020` (a batch is numbered in one run). */
  from: BinCodeSchema.optional(),
  to: BinCodeSchema.optional(),
})
/** Which bins to print and on what. */
export type BinLabelQuery = z.infer<typeof BinLabelQuerySchema>

/** The code of the n-th bin: BIN-0001. */
export function binCode(n: number): string {
  return `BIN-${String(n).padStart(4, '0')}`
}
