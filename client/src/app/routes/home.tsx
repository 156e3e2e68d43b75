import { useQuery } from '@tanstack/react-query'
import { useSearchParams } from 'react-router-dom'
import { REPORT_TIME_ZONE, ReportRangeQuerySchema, type ReportRangeQuery } from '@kitwright/shared/reports'
import { ORDER_STATUS_LABELS } from '@kitwright/shared/status-words'
import { Section } from '../../components/ui/section'
import { meOptions } from '../../features/auth/api/auth-queries'
import { MeasurementFlagsPanel } from '../../features/build-bench/components/measurement-flags-panel'
import { ReturnsSummaryPanel } from '../../features/returns/components/returns-summary-panel'
import { paths } from '../../config/paths'
import { FailedMailPanel } from '../../features/mail/components/failed-mail-panel'
import {
  cutRunYieldOptions,
  firstPassYieldOptions,
  lateOrdersOptions,
  leadTimeOptions,
  orderStatesOptions,
  reportCsvHref,
  shortPartsOptions,
  throughputOptions,
  wipOptions,
  yieldOverTimeOptions,
} from '../../features/reports/api/report-queries'
import { ChartPanel } from '../../features/reports/components/chart-panel'
import { CutRunYieldTable, FirstPassTable, LeadTimeTable, ThroughputTable, YieldWeeksTable } from '../../features/reports/components/chart-tables'
import { ExportLink } from '../../features/reports/components/export-link'
import { FirstPassChart } from '../../features/reports/components/first-pass-chart'
import { utcStamp } from '../../features/reports/components/format'
import { LateOrdersPanel } from '../../features/reports/components/late-orders-panel'
import { MorningNumbers } from '../../features/reports/components/morning-numbers'
import { RangePicker } from '../../features/reports/components/range-picker'
import { ShortPartsPanel } from '../../features/reports/components/short-parts-panel'
import { ThroughputChart } from '../../features/reports/components/throughput-chart'
import { WipPanel } from '../../features/reports/components/wip-panel'
import { YieldChart } from '../../features/reports/components/yield-chart'
import { useLengthUnit } from '../../lib/shop-settings'


function rangeFromSearch(params: URLSearchParams): ReportRangeQuery {
  const parsed = ReportRangeQuerySchema.safeParse({ from: params.get('from') || undefined, to: params.get('to') || undefined })
  return parsed.success ? parsed.data : {}
}

function Waiting({ error, what }: { error: Error | null; what: string }) {
  return error ? (
    <p role="alert" className="text-red-700">
      {error.message}
    </p>
  ) : (
    <p className="text-stone-500">Reading {what}…</p>
  )
}

