import { z } from 'zod'
import type { ParseLengthResult } from '@kitwright/shared/domain/units'
import { LotCodeSchema } from '@kitwright/shared/lots'
import { StockQuantitySchema, StockReferenceSchema, type ReceiveStock, type StockPartOption } from '@kitwright/shared/stock'

/**
 * The receiving form: the shared receipt contract, but with the stick length as typed in the shop's
 * unit. Parsing turns it into the shared `ReceiveStock` the API takes; the server checks again.
 */
export function makeReceiveFormSchema(parts: readonly StockPartOption[], parseLength: (text: string) => ParseLengthResult) {
  const byId = new Map(parts.map((p) => [p.id, p]))
  return z
    .object({
      reference: StockReferenceSchema,
      purchaseOrderId: z.string(),
      lines: z
        .array(
          z.object({
            partId: z.string().min(1, 'Choose a part'),
            quantity: StockQuantitySchema,
            stickLength: z.string().trim(),
            lot: LotCodeSchema,
            reason: z.string().trim().max(200, 'Use at most 200 characters'),
            closeShort: z.boolean(),
          }),
        )
        .min(1, 'Add at least one line'),
    })
    .transform((form, ctx): ReceiveStock => {
      const lines = form.lines.map((line, i) => {
        const part = byId.get(line.partId)
        let stickLength: number | null = null
        if (part?.kind === 'stock_length') {
          if (line.stickLength === '')
            ctx.addIssue({ code: 'custom', path: ['lines', i, 'stickLength'], message: 'Pipe is received by the stick: give the stick length' })
          else {
            const parsed = parseLength(line.stickLength)
            if (parsed.ok) stickLength = parsed.value
            else ctx.addIssue({ code: 'custom', path: ['lines', i, 'stickLength'], message: parsed.message })
          }
        }
        if (part?.lotTracked && line.lot === '')
          ctx.addIssue({
            code: 'custom',
            path: ['lines', i, 'lot'],
            message: `${part.sku} is tracked by lot: type or scan the supplier's lot on the bag or box`,
          })
        const lot = part?.lotTracked ? line.lot : null
        return {
          partId: line.partId,
          quantity: line.quantity,
          stickLength,
          lot,
          reference: form.reference,
          reason: line.reason || null,
          closeShort: line.closeShort,
        }
      })
      return { lines, purchaseOrderId: form.purchaseOrderId || null }
    })
}

/** The receiving form's values as typed. */
export type ReceiveFormValues = z.input<ReturnType<typeof makeReceiveFormSchema>>
