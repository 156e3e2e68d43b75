import { Link, useNavigate } from 'react-router-dom'
import type { ScanResult } from '@kitwright/shared/scan'
import { BIN_STATUS_LABELS, OFFCUT_STATUS_LABELS, ORDER_STATUS_LABELS, RETURN_STATUS_LABELS, WORK_ORDER_STATUS_LABELS, wordFor } from '@kitwright/shared/status-words'
import { ScanField } from '../../components/ui/scan-field'
import { paths } from '../../config/paths'
import { useResolveScan } from '../../features/scan/api/scan-queries'

const PLACE_WORDS = { cut: 'Cut bench', build: 'Build bench', pack: 'Pack bench', office: 'Office', stock: 'Stock', done: 'Done' } as const

/** The scanned thing's status in the shop's one word for it (a bin holding a unit shows the unit's). */
function statusWord(r: ScanResult): string {
  if (r.kind === 'work_order' || (r.kind === 'bin' && r.workOrderSerial)) return wordFor(WORK_ORDER_STATUS_LABELS, r.status)
  if (r.kind === 'bin') return wordFor(BIN_STATUS_LABELS, r.status)
  if (r.kind === 'order') return wordFor(ORDER_STATUS_LABELS, r.status)
  if (r.kind === 'offcut') return wordFor(OFFCUT_STATUS_LABELS, r.status)
  if (r.kind === 'return') return wordFor(RETURN_STATUS_LABELS, r.status)
  return wordFor({ active: 'Active', deactivated: 'Deactivated' }, r.status)
}

/**
 * Scan anything Kitwright printed and learn what it is and where it goes next. A return label (or a
 * return's number) opens that return's page for those who may open returns (the office, the pack bench
 * that receives the parcel); the others are told to take the parcel to the pack bench.
 */
export function Component() {
  const navigate = useNavigate()
  const resolve = useResolveScan({
    onSuccess: (r) => {
      if (r.kind === 'return' && r.returnId) void navigate(paths.returnDetail.href(r.returnId))
    },
  })
  const result = resolve.data
  return (
    <div className="max-w-3xl space-y-6">
      <h1 className="text-4xl font-bold">Scan</h1>
      <ScanField label="Bin, unit serial, order, offcut, part or return label" onScan={(code) => resolve.mutate(code)} />
      {resolve.isError && (
        <p role="alert" className="rounded-lg border-2 border-red-400 bg-red-50 p-4 text-xl text-red-900">
          {resolve.error.message}
        </p>
      )}
      {result && (
        <section aria-label="Scanned" className="space-y-3 rounded-lg border-2 border-brand-600 bg-white p-6">
          <p className="text-2xl font-bold">{result.title}</p>
          <p className="text-lg">
            Status: <strong>{statusWord(result)}</strong>
          </p>
          <p className="text-xl">
            <strong>{PLACE_WORDS[result.next.place]}:</strong> {result.next.message}
          </p>
          {result.returnId && (
            <Link className="mr-6 inline-block text-lg font-bold text-brand-700 underline" to={paths.returnDetail.href(result.returnId)}>
              {result.kind === 'return' ? `Open return ${result.code}` : `Open the return of ${result.code}`}
            </Link>
          )}
          {result.workOrderSerial && (
            <Link className="inline-block text-lg font-bold text-brand-700 underline" to={paths.unit.href(result.workOrderSerial)}>
              Open the build record of {result.workOrderSerial}
            </Link>
          )}
        </section>
      )}
    </div>
  )
}
