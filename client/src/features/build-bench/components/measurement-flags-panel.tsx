import { useQuery } from '@tanstack/react-query'
import { Link } from 'react-router-dom'
import type { MeasurementFlag } from '@kitwright/shared/measurement-flags'
import { Section } from '../../../components/ui/section'
import { paths } from '../../../config/paths'
import { measurementFlagsOptions } from '../api/build-queries'
import { formatLimits, formatWhen } from './format'

/** Where the unit is with its flag: sent to rework, in rework, or reworked (the step undone to measure again). */
function reworkWords(f: MeasurementFlag): string | null {
  if (f.undoneAt) return f.rework ? 'reworked' : 'measured again'
  if (!f.rework) return null
  return f.workOrderStatus === 'rework' ? 'in rework' : 'sent to rework'
}

/**
 * Out-of-limits measurements, one a line: the unit, the step, the value and its limits, the reason,
 * who and when, and where the rework stands. The home page's attention list and the order page
 * show the same lines (`withOrder` names the order, for the home page; without it the step's words are shown).
 */
export function MeasurementFlagList({ flags, withOrder }: { flags: readonly MeasurementFlag[]; withOrder: boolean }) {
  return (
    <ul aria-label="Measurements out of limits" className="divide-y divide-stone-200">
      {flags.map((f) => {
        const rework = reworkWords(f)
        return (
          <li key={f.tickId} className="py-2">
            <p>
              <Link to={paths.unit.href(f.serial)} className="font-bold text-brand-700 underline">
                Unit {f.serial}
              </Link>{' '}
              {withOrder ? (
                <>
                  (order{' '}
                  <Link to={paths.order.href(f.orderId)} className="text-brand-700 underline">
                    {f.orderNumber}
                  </Link>
                  , {f.kitSku} rev {f.revisionCode})
                </>
              ) : (
                <>
                  ({f.kitSku} rev {f.revisionCode})
                </>
              )}{' '}
              · step {f.stepPosition}:{' '}
              <strong className={f.undoneAt ? 'text-stone-600 line-through' : 'text-red-700'}>
                {f.measurement} {f.unit}
              </strong>
              , limits {formatLimits(f.min, f.max, f.unit)}
              {rework && (
                <span
                  className={
                    f.undoneAt ? 'ml-2 rounded bg-green-700 px-2 text-sm font-bold text-white' : 'ml-2 rounded bg-red-700 px-2 text-sm font-bold text-white'
                  }
                >
                  {rework}
                </span>
              )}
            </p>
            {!withOrder && (
              <p className="text-sm text-stone-700">
                Step {f.stepPosition}: {f.stepText}
              </p>
            )}
            <p className="text-sm text-stone-700">
              “{f.reason ?? 'no reason'}” — {f.by}, {formatWhen(f.at)}
              {f.undoneAt && (
                <>
                  {' '}
                  · step undone by {f.undoneBy ?? 'someone'}, {formatWhen(f.undoneAt)}
                </>
              )}
            </p>
          </li>
        )
      })}
    </ul>
  )
}

/** The planner's attention list of out-of-limits measurements recorded at the build bench, with the reason given. */
export function MeasurementFlagsPanel() {
  const flags = useQuery(measurementFlagsOptions())
  return (
    <Section id="out-of-limits" title="Measurements out of limits">
      <p className="text-sm text-stone-600">
        Recorded at the build bench with a reason, on units not yet shipped; newest first. Undoing the step and measuring again clears it.
      </p>
      {flags.isError && (
        <p role="alert" className="text-red-700">
          {flags.error.message}
        </p>
      )}
      {flags.data?.length === 0 && <p>No measurement is out of limits.</p>}
      {flags.data && flags.data.length > 0 && <MeasurementFlagList flags={flags.data} withOrder />}
      {!flags.data && !flags.isError && <p className="text-stone-500">Looking for out-of-limits measurements…</p>}
    </Section>
  )
}
