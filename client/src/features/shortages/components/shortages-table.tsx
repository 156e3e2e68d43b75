import type { Length } from '@kitwright/shared/domain/units'
import type { ShortageRow } from '@kitwright/shared/work-orders'
import { EmptyRow, PlainTable, rowClass } from '../../../components/ui/plain-table'
import { cn } from '../../../lib/cn'
import { formatDay } from '../../orders/components/format'

const HEADERS = ['Part', 'Needed', 'Reserved', 'Free in stock', 'On order', 'Short', 'Needed by', 'Supplier · lead time', 'Suggest buying']
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
    <PlainTable label="Shortages" headers={HEADERS}>
      {rows.map((r) => (
        <tr key={r.partId} className={rowClass(r.short > 0)} data-short={r.short > 0 ? 'true' : undefined}>
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
        <EmptyRow columns={HEADERS.length}>
          Nothing is short: every open order's parts are reserved or free in stock, and no part is at its reorder point.
        </EmptyRow>
      )}
    </PlainTable>
  )
}
