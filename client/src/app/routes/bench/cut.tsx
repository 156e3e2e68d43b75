import { useQuery } from '@tanstack/react-query'
import { useEffect, useState } from 'react'
import { useSearchParams } from 'react-router-dom'
import { Button } from '../../../components/ui/button'
import { Caution } from '../../../components/ui/section'
import { BenchDeviceToggle } from '../../../components/ui/bench-device-toggle'
import { Worklist } from '../../../components/ui/worklist'
import { benchCutSheetHref, benchRunOptions, overlayWaiting } from '../../../features/cut-bench/api/cut-bench-queries'
import { useWaitingActions } from '../../../lib/offline/use-bench-queue'
import { cutWorklistOptions } from '../../../features/cut-bench/api/cut-worklist-queries'
import { BenchStick } from '../../../features/cut-bench/components/bench-stick'
import { BenchWorkOrders } from '../../../features/cut-bench/components/bench-work-orders'

const CUT_ACTIONS = ['cut.tick', 'cut.undo'] as const

function RunBench({ runId }: { runId: string }) {
  const fetched = useQuery(benchRunOptions(runId))
  // Ticks kept on the tablet (no network) show as cut until the server has them.
  const waiting = useWaitingActions(CUT_ACTIONS)
  const run = { ...fetched, data: fetched.data && overlayWaiting(fetched.data, waiting) }
  const [chosen, setChosen] = useState<string | null>(null)
  const firstOpen = run.data?.sticks.find((s) => s.status === 'pending' || s.status === 'in_progress')?.id
  // Stay on the stick being cut when it is finished (its offcut label is shown there); Next moves on.
  useEffect(() => {
    if (chosen === null && firstOpen) setChosen(firstOpen)
  }, [chosen, firstOpen])
  if (run.isError)
    return (
      <p role="alert" className="text-xl text-red-700">
        {run.error.message}
      </p>
    )
  if (!run.data) return <p className="text-xl">Loading the run…</p>
  const r = run.data
  const open = r.sticks.filter((s) => s.status === 'pending' || s.status === 'in_progress')
  const current = r.sticks.find((s) => s.id === chosen) ?? open[0] ?? r.sticks.at(-1)
  const index = current ? r.sticks.indexOf(current) : -1
  const scale = Math.max(1, ...r.sticks.map((s) => s.length))
  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-center gap-3">
        <p className="mr-auto text-2xl">
          Run <strong>{r.number}</strong> · {r.sticks.length - open.length} of {r.sticks.length} sticks finished{r.status === 'done' ? ' · all cut' : ''}
        </p>
        <a
          className="inline-flex h-14 items-center rounded-md border-2 border-stone-400 bg-white px-5 text-lg font-bold"
          href={benchCutSheetHref(r.id)}
          target="_blank"
          rel="noreferrer"
        >
          Cut sheet
        </a>
      </div>
      <Caution>Eye protection on, work clamped, hands clear of the blade. The saw maker's instructions and your shop's practice come first.</Caution>
      <div className="grid gap-4 lg:grid-cols-[2fr_1fr]">
        <div className="space-y-3">
          <nav aria-label="Sticks" className="flex flex-wrap gap-2">
            <Button size="bench" variant="secondary" disabled={index <= 0} onClick={() => setChosen(r.sticks[index - 1]!.id)}>
              ◀ Previous stick
            </Button>
            <Button size="bench" variant="secondary" disabled={index < 0 || index >= r.sticks.length - 1} onClick={() => setChosen(r.sticks[index + 1]!.id)}>
              Next stick ▶
            </Button>
          </nav>
          {current && <BenchStick key={current.id} run={r} stick={current} scale={scale} />}
        </div>
        <BenchWorkOrders run={r} />
      </div>
    </div>
  )
}

/**
 * The cut bench: the published runs, the most urgent first (rush units, then the earliest promised
 * ship date), one tap to open one; a single published run opens by itself.
 */
export function Component() {
  const [params, setParams] = useSearchParams()
  const runs = useQuery(cutWorklistOptions())
  const runId = params.get('run')
  const only = runs.data?.length === 1 ? runs.data[0]!.runId : null
  // One published run: open it, and keep it in the address so it stays open once it is all cut.
  useEffect(() => {
    if (!runId && only) setParams({ run: only }, { replace: true })
  }, [runId, only, setParams])
  return (
    <div className="space-y-4 text-lg">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <h1 className="text-4xl font-bold">Cut bench</h1>
        <BenchDeviceToggle bench="cut" />
      </div>
      {runs.data?.length === 0 && !params.get('run') && (
        <p className="rounded-lg border-2 border-stone-300 bg-white p-6 text-2xl">No cut run is published. The planner publishes one from the cut runs page.</p>
      )}
      {runs.isError && (
        <p role="alert" className="text-xl text-red-700">
          {runs.error.message}
        </p>
      )}
      {(runs.data?.length ?? 0) > 1 && (
        <Worklist
          label="Published runs"
          role="group"
          items={runs.data}
          empty=""
          current={runId}
          itemKey={(r) => r.runId}
          itemLabel={(r) => `${r.number}, ${r.cutsDone} of ${r.cutsTotal} cuts`}
          onPick={(r) => setParams({ run: r.runId })}
        >
          {(r) => (
            <>
              <strong>{r.number}</strong> · {r.cutsDone} of {r.cutsTotal} cuts · {r.workOrderCount} unit{r.workOrderCount === 1 ? '' : 's'}
              {r.rushUnits > 0 ? ` · ${r.rushUnits} rush` : ''}
            </>
          )}
        </Worklist>
      )}
      {runId && <RunBench key={runId} runId={runId} />}
    </div>
  )
}
