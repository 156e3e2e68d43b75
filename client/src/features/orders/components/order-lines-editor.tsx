import { useQuery } from '@tanstack/react-query'
import { useEffect, useState } from 'react'
import { useController, useFieldArray, useWatch, type Control, type FieldErrors, type UseFormRegister } from 'react-hook-form'
import type { Kit } from '@kitwright/shared/kits'
import type { NewOrder, NewOrderDraft } from '@kitwright/shared/orders'
import { Button } from '../../../components/ui/button'
import { Field, Input, Select } from '../../../components/ui/field'
import { orderKitsOptions } from '../api/order-queries'
import { dollarsToCents } from '@kitwright/shared/money'
import { formatMoney } from './format'

export const EMPTY_LINE: NewOrderDraft['lines'][number] = { kitSku: '', quantity: 1, unitPriceCents: Number.NaN }

interface Props {
  control: Control<NewOrderDraft, unknown, NewOrder>
  register: UseFormRegister<NewOrderDraft>
  errors: FieldErrors<NewOrderDraft>
}

/**
 * The unit price box: dollars as typed, cents in the form. It starts empty (or at the chosen kit's
 * list price) and follows the kit while the planner has not typed a price of their own.
 */
function UnitPriceInput({ control, index, kit, error }: { control: Control<NewOrderDraft, unknown, NewOrder>; index: number; kit: Kit | undefined; error?: string }) {
  const { field } = useController({ control, name: `lines.${index}.unitPriceCents` })
  const [text, setText] = useState(() => (Number.isFinite(field.value) ? (field.value / 100).toFixed(2) : ''))
  const [typed, setTyped] = useState(false)
  const listPrice = kit?.priceCents ?? null
  const { onChange } = field
  // A kit chosen and no price typed yet: start from its list price.
  useEffect(() => {
    if (typed || listPrice === null) return
    setText((listPrice / 100).toFixed(2))
    onChange(listPrice)
  }, [typed, listPrice, onChange])
  return (
    <Field label="Unit price ($)" error={error} hint={kit?.priceCents != null ? `List price ${formatMoney(kit.priceCents)}` : undefined}>
      <Input
        inputMode="decimal"
        placeholder="189.00"
        aria-invalid={!!error}
        name={field.name}
        ref={field.ref}
        value={text}
        onBlur={field.onBlur}
        onChange={(e) => {
          setTyped(true)
          setText(e.target.value)
          field.onChange(dollarsToCents(e.target.value))
        }}
      />
    </Field>
  )
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
            <UnitPriceInput control={control} index={i} kit={(kits.data ?? []).find((k) => k.sku === watched?.[i]?.kitSku)} error={e?.unitPriceCents?.message} />
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
