import type { CutRunYieldReport, FirstPassYieldReport, LeadTimeReport, ThroughputReport, YieldOverTimeReport } from '@kitwright/shared/reports'
import { days, percent, utcStamp } from './format'
import { NumbersTable } from './numbers-table'

/** The numbers behind the throughput chart. */
export function ThroughputTable({ report }: { report: ThroughputReport }) {
  return (
    <NumbersTable
      label="Units built and shipped per day"
      header={['Day (UTC)', 'Units built', 'Units shipped']}
      empty="No days in the range."
      rows={[...report.rows.map((r) => [r.day, r.unitsBuilt, r.unitsShipped]), ['Total', report.totals.unitsBuilt, report.totals.unitsShipped]]}
    />
  )
}

/** The numbers behind the yield chart. */
export function YieldWeeksTable({ report }: { report: YieldOverTimeReport }) {
  return (
    <NumbersTable
      label="Material yield per week"
      header={['Week starting (UTC)', 'Cut runs', 'Planned', 'Actual', 'Damaged sticks', 'Pieces cut again']}
      empty="No weeks in the range."
      rows={report.rows.map((r) => [r.weekStart, r.runs, percent(r.plannedYield), percent(r.actualYield), r.damagedSticks, r.spoiledPieces])}
    />
  )
}

/** Planned against actual yield per cut run, lengths in the shop's unit. */
export function CutRunYieldTable({ report, formatLength }: { report: CutRunYieldReport; formatLength: (v: number) => string }) {
  return (
    <NumbersTable
      label="Material yield per cut run"
      header={['Cut run', 'Finished', 'Pieces', 'Pipe consumed', 'Planned', 'Actual', 'Damaged sticks', 'Pieces cut again']}
      numeric={[2, 3, 4, 5, 6, 7]}
      empty="No cut run finished in the range."
      rows={report.rows.map((r) => [
        r.number,
        utcStamp(r.completedAt),
        formatLength(r.actual.pieceLength),
        formatLength(r.actual.consumedLength),
        percent(r.planned.yield),
        percent(r.actual.yield),
        r.damagedSticks,
        r.spoiledPieces,
      ])}
    />
  )
}

/** The numbers behind the first-pass chart. */
export function FirstPassTable({ report }: { report: FirstPassYieldReport }) {
  return (
    <NumbersTable
      label="First-pass leak test yield per kit revision"
      header={['Kit revision', 'Units tested', 'Passed first test', 'First-pass yield']}
      empty="No unit had its first leak test in the range."
      rows={report.rows.map((r) => [`${r.kitSku} rev ${r.revisionCode} · ${r.kitName}`, r.unitsTested, r.passedFirst, percent(r.yield)])}
    />
  )
}

/** Lead time from paid to shipped per week, and over the whole range. */
export function LeadTimeTable({ report }: { report: LeadTimeReport }) {
  const o = report.overall
  return (
    <NumbersTable
      label="Lead time from paid to shipped"
      header={['Week starting (UTC)', 'Orders shipped', 'Average', 'Median', 'Longest']}
      empty="No weeks in the range."
      rows={[
        ...report.rows.map((r) => [r.weekStart, r.orders, days(r.averageDays), days(r.medianDays), days(r.longestDays)]),
        ['Whole range', o.orders, days(o.averageDays), days(o.medianDays), days(o.longestDays)],
      ]}
    />
  )
}
