import { Link } from 'react-router-dom'
import { ScanField } from '../../components/ui/scan-field'
import { paths } from '../../config/paths'
import { useResolveScan } from '../../features/scan/api/scan-queries'

const PLACE_WORDS = { cut: 'Cut bench', build: 'Build bench', pack: 'Pack bench', office: 'Office', stock: 'Stock', done: 'Done' } as const

/** Scan anything Kitwright printed and learn what it is and where it goes next. */
export function Component() {
  const resolve = useResolveScan()
  const result = resolve.data
  return (
    <div className="max-w-3xl space-y-6">
      <h1 className="text-4xl font-bold">Scan</h1>
      <ScanField label="Bin, unit serial, order, offcut or part" onScan={(code) => resolve.mutate(code)} />
      {resolve.isError && (
        <p role="alert" className="rounded-lg border-2 border-red-400 bg-red-50 p-4 text-xl text-red-900">
          {resolve.error.message}
        </p>
      )}
      {result && (
        <section aria-label="Scanned" className="space-y-3 rounded-lg border-2 border-brand-600 bg-white p-6">
          <p className="text-2xl font-bold">{result.title}</p>
          <p className="text-lg">
            Status: <strong>{result.status.replaceAll('_', ' ')}</strong>
          </p>
          <p className="text-xl">
            <strong>{PLACE_WORDS[result.next.place]}:</strong> {result.next.message}
          </p>
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
