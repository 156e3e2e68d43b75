import { useFieldArray, useFormContext, useWatch } from 'react-hook-form'
import { Button } from '../../../components/ui/button'
import { Field, Input } from '../../../components/ui/field'
import { Section } from '../../../components/ui/section'
import { errorAt } from './field-error'
import type { RevisionFormValues } from './revision-form-model'

const EMPTY_STEP = { text: '', caution: '', photoRequired: false, measurementRequired: false, measurementUnit: '', measurementMin: '', measurementMax: '', freeOrder: false, outOfLimitsRework: false }

/** The build bench's steps, in order, each with its caution and what it must record. */
export function StepsSection({ readOnly }: { readOnly: boolean }) {
  const { control, register, formState } = useFormContext<RevisionFormValues>()
  const { fields, append, remove, move } = useFieldArray({ control, name: 'buildSteps' })
  const steps = useWatch<RevisionFormValues, 'buildSteps'>({ name: 'buildSteps' })
  return (
    <Section
      title="Build steps"
      id="steps"
      actions={
        !readOnly && (
          <Button variant="secondary" size="sm" onClick={() => append(EMPTY_STEP)}>
            Add a step
          </Button>
        )
      }
    >
      <ol className="space-y-3">
        {fields.map((field, i) => (
          <li key={field.id} className="grid gap-2 rounded-md border border-stone-200 p-3 md:grid-cols-[2rem_1fr]">
            <span className="text-2xl font-bold text-stone-500">{i + 1}</span>
            <div className="space-y-2">
              <Field label="What to do" error={errorAt(formState.errors, `buildSteps.${i}.text`)}>
                <Input {...register(`buildSteps.${i}.text`)} />
              </Field>
              <Field label="Caution (shown beside the step)">
                <Input {...register(`buildSteps.${i}.caution`)} />
              </Field>
              <div className="flex flex-wrap items-center gap-4">
                <label className="flex items-center gap-2">
                  <input type="checkbox" className="size-5" {...register(`buildSteps.${i}.photoRequired`)} /> Photo required
                </label>
                <label className="flex items-center gap-2">
                  <input type="checkbox" className="size-5" {...register(`buildSteps.${i}.measurementRequired`)} /> Measurement required
                </label>
                <label className="flex items-center gap-2">
                  <input type="checkbox" className="size-5" {...register(`buildSteps.${i}.freeOrder`)} /> Any order (the other steps go in order)
                </label>
                {steps[i]?.measurementRequired && (
                  <>
                    <Input aria-label={`Unit of step ${i + 1}`} placeholder="unit" className="w-24" {...register(`buildSteps.${i}.measurementUnit`)} />
                    <Input aria-label={`Lowest of step ${i + 1}`} placeholder="lowest" className="w-24" {...register(`buildSteps.${i}.measurementMin`)} />
                    <Input aria-label={`Highest of step ${i + 1}`} placeholder="highest" className="w-24" {...register(`buildSteps.${i}.measurementMax`)} />
                    <label className="flex items-center gap-2">
                      <input type="checkbox" className="size-5" {...register(`buildSteps.${i}.outOfLimitsRework`)} /> Out of limits sends the unit to rework
                    </label>
                  </>
                )}
              </div>
              {(['measurementUnit', 'measurementMin', 'measurementMax'] as const).map((k) => {
                const m = errorAt(formState.errors, `buildSteps.${i}.${k}`)
                return m ? <p key={k} role="alert" className="text-sm text-red-700">{m}</p> : null
              })}
              {!readOnly && (
                <div className="flex gap-2">
                  <Button size="sm" variant="ghost" disabled={i === 0} onClick={() => move(i, i - 1)}>
                    Move up
                  </Button>
                  <Button size="sm" variant="ghost" disabled={i === fields.length - 1} onClick={() => move(i, i + 1)}>
                    Move down
                  </Button>
                  <Button size="sm" variant="ghost" onClick={() => remove(i)}>
                    Remove
                  </Button>
                </div>
              )}
            </div>
          </li>
        ))}
      </ol>
    </Section>
  )
}
