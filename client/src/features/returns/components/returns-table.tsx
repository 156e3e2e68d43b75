import { Link } from 'react-router-dom'
import { formatDateOf } from '@kitwright/shared/dates'
import type { ReturnListRow } from '@kitwright/shared/returns'
import { RETURN_STATUS_LABELS } from '@kitwright/shared/status-words'

/** Returns, newest first; the number opens the return. */
export function ReturnsTable({ rows, hrefOf }: { rows: ReturnListRow[]; hrefOf: (id: string) => string }) {
  if (rows.length === 0) return <p className="text-stone-600">No returns here.</p>
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-left text-base" aria-label="Returns">
        <thead className="border-b border-stone-300 text-sm text-stone-600">
          <tr>
            <th className="p-2">Return</th>
            <th className="p-2">Status</th>
            <th className="p-2">Unit</th>
            <th className="p-2">Kit</th>
            <th className="p-2">Reason</th>
            <th className="p-2">Order</th>
            <th className="p-2">Opened</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr key={r.id} className="border-b border-stone-200">
              <td className="p-2">
                <Link className="font-bold text-brand-700 underline" to={hrefOf(r.id)}>
                  {r.number}
                </Link>
              </td>
              <td className="p-2">{RETURN_STATUS_LABELS[r.status]}</td>
              <td className="p-2">{r.serial}</td>
              <td className="p-2">
                {r.kitSku} rev {r.revisionCode}
              </td>
              <td className="p-2">{r.reason}</td>
              <td className="p-2">{r.orderNumber}</td>
              <td className="p-2">{formatDateOf(r.openedAt)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  )
}
