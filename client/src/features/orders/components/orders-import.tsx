import { toast } from 'sonner'
import { csvErrorsFromFields, csvRowText } from '@kitwright/shared/csv'
import { ORDER_CSV_COLUMNS, type OrderImportPreview } from '@kitwright/shared/orders-csv'
import { CsvRowErrors } from '../../../components/ui/csv-row-errors'
import { CsvSource } from '../../../components/ui/csv-source'
import { PreviewTable, type PreviewColumn } from '../../../components/ui/preview-table'
import { useCsvImport } from '../../../lib/use-csv-import'
import { ApiError } from '../../../lib/api-client'
import { useImportOrders, usePreviewOrdersImport } from '../api/order-queries'
import { formatMoney } from './format'

const ACTION_WORDS = { create: 'Create', skip: 'Skip: already stored' } as const

const PREVIEW_COLUMNS: PreviewColumn<OrderImportPreview['orders'][number]>[] = [
  { header: 'Rows', cell: (o) => o.rows.join(', '), className: 'tabular-nums' },
  { header: 'Order', cell: (o) => o.number, className: 'font-bold' },
  { header: 'Customer', cell: (o) => o.customerName || '—' },
  { header: 'Lines', cell: (o) => o.lineCount, className: 'tabular-nums' },
  { header: 'Units', cell: (o) => o.units, className: 'tabular-nums' },
  { header: 'Total', cell: (o) => formatMoney(o.totalCents), className: 'tabular-nums' },
  { header: 'Will', cell: (o) => (o.action ? ACTION_WORDS[o.action] : 'Fix its rows first') },
]

function OrdersPreview({ preview }: { preview: OrderImportPreview }) {
  return <PreviewTable rows={preview.orders} columns={PREVIEW_COLUMNS} rowKey={(o) => o.number} flagged={(o) => o.action === null} />
}

/** Choose or paste an orders CSV, see what it would do and what to fix, then import it all at once. */
export function OrdersImport({ onImported }: { onImported: () => void }) {
  const importer = useCsvImport(usePreviewOrdersImport())
  const { csv, setCsv, runPreview, current, errors, setImportErrors } = importer
  const importOrders = useImportOrders()
  const canImport = !!current && current.errors.length === 0 && current.creates > 0 && !importOrders.isPending

  const runImport = () =>
    importOrders.mutate(csv, {
      onSuccess: (r) => {
        toast.success(`Imported ${r.created.length} order${r.created.length === 1 ? '' : 's'}${r.skipped.length ? `; ${r.skipped.length} already stored, skipped` : ''}`)
        onImported()
      },
      onError: (err) => {
        if (err instanceof ApiError) setImportErrors(csvErrorsFromFields(err.body.fields ?? {}))
        toast.error(err instanceof ApiError ? err.message : 'Could not reach Kitwright')
      },
    })

  return (
    <div className="space-y-4">
      <div className="space-y-3 rounded-lg border border-stone-300 bg-white p-4">
        <p className="text-stone-700">
          One row per order line, the order's own fields repeated on each of its lines. Columns: <code className="text-sm">{ORDER_CSV_COLUMNS.join(', ')}</code>.
          The header is row 1. Dates as 2026-03-01 (or 2026-03-01T14:30:00Z), prices in dollars (189.00), country as two letters (US). An order number
          already stored is skipped, so the same file can be imported twice safely.
        </p>
        <CsvSource csv={csv} onCsvChange={setCsv} onPreview={runPreview} previewing={importer.previewing} onImport={runImport} canImport={canImport} />
        {current && (
          <p aria-live="polite" className="font-bold">
            {current.creates} new, {current.skips} already stored
            {current.errors.length > 0 ? ` · ${current.errors.length} to fix before importing; nothing is imported until every row is right` : ''}
          </p>
        )}
      </div>
      <CsvRowErrors errors={errors} />
      {current && current.warnings.length > 0 && (
        <ul aria-label="Worth knowing" className="space-y-1 rounded-lg border border-amber-300 bg-amber-50 p-4 text-amber-950">
          {current.warnings.map((e, i) => (
            <li key={i}>{csvRowText(e)}</li>
          ))}
        </ul>
      )}
      {current && current.orders.length > 0 && <OrdersPreview preview={current} />}
    </div>
  )
}
