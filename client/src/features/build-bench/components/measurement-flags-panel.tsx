import { useQuery } from '@tanstack/react-query'
import { Link } from 'react-router-dom'
import { Section } from '../../../components/ui/section'
import { paths } from '../../../config/paths'
import { measurementFlagsOptions } from '../api/build-queries'
import { formatLimits, formatWhen } from './format'

/** The planner's attention list of out-of-limits measurements recorded at the build bench, with the reason given. */
export function MeasurementFlagsPanel() {
  const flags = useQuery(measurementFlagsOptions())
  return (
    <Section id="out-of-limits" title="Measurements out of limits">
      <p className="text-sm text-stone-600">Recorded at the build bench with a reason, on units not yet shipped; newest first. Undoing the step and measuring again clears it.</p>
      {flags.isError && (
        <p role="alert" className="text-red-700">
          {flags.error.message}
        </p>
      )}
      {flags.data?.length === 0 && <p>No measurement is out of limits.</p>}
      {flags.data && flags.data.length > 0 && (
        <ul aria-label="Measurements out of limits" className="divide-y divide-stone-200">
          {flags.data.map((f) => (
            <li key={f.tickId} className="py-2">
              <p>
                <Link to={paths.unit.href(f.serial)} className="font-bold text-brand-700 underline">
                  Unit {f.serial}
                </Link>{' '}
                (order{' '}
                <Link to={paths.order.href(f.orderId)} className="text-brand-700 underline">
                  {f.orderNumber}
                </Link>
                , {f.kitSku} rev {f.revisionCode}) · step {f.stepPosition}: <strong className="text-red-700">{f.measurement} {f.unit}</strong>, limits {formatLimits(f.min, f.max, f.unit)}
                {f.rework && <span className="ml-2 rounded bg-red-700 px-2 text-sm font-bold text-white">{f.workOrderStatus === 'rework' ? 'in rework' : 'sent to rework'}</span>}
              </p>
              <p className="text-sm text-stone-700">
                “{f.reason ?? 'no reason'}” — {f.by}, {formatWhen(f.at)}
              </p>
            </li>
          ))}
        </ul>
      )}
      {!flags.data && !flags.isError && <p className="text-stone-500">Looking for out-of-limits measurements…</p>}
    </Section>
  )
}
