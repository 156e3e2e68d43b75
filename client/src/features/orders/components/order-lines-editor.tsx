import { useQuery } from '@tanstack/react-query'
import { useFieldArray, useWatch, type Control, type FieldErrors, type UseFormRegister } from 'react-hook-form'
import type { NewOrder, NewOrderDraft } from '@kitwright/shared/orders'
import { Button } from '../../../components/ui/button'
import { Field, Input, Select } from '../../../components/ui/field'
import { orderKitsOptions } from '../api/order-queries'
import { formatMoney } from './format'

/** Dollars typed into a price box as cents (NaN when unreadable, so the schema says what to fix). */
export function dollarsToCents(text: unknown): number {
  if (typeof text === 'number') return text
  const m = /^\s*\$?\s*(\d{1,7})(?:\.(\d{1,2}))?\s*$/.exec(String(text ?? ''))
  return m ? Number(m[1]) * 100 + Number((m[2] ?? '').padEnd(2, '0')) : Number.NaN
}

export const EMPTY_LINE: NewOrderDraft['lines'][number] = { kitSku: '', quantity: 1, unitPriceCents: Number.NaN }

interface Props {
  control: Control<NewOrderDraft, unknown, NewOrder>
  register: UseFormRegister<NewOrderDraft>
  errors: FieldErrors<NewOrderDraft>
}

/** The lines of a phone order: a kit, how many, and the price agreed, one row each. */
export function OrderLinesEditor({ control, register, errors }: Props) {
  const kits = useQuery(orderKitsOptions())
  const lines = useFieldArray({ control, name: 'lines' })
  const watched = useWatch({ control, name: 'lines' })
  const total = (watched ?? []).reduce((s, l) => s + (Number.isFinite(l.unitPriceCents) && Number.isFinite(l.quantity) ? l.unitPriceCents * l.quantity : 0), 0)
  return (
    <fieldset className="space-y-3">
      <legend className="text-xl font-bold">Lines</legend>
      {lines.fields.map((field, i) => {
        const e = errors.lines?.[i]
        return (
          <div key={field.id} className="grid items-start gap-3 sm:grid-cols-[1fr_8rem_10rem_auto]" aria-label={`Line ${i + 1}`} role="group">
            <Field label={`Kit, line ${i + 1}`} error={e?.kitSku?.message}>
              <Select aria-invalid={!!e?.kitSku} {...register(`lines.${i}.kitSku`)}>
                <option value="">Choose a kit…</option>
                {(kits.data ?? []).map((k) => (
                  <option key={k.id} value={k.sku} disabled={!k.revisions.some((r) => r.status === 'released')}>
                    {k.sku} · {k.name}
                  </option>
                ))}
              </Select>
            </Field>
            <Field label="Quantity" error={e?.quantity?.message}>
              <Input type="number" min={1} inputMode="numeric" aria-invalid={!!e?.quantity} {...register(`lines.${i}.quantity`, { valueAsNumber: true })} />
            </Field>
            <Field label="Unit price ($)" error={e?.unitPriceCents?.message}>
              <Input inputMode="decimal" placeholder="189.00" aria-invalid={!!e?.unitPriceCents} {...register(`lines.${i}.unitPriceCents`, { setValueAs: dollarsToCents })} />
            </Field>
            <Button variant="ghost" className="mt-6" disabled={lines.fields.length === 1} onClick={() => lines.remove(i)} aria-label={`Remove line ${i + 1}`}>
              Remove
            </Button>
          </div>
        )
      })}
      {errors.lines?.message && (
        <p role="alert" className="text-sm text-red-700">
          {errors.lines.message}
        </p>
      )}
      <div className="flex flex-wrap items-center gap-4">
        <Button variant="secondary" onClick={() => lines.append(EMPTY_LINE)}>
          Add a line
        </Button>
        <span className="font-bold">Total {formatMoney(total)}</span>
      </div>
    </fieldset>
  )
}
