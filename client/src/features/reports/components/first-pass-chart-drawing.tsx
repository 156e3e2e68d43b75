import { Bar, BarChart, CartesianGrid, LabelList, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts'
import type { FirstPassYieldReport } from '@kitwright/shared/reports'

/** First-pass leak test yield per kit revision: one bar each, its percentage and count written on it. */
export function FirstPassChart({ report }: { report: FirstPassYieldReport }) {
  const data = report.rows.map((r) => ({
    label: `${r.kitSku} rev ${r.revisionCode}`,
    yield: r.yield === null ? 0 : Math.round(r.yield * 1000) / 10,
    caption: `${r.yield === null ? '—' : (r.yield * 100).toFixed(1)} % of ${r.unitsTested}`,
  }))
  return (
    <div className="h-72" role="img" aria-label={`First-pass leak test yield per kit revision, ${report.from} to ${report.to} (UTC)`}>
      <ResponsiveContainer width="100%" height="100%">
        <BarChart data={data} margin={{ top: 24, right: 16, bottom: 24, left: 8 }}>
          <CartesianGrid stroke="#e7e5e4" vertical={false} />
          <XAxis dataKey="label" tick={{ fill: '#44403c', fontSize: 12 }} label={{ value: 'Kit revision', position: 'insideBottom', offset: -16, fill: '#44403c' }} />
          <YAxis domain={[0, 100]} unit=" %" tick={{ fill: '#44403c', fontSize: 12 }} label={{ value: 'Passed first test', angle: -90, position: 'insideLeft', fill: '#44403c' }} />
          <Tooltip formatter={(v) => `${String(v)} %`} />
          <Bar dataKey="yield" name="First-pass yield" fill="#17603e" isAnimationActive={false}>
            <LabelList dataKey="caption" position="top" fill="#1c1917" fontSize={12} />
          </Bar>
        </BarChart>
      </ResponsiveContainer>
    </div>
  )
}
