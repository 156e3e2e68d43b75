import { zodResolver } from '@hookform/resolvers/zod'
import { useForm } from 'react-hook-form'
import { toast } from 'sonner'
import { ADJUST_REASON_SUGGESTIONS, AdjustStockSchema, formatStickLength, type AdjustStock, type AdjustStockInput, type StockLedger, type StockRow } from '@kitwright/shared/stock'
import { Button } from '../../../components/ui/button'
import { Field, Input, Select } from '../../../components/ui/field'
import { applyServerErrors } from '../../../lib/form-errors'
import { useLengthUnit } from '../../../lib/shop-settings'
import { useAdjustStock } from '../api/stock-queries'

/** An adjustment of one part's on-hand, with the reason the ledger keeps. */
export function AdjustForm({ part, lots = [] }: { part: StockRow; lots?: StockLedger['lots'] }) {
  const { unit } = useLengthUnit()
  const adjust = useAdjustStock()
  const isPipe = part.kind === 'stock_length'
  const form = useForm<AdjustStockInput, unknown, AdjustStock>({
    resolver: zodResolver(AdjustStockSchema),
    defaultValues: { partId: part.partId, quantity: Number.NaN, stickLength: isPipe ? (part.stickLengths[0] ?? null) : null, lot: lots[0]?.code ?? null, reason: '' },
  })
  const { errors } = form.formState
  const submit = (input: AdjustStock) =>
    adjust.mutate(input, {
      onSuccess: ({ moves }) => {
        const q = moves[0]?.quantity ?? 0
        toast.success(`${part.sku}: ${q > 0 ? `+${q}` : q} recorded`)
        form.reset({ partId: part.partId, quantity: Number.NaN, stickLength: form.getValues('stickLength'), lot: form.getValues('lot'), reason: '' })
      },
      onError: (err) => applyServerErrors(err, form.setError),
    })
  return (
    <form onSubmit={form.handleSubmit(submit)} noValidate aria-label="Adjust stock" className="grid gap-3 rounded-lg border border-stone-300 bg-white p-4 md:grid-cols-[1fr_1fr_2fr_auto]">
      <Field label="Change (+ or −)" hint="e.g. -2 for two damaged, 5 for five found" error={errors.quantity?.message}>
        <Input type="number" inputMode="numeric" aria-invalid={!!errors.quantity} {...form.register('quantity', { valueAsNumber: true })} />
      </Field>
      {isPipe ? (
        <Field label="Stick length" error={errors.stickLength?.message}>
          <Select {...form.register('stickLength', { setValueAs: (v: string | number | null) => (v === '' || v === null ? null : Number(v)) })}>
            {part.stickLengths.map((l) => (
              <option key={l} value={l}>
                {formatStickLength(l, unit)}
              </option>
            ))}
          </Select>
        </Field>
      ) : lots.length > 0 ? (
        <Field label="Supplier's lot" hint="The lot the change is in" error={errors.lot?.message}>
          <Select {...form.register('lot')}>
            {lots.map((l) => (
              <option key={l.lotId} value={l.code}>
                {l.code} ({l.onHand} on hand)
              </option>
            ))}
          </Select>
        </Field>
      ) : (
        <div aria-hidden className="hidden md:block" />
      )}
      <Field label="Reason" hint="Required: count correction, damaged, found stock…" error={errors.reason?.message}>
        <Input list="adjust-reasons" aria-invalid={!!errors.reason} {...form.register('reason')} />
        <datalist id="adjust-reasons">
          {ADJUST_REASON_SUGGESTIONS.map((r) => (
            <option key={r} value={r} />
          ))}
        </datalist>
      </Field>
      <div className="flex items-start pt-6">
        <Button type="submit" disabled={adjust.isPending}>
          Record adjustment
        </Button>
      </div>
    </form>
  )
}
