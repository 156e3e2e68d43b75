import type { Length } from '@kitwright/shared/domain/units'
import type { ShortageRow } from '@kitwright/shared/work-orders'
import { cn } from '../../../lib/cn'
import { formatDay } from '../../orders/components/format'

const th = 'px-3 py-2 font-bold'
const td = 'px-3 py-2 tabular-nums'

/** The orders that need a part, the first few by number. */
function ordersWords(numbers: string[]) {
  if (numbers.length === 0) return 'No open order (reorder point)'
  const shown = numbers.slice(0, 4).join(', ')
  return numbers.length > 4 ? `${shown} and ${numbers.length - 4} more` : shown
}

function unitWord(r: ShortageRow) {
  return r.kind === 'stock_length' ? 'sticks' : r.unitOfMeasure
}

/**
 * Parts the open orders need, against what is reserved for them and what is free, with the orders
 * that need each and the earliest date. Pipe is estimated in sticks from the cut parts (it is
 * reserved when a cut run is published).
 */
export function ShortagesTable({ rows, formatLength }: { rows: ShortageRow[]; formatLength: (v: Length) => string }) {
  return (
    <div className="overflow-x-auto rounded-lg border border-stone-300 bg-white">
      <table className="w-full text-left" aria-label="Shortages">
        <thead className="bg-stone-50 text-sm text-stone-600">
          <tr>
            <th className={th}>Part</th>
            <th className={th}>Needed</th>
            <th className={th}>Reserved</th>
            <th className={th}>Free in stock</th>
            <th className={th}>On order</th>
            <th className={th}>Short</th>
            <th className={th}>Needed by</th>
            <th className={th}>Supplier · lead time</th>
            <th className={th}>Suggest buying</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr key={r.partId} className={cn('border-t border-stone-200', r.short > 0 && 'bg-red-50')} data-short={r.short > 0 ? 'true' : undefined}>
              <td className="px-3 py-2">
                <span className="block font-bold">{r.sku}</span>
                <span className="block text-sm text-stone-600">{r.name}</span>
                {r.kind === 'stock_length' && r.cutLength !== null && r.stickLength !== null && (
                  <span className="block text-sm text-stone-600">
                    Estimate: {formatLength(r.cutLength)} to cut with kerf ÷ {formatLength(r.stickLength)} sticks, rounded up
                  </span>
                )}
              </td>
              <td className={td}>
                {r.needed} {unitWord(r)}
              </td>
              <td className={td}>{r.reserved}</td>
              <td className={td}>{r.available}</td>
              <td className="px-3 py-2" data-testid="on-order">
                {r.onOrder > 0 ? <span className="block tabular-nums">{r.onOrder}</span> : '—'}
                {r.onOrderPurchaseOrders.map((po) => (
                  <span key={po.number} className="block text-sm text-stone-600">
                    {po.number}: {po.outstanding}
                    {po.expectedDate ? `, due ${formatDay(po.expectedDate)}` : ''}
                  </span>
                ))}
              </td>
              <td className={cn(td, r.short > 0 && 'font-bold text-red-700')}>{r.short > 0 ? `${r.short} ${unitWord(r)}` : '—'}</td>
              <td className="px-3 py-2">
                {r.neededBy ? <span className="block font-bold">{formatDay(r.neededBy)}</span> : null}
                <span className="block text-sm text-stone-600">{ordersWords(r.orderNumbers)}</span>
              </td>
              <td className="px-3 py-2">
                {r.supplier ?? '—'}
                {r.leadTimeDays !== null ? ` · ${r.leadTimeDays} days` : ''}
              </td>
              <td className={cn(td, r.suggestedOrder > 0 && 'font-bold')}>
                {r.suggestedOrder > 0 ? `${r.suggestedOrder} ${unitWord(r)}` : '—'}
                {r.belowReorderPoint && (
                  <span className="block text-sm font-normal text-stone-600">
                    {r.available} free{r.onOrder > 0 ? ` + ${r.onOrder} on order` : ''}, reorder point {r.reorderPoint}
                  </span>
                )}
              </td>
            </tr>
          ))}
          {rows.length === 0 && (
            <tr>
              <td colSpan={9} className="px-3 py-6 text-center text-stone-500">
                Nothing is short: every open order's parts are reserved or free in stock, and no part is at its reorder point.
              </td>
            </tr>
          )}
        </tbody>
      </table>
    </div>
  )
}
