import { useQuery, useQueryClient } from '@tanstack/react-query'
import { Link, useSearchParams } from 'react-router-dom'
import { Button } from '../../../components/ui/button'
import { ScanField } from '../../../components/ui/scan-field'
import { BenchDeviceToggle } from '../../../components/ui/bench-device-toggle'
import { Worklist } from '../../../components/ui/worklist'
import { paths } from '../../../config/paths'
import { buildLookupOptions, buildWorklistOptions } from '../../../features/build-bench/api/build-queries'
import { BUILD_ACTIONS, overlayWaiting } from '../../../features/build-bench/api/build-bench-actions'
import { meOptions } from '../../../features/auth/api/auth-queries'
import { useWaitingActions } from '../../../lib/offline/use-bench-queue'
import { BuildUnit } from '../../../features/build-bench/components/build-unit'
import { ApiError } from '../../../lib/api-client'
import { WORK_ORDER_STATUS_LABELS, wordFor } from '@kitwright/shared/status-words'

/**
 * The build bench: scan a bin (or type a serial), or pick a unit from the list of what is ready
 * (rush first, then by promised date), and work it through its steps and leak test.
 */
export function Component() {
  const [search, setSearch] = useSearchParams()
  const qc = useQueryClient()
  const code = search.get('code') ?? ''
  const lookup = useQuery(buildLookupOptions(code))
  const worklist = useQuery(buildWorklistOptions())
  const me = useQuery(meOptions())
  // Steps ticked on this tablet with no network show as ticked until the server has them.
  const waiting = useWaitingActions(BUILD_ACTIONS)
  const page = lookup.data && me.data ? overlayWaiting(lookup.data, waiting, me.data) : lookup.data
  const refusedSerial = lookup.error instanceof ApiError ? lookup.error.body.fields?.serial : undefined
  const open = (scanned: string) => {
    setSearch({ code: scanned })
    // The next queued scan waits for this unit's page (a failure shows on the page itself).
    return qc.prefetchQuery(buildLookupOptions(scanned))
  }
  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <h1 className="text-4xl font-bold">Build bench</h1>
        <BenchDeviceToggle bench="build" />
      </div>
      <ScanField label="Scan the bin, or type the serial" onScan={open} />
      {code !== '' && (
        <Button size="bench" variant="secondary" onClick={() => setSearch({})}>
          ◀ Ready to build ({worklist.data?.length ?? '…'})
        </Button>
      )}
      {code === '' && (
        <>
          <p className="text-2xl text-stone-700">Scan the bin the unit came in from the cut bench, or pick it below.</p>
          {worklist.isError && <p role="alert" className="text-xl text-red-700">{worklist.error.message}</p>}
          <Worklist
            label="Ready to build"
            items={worklist.data}
            empty="Nothing is waiting: the cut bench fills the bins."
            itemKey={(u) => u.serial}
            itemLabel={(u) => `Unit ${u.serial}`}
            onPick={(u) => void open(u.serial)}
          >
            {(u) => (
              <>
                <strong>Unit {u.serial}</strong> · {u.kitSku} rev {u.revisionCode} · {u.binCode ? `bin ${u.binCode}` : 'no bin'} · order {u.orderNumber} ·{' '}
                <span className={u.status === 'rework' ? 'font-bold text-red-700' : ''}>{wordFor(WORK_ORDER_STATUS_LABELS, u.status)}</span>
              </>
            )}
          </Worklist>
        </>
      )}
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
      {page && <BuildUnit code={code} page={page} />}
    </div>
  )
}
