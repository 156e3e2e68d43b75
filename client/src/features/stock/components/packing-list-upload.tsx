import { useState } from 'react'
import { toast } from 'sonner'
import { PACKING_LIST_COLUMNS, formatStickLength, type PackingListPreview } from '@kitwright/shared/stock'
import { Button } from '../../../components/ui/button'
import { Field, Input } from '../../../components/ui/field'
import { ApiError } from '../../../lib/api-client'
import { cn } from '../../../lib/cn'
import { useLengthUnit } from '../../../lib/shop-settings'
import { usePreviewPackingList, useReceivePackingList } from '../api/stock-queries'

const EXAMPLE = 'sku,quantity,stick_length,reference,lot\nPVC-050-S40,20,10 ft,RPF-24201,\nSPR-360-THR,200,,RPF-24201,NZ-2611-07'

function showError(err: unknown) {
  toast.error(err instanceof ApiError ? err.message : 'Could not reach Kitwright; check the connection and try again')
}

/** A supplier packing list as CSV: preview every row with its problems, then receive all rows or none. */
export function PackingListUpload() {
  const { unit } = useLengthUnit()
  const [csv, setCsv] = useState<string | null>(null)
  const [fileName, setFileName] = useState('')
  const [defaultReference, setDefaultReference] = useState('')
  const [preview, setPreview] = useState<PackingListPreview | null>(null)
  const previewMutation = usePreviewPackingList()
  const receive = useReceivePackingList()

  const check = (text: string) =>
    previewMutation.mutate({ csv: text, defaultReference: defaultReference || null, purchaseOrderId: null }, { onSuccess: setPreview, onError: showError })

  const onFile = async (file: File | undefined) => {
    if (!file) return
    const text = await file.text()
    setFileName(file.name)
    setCsv(text)
    check(text)
  }

  const apply = () => {
    if (!csv) return
    receive.mutate(
      // Rows name their purchase order in the file's purchase_order column.
      { csv, defaultReference: defaultReference || null, purchaseOrderId: null },
      {
        onSuccess: ({ moves }) => {
          toast.success(`Received ${moves.length} ${moves.length === 1 ? 'line' : 'lines'} from ${fileName || 'the packing list'}`)
          setCsv(null)
          setPreview(null)
          setFileName('')
        },
        onError: showError,
      },
    )
  }

  return (
    <section aria-label="Packing list" className="space-y-4 rounded-lg border border-stone-300 bg-white p-4">
      <div className="space-y-1 text-stone-700">
        <p>
          Columns (header row first, any order, other columns ignored): <code>{PACKING_LIST_COLUMNS.join(', ')}</code>. Stick length only for pipe, e.g.{' '}
          <code>10 ft</code> or <code>3048 mm</code>; a bare number is read in {unit === 'in' ? 'inches' : 'millimetres'}. Lot: the supplier's lot of a
          lot-tracked part (required for those, empty for the others).
        </p>
        <pre className="overflow-x-auto rounded bg-stone-100 p-2 text-sm">{EXAMPLE}</pre>
      </div>
      <div className="flex flex-wrap items-end gap-3">
        <Field label="Packing list (CSV file)">
          <Input type="file" accept=".csv,text/csv" className="pt-2" onChange={(e) => void onFile(e.target.files?.[0])} />
        </Field>
        <Field label="Packing-list no. for rows without one">
          <Input value={defaultReference} onChange={(e) => setDefaultReference(e.target.value)} onBlur={() => csv && check(csv)} className="w-56" />
        </Field>
      </div>
      {preview && (
        <div className="space-y-3">
          {preview.ok ? (
            <p className="font-bold text-brand-700">All {preview.rows.length} rows can be received.</p>
          ) : (
            <div role="alert" className="rounded-md border border-red-300 bg-red-50 p-3 text-red-800">
              <p className="font-bold">Nothing will be received until these are fixed in the file:</p>
              <ul className="list-disc pl-5">
                {preview.errors.map((e) => (
                  <li key={e}>{e}</li>
                ))}
              </ul>
            </div>
          )}
          {preview.rows.length > 0 && (
            <div className="overflow-x-auto rounded-lg border border-stone-300">
              <table className="w-full text-left text-sm" aria-label="Packing list preview">
                <thead className="bg-stone-50 text-stone-600">
                  <tr>
                    <th className="px-3 py-2">Row</th>
                    <th className="px-3 py-2">SKU</th>
                    <th className="px-3 py-2">Part</th>
                    <th className="px-3 py-2">Quantity</th>
                    <th className="px-3 py-2">Stick length</th>
                    <th className="px-3 py-2">Reference</th>
                    <th className="px-3 py-2">Lot</th>
                    <th className="px-3 py-2">Problems</th>
                  </tr>
                </thead>
                <tbody>
                  {preview.rows.map((r) => (
                    <tr key={r.row} className={cn('border-t border-stone-200', r.errors.length > 0 && 'bg-red-50')}>
                      <td className="px-3 py-2">{r.row}</td>
                      <td className="px-3 py-2">{r.sku || '—'}</td>
                      <td className="px-3 py-2">{r.partName ?? '—'}</td>
                      <td className="px-3 py-2">{r.quantity ?? '—'}</td>
                      <td className="px-3 py-2">{r.stickLength === null ? '—' : formatStickLength(r.stickLength, unit)}</td>
                      <td className="px-3 py-2">{r.reference ?? '—'}</td>
                      <td className="px-3 py-2 font-mono">{r.lot ?? '—'}</td>
                      <td className="px-3 py-2 text-red-800">{r.errors.join('; ') || <span className="text-brand-700">OK</span>}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          )}
          <Button onClick={apply} disabled={!preview.ok || receive.isPending}>
            Receive {preview.rows.length} {preview.rows.length === 1 ? 'row' : 'rows'}
          </Button>
        </div>
      )}
    </section>
  )
}
