import { useQuery } from '@tanstack/react-query'
import { Link, useNavigate } from 'react-router-dom'
import { CUT_RUN_STATUS_LABELS } from '@kitwright/shared/status-words'
import { paths } from '../../../config/paths'
import { cutRunsListOptions } from '../../../features/cut-runs/api/cut-run-queries'
import { PlanForm } from '../../../features/cut-runs/components/plan-form'
import { Section } from '../../../components/ui/section'

export function Component() {
  const runs = useQuery(cutRunsListOptions())
  const navigate = useNavigate()
  return (
    <div className="space-y-6">
      <h1 className="text-3xl font-bold">Cut runs</h1>
      <Section title="Recent runs">
        {runs.data?.length === 0 && <p className="text-stone-600">No cut runs yet.</p>}
        <ul className="divide-y divide-stone-200">
          {(runs.data ?? []).map((r) => (
            <li key={r.id} className="flex flex-wrap items-center gap-3 py-2">
              <Link to={paths.cutRun.href(r.id)} className="font-bold text-brand-700 underline">
                {r.number}
              </Link>
              <span className="rounded bg-stone-100 px-2 text-sm">{CUT_RUN_STATUS_LABELS[r.status]}</span>
              <span className="text-stone-700">
                {r.workOrderCount} work orders · {r.sticksUsed} sticks · {r.cutsDone}/{r.cutsTotal} pieces cut
              </span>
            </li>
          ))}
        </ul>
      </Section>
      <h2 className="text-2xl font-bold">Plan a new cut run</h2>
      <PlanForm onPlanned={(run) => void navigate(paths.cutRun.href(run.id))} />
    </div>
  )
}
