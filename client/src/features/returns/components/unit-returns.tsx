import { useQuery } from '@tanstack/react-query'
import { Link } from 'react-router-dom'
import { formatDateTime } from '@kitwright/shared/dates'
import { RETURN_DISPOSITION_LABELS, RETURN_STATUS_LABELS } from '@kitwright/shared/status-words'
import { Section } from '../../../components/ui/section'
import { unitReturnsOptions } from '../api/return-queries'


/**
 * The unit's returns, in its build record beside the original build: why it came back, when it was
 * received, what was decided, and what became of it after a replace or refund (spare or scrapped). A repair's reopened steps and its retest show in the steps and leak
 * tests above (undone ticks, a new attempt), and its rework entry names the return.
 */
export function UnitReturns({ serial, returnHref }: { serial: string; returnHref: ((id: string) => string) | null }) {
  const q = useQuery(unitReturnsOptions(serial))
  if (!q.data || q.data.returns.length === 0) return null
  return (
    <Section title="Returns">
      <ol className="space-y-3" aria-label="Returns of this unit">
        {q.data.returns.map((r) => (
          <li key={r.id} className="rounded-md border border-stone-300 p-3 text-lg">
            <p>
              <strong>{returnHref ? <Link className="text-brand-700 underline" to={returnHref(r.id)}>{r.number}</Link> : r.number}</strong> · {RETURN_STATUS_LABELS[r.status]} · {r.reason}
              {r.notes ? ` (${r.notes})` : ''}
            </p>
            <p className="text-base text-stone-700">
              Opened {formatDateTime(r.openedAt)}
              {r.receivedAt ? ` · received ${formatDateTime(r.receivedAt)}` : ''}
              {r.decidedAt ? ` · decided ${formatDateTime(r.decidedAt)}` : ''}
              {r.decisionNote ? `: ${r.decisionNote}` : ''}
              {r.replacementSerial ? ` · replaced by ${r.replacementSerial}` : ''}
              {r.refundCents !== null ? ` · refund noted ${(r.refundCents / 100).toFixed(2)}` : ''}
            </p>
            {r.disposition && (
              <p className="text-base text-stone-700">
                {RETURN_DISPOSITION_LABELS[r.disposition]}
                {r.disposedAt ? ` ${formatDateTime(r.disposedAt)}` : ''}
                {r.dispositionNote ? `: ${r.dispositionNote}` : ''}
              </p>
            )}
          </li>
        ))}
      </ol>
    </Section>
  )
}
