import type { LeakTest } from '@kitwright/shared/build'
import { LEAK_PLACE_LABELS, formatPressure } from '@kitwright/shared/domain/leak-test'
import { cn } from '../../../lib/cn'
import { formatLitres, formatWhen } from './format'

/** Every leak test of the unit, attempt by attempt, with pass or fail and why. */
export function LeakTestList({ tests }: { tests: readonly LeakTest[] }) {
  if (tests.length === 0) return <p className="text-lg text-stone-600">No leak test recorded yet.</p>
  return (
    <ol className="space-y-2" aria-label="Leak tests">
      {tests.map((t) => (
        <li key={t.id} className={cn('break-inside-avoid rounded-md border-2 p-3', t.passed ? 'border-brand-600 bg-brand-50' : 'border-red-600 bg-red-50')}>
          <p className="text-xl">
            <strong>Attempt {t.attempt}:</strong>{' '}
            <strong className={t.passed ? 'text-brand-700' : 'text-red-800'}>{t.passed ? 'PASSED' : 'FAILED'}</strong> · {formatPressure(t.startPressurePa, t.unit)} →{' '}
            {formatPressure(t.endPressurePa, t.unit)} (drop {formatPressure(t.dropPa, t.unit)}) over {t.holdMinutes} min, {formatLitres(t.waterVolumeMl)} of water
          </p>
          {t.leaks.length > 0 && (
            <p className="text-lg">
              Leaks seen: {t.leaks.map((l) => LEAK_PLACE_LABELS[l]).join(', ')}
              {t.leakNote && ` — ${t.leakNote}`}
            </p>
          )}
          {t.reason && <p className="text-lg text-red-800">{t.reason}</p>}
          <p className="text-base text-stone-600">
            {t.by.name}, {formatWhen(t.at)}
          </p>
        </li>
      ))}
    </ol>
  )
}
