import { useState } from 'react'
import { toast } from 'sonner'
import type { BuildPage, BuildStepState } from '@kitwright/shared/build'
import { outsideLimits, parseMeasurement } from '@kitwright/shared/domain/measurement'
import { Button } from '../../../components/ui/button'
import { Caution } from '../../../components/ui/section'
import { ApiError } from '../../../lib/api-client'
import { cn } from '../../../lib/cn'
import { useTickStep, useUndoTick } from '../api/build-bench-actions'
import { formatLimits, formatWhen } from './format'
import { PhotoButton } from './photo-button'
import { PhotoStrip } from './photo-strip'

/** The earlier steps this one waits for: none for a free-order step, else every earlier unticked step that is not free-order. */
export function waitingFor(page: BuildPage, step: BuildStepState): number[] {
  if (step.freeOrder) return []
  return page.steps.filter((s) => s.position < step.position && !s.freeOrder && !s.tick).map((s) => s.position)
}

/**
 * One build step: what to do, its caution, its measurement or photo, one big tick, and undo. The
 * measurement is typed as the shop writes lengths (18 1/2, 18-1/2", 470 mm); a value outside the
 * limits asks for a reason before it is recorded (the server insists too).
 */
export function StepCard({ code, page, step }: { code: string; page: BuildPage; step: BuildStepState }) {
  const tick = useTickStep(code)
  const undo = useUndoTick(code)
  const [measurement, setMeasurement] = useState('')
  const [reason, setReason] = useState('')
  const [problem, setProblem] = useState<string | null>(null)
  const [askReason, setAskReason] = useState(false)
  const photos = page.photos.filter((p) => p.stepId === step.id)
  const limits = formatLimits(step.measurementMin, step.measurementMax, step.measurementUnit)
  const ticked = step.tick
  const before = ticked ? [] : waitingFor(page, step)
  const onTick = () => {
    setProblem(null)
    let value: string | null = null
    if (step.measurementRequired) {
      const read = parseMeasurement(measurement, step.measurementUnit)
      if (!read.ok) {
        setProblem(measurement.trim() === '' ? `Enter the measurement in ${step.measurementUnit ?? 'its unit'} first` : read.message)
        return
      }
      if (outsideLimits(read.value, step.measurementMin, step.measurementMax) && reason.trim() === '') {
        setAskReason(true)
        setProblem(`${read.value} ${step.measurementUnit ?? ''} is outside the limits (${limits}): measure again, or say why it is recorded.`)
        return
      }
      value = measurement
    }
    tick.mutate(
      { workOrderId: page.workOrder.id, stepId: step.id, serial: page.workOrder.serial, position: step.position, measurement: value, reason: askReason ? reason : null },
      {
        onSuccess: () => {
          setMeasurement('')
          setReason('')
          setAskReason(false)
        },
        onError: (err) => {
          if (err instanceof ApiError && err.body.fields?.reason) setAskReason(true)
          setProblem(err.message)
        },
      },
    )
  }
  return (
    <li
      aria-label={`Step ${step.position}`}
      data-ticked={ticked ? 'true' : undefined}
      className={cn('space-y-3 rounded-lg border-2 bg-white p-4', ticked ? (ticked.outOfLimits ? 'border-red-700 bg-red-50' : 'border-brand-600 bg-brand-50') : 'border-stone-300')}
    >
      <div className="flex gap-4">
        <span className="flex h-12 w-12 shrink-0 items-center justify-center rounded-full bg-stone-900 text-2xl font-bold text-white">{step.position}</span>
        <div className="min-w-0 flex-1 space-y-2">
          <p className="text-2xl leading-snug">
            {step.text}
            {step.freeOrder && <span className="ml-3 rounded-md bg-stone-200 px-2 py-0.5 align-middle text-base font-bold text-stone-800">Any order</span>}
          </p>
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
                value={measurement}
                placeholder={step.measurementUnit === 'mm' ? '470' : step.measurementUnit === 'in' ? '18 1/2' : ''}
                onChange={(e) => {
                  setMeasurement(e.target.value)
                  setProblem(null)
                }}
                onKeyDown={(e) => e.key === 'Enter' && onTick()}
                aria-label={`Measurement for step ${step.position} in ${step.measurementUnit ?? ''}`}
                className="h-14 w-44 rounded-md border-2 border-stone-400 px-3 text-2xl focus:outline-3 focus:outline-brand-600"
              />
              <span className="text-xl">{step.measurementUnit}</span>
            </span>
          </label>
        )}
        {step.measurementRequired && !ticked && askReason && (
          <label className="block min-w-72 flex-1">
            <span className="block text-lg font-bold">Why record it out of limits{step.outOfLimitsRework ? ' (the unit goes to rework)' : ' (flagged to the planner)'}</span>
            <input
              type="text"
              value={reason}
              onChange={(e) => setReason(e.target.value)}
              onKeyDown={(e) => e.key === 'Enter' && onTick()}
              aria-label={`Reason for step ${step.position}`}
              className="h-14 w-full rounded-md border-2 border-red-600 px-3 text-xl focus:outline-3 focus:outline-brand-600"
            />
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
              <span className="rounded-md bg-red-700 px-3 py-1 text-lg font-bold text-white">
                Out of limits ({limits}){ticked.outOfLimitsReason ? `: ${ticked.outOfLimitsReason}` : ''}
              </span>
            )}
            <Button
              variant="secondary"
              size="bench"
              className="ml-auto"
              disabled={undo.isPending}
              aria-label={`Undo step ${step.position}`}
              onClick={() => undo.mutate({ workOrderId: page.workOrder.id, stepId: step.id, serial: page.workOrder.serial, position: step.position }, { onError: (err) => toast.error(err.message) })}
            >
              Undo
            </Button>
          </>
        ) : (
          <>
            {before.length > 0 && <p className="text-lg text-stone-700">Do step {before[0]} first</p>}
            <Button
              size="bench"
              className="ml-auto min-w-40 text-xl"
              disabled={tick.isPending || before.length > 0 || (step.photoRequired && photos.length === 0)}
              aria-label={`Tick step ${step.position}`}
              onClick={onTick}
            >
              ✓ Done
            </Button>
          </>
        )}
      </div>
      {problem && (
        <p role="alert" className="ml-16 rounded-md border-2 border-red-700 bg-red-50 p-3 text-xl font-bold text-red-900">
          {problem}
        </p>
      )}
    </li>
  )
}
