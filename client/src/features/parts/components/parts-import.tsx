import { toast } from 'sonner'
import { PART_KIND_LABELS } from '@kitwright/shared/parts'
import { csvErrorsFromFields } from '@kitwright/shared/csv'
import { PART_CSV_COLUMNS, type PartCsvError, type PartImportPreview } from '@kitwright/shared/parts-csv'
import { CsvRowErrors } from '../../../components/ui/csv-row-errors'
import { CsvSource } from '../../../components/ui/csv-source'
import { useCsvImport } from '../../../lib/use-csv-import'
import { ApiError } from '../../../lib/api-client'
import { useImportParts, usePreviewPartsImport } from '../api/part-queries'
import { formatDollars } from './money'

function PreviewTable({ preview }: { preview: PartImportPreview }) {
  const byRow = new Map<number, PartCsvError[]>()
  for (const e of preview.errors) byRow.set(e.row, [...(byRow.get(e.row) ?? []), e])
  return (
    <div className="overflow-x-auto rounded-lg border border-stone-300 bg-white">
      <table className="w-full text-left" aria-label="Import preview">
        <thead className="bg-stone-50 text-sm text-stone-600">
          <tr>
            {['Row', 'SKU', 'Name', 'Kind', 'Unit cost', 'Will', 'Problems'].map((h) => (
              <th key={h} className="px-3 py-2 font-bold">
                {h}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {preview.rows.map((r) => {
            const problems = byRow.get(r.row) ?? []
            return (
              <tr key={r.row} className={problems.length ? 'border-t border-stone-200 bg-red-50' : 'border-t border-stone-200'}>
                <td className="px-3 py-2 tabular-nums">{r.row}</td>
                <td className="px-3 py-2 font-bold">{r.sku || '—'}</td>
                <td className="px-3 py-2">{r.part?.name ?? '—'}</td>
                <td className="px-3 py-2">{r.part ? PART_KIND_LABELS[r.part.kind] : '—'}</td>
                <td className="px-3 py-2 tabular-nums">{r.part ? formatDollars(r.part.unitCostCents) : '—'}</td>
                <td className="px-3 py-2">{r.action === 'create' ? 'Create' : r.action === 'update' ? 'Update' : '—'}</td>
                <td className="px-3 py-2 text-red-800">{problems.map((p) => (p.column ? `${p.column}: ${p.message}` : p.message)).join(' · ')}</td>
              </tr>
            )
          })}
        </tbody>
      </table>
    </div>
  )
}

/** Choose or paste a parts CSV, see what it would do and what to fix, then import it all at once. */
export function PartsImport({ onImported }: { onImported: () => void }) {
  const importer = useCsvImport(usePreviewPartsImport())
  const { csv, setCsv, runPreview, current, errors, setImportErrors } = importer
  const importParts = useImportParts()
  const canImport = !!current && current.errors.length === 0 && current.rows.length > 0 && !importParts.isPending

  const runImport = () =>
    importParts.mutate(csv, {
      onSuccess: (r) => {
        toast.success(`Imported: ${r.created} new, ${r.updated} updated`)
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
          Columns: <code className="text-sm">{PART_CSV_COLUMNS.join(', ')}</code>. The header is row 1. Lengths as typed in the shop (10 ft, 0.840 in,
          21.3 mm), cost in dollars (12.34), weight in grams. A SKU already in the catalog updates that part.
        </p>
        <CsvSource csv={csv} onCsvChange={setCsv} onPreview={runPreview} previewing={importer.previewing} onImport={runImport} canImport={canImport} />
        {current && (
          <p aria-live="polite" className="font-bold">
            {current.creates} new, {current.updates} updated
            {current.errors.length > 0 ? ` · ${current.errors.length} to fix before importing; nothing is imported until every row is right` : ''}
          </p>
        )}
      </div>
      <CsvRowErrors errors={errors} />
      {current && current.rows.length > 0 && <PreviewTable preview={current} />}
    </div>
  )
}
