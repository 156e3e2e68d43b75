import { Link } from 'react-router-dom'
import type { Shortages } from '@kitwright/shared/work-orders'
import { Section } from '../../../components/ui/section'
import { paths } from '../../../config/paths'
import { reportCsvHref } from '../api/report-queries'
import { ExportLink } from './export-link'
import { NumbersTable } from './numbers-table'

/** The parts the open work orders are short of (the shortages page has the details). */
export function ShortPartsPanel({ shortages }: { shortages: Shortages | undefined }) {
  const rows = shortages?.rows.filter((r) => r.short > 0) ?? []
  return (
    <Section id="short-parts" title="Short parts" actions={<ExportLink href={reportCsvHref('shortages')} label="short parts" />}>
      {shortages ? (
        <NumbersTable
          label="Short parts"
          header={['Part', 'Short', 'Needed', 'Free in stock', 'Supplier']}
          numeric={[1, 2, 3]}
          empty="Nothing is short."
          rows={rows.slice(0, 8).map((r) => [
            `${r.sku} · ${r.name}`,
            <span key="s" className="font-bold text-red-700">{`${r.short} ${r.kind === 'stock_length' ? 'sticks' : r.unitOfMeasure}`}</span>,
            r.needed,
            r.available,
            r.supplier ?? '—',
          ])}
        />
      ) : (
        <p className="text-stone-500">Adding up the work orders…</p>
      )}
      <Link to={paths.shortages.href()} className="text-sm font-bold text-brand-700 underline">
        All shortages{rows.length > 8 ? ` (${rows.length})` : ''}
      </Link>
    </Section>
  )
}
