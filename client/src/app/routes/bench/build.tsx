import { useQuery, useQueryClient } from '@tanstack/react-query'
import { Link, useSearchParams } from 'react-router-dom'
import { ScanField } from '../../../components/ui/scan-field'
import { paths } from '../../../config/paths'
import { buildLookupOptions } from '../../../features/build-bench/api/build-queries'
import { BuildUnit } from '../../../features/build-bench/components/build-unit'
import { ApiError } from '../../../lib/api-client'

/** The build bench: scan a bin (or type a serial) and work the unit through its steps and leak test. */
export function Component() {
  const [search, setSearch] = useSearchParams()
  const qc = useQueryClient()
  const code = search.get('code') ?? ''
  const lookup = useQuery(buildLookupOptions(code))
  const refusedSerial = lookup.error instanceof ApiError ? lookup.error.body.fields?.serial : undefined
  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-end gap-4">
        <h1 className="text-4xl font-bold">Build bench</h1>
        <ScanField label="Scan the bin, or type the serial" className="min-w-72 flex-1" onScan={(scanned) => {
            setSearch({ code: scanned })
            // The next queued scan waits for this unit's page (a failure shows on the page itself).
            return qc.prefetchQuery(buildLookupOptions(scanned))
          }}
        />
      </div>
      {code === '' && <p className="text-2xl text-stone-700">Scan the bin the unit came in from the cut bench to see its build steps.</p>}
      {lookup.isPending && code !== '' && <p className="text-2xl">Looking up {code}…</p>}
      {lookup.isError && (
        <div role="alert" className="space-y-3 rounded-lg border-4 border-red-700 bg-red-50 p-6 text-2xl">
          <p>{lookup.error.message}</p>
          {refusedSerial && (
            <Link to={paths.unit.href(refusedSerial)} className="inline-block font-bold text-brand-700 underline">
              Open the build record of {refusedSerial}
            </Link>
          )}
        </div>
      )}
      {lookup.data && <BuildUnit code={code} page={lookup.data} />}
    </div>
  )
}
