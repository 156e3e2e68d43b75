import type { CutRunDetail } from '@kitwright/shared/cut-runs'
import { CUT_STICK_STATUS_LABELS } from '@kitwright/shared/status-words'
import { StickDrawing } from '../../../components/cut/stick-drawing'
import { StickLegend } from '../../../components/cut/stick-legend'
import { Section } from '../../../components/ui/section'
import { useLengthUnit } from '../../../lib/shop-settings'

/** The plan's totals, its distance from the lower bound, and every stick drawn to one scale. */
export function PlanView({ run }: { run: CutRunDetail }) {
  const { format } = useLengthUnit()
  const t = run.totals
  const scale = Math.max(1, ...run.sticks.map((s) => s.length))
  const facts: [string, string][] = [
    ['Sticks', `${t.sticksUsed} (${t.offcutsUsed} from offcuts)`],
    ['Fewest possible', `${t.lowerBoundSticks} stick${t.lowerBoundSticks === 1 ? '' : 's'}`],
    ['Stock bought', format(t.stockCost)],
    ['Gap to the lower bound', `${(t.gap * 100).toFixed(1)} % (bound ${format(t.lowerBoundCost)})`],
    ['Pieces', format(t.pieceLength)],
    ['Waste', `${format(t.waste)} (${t.wastePercent.toFixed(1)} %)`],
    ['Offcuts to stock', `${t.offcutsMade} (${format(t.offcutLength)})`],
    ['Engine', `${run.planStatus === 'optimal' ? 'proven best' : run.planStatus === 'time-limit' ? 'stopped at the time limit' : 'good, not proven best'} in ${(run.solveMs / 1000).toFixed(1)} s`],
  ]
  return (
    <div className="space-y-4">
      <Section title="Totals">
        <dl className="grid gap-x-6 gap-y-2 sm:grid-cols-2 lg:grid-cols-4">
          {facts.map(([k, v]) => (
            <div key={k}>
              <dt className="text-sm text-stone-600">{k}</dt>
              <dd className="text-lg font-bold">{v}</dd>
            </div>
          ))}
        </dl>
        <p className="text-sm text-stone-600">
          Kerf {format(run.kerf)}, end trim {format(run.endTrim)}, offcuts kept from {format(run.minOffcut)}.
        </p>
        <StickLegend />
      </Section>
      <Section title={`Sticks (${run.sticks.length})`}>
        <ol className="space-y-3">
          {run.sticks.map((s) => (
            <li key={s.id} className="space-y-1">
              <p className="text-sm">
                <span className="font-bold">Stick {s.position}</span> · pattern {s.patternIndex + 1} · {s.partSku} ·{' '}
                {s.source === 'offcut' ? `offcut ${s.sourceOffcutCode} (${format(s.length)})` : `${format(s.length)} stick`}
                {s.status !== 'pending' ? ` · ${CUT_STICK_STATUS_LABELS[s.status]}` : ''}
              </p>
              <StickDrawing stick={s} kerf={run.kerf} scaleLength={scale} format={format} />
            </li>
          ))}
        </ol>
      </Section>
    </div>
  )
}
