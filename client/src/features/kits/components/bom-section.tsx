import { useFieldArray, useFormContext } from 'react-hook-form'
import type { Part } from '@kitwright/shared/parts'
import { Button } from '../../../components/ui/button'
import { Input, Select } from '../../../components/ui/field'
import { Section } from '../../../components/ui/section'
import { errorAt } from './field-error'
import type { RevisionFormValues } from './revision-form-model'

/** The bill of materials: hardware and packaging per unit (pipe comes in as cut parts). */
export function BomSection({ parts, readOnly }: { parts: Part[]; readOnly: boolean }) {
  const { control, register, formState } = useFormContext<RevisionFormValues>()
  const { fields, append, remove } = useFieldArray({ control, name: 'bomLines' })
  return (
    <Section
      title="Bill of materials"
      id="bom"
      actions={
        !readOnly && (
          <Button variant="secondary" size="sm" onClick={() => append({ partId: '', quantity: '1', note: '' })}>
            Add a line
          </Button>
        )
      }
    >
      {fields.length === 0 ? (
        <p className="text-stone-600">No lines yet.</p>
      ) : (
        <table className="w-full text-left" aria-label="Bill of materials">
          <thead className="text-sm text-stone-600">
            <tr>
              <th>Part</th>
              <th>Qty per unit</th>
              <th>Note</th>
              <th />
            </tr>
          </thead>
          <tbody>
            {fields.map((field, i) => (
              <tr key={field.id} className="border-t border-stone-200 align-top">
                <td className="py-1 pr-2">
                  <Select aria-label={`Part of line ${i + 1}`} {...register(`bomLines.${i}.partId`)}>
                    <option value="">Choose a part…</option>
                    {parts.map((p) => (
                      <option key={p.id} value={p.id}>
                        {p.sku} · {p.name}
                      </option>
                    ))}
                  </Select>
                  {errorAt(formState.errors, `bomLines.${i}.partId`) && <span role="alert" className="text-sm text-red-700">{errorAt(formState.errors, `bomLines.${i}.partId`)}</span>}
                </td>
                <td className="w-28 pr-2">
                  <Input aria-label={`Quantity of line ${i + 1}`} inputMode="numeric" {...register(`bomLines.${i}.quantity`)} />
                  {errorAt(formState.errors, `bomLines.${i}.quantity`) && <span role="alert" className="text-sm text-red-700">{errorAt(formState.errors, `bomLines.${i}.quantity`)}</span>}
                </td>
                <td className="pr-2">
                  <Input aria-label={`Note of line ${i + 1}`} {...register(`bomLines.${i}.note`)} />
                </td>
                <td>
                  {!readOnly && (
                    <Button size="sm" variant="ghost" onClick={() => remove(i)} aria-label={`Remove line ${i + 1}`}>
                      Remove
                    </Button>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </Section>
  )
}
