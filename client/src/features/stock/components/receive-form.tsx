import { zodResolver } from '@hookform/resolvers/zod'
import { useQuery } from '@tanstack/react-query'
import { useEffect, useMemo, useState } from 'react'
import { useFieldArray, useForm, useWatch, type Path } from 'react-hook-form'
import { toast } from 'sonner'
import { formatStickLength, type ReceiveStock } from '@kitwright/shared/stock'
import type { PurchaseOrder } from '@kitwright/shared/purchasing'
import { Button } from '../../../components/ui/button'
import { Field, Input, Select } from '../../../components/ui/field'
import { ApiError } from '../../../lib/api-client'
import { useLengthUnit } from '../../../lib/shop-settings'
import { stockPartOptions, useReceiveStock } from '../api/stock-queries'
import { makeReceiveFormSchema, type ReceiveFormValues } from './receive-form-schema'

const EMPTY_LINE = { partId: '', quantity: Number.NaN, stickLength: '', lot: '', reason: '', closeShort: false }

/**
 * The receiving form: one or more lines of one delivery, saved together or not at all. Against a
 * purchase order (sent or partly received), choosing it fills in what is still to come; more than
 * that needs a reason.
 */
export function ReceiveForm({ openOrders = [], initialPurchaseOrderId = '' }: { openOrders?: PurchaseOrder[]; initialPurchaseOrderId?: string }) {
  const parts = useQuery(stockPartOptions())
  const { unit, parse } = useLengthUnit()
  const receive = useReceiveStock()
  const schema = useMemo(() => makeReceiveFormSchema(parts.data ?? [], parse), [parts.data, parse])
  const form = useForm<ReceiveFormValues, unknown, ReceiveStock>({
    resolver: zodResolver(schema),
    defaultValues: { reference: '', purchaseOrderId: '', lines: [EMPTY_LINE] },
  })
  const chosenId = useWatch({ control: form.control, name: 'purchaseOrderId' })
  const chosen = openOrders.find((o) => o.id === chosenId)
  /** Fills the lines with what the order still brings. */
  const fillFrom = (id: string) => {
    const po = openOrders.find((o) => o.id === id)
    const due = po?.lines.filter((l) => l.outstanding > 0) ?? []
    form.reset({
      reference: form.getValues('reference'),
      purchaseOrderId: id,
      lines: due.length
        ? due.map((l) => ({ partId: l.partId, quantity: l.outstanding, stickLength: l.stickLength === null ? '' : formatStickLength(l.stickLength, unit), lot: '', reason: '', closeShort: false }))
        : [EMPTY_LINE],
    })
  }
  const [filledInitial, setFilledInitial] = useState(false)
  useEffect(() => {
    if (filledInitial || !initialPurchaseOrderId || !openOrders.some((o) => o.id === initialPurchaseOrderId)) return
    setFilledInitial(true)
    fillFrom(initialPurchaseOrderId)
  })
  const lines = useFieldArray({ control: form.control, name: 'lines' })
  const watched = useWatch({ control: form.control, name: 'lines' })
  const { errors } = form.formState
  const byId = new Map((parts.data ?? []).map((p) => [p.id, p]))

  const submit = (input: ReceiveStock) =>
    receive.mutate(input, {
      onSuccess: ({ moves }) => {
        toast.success(`Received ${moves.length} ${moves.length === 1 ? 'line' : 'lines'} into stock`)
        form.reset({ reference: '', purchaseOrderId: '', lines: [EMPTY_LINE] })
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
      <Field label="Purchase order (optional)" hint="The goods came on this order: its lines count them, and the part's cost follows what was paid">
        <Select className="max-w-md" value={chosenId} onChange={(e) => fillFrom(e.target.value)}>
          <option value="">None (no purchase order)</option>
          {openOrders.map((o) => (
            <option key={o.id} value={o.id}>
              {o.number} — {o.supplier.name}
            </option>
          ))}
        </Select>
      </Field>
      <Field label="Packing-list no. (optional)" hint="The supplier's delivery or packing-list number, kept on every line" error={errors.reference?.message}>
        <Input className="max-w-xs" aria-invalid={!!errors.reference} {...form.register('reference')} />
      </Field>
      {lines.fields.map((field, i) => {
        const part = byId.get(watched?.[i]?.partId ?? '')
        const isPipe = part?.kind === 'stock_length'
        const e = errors.lines?.[i]
        return (
          <fieldset key={field.id} className="grid items-start gap-3 border-t border-stone-200 pt-3 md:grid-cols-[2fr_1fr_1fr_auto]">
            {chosen && (
              <div className="md:col-span-4">
                {(() => {
                  const line = chosen.lines.find((l) => l.partId === watched?.[i]?.partId)
                  return line ? (
                    <p className="text-sm text-stone-700">
                      {chosen.number}: {line.received} of {line.quantity} received, {line.outstanding} still to come
                    </p>
                  ) : null
                })()}
              </div>
            )}
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
            ) : part?.lotTracked ? (
              <Field label={`Supplier's lot (line ${i + 1})`} hint="As printed on the bag or box; scan it or type it" error={e?.lot?.message}>
                <Input className="font-mono" aria-invalid={!!e?.lot} {...form.register(`lines.${i}.lot`)} />
              </Field>
            ) : (
              <div aria-hidden className="hidden md:block" />
            )}
            {isPipe && part.lotTracked && (
              <div className="md:col-span-4">
                <Field label={`Supplier's lot (line ${i + 1})`} hint="As printed on the bundle; scan it or type it" error={e?.lot?.message}>
                  <Input className="max-w-xs font-mono" aria-invalid={!!e?.lot} {...form.register(`lines.${i}.lot`)} />
                </Field>
              </div>
            )}
            {chosen && (
              <div className="md:col-span-3">
                <Field label={`Reason, if more than is still to come (line ${i + 1})`} error={e?.reason?.message}>
                  <Input aria-invalid={!!e?.reason} placeholder="e.g. the supplier sent a full box" {...form.register(`lines.${i}.reason`)} />
                </Field>
                <label className="mt-2 flex items-center gap-2 text-sm">
                  <input type="checkbox" className="h-5 w-5" {...form.register(`lines.${i}.closeShort`)} />
                  The rest of this line will not come: close it short (give the reason above)
                </label>
              </div>
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
