import { Link } from 'react-router-dom'
import type { BuildPage } from '@kitwright/shared/build'
import { WORK_ORDER_STATUS_LABELS } from '@kitwright/shared/status-words'
import { paths } from '../../../config/paths'
import { cn } from '../../../lib/cn'
import { formatWhen } from './format'

/** Which unit this is, where it stands, and what is left before the pack bench. */
export function BuildSummary({ page }: { page: BuildPage }) {
  const { workOrder: wo, readiness: r } = page
  const left: string[] = []
  if (r.stepsLeft > 0) left.push(`${r.stepsLeft} step${r.stepsLeft === 1 ? '' : 's'} to tick`)
  if (r.photosMissing > 0) left.push(`${r.photosMissing} photo${r.photosMissing === 1 ? '' : 's'} to take`)
  if (r.leakTest === 'none') left.push('the leak test to run')
  if (r.leakTest === 'failed') left.push('a passing leak test after the fix')
  if (r.openRework > 0 && r.leakTest !== 'failed') left.push('the rework below')
  if (r.lotsMissing > 0) left.push(`the lot of ${r.lotsMissing} part${r.lotsMissing === 1 ? '' : 's'} to record`)
  const openRework = page.rework.filter((x) => x.resolvedAt === null)
  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-baseline gap-x-6 gap-y-2">
        <h2 className="text-4xl font-bold">Unit {wo.serial}</h2>
        <p className="text-2xl">
          {page.kit.sku} rev {page.revision.code} · {page.kit.name}
          {wo.binCode && <> · bin {wo.binCode}</>}
        </p>
        <Link to={paths.unit.href(wo.serial)} className="ml-auto text-xl font-bold text-brand-700 underline">
          Build record
        </Link>
      </div>
      <p
        role="status"
        className={cn(
          'rounded-lg p-4 text-2xl font-bold',
          wo.status === 'built' ? 'bg-brand-700 text-white' : wo.status === 'rework' ? 'bg-red-700 text-white' : 'bg-stone-200 text-stone-900',
        )}
      >
        {WORK_ORDER_STATUS_LABELS[wo.status]}
        {wo.status === 'built' && <span className="font-normal"> · next: the pack bench</span>}
        {wo.status !== 'built' && left.length > 0 && <span className="font-normal"> · left: {left.join(', ')}</span>}
      </p>
      {openRework.map((x) => (
        <div key={x.id} className="rounded-lg border-4 border-red-700 bg-red-50 p-4 text-xl">
          <p className="font-bold">{x.cause === 'measurement' ? 'Rework: fix this, then undo the step and measure again.' : 'Rework: fix this, then run the leak test again.'}</p>
          <p>{x.reason}</p>
          <p className="text-base text-stone-700">
            Sent by {x.by.name}, {formatWhen(x.at)}
          </p>
        </div>
      ))}
    </div>
  )
}
