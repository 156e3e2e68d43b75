import { useQuery } from '@tanstack/react-query'
import { Link, useParams } from 'react-router-dom'
import { toast } from 'sonner'
import { CUT_RUN_STATUS_LABELS } from '@kitwright/shared/status-words'
import { paths } from '../../../config/paths'
import { cutRunDetailOptions, cutSheetHref, useCancelCutRun, usePublishCutRun, useReplanCutRun } from '../../../features/cut-runs/api/cut-run-queries'
import { PlanProgress } from '../../../features/cut-runs/components/plan-progress'
import { PlanView } from '../../../features/cut-runs/components/plan-view'
import { Button } from '../../../components/ui/button'

/** How long "Take longer" lets the engine plan. */
const LONGER_SECONDS = 30

const linkButton = 'inline-flex h-11 items-center rounded-md border border-stone-300 bg-white px-4 font-bold hover:bg-stone-50'

export function Component() {
  const { runId = '' } = useParams()
  const run = useQuery(cutRunDetailOptions(runId))
  const publish = usePublishCutRun()
  const cancel = useCancelCutRun()
  const replan = useReplanCutRun()
  if (run.isError)
    return (
      <p role="alert" className="text-red-700">
        {run.error.message}
      </p>
    )
  if (!run.data) return <p>Loading…</p>
  const r = run.data
  // Each distinct pattern is one saw set-up; offcuts count one each.
  const patterns = new Set(r.sticks.filter((s) => !s.replanned).map((s) => s.patternIndex)).size
  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-center gap-3">
        <h1 className="mr-auto text-3xl font-bold">
          Cut run {r.number} <span className="ml-2 rounded bg-stone-100 px-2 text-lg align-middle">{CUT_RUN_STATUS_LABELS[r.status]}</span>
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
        {r.status === 'draft' && r.planStatus !== 'optimal' && (
          <Button
            variant="secondary"
            disabled={replan.isPending}
            onClick={() =>
              replan.mutate(
                { id: r.id, timeLimitSeconds: LONGER_SECONDS },
                {
                  onSuccess: (p) => toast.success(`Planned again for up to ${LONGER_SECONDS} s: ${p.totals.sticksUsed} sticks`),
                  onError: (e) => toast.error(e.message),
                },
              )
            }
          >
            Take longer ({LONGER_SECONDS} s)
          </Button>
        )}
        {(r.status === 'draft' || r.status === 'published') && (
          <Button variant="secondary" disabled={cancel.isPending} onClick={() => cancel.mutate(r.id, { onError: (e) => toast.error(e.message) })}>
            {r.status === 'draft' ? 'Discard draft' : 'Cancel run'}
          </Button>
        )}
      </div>
      {replan.isPending && <PlanProgress limitSeconds={LONGER_SECONDS} />}
      <p className="text-lg" aria-label="Sticks and patterns">
        <strong>{r.totals.sticksUsed}</strong> stick{r.totals.sticksUsed === 1 ? '' : 's'} in <strong>{patterns}</strong> pattern{patterns === 1 ? '' : 's'}{' '}
        (saw set-ups).{' '}
        {r.planStatus === 'optimal'
          ? 'Proven best: no plan uses less stock.'
          : `Every plan needs at least ${r.totals.lowerBoundSticks} sticks${r.planStatus === 'time-limit' ? '; the engine stopped at its time limit' : ''}${r.status === 'draft' ? ': take longer to look for a better plan' : ''}.`}
      </p>
      {r.solverNote && (
        <p role="status" className="rounded-md border-2 border-amber-600 bg-amber-50 p-3">
          The engine's solver could not be loaded on the server, so this is the quick first-fit plan, not a searched one, and nothing proves how close it is to
          the best ({r.solverNote}). Tell whoever looks after the shop computer; planning again once it is fixed may save sticks.
        </p>
      )}
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
