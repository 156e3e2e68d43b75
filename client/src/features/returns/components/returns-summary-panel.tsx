import { useQuery } from '@tanstack/react-query'
import { Link } from 'react-router-dom'
import { Section } from '../../../components/ui/section'
import { returnSummaryOptions } from '../api/return-queries'

/**
 * The owner's view of returns: how many came back per kit revision and reason, beside how many of
 * that revision went out, so a revision that leaks shows at a glance.
 */
export function ReturnsSummaryPanel({ returnsHref }: { returnsHref: string }) {
  const summary = useQuery(returnSummaryOptions())
  return (
    <Section
      title="Returns per kit revision and reason"
      actions={
        <Link className="text-brand-700 underline" to={returnsHref}>
          {summary.data ? `${summary.data.open} to decide` : 'Returns'}
        </Link>
      }
    >
      {summary.isError && (
        <p role="alert" className="text-red-700">
          {summary.error.message}
        </p>
      )}
      {summary.data && summary.data.rows.length === 0 && <p className="text-stone-600">No returns yet.</p>}
      {summary.data && summary.data.rows.length > 0 && (
        <table className="w-full text-left" aria-label="Returns per kit revision and reason">
          <thead className="border-b border-stone-300 text-sm text-stone-600">
            <tr>
              <th className="p-2">Kit revision</th>
              <th className="p-2">Reason</th>
              <th className="p-2 text-right">Returns</th>
              <th className="p-2 text-right">Of units shipped</th>
            </tr>
          </thead>
          <tbody>
            {summary.data.rows.map((r) => (
              <tr key={`${r.kitSku}-${r.revisionCode}-${r.reason}`} className="border-b border-stone-200">
                <td className="p-2">
                  {r.kitSku} rev {r.revisionCode}
                </td>
                <td className="p-2">{r.reason}</td>
                <td className="p-2 text-right font-bold">{r.returns}</td>
                <td className="p-2 text-right">
                  {r.shipped > 0 ? `${r.returns} of ${r.shipped} (${((100 * r.returns) / r.shipped).toFixed(1)} %)` : '—'}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </Section>
  )
}
