import { ORDER_STATUS_LABELS } from '@kitwright/shared/status-words'
import { Link } from 'react-router-dom'
import type { LateOrdersReport } from '@kitwright/shared/reports'
import { Section } from '../../../components/ui/section'
import { paths } from '../../../config/paths'
import { reportCsvHref } from '../api/report-queries'
import { ExportLink } from './export-link'
import { NumbersTable } from './numbers-table'


/** Orders past their promised ship date, oldest promise first. */
export function LateOrdersPanel({ report }: { report: LateOrdersReport | undefined }) {
  return (
    <Section id="late-orders" title="Late orders" actions={<ExportLink href={reportCsvHref('late-orders')} label="late orders" />}>
      <p className="text-sm text-stone-600">
        Promised ship date before today ({report?.today ?? '…'}, UTC) and not shipped or cancelled; oldest promise first.
        {report && report.total > report.rows.length ? ` Showing ${report.rows.length} of ${report.total}; the CSV has them all.` : ''}
      </p>
      {report ? (
        <NumbersTable
          label="Late orders"
          header={['Order', 'Customer', 'State', 'Promised', 'Days late', 'Units shipped']}
          numeric={[4, 5]}
          empty="Nothing is late."
          rows={report.rows.map((o) => [
            <Link key="n" to={paths.order.href(o.orderId)} className="font-bold text-brand-700 underline">
              {o.number}
            </Link>,
            o.customerName,
            ORDER_STATUS_LABELS[o.status],
            o.promisedShipDate,
            <span key="d" className="font-bold text-red-700">
              {o.daysLate}
            </span>,
            `${o.unitsShipped} of ${o.units}`,
          ])}
        />
      ) : (
        <p className="text-stone-500">Looking for late orders…</p>
      )}
    </Section>
  )
}
