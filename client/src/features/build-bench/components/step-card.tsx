import { useState } from 'react'
import { toast } from 'sonner'
import type { BuildPage, BuildStepState } from '@kitwright/shared/build'
import { Button } from '../../../components/ui/button'
import { Caution } from '../../../components/ui/section'
import { cn } from '../../../lib/cn'
import { useTickStep, useUndoTick } from '../api/build-queries'
import { formatLimits, formatWhen } from './format'
import { PhotoButton } from './photo-button'
import { PhotoStrip } from './photo-strip'

/** One build step: what to do, its caution, its measurement or photo, one big tick, and undo. */
export function StepCard({ code, page, step }: { code: string; page: BuildPage; step: BuildStepState }) {
  const tick = useTickStep(code)
  const undo = useUndoTick(code)
  const [measurement, setMeasurement] = useState('')
  const photos = page.photos.filter((p) => p.stepId === step.id)
  const limits = formatLimits(step.measurementMin, step.measurementMax, step.measurementUnit)
  const ticked = step.tick
  const onTick = () => {
    const value = measurement.trim() === '' ? null : Number(measurement.replace(',', '.'))
    if (step.measurementRequired && (value === null || Number.isNaN(value))) {
      toast.error(`Enter the measurement in ${step.measurementUnit ?? 'its unit'} first`)
      return
    }
    tick.mutate(
      { workOrderId: page.workOrder.id, stepId: step.id, measurement: step.measurementRequired ? value : null },
      { onSuccess: () => setMeasurement(''), onError: (err) => toast.error(err.message) },
    )
  }
  return (
    <li
      aria-label={`Step ${step.position}`}
      data-ticked={ticked ? 'true' : undefined}
      className={cn('space-y-3 rounded-lg border-2 bg-white p-4', ticked ? 'border-brand-600 bg-brand-50' : 'border-stone-300')}
    >
      <div className="flex gap-4">
        <span className="flex h-12 w-12 shrink-0 items-center justify-center rounded-full bg-stone-900 text-2xl font-bold text-white">{step.position}</span>
        <div className="min-w-0 flex-1 space-y-2">
          <p className="text-2xl leading-snug">{step.text}</p>
          {step.caution && <Caution>{step.caution}</Caution>}
        </div>
      </div>
      {step.photoRequired && (
        <div className="space-y-2 pl-16">
          <p className="text-lg font-bold">{photos.length > 0 ? 'Photo taken' : 'This step needs a photo before it can be ticked'}</p>
          <PhotoStrip photos={photos} />
          {!ticked && <PhotoButton code={code} workOrderId={page.workOrder.id} stepId={step.id} label={`Photo for step ${step.position}`} />}
        </div>
      )}
      <div className="flex flex-wrap items-end gap-4 pl-16">
        {step.measurementRequired && !ticked && (
          <label className="block">
            <span className="block text-lg font-bold">
              Measurement ({step.measurementUnit}){limits && <span className="font-normal text-stone-700"> · limits {limits}</span>}
            </span>
            <span className="flex items-center gap-2">
              <input
                type="text"
                inputMode="decimal"
                value={measurement}
                onChange={(e) => setMeasurement(e.target.value)}
                onKeyDown={(e) => e.key === 'Enter' && onTick()}
                aria-label={`Measurement for step ${step.position} in ${step.measurementUnit ?? ''}`}
                className="h-14 w-40 rounded-md border-2 border-stone-400 px-3 text-2xl focus:outline-3 focus:outline-brand-600"
              />
              <span className="text-xl">{step.measurementUnit}</span>
            </span>
          </label>
        )}
        {ticked ? (
          <>
            <p className="text-xl">
              <span aria-hidden className="mr-2 font-bold text-brand-700">✓</span>
              Ticked by <strong>{ticked.by.name}</strong>, {formatWhen(ticked.at)}
              {ticked.measurement !== null && (
                <>
                  {' '}
                  · measured <strong>{ticked.measurement} {step.measurementUnit}</strong>
                </>
              )}
            </p>
            {ticked.outOfLimits && (
              <span className="rounded-md bg-red-700 px-3 py-1 text-lg font-bold text-white">Out of limits ({limits})</span>
            )}
            <Button
              variant="secondary"
              size="bench"
              className="ml-auto"
              disabled={undo.isPending}
              aria-label={`Undo step ${step.position}`}
              onClick={() => undo.mutate({ workOrderId: page.workOrder.id, stepId: step.id }, { onError: (err) => toast.error(err.message) })}
            >
              Undo
            </Button>
          </>
        ) : (
          <Button
            size="bench"
            className="ml-auto min-w-40 text-xl"
            disabled={tick.isPending || (step.photoRequired && photos.length === 0)}
            aria-label={`Tick step ${step.position}`}
            onClick={onTick}
          >
            ✓ Done
          </Button>
        )}
      </div>
    </li>
  )
}
