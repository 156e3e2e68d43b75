import { zodResolver } from '@hookform/resolvers/zod'
import { useForm } from 'react-hook-form'
import { toast } from 'sonner'
import { z } from 'zod'
import { formatLengthForInput, parseLength, type LengthUnit } from '@kitwright/shared/domain/units'
import { UpdateShopSettingsSchema, type ShopSettings } from '@kitwright/shared/settings'
import { Button } from '../../../components/ui/button'
import { Field, Input, Select } from '../../../components/ui/field'
import { applyServerErrors } from '../../../lib/form-errors'
import { useUpdateSettings } from '../api/use-update-settings'

const UNIT_WORDS: Record<LengthUnit, string> = { in: 'inches', mm: 'millimetres' }
const LENGTH_FIELDS = ['kerf', 'endTrim', 'minOffcut'] as const

/**
 * What the admin types: lengths as text in the shop's current unit (read by the same parser as every
 * length field; a typed unit wins), the lead time as a number. On submit the lengths become base
 * units and the whole change is checked by the shared settings contract.
 */
const settingsFormSchema = (unit: LengthUnit) =>
  z
    .object({
      displayUnit: z.enum(['in', 'mm']),
      kerf: z.string(),
      endTrim: z.string(),
      minOffcut: z.string(),
      leadTimeDays: UpdateShopSettingsSchema.shape.leadTimeDays.unwrap(),
      autoReleasePaid: z.boolean(),
      nestingTimeLimitSeconds: UpdateShopSettingsSchema.shape.nestingTimeLimitSeconds.unwrap(),
      workdayStartHourUtc: UpdateShopSettingsSchema.shape.workdayStartHourUtc.unwrap(),
      workdayHours: UpdateShopSettingsSchema.shape.workdayHours.unwrap(),
      cutMinutesPerUnit: UpdateShopSettingsSchema.shape.cutMinutesPerUnit.unwrap(),
      buildMinutesPerUnit: UpdateShopSettingsSchema.shape.buildMinutesPerUnit.unwrap(),
      packMinutesPerUnit: UpdateShopSettingsSchema.shape.packMinutesPerUnit.unwrap(),
    })
    .superRefine((v, ctx) => {
      for (const key of LENGTH_FIELDS) {
        const parsed = parseLength(v[key], unit)
        if (!parsed.ok) ctx.addIssue({ code: 'custom', path: [key], message: parsed.message })
      }
    })
type SettingsFormValues = z.infer<ReturnType<typeof settingsFormSchema>>

function lengthOf(text: string, unit: LengthUnit): number {
  const parsed = parseLength(text, unit)
  if (!parsed.ok) throw new Error(parsed.message)
  return parsed.value
}

