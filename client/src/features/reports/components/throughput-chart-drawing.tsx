import { Bar, CartesianGrid, ComposedChart, Legend, Line, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts'
import type { ThroughputReport } from '@kitwright/shared/reports'
import { shortDay } from './format'

// Dark green bars and a dark blue line with dots: told apart by shape as well as colour,
// both above 4.5:1 against white (WCAG 2.1, 1.4.11 asks 3:1 for graphics).
const BUILT = '#17603e'
const SHIPPED = '#1d4ed8'

/** Units built (bars) and shipped (line) per day. */
export function ThroughputChart({ report }: { report: ThroughputReport }) {
  const data = report.rows.map((r) => ({ ...r, label: shortDay(r.day) }))
  return (
    <div
      className="h-72"
      role="img"
      aria-label={`Units built and shipped per day, ${report.from} to ${report.to} (UTC): ${report.totals.unitsBuilt} built, ${report.totals.unitsShipped} shipped`}
    >
      <ResponsiveContainer width="100%" height="100%">
        <ComposedChart data={data} margin={{ top: 8, right: 16, bottom: 24, left: 8 }}>
          <CartesianGrid stroke="#e7e5e4" vertical={false} />
          <XAxis
            dataKey="label"
            tick={{ fill: '#44403c', fontSize: 12 }}
            minTickGap={16}
            label={{ value: 'Day (UTC)', position: 'insideBottom', offset: -16, fill: '#44403c' }}
          />
          <YAxis
            allowDecimals={false}
            tick={{ fill: '#44403c', fontSize: 12 }}
            label={{ value: 'Units', angle: -90, position: 'insideLeft', fill: '#44403c' }}
          />
          <Tooltip />
          <Legend verticalAlign="top" height={28} />
          <Bar dataKey="unitsBuilt" name="Units built (bars)" fill={BUILT} isAnimationActive={false} />
          <Line
            dataKey="unitsShipped"
            name="Units shipped (line with dots)"
            stroke={SHIPPED}
            strokeWidth={2}
            dot={{ r: 3, fill: SHIPPED, strokeWidth: 0 }}
            legendType="line"
            isAnimationActive={false}
            type="linear"
          />
        </ComposedChart>
      </ResponsiveContainer>
    </div>
  )
}
