import { zodResolver } from '@hookform/resolvers/zod'
import { useQuery } from '@tanstack/react-query'
import { useMemo } from 'react'
import { useFieldArray, useForm, useWatch, type Path } from 'react-hook-form'
import { toast } from 'sonner'
import { formatStickLength, type ReceiveStock } from '@kitwright/shared/stock'
import { Button } from '../../../components/ui/button'
import { Field, Input, Select } from '../../../components/ui/field'
import { ApiError } from '../../../lib/api-client'
import { useLengthUnit } from '../../../lib/shop-settings'
import { stockPartOptions, useReceiveStock } from '../api/stock-queries'
import { makeReceiveFormSchema, type ReceiveFormValues } from './receive-form-schema'

const EMPTY_LINE = { partId: '', quantity: Number.NaN, stickLength: '' }

/** The receiving form: one or more lines of one delivery, saved together or not at all. */
export function ReceiveForm() {
  const parts = useQuery(stockPartOptions())
  const { unit, parse } = useLengthUnit()
  const receive = useReceiveStock()
  const schema = useMemo(() => makeReceiveFormSchema(parts.data ?? [], parse), [parts.data, parse])
  const form = useForm<ReceiveFormValues, unknown, ReceiveStock>({
    resolver: zodResolver(schema),
    defaultValues: { reference: '', lines: [EMPTY_LINE] },
  })
  const lines = useFieldArray({ control: form.control, name: 'lines' })
  const watched = useWatch({ control: form.control, name: 'lines' })
  const { errors } = form.formState
  const byId = new Map((parts.data ?? []).map((p) => [p.id, p]))

  const submit = (input: ReceiveStock) =>
    receive.mutate(input, {
      onSuccess: ({ moves }) => {
        toast.success(`Received ${moves.length} ${moves.length === 1 ? 'line' : 'lines'} into stock`)
        form.reset({ reference: '', lines: [EMPTY_LINE] })
      },
      onError: (err) => {
        if (err instanceof ApiError) {
          for (const [field, message] of Object.entries(err.body.fields ?? {})) {
            // The API names lines.N.sku for a part it cannot find; the form picks parts by id.
            form.setError(field.replace(/\.sku$/, '.partId') as Path<ReceiveFormValues>, { message })
          }
          toast.error(err.message)
        } else toast.error('Could not reach Kitwright; check the connection and try again')
      },
    })

  return (
    <form onSubmit={form.handleSubmit(submit)} noValidate aria-label="Receive stock" className="space-y-4 rounded-lg border border-stone-300 bg-white p-4">
      <Field label="Packing-list no. (optional)" hint="The supplier's delivery or packing-list number, kept on every line" error={errors.reference?.message}>
        <Input className="max-w-xs" aria-invalid={!!errors.reference} {...form.register('reference')} />
      </Field>
      {lines.fields.map((field, i) => {
        const part = byId.get(watched?.[i]?.partId ?? '')
        const isPipe = part?.kind === 'stock_length'
        const e = errors.lines?.[i]
        return (
          <fieldset key={field.id} className="grid items-start gap-3 border-t border-stone-200 pt-3 md:grid-cols-[2fr_1fr_1fr_auto]">
            <legend className="sr-only">Line {i + 1}</legend>
            <Field label={`Part (line ${i + 1})`} error={e?.partId?.message}>
              <Select aria-invalid={!!e?.partId} {...form.register(`lines.${i}.partId`)}>
                <option value="">Choose a part…</option>
                {(parts.data ?? []).map((p) => (
                  <option key={p.id} value={p.id}>
                    {p.sku} — {p.name}
                  </option>
                ))}
              </Select>
            </Field>
            <Field label={`Quantity${part ? ` (${part.unitOfMeasure})` : ''}`} error={e?.quantity?.message}>
              <Input type="number" inputMode="numeric" min={1} aria-invalid={!!e?.quantity} {...form.register(`lines.${i}.quantity`, { valueAsNumber: true })} />
            </Field>
            {isPipe ? (
              <Field
                label="Stick length"
                hint={`One of ${part.stickLengths.map((l) => formatStickLength(l, unit)).join(', ')}`}
                error={e?.stickLength?.message}
              >
                <Input list={`stick-lengths-${i}`} placeholder={unit === 'in' ? 'e.g. 10 ft' : 'e.g. 3048 mm'} aria-invalid={!!e?.stickLength} {...form.register(`lines.${i}.stickLength`)} />
                <datalist id={`stick-lengths-${i}`}>
                  {part.stickLengths.map((l) => (
                    <option key={l} value={formatStickLength(l, unit)} />
                  ))}
                </datalist>
              </Field>
            ) : (
              <div aria-hidden className="hidden md:block" />
            )}
            <div className="flex h-full items-end pb-1">
              <Button variant="ghost" size="sm" disabled={lines.fields.length === 1} onClick={() => lines.remove(i)}>
                Remove line
              </Button>
            </div>
          </fieldset>
        )
      })}
      {errors.lines?.root?.message && <p role="alert" className="text-red-700">{errors.lines.root.message}</p>}
      <div className="flex flex-wrap gap-3">
        <Button variant="secondary" onClick={() => lines.append(EMPTY_LINE)}>
          Add a line
        </Button>
        <Button type="submit" disabled={receive.isPending || parts.isLoading}>
          Receive into stock
        </Button>
      </div>
    </form>
  )
}
