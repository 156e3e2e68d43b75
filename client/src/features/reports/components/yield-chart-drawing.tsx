import { CartesianGrid, Legend, Line, LineChart, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts'
import type { YieldOverTimeReport } from '@kitwright/shared/reports'
import { percent, shortDay } from './format'

const ACTUAL = '#17603e'
const PLANNED = '#57534e'

/** Planned (dashed) against actual (solid) material yield per week, in percent. */
export function YieldChart({ report }: { report: YieldOverTimeReport }) {
  const data = report.rows.map((r) => ({
    label: shortDay(r.weekStart),
    planned: r.plannedYield === null ? null : Math.round(r.plannedYield * 1000) / 10,
    actual: r.actualYield === null ? null : Math.round(r.actualYield * 1000) / 10,
  }))
  // The axis starts 10 points below the lowest yield (at 0 at most), so a few points' loss shows.
  const lowest = Math.min(100, ...data.flatMap((d) => [d.planned, d.actual].filter((v): v is number => v !== null)))
  const floor = Math.max(0, Math.floor(lowest / 10) * 10 - 10)
  return (
    <div className="h-72" role="img" aria-label={`Material yield per week, ${report.from} to ${report.to} (UTC), planned dashed and actual solid`}>
      <ResponsiveContainer width="100%" height="100%">
        <LineChart data={data} margin={{ top: 8, right: 16, bottom: 24, left: 8 }}>
          <CartesianGrid stroke="#e7e5e4" vertical={false} />
          <XAxis dataKey="label" tick={{ fill: '#44403c', fontSize: 12 }} label={{ value: 'Week starting (Monday, UTC)', position: 'insideBottom', offset: -16, fill: '#44403c' }} />
          <YAxis domain={[floor, 100]} allowDataOverflow unit=" %" tick={{ fill: '#44403c', fontSize: 12 }} label={{ value: 'Yield', angle: -90, position: 'insideLeft', fill: '#44403c' }} />
          <Tooltip formatter={(v) => (typeof v === 'number' ? percent(v / 100) : String(v))} />
          <Legend verticalAlign="top" height={28} />
          <Line dataKey="planned" name="Planned (dashed)" stroke={PLANNED} strokeWidth={2} strokeDasharray="6 4" dot={{ r: 3 }} connectNulls isAnimationActive={false} />
          <Line dataKey="actual" name="Actual, miscuts included (solid)" stroke={ACTUAL} strokeWidth={3} dot={{ r: 4 }} connectNulls isAnimationActive={false} />
        </LineChart>
      </ResponsiveContainer>
    </div>
  )
}
