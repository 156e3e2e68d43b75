import { useQuery } from '@tanstack/react-query'
import { Link, useParams } from 'react-router-dom'
import { toast } from 'sonner'
import { paths } from '../../../config/paths'
import { cutRunDetailOptions, cutSheetHref, useCancelCutRun, usePublishCutRun } from '../../../features/cut-runs/api/cut-run-queries'
import { PlanView } from '../../../features/cut-runs/components/plan-view'
import { Button } from '../../../components/ui/button'

const linkButton = 'inline-flex h-11 items-center rounded-md border border-stone-300 bg-white px-4 font-bold hover:bg-stone-50'

export function Component() {
  const { runId = '' } = useParams()
  const run = useQuery(cutRunDetailOptions(runId))
  const publish = usePublishCutRun()
  const cancel = useCancelCutRun()
  if (run.isError) return <p role="alert" className="text-red-700">{run.error.message}</p>
  if (!run.data) return <p>Loading…</p>
  const r = run.data
  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-center gap-3">
        <h1 className="mr-auto text-3xl font-bold">
          Cut run {r.number} <span className="ml-2 rounded bg-stone-100 px-2 text-lg align-middle">{r.status}</span>
        </h1>
        <Link to={paths.cutRuns.href()} className={linkButton}>
          All cut runs
        </Link>
        {r.status !== 'draft' && r.status !== 'cancelled' && (
          <>
            <a href={cutSheetHref(r.id, 'letter')} className={linkButton} target="_blank" rel="noreferrer">
              Cut sheet (Letter)
            </a>
            <a href={cutSheetHref(r.id, 'a4')} className={linkButton} target="_blank" rel="noreferrer">
              Cut sheet (A4)
            </a>
          </>
        )}
        {r.status === 'draft' && (
          <Button
            disabled={publish.isPending}
            onClick={() =>
              publish.mutate(r.id, {
                onSuccess: (p) => toast.success(`Cut run ${p.number} published: its sticks are reserved`),
                onError: (e) => toast.error(e.message),
              })
            }
          >
            Publish
          </Button>
        )}
        {(r.status === 'draft' || r.status === 'published') && (
          <Button variant="secondary" disabled={cancel.isPending} onClick={() => cancel.mutate(r.id, { onError: (e) => toast.error(e.message) })}>
            {r.status === 'draft' ? 'Discard draft' : 'Cancel run'}
          </Button>
        )}
      </div>
      {publish.error && (
        <p role="alert" className="rounded-md bg-red-50 p-3 text-red-800">
          {publish.error.message}
        </p>
      )}
      <p className="text-stone-700">
        {r.workOrders.length} work orders: {r.workOrders.map((w) => `${w.serial} (${w.kitSku} ${w.revisionCode})`).join(', ')}.
        {r.status === 'draft' ? ' Publishing freezes this plan and reserves its sticks and offcuts in the stock ledger.' : ''}
      </p>
      <PlanView run={r} />
    </div>
  )
}
