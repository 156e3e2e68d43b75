import type { WipReport } from '@kitwright/shared/reports'
import { Section } from '../../../components/ui/section'
import { reportCsvHref } from '../api/report-queries'
import { ExportLink } from './export-link'
import { NumbersTable } from './numbers-table'

const BENCH = { cut: 'Cut bench: waiting to cut', build: 'Build bench: cut, building, rework', pack: 'Pack bench: built, ready to pack' } as const

/** Units waiting at each bench, how many are stuck, and the oldest one's age. */
export function WipPanel({ report }: { report: WipReport | undefined }) {
  return (
    <Section id="work-in-progress" title="Work in progress by bench" actions={<ExportLink href={reportCsvHref('work-in-progress')} label="work in progress" />}>
      <p className="text-sm text-stone-600">Ages count from the unit's release. Stuck: no change of status for {report?.stuckDays ?? 3} days or more.</p>
      {report ? (
        <NumbersTable
          label="Work in progress by bench"
          header={['Bench', 'Units', 'In rework', 'Stuck', 'Oldest unit', 'Its age']}
          numeric={[1, 2, 3, 5]}
          empty="No work in progress."
          rows={report.rows.map((b) => [
            BENCH[b.bench],
            b.units,
            b.bench === 'build' ? b.rework : '—',
            <span key="s" className={b.stuck > 0 ? 'font-bold text-red-700' : undefined}>
              {b.stuck}
            </span>,
            b.oldestSerial ? `${b.oldestSerial} (order ${b.oldestOrderNumber ?? '—'})` : '—',
            b.oldestAgeDays === null ? '—' : `${b.oldestAgeDays.toFixed(1)} days`,
          ])}
        />
      ) : (
        <p className="text-stone-500">Counting units…</p>
      )}
    </Section>
  )
}
