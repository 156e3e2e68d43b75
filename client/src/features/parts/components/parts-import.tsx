import { toast } from 'sonner'
import { PART_KIND_LABELS } from '@kitwright/shared/parts'
import { csvErrorsFromFields } from '@kitwright/shared/csv'
import { PART_CSV_COLUMNS, type PartCsvError, type PartImportPreview } from '@kitwright/shared/parts-csv'
import { CsvRowErrors } from '../../../components/ui/csv-row-errors'
import { CsvSource } from '../../../components/ui/csv-source'
import { PreviewTable, type PreviewColumn } from '../../../components/ui/preview-table'
import { useCsvImport } from '../../../lib/use-csv-import'
import { ApiError } from '../../../lib/api-client'
import { useImportParts, usePreviewPartsImport } from '../api/part-queries'
import { formatDollars } from './money'

type PreviewRow = PartImportPreview['rows'][number] & { problems: PartCsvError[] }

const PREVIEW_COLUMNS: PreviewColumn<PreviewRow>[] = [
  { header: 'Row', cell: (r) => r.row, className: 'tabular-nums' },
  { header: 'SKU', cell: (r) => r.sku || '—', className: 'font-bold' },
  { header: 'Name', cell: (r) => r.part?.name ?? '—' },
  { header: 'Kind', cell: (r) => (r.part ? PART_KIND_LABELS[r.part.kind] : '—') },
  { header: 'Unit cost', cell: (r) => (r.part ? formatDollars(r.part.unitCostCents) : '—'), className: 'tabular-nums' },
  { header: 'Will', cell: (r) => (r.action === 'create' ? 'Create' : r.action === 'update' ? 'Update' : '—') },
  { header: 'Problems', cell: (r) => r.problems.map((p) => (p.column ? `${p.column}: ${p.message}` : p.message)).join(' · '), className: 'text-red-800' },
]

function PartsPreview({ preview }: { preview: PartImportPreview }) {
  const byRow = new Map<number, PartCsvError[]>()
  for (const e of preview.errors) byRow.set(e.row, [...(byRow.get(e.row) ?? []), e])
  const rows = preview.rows.map((r) => ({ ...r, problems: byRow.get(r.row) ?? [] }))
  return <PreviewTable rows={rows} columns={PREVIEW_COLUMNS} rowKey={(r) => r.row} flagged={(r) => r.problems.length > 0} />
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
      {current && current.rows.length > 0 && <PartsPreview preview={current} />}
    </div>
  )
}