/** The admin's form for the shop's cutting allowances, unit, lead time and auto-release. */
export function SettingsForm({ settings }: { settings: ShopSettings }) {
  const update = useUpdateSettings()
  const unit = settings.displayUnit
  const form = useForm<SettingsFormValues>({
    resolver: zodResolver(settingsFormSchema(unit)),
    defaultValues: {
      displayUnit: unit,
      kerf: formatLengthForInput(settings.kerf, unit),
      endTrim: formatLengthForInput(settings.endTrim, unit),
      minOffcut: formatLengthForInput(settings.minOffcut, unit),
      leadTimeDays: settings.leadTimeDays,
      autoReleasePaid: settings.autoReleasePaid,
      nestingTimeLimitSeconds: settings.nestingTimeLimitSeconds,
      workdayStartHourUtc: settings.workdayStartHourUtc,
      workdayHours: settings.workdayHours,
      cutMinutesPerUnit: settings.cutMinutesPerUnit,
      buildMinutesPerUnit: settings.buildMinutesPerUnit,
      packMinutesPerUnit: settings.packMinutesPerUnit,
    },
  })
  const errors = form.formState.errors
  const submit = form.handleSubmit((v) =>
    update.mutate(
      {
        displayUnit: v.displayUnit,
        kerf: lengthOf(v.kerf, unit),
        endTrim: lengthOf(v.endTrim, unit),
        minOffcut: lengthOf(v.minOffcut, unit),
        leadTimeDays: v.leadTimeDays,
        autoReleasePaid: v.autoReleasePaid,
        nestingTimeLimitSeconds: v.nestingTimeLimitSeconds,
        workdayStartHourUtc: v.workdayStartHourUtc,
        workdayHours: v.workdayHours,
        cutMinutesPerUnit: v.cutMinutesPerUnit,
        buildMinutesPerUnit: v.buildMinutesPerUnit,
        packMinutesPerUnit: v.packMinutesPerUnit,
      },
      {
        onSuccess: (saved) => {
          toast.success('Settings saved')
          form.reset({
            displayUnit: saved.displayUnit,
            kerf: formatLengthForInput(saved.kerf, saved.displayUnit),
            endTrim: formatLengthForInput(saved.endTrim, saved.displayUnit),
            minOffcut: formatLengthForInput(saved.minOffcut, saved.displayUnit),
            leadTimeDays: saved.leadTimeDays,
            autoReleasePaid: saved.autoReleasePaid,
            nestingTimeLimitSeconds: saved.nestingTimeLimitSeconds,
            workdayStartHourUtc: saved.workdayStartHourUtc,
            workdayHours: saved.workdayHours,
            cutMinutesPerUnit: saved.cutMinutesPerUnit,
            buildMinutesPerUnit: saved.buildMinutesPerUnit,
            packMinutesPerUnit: saved.packMinutesPerUnit,
          })
        },
        onError: (err) => applyServerErrors(err, form.setError),
      },
    ),
  )
  const hint = `Lengths are read in ${UNIT_WORDS[unit]}, the unit shown now, unless you type one: e.g. ${unit === 'in' ? '1/8, 4-1/4", 3 mm' : '3, 108 mm, 1/8 in'}.`
  return (
    <form onSubmit={submit} aria-label="Shop settings" className="max-w-2xl space-y-6" noValidate>
      <fieldset className="space-y-4">
        <legend className="text-xl font-bold">Cutting</legend>
        <Field label="Units shown on screens and sheets" error={errors.displayUnit?.message}>
          <Select {...form.register('displayUnit')} className="w-56">
            <option value="in">Inches and sixteenths</option>
            <option value="mm">Millimetres</option>
          </Select>
        </Field>
        <div className="grid gap-4 sm:grid-cols-3">
          <Field label="Kerf (saw blade width)" error={errors.kerf?.message}>
            <Input {...form.register('kerf')} aria-invalid={!!errors.kerf} />
          </Field>
          <Field label="End trim per stick" error={errors.endTrim?.message}>
            <Input {...form.register('endTrim')} aria-invalid={!!errors.endTrim} />
          </Field>
          <Field label="Minimum offcut kept" error={errors.minOffcut?.message}>
            <Input {...form.register('minOffcut')} aria-invalid={!!errors.minOffcut} />
          </Field>
        </div>
        <p className="text-sm text-stone-500">{hint}</p>
        <Field
          label="Time to plan a cut run (seconds)"
          error={errors.nestingTimeLimitSeconds?.message}
          hint="The planner gets the best plan found in this time, with how far it can be from the best possible; a run can be planned again for longer."
        >
          <Input
            type="number"
            min={0.5}
            max={120}
            step={0.5}
            {...form.register('nestingTimeLimitSeconds', { valueAsNumber: true })}
            aria-invalid={!!errors.nestingTimeLimitSeconds}
            className="w-32"
          />
        </Field>
      </fieldset>
      <fieldset className="space-y-4">
        <legend className="text-xl font-bold">Orders</legend>
        <Field
          label="Minimum lead time (working days)"
          error={errors.leadTimeDays?.message}
          hint="Monday to Friday after the order is placed. An order that arrives without a ship date is promised from the work ahead of it at each bench and the parts it waits for, and never sooner than this."
        >
          <Input
            type="number"
            min={0}
            max={250}
            step={1}
            {...form.register('leadTimeDays', { valueAsNumber: true })}
            aria-invalid={!!errors.leadTimeDays}
            className="w-32"
          />
        </Field>
        <div className="grid gap-4 sm:grid-cols-2">
          <Field label="Working day starts at (hour, UTC)" error={errors.workdayStartHourUtc?.message}>
            <Input
              type="number"
              min={0}
              max={23}
              step={1}
              {...form.register('workdayStartHourUtc', { valueAsNumber: true })}
              aria-invalid={!!errors.workdayStartHourUtc}
              className="w-32"
            />
          </Field>
          <Field label="Hours in a working day" error={errors.workdayHours?.message}>
            <Input
              type="number"
              min={1}
              max={24}
              step={1}
              {...form.register('workdayHours', { valueAsNumber: true })}
              aria-invalid={!!errors.workdayHours}
              className="w-32"
            />
          </Field>
        </div>
        <div className="grid gap-4 sm:grid-cols-3">
          <Field label="Cut bench, minutes per unit" error={errors.cutMinutesPerUnit?.message}>
            <Input
              type="number"
              min={1}
              max={1440}
              step={1}
              {...form.register('cutMinutesPerUnit', { valueAsNumber: true })}
              aria-invalid={!!errors.cutMinutesPerUnit}
              className="w-32"
            />
          </Field>
          <Field label="Build bench, minutes per unit" error={errors.buildMinutesPerUnit?.message}>
            <Input
              type="number"
              min={1}
              max={1440}
              step={1}
              {...form.register('buildMinutesPerUnit', { valueAsNumber: true })}
              aria-invalid={!!errors.buildMinutesPerUnit}
              className="w-32"
            />
          </Field>
          <Field label="Pack bench, minutes per unit" error={errors.packMinutesPerUnit?.message}>
            <Input
              type="number"
              min={1}
              max={1440}
              step={1}
              {...form.register('packMinutesPerUnit', { valueAsNumber: true })}
              aria-invalid={!!errors.packMinutesPerUnit}
              className="w-32"
            />
          </Field>
        </div>
        <p className="text-sm text-stone-600">
          Until a bench has finished at least 5 units in the last 90 days, promises use these minutes; then the cut and build benches use the median of their
          own history (the pack bench keeps no start time, so its figure is always this one).
        </p>
        <label className="flex items-start gap-3">
          <input type="checkbox" className="mt-1 size-5 accent-brand-700" {...form.register('autoReleasePaid')} />
          <span>
            <span className="block font-bold">Release paid orders automatically</span>
            <span className="block text-sm text-stone-600">
              A paid web-store order is released into work orders as it arrives. Short stock does not stop it: the units wait for parts and the shortage is
              listed. Off: a planner releases each order.
            </span>
          </span>
        </label>
      </fieldset>
      <Button type="submit" disabled={update.isPending || !form.formState.isDirty}>
        Save settings
      </Button>
    </form>
  )
}
