import { useFieldArray, useFormContext, useWatch } from 'react-hook-form'
import type { Part } from '@kitwright/shared/parts'
import { Button } from '../../../components/ui/button'
import { Input, Select } from '../../../components/ui/field'
import { Section } from '../../../components/ui/section'
import { useLengthUnit } from '../../../lib/shop-settings'
import { errorAt } from './field-error'
import type { RevisionFormValues } from './revision-form-model'

function Err({ message }: { message?: string }) {
  return message ? <span role="alert" className="block text-sm text-red-700">{message}</span> : null
}

/** The revision's cut parts: frame lines show their calculated length; an override needs a reason. */
export function CutPartsSection({ pipes, readOnly }: { pipes: Part[]; readOnly: boolean }) {
  const { control, register, formState } = useFormContext<RevisionFormValues>()
  const { fields, append, remove } = useFieldArray({ control, name: 'cutParts' })
  const rows = useWatch<RevisionFormValues, 'cutParts'>({ name: 'cutParts' })
  const { parse, format } = useLengthUnit()
  return (
    <Section
      title="Cut parts"
      id="cut-parts"
      actions={
        !readOnly && (
          <Button variant="secondary" size="sm" onClick={() => append({ partId: pipes[0]?.id ?? '', label: '', length: '', quantity: '1', frameKey: '', calculatedLength: null, overrideReason: '' })}>
            Add a cut part by hand
          </Button>
        )
      }
    >
      {fields.length === 0 ? (
        <p className="text-stone-600">No cut parts yet.</p>
      ) : (
        <table className="w-full text-left" aria-label="Cut parts">
          <thead className="text-sm text-stone-600">
            <tr>
              <th>Label</th>
              <th>Cut from</th>
              <th>Length</th>
              <th>Qty</th>
              <th>Calculated</th>
              <th />
            </tr>
          </thead>
          <tbody>
            {fields.map((field, i) => {
              const row = rows[i]
              const parsed = row ? parse(row.length) : null
              const overridden = row?.calculatedLength != null && parsed?.ok === true && parsed.value !== row.calculatedLength
              return (
                <tr key={field.id} className="border-t border-stone-200 align-top">
                  <td className="py-1 pr-2">
                    <Input aria-label={`Label of cut part ${i + 1}`} {...register(`cutParts.${i}.label`)} readOnly={!!row?.frameKey} />
                    <Err message={errorAt(formState.errors, `cutParts.${i}.label`)} />
                  </td>
                  <td className="pr-2">
                    <Select aria-label={`Pipe of cut part ${i + 1}`} {...register(`cutParts.${i}.partId`)}>
                      {pipes.map((p) => (
                        <option key={p.id} value={p.id}>
                          {p.sku}
                        </option>
                      ))}
                    </Select>
                    <Err message={errorAt(formState.errors, `cutParts.${i}.partId`)} />
                  </td>
                  <td className="w-36 pr-2">
                    <Input aria-label={`Length of cut part ${i + 1}`} {...register(`cutParts.${i}.length`)} />
                    <Err message={errorAt(formState.errors, `cutParts.${i}.length`) ?? (parsed && !parsed.ok ? parsed.message : undefined)} />
                  </td>
                  <td className="w-20 pr-2">
                    <Input aria-label={`Quantity of cut part ${i + 1}`} inputMode="numeric" {...register(`cutParts.${i}.quantity`)} readOnly={!!row?.frameKey} />
                    <Err message={errorAt(formState.errors, `cutParts.${i}.quantity`)} />
                  </td>
                  <td className="pr-2 text-stone-600">
                    {row?.calculatedLength != null ? format(row.calculatedLength) : 'by hand'}
                    {overridden && (
                      <>
                        <Input aria-label={`Why cut part ${i + 1} differs from the calculation`} placeholder="Why it differs" className="mt-1" {...register(`cutParts.${i}.overrideReason`)} />
                        <Err message={errorAt(formState.errors, `cutParts.${i}.overrideReason`)} />
                      </>
                    )}
                  </td>
                  <td>
                    {!readOnly && !row?.frameKey && (
                      <Button size="sm" variant="ghost" onClick={() => remove(i)} aria-label={`Remove cut part ${i + 1}`}>
                        Remove
                      </Button>
                    )}
                  </td>
                </tr>
              )
            })}
          </tbody>
        </table>
      )}
    </Section>
  )
}
