import { toast } from 'sonner'
import { csvErrorsFromFields, csvRowText } from '@kitwright/shared/csv'
import { ORDER_CSV_COLUMNS, type OrderImportPreview } from '@kitwright/shared/orders-csv'
import { CsvRowErrors } from '../../../components/ui/csv-row-errors'
import { CsvSource } from '../../../components/ui/csv-source'
import { useCsvImport } from '../../../lib/use-csv-import'
import { ApiError } from '../../../lib/api-client'
import { useImportOrders, usePreviewOrdersImport } from '../api/order-queries'
import { formatMoney } from './format'

const ACTION_WORDS = { create: 'Create', skip: 'Skip: already stored' } as const

function PreviewTable({ preview }: { preview: OrderImportPreview }) {
  return (
    <div className="overflow-x-auto rounded-lg border border-stone-300 bg-white">
      <table className="w-full text-left" aria-label="Import preview">
        <thead className="bg-stone-50 text-sm text-stone-600">
          <tr>
            {['Rows', 'Order', 'Customer', 'Lines', 'Units', 'Total', 'Will'].map((h) => (
              <th key={h} className="px-3 py-2 font-bold">
                {h}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {preview.orders.map((o) => (
            <tr key={o.number} className={o.action === null ? 'border-t border-stone-200 bg-red-50' : 'border-t border-stone-200'}>
              <td className="px-3 py-2 tabular-nums">{o.rows.join(', ')}</td>
              <td className="px-3 py-2 font-bold">{o.number}</td>
              <td className="px-3 py-2">{o.customerName || '—'}</td>
              <td className="px-3 py-2 tabular-nums">{o.lineCount}</td>
              <td className="px-3 py-2 tabular-nums">{o.units}</td>
              <td className="px-3 py-2 tabular-nums">{formatMoney(o.totalCents)}</td>
              <td className="px-3 py-2">{o.action ? ACTION_WORDS[o.action] : 'Fix its rows first'}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  )
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
      {current && current.orders.length > 0 && <PreviewTable preview={current} />}
    </div>
  )
}
