import type { UnitRecord } from '@kitwright/shared/build'
import { formatLimits, formatWhen } from './format'

/** Every step with who ticked it and when, its measurement, and any undo along the way. */
export function RecordSteps({ record }: { record: UnitRecord }) {
  return (
    <table className="w-full text-left text-base" aria-label="Build steps">
      <thead className="border-b-2 border-stone-400">
        <tr>
          <th className="py-1 pr-3">#</th>
          <th className="py-1 pr-3">Step</th>
          <th className="py-1 pr-3">Ticked</th>
          <th className="py-1 pr-3">Measurement</th>
        </tr>
      </thead>
      <tbody>
        {record.steps.map((s) => (
          <tr key={s.id} className="border-b border-stone-200 align-top">
            <td className="py-1 pr-3 font-bold">{s.position}</td>
            <td className="py-1 pr-3">
              {s.text}
              {s.history
                .filter((h) => h.undoneAt !== null)
                .map((h) => (
                  <span key={h.id} className="block text-sm text-stone-600">
                    Ticked by {h.by.name} {formatWhen(h.at)}, undone by {h.undoneBy?.name ?? '?'} {formatWhen(h.undoneAt!)}
                  </span>
                ))}
            </td>
            <td className="py-1 pr-3">{s.tick ? `${s.tick.by.name}, ${formatWhen(s.tick.at)}` : <strong>not ticked</strong>}</td>
            <td className="py-1 pr-3">
              {s.tick?.measurement != null && (
                <>
                  {s.tick.measurement} {s.measurementUnit}
                  {s.tick.outOfLimits && (
                    <strong className="text-red-800">
                      {' '}
                      · out of limits ({formatLimits(s.measurementMin, s.measurementMax, s.measurementUnit)})
                      {s.tick.outOfLimitsReason ? `: ${s.tick.outOfLimitsReason}` : ''}
                    </strong>
                  )}
                </>
              )}
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  )
}
