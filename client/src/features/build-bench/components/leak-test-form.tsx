import { zodResolver } from '@hookform/resolvers/zod'
import type { ReactNode } from 'react'
import { useForm } from 'react-hook-form'
import { toast } from 'sonner'
import { RecordLeakTestSchema, type BuildPage, type RecordLeakTestInput } from '@kitwright/shared/build'
import { LEAK_PLACE_LABELS, LEAK_PLACES, PRESSURE_UNITS, formatPressure } from '@kitwright/shared/domain/leak-test'
import type { z } from 'zod'
import { Button } from '../../../components/ui/button'
import { applyServerErrors } from '../../../lib/form-errors'
import { useRecordLeakTest } from '../api/build-bench-actions'
import { formatLitres } from './format'

type LeakTestValues = z.infer<typeof RecordLeakTestSchema>

const big = 'h-14 w-full rounded-md border-2 border-stone-400 bg-white px-3 text-2xl focus:outline-3 focus:outline-brand-600 aria-invalid:border-red-600'

function NumberField({ label, error, children }: { label: string; error?: string; children: ReactNode }) {
  return (
    <label className="block space-y-1">
      <span className="block text-lg font-bold">{label}</span>
      {children}
      {error && (
        <span role="alert" className="block text-lg text-red-700">
          {error}
        </span>
      )}
    </label>
  )
}

/** The leak test as read off the gauge; pass or fail comes back from the server, judged by the protocol. */
export function LeakTestForm({ code, page }: { code: string; page: BuildPage }) {
  const protocol = page.leakTestProtocol!
  const record = useRecordLeakTest(code)
  const form = useForm<RecordLeakTestInput, unknown, LeakTestValues>({
    resolver: zodResolver(RecordLeakTestSchema),
    defaultValues: {
      unit: 'psi',
      startPressure: Number.NaN,
      endPressure: Number.NaN,
      holdMinutes: protocol.holdMinutes,
      waterVolumeMl: protocol.waterVolumeMl,
      leaks: [],
      leakNote: '',
    },
  })
  const { errors } = form.formState
  // The server refuses the test until every step is ticked: say so here, before anyone fills it in.
  const stepsLeft = page.steps.filter((s) => !s.tick).map((s) => s.position)
  const unit = form.watch('unit')
  const p = (pa: number) => formatPressure(pa, unit)
  const submit = (input: LeakTestValues) =>
    record.mutate(
      { workOrderId: page.workOrder.id, serial: page.workOrder.serial, ...input },
      {
        onSuccess: (next) => {
          // No network: the readings wait on the tablet; pass or fail is the server's to say, later.
          const last = next?.leakTests.at(-1)
          if (!next) toast.info('No network: the leak test readings are kept on this tablet; the verdict comes when the network is back')
          else if (last?.passed) toast.success(`Leak test ${last.attempt} passed`)
          else toast.error(`Leak test ${last?.attempt ?? ''} failed: the unit goes to rework`)
          form.reset({ ...form.getValues(), startPressure: Number.NaN, endPressure: Number.NaN, leaks: [], leakNote: '' })
        },
        onError: (err) => applyServerErrors(err, form.setError),
      },
    )
  return (
    <form onSubmit={form.handleSubmit(submit)} noValidate aria-label="Leak test" className="space-y-4">
      <p className="text-lg">
        Protocol: start between <strong>{p(protocol.minPressurePa)}</strong> and <strong>{p(protocol.maxPressurePa)}</strong>, hold at least{' '}
        <strong>{protocol.holdMinutes} min</strong>, drop at most <strong>{p(protocol.maxDropPa)}</strong>, with{' '}
        <strong>{formatLitres(protocol.waterVolumeMl)}</strong> of water.
      </p>
      <fieldset className="flex flex-wrap items-center gap-3">
        <legend className="mb-1 text-lg font-bold">Gauge reads in</legend>
        {PRESSURE_UNITS.map((u) => (
          <label
            key={u}
            className="inline-flex h-14 min-w-24 cursor-pointer items-center justify-center gap-2 rounded-md border-2 border-stone-400 px-4 text-xl font-bold has-checked:border-brand-700 has-checked:bg-brand-700 has-checked:text-white"
          >
            <input type="radio" value={u} className="sr-only" {...form.register('unit')} />
            {u}
          </label>
        ))}
      </fieldset>
      <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
        <NumberField label={`Start pressure (${unit})`} error={errors.startPressure?.message}>
          <input
            type="number"
            step="any"
            inputMode="decimal"
            className={big}
            aria-invalid={!!errors.startPressure}
            {...form.register('startPressure', { valueAsNumber: true })}
          />
        </NumberField>
        <NumberField label={`Pressure after the hold (${unit})`} error={errors.endPressure?.message}>
          <input
            type="number"
            step="any"
            inputMode="decimal"
            className={big}
            aria-invalid={!!errors.endPressure}
            {...form.register('endPressure', { valueAsNumber: true })}
          />
        </NumberField>
        <NumberField label="Hold (minutes)" error={errors.holdMinutes?.message}>
          <input
            type="number"
            inputMode="numeric"
            className={big}
            aria-invalid={!!errors.holdMinutes}
            {...form.register('holdMinutes', { valueAsNumber: true })}
          />
        </NumberField>
        <NumberField label="Water (ml)" error={errors.waterVolumeMl?.message}>
          <input
            type="number"
            inputMode="numeric"
            className={big}
            aria-invalid={!!errors.waterVolumeMl}
            {...form.register('waterVolumeMl', { valueAsNumber: true })}
          />
        </NumberField>
      </div>
      <fieldset>
        <legend className="mb-2 text-lg font-bold">Leaks seen (tap every place that dripped; none if dry)</legend>
        <div className="flex flex-wrap gap-3">
          {LEAK_PLACES.map((place) => (
            <label
              key={place}
              className="inline-flex h-14 cursor-pointer items-center gap-2 rounded-md border-2 border-stone-400 px-4 text-xl has-checked:border-red-700 has-checked:bg-red-700 has-checked:text-white"
            >
              <input type="checkbox" value={place} className="h-6 w-6" {...form.register('leaks')} />
              {LEAK_PLACE_LABELS[place]}
            </label>
          ))}
        </div>
      </fieldset>
      <NumberField label="Where exactly / note" error={errors.leakNote?.message}>
        <input type="text" className={big} {...form.register('leakNote')} />
      </NumberField>
      {stepsLeft.length > 0 && (
        <p className="rounded-md border-2 border-amber-600 bg-amber-50 p-3 text-xl font-bold">
          The leak test comes after every build step: tick step{stepsLeft.length > 1 ? 's' : ''} {stepsLeft.join(', ')} first.
        </p>
      )}
      <Button type="submit" size="bench" disabled={record.isPending || stepsLeft.length > 0} className="text-xl">
        Record leak test
      </Button>
    </form>
  )
}
