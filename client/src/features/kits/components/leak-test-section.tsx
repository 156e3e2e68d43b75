import { useFormContext, useWatch } from 'react-hook-form'
import { WATER_ONLY_PRESSURE_TEST_CAUTION } from '@kitwright/shared/domain/safety-cautions'
import { Button } from '../../../components/ui/button'
import { Field, Input, Select } from '../../../components/ui/field'
import { Caution, Section } from '../../../components/ui/section'
import { errorAt } from './field-error'
import type { RevisionFormValues } from './revision-form-model'

/** The leak test protocol each unit of this revision must pass at the build bench. */
export function LeakTestSection({ readOnly }: { readOnly: boolean }) {
  const { register, setValue, formState } = useFormContext<RevisionFormValues>()
  const has = useWatch<RevisionFormValues, 'hasLeakTest'>({ name: 'hasLeakTest' })
  const unit = useWatch<RevisionFormValues, 'leakTest.pressureUnit'>({ name: 'leakTest.pressureUnit' })
  if (!has) {
    return (
      <Section title="Leak test protocol" id="leak-test">
        <p className="text-stone-600">No leak test: units of this revision are not run wet (spare-parts packs, say).</p>
        {!readOnly && (
          <Button variant="secondary" onClick={() => setValue('hasLeakTest', true, { shouldDirty: true })}>
            Add a leak test
          </Button>
        )}
      </Section>
    )
  }
  const e = (k: string) => errorAt(formState.errors, `leakTest.${k}`)
  return (
    <Section title="Leak test protocol" id="leak-test">
      <div className="grid gap-3 sm:grid-cols-3 lg:grid-cols-6">
        <Field label="Pressure unit">
          <Select {...register('leakTest.pressureUnit')}>
            <option value="psi">psi</option>
            <option value="kPa">kPa</option>
          </Select>
        </Field>
        <Field label={`Lowest test pressure (${unit})`} error={e('minPressure')}>
          <Input inputMode="decimal" {...register('leakTest.minPressure')} />
        </Field>
        <Field label={`Highest test pressure (${unit})`} error={e('maxPressure')}>
          <Input inputMode="decimal" {...register('leakTest.maxPressure')} />
        </Field>
        <Field label="Hold (minutes)" error={e('holdMinutes')}>
          <Input inputMode="numeric" {...register('leakTest.holdMinutes')} />
        </Field>
        <Field label={`Largest allowed drop (${unit})`} error={e('maxDrop')}>
          <Input inputMode="decimal" {...register('leakTest.maxDrop')} />
        </Field>
        <Field label="Water volume (litres)" error={e('waterLitres')}>
          <Input inputMode="decimal" {...register('leakTest.waterLitres')} />
        </Field>
      </div>
      <Caution>
        The test runs a mains-powered pump in water: ground-fault protected (GFCI/RCD) outlet, dry hands, a drip loop in the cord,
        and unplug before reaching into the water. Never pressurise above the fittings' rating. Local codes and licensed practice
        come first.
      </Caution>
      <Caution>{WATER_ONLY_PRESSURE_TEST_CAUTION}</Caution>
    </Section>
  )
}
