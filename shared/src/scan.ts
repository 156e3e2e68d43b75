import { z } from 'zod'

/** The kinds of code Kitwright prints or knows. */
export const SCAN_KINDS = ['bin', 'work_order', 'order', 'offcut', 'part', 'return'] as const

/** Where a scanned thing should go next. */
export const NEXT_PLACES = ['cut', 'build', 'pack', 'office', 'stock', 'done'] as const

/** What a scanned code is, and where it should go next. */
export const ScanResultSchema = z.object({
  kind: z.enum(SCAN_KINDS),
  code: z.string(),
  /** A line for people: "Bin BIN-0004 holds unit U-1003 (12-site tote kit, rev B)". */
  title: z.string(),
  status: z.string(),
  next: z.object({ place: z.enum(NEXT_PLACES), message: z.string() }),
  /** Ids to open the thing with. */
  workOrderSerial: z.string().nullable(),
  orderId: z.string().uuid().nullable(),
  partId: z.string().uuid().nullable(),
  /** A return (its label's tracking number or its number scanned), for those who may open returns. */
  returnId: z.string().uuid().nullable(),
})
/** What a scanned code is, and where it should go next. */
export type ScanResult = z.infer<typeof ScanResultSchema>

/** A scanned code as it arrives in the path: trimmed, no control characters, not absurdly long. */
export const ScanParamsSchema = z.object({
  code: z
    .string()
    .trim()
    .min(1, 'Scan or type a code')
    .max(80, 'No Kitwright code is that long; scan again')
    .regex(/^[\x20-\x7e]+$/, 'The code has characters no Kitwright label prints; scan again'),
})