export function Component() {
  const { data: me } = useQuery(meOptions())
  const [searchParams, setSearchParams] = useSearchParams()
  const range = rangeFromSearch(searchParams)
  const { format } = useLengthUnit()
  const states = useQuery(orderStatesOptions())
  const late = useQuery(lateOrdersOptions())
  const wip = useQuery(wipOptions())
  const shortages = useQuery(shortPartsOptions())
  const throughput = useQuery(throughputOptions(range))
  const yieldWeeks = useQuery(yieldOverTimeOptions(range))
  const runYield = useQuery(cutRunYieldOptions(range))
  const firstPass = useQuery(firstPassYieldOptions(range))
  const lead = useQuery(leadTimeOptions(range))
  const stuckDays = wip.data?.stuckDays ?? 3
  const shown = throughput.data ? `${throughput.data.from} to ${throughput.data.to}` : 'the last 30 days'
  const setRange = (next: ReportRangeQuery) => {
    const params: Record<string, string> = {}
    if (next.from) params.from = next.from
    if (next.to) params.to = next.to
    setSearchParams(params, { replace: true })
  }

  return (
    <div className="space-y-6">
      <div>
        <h1 className="text-3xl font-bold">Good day, {me?.name.split(' ')[0]}</h1>
        <p className="text-stone-700">
          Dates and days on this page are in {REPORT_TIME_ZONE}.{states.data ? ` Figures as of ${utcStamp(states.data.asOf)}.` : ''}
        </p>
      </div>

      <MorningNumbers
        late={late.data?.total}
        stuck={wip.data?.rows.reduce((s, r) => s + r.stuck, 0)}
        stuckDays={stuckDays}
        short={shortages.data?.rows.filter((r) => r.short > 0).length}
        leadDays={lead.data ? lead.data.overall.averageDays : undefined}
      />

      <Section title="Orders by state" actions={<ExportLink href={reportCsvHref('order-states')} label="orders by state" />}>
        {states.data ? (
          <dl className="flex flex-wrap gap-x-8 gap-y-2">
            {states.data.rows.map((r) => (
              <div key={r.status}>
                <dt className="text-sm font-bold text-stone-600">{ORDER_STATUS_LABELS[r.status]}</dt>
                <dd className="text-2xl font-bold tabular-nums">{r.count}</dd>
              </div>
            ))}
          </dl>
        ) : (
          <Waiting error={states.error} what="the orders" />
        )}
      </Section>

      <FailedMailPanel />

      <div className="grid gap-6 xl:grid-cols-2">
        <LateOrdersPanel report={late.data} />
        <div className="space-y-6">
          <WipPanel report={wip.data} />
          <ShortPartsPanel shortages={shortages.data} />
          <MeasurementFlagsPanel />
          <ReturnsSummaryPanel returnsHref={paths.returns.href()} />
        </div>
      </div>

      <div className="flex flex-wrap items-end justify-between gap-3 border-t border-stone-300 pt-4">
        <div>
          <h2 className="text-2xl font-bold">Over time</h2>
          <p className="text-stone-700">Charts for {shown} (UTC days, both included).</p>
        </div>
        <RangePicker value={range} onChange={setRange} />
      </div>
      {[throughput, yieldWeeks, runYield, firstPass, lead].find((q) => q.error) && <Waiting error={[throughput, yieldWeeks, runYield, firstPass, lead].find((q) => q.error)!.error} what="" />}

      <div className="grid gap-6 xl:grid-cols-2">
        <ChartPanel
          title="Units built and shipped per day"
          note="Built: the day a unit's last step tick or leak test made it ready to pack. Shipped: units in the parcels that left that day."
          csvHref={reportCsvHref('throughput', range)}
          chart={throughput.data ? <ThroughputChart report={throughput.data} /> : <Waiting error={null} what="throughput" />}
          table={throughput.data && <ThroughputTable report={throughput.data} />}
        />
        <ChartPanel
          title="Material yield per week"
          note="Length of the pieces ÷ pipe used up (sticks and offcuts taken, less remnants put back as offcuts), for the cut runs finished each week. Miscut sticks count in full."
          csvHref={reportCsvHref('yield-over-time', range)}
          chart={yieldWeeks.data ? <YieldChart report={yieldWeeks.data} /> : <Waiting error={null} what="yields" />}
          table={yieldWeeks.data && <YieldWeeksTable report={yieldWeeks.data} />}
        />
        <ChartPanel
          title="First-pass leak test yield per kit revision"
          note="Units whose first leak test passed ÷ units tested, by the day of the first test; retests after rework do not count."
          csvHref={reportCsvHref('first-pass-yield', range)}
          chart={firstPass.data ? <FirstPassChart report={firstPass.data} /> : <Waiting error={null} what="leak tests" />}
          table={firstPass.data && <FirstPassTable report={firstPass.data} />}
        />
        <Section title="Lead time, paid to shipped" actions={<ExportLink href={reportCsvHref('lead-time', range)} label="lead time" />}>
          <p className="text-sm text-stone-600">Orders shipped in full in the range. Paid: the store's payment event when the order came in unpaid, else the time it was placed.</p>
          {lead.data ? <LeadTimeTable report={lead.data} /> : <Waiting error={null} what="lead times" />}
        </Section>
      </div>

      <Section title="Material yield per cut run" actions={<ExportLink href={reportCsvHref('cut-run-yield', range)} label="material yield per cut run" />}>
        <p className="text-sm text-stone-600">Cut runs finished in the range, newest first: the published plan against what the saw did.</p>
        {runYield.data ? <CutRunYieldTable report={runYield.data} formatLength={format} /> : <Waiting error={null} what="cut runs" />}
      </Section>
    </div>
  )
}
