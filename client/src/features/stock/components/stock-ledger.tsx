import { formatDateTime } from '@kitwright/shared/dates'
import { PART_KIND_LABELS } from '@kitwright/shared/parts'
import { formatStickLength, type StockLedger, type StockMoveKind } from '@kitwright/shared/stock'
import { EmptyRow, PlainTable, rowClass, type PlainHeader } from '../../../components/ui/plain-table'
import { cn } from '../../../lib/cn'
import { useLengthUnit } from '../../../lib/shop-settings'
import { LowBadge } from './low-badge'

const KIND_LABELS: Record<StockMoveKind, string> = {
  receive: 'Received',
  adjust: 'Adjusted',
  reserve: 'Reserved',
  release: 'Released',
  consume: 'Used',
  offcut_in: 'Offcut kept',
  offcut_out: 'Offcut used',
  ship: 'Shipped',
}


const LEDGER_HEADERS: PlainHeader[] = [
  'When',
  'Move',
  { label: 'Change', numeric: true },
  'Stick / lot',
  'Why / reference',
  'By',
  { label: 'On hand after', numeric: true },
  { label: 'Reserved after', numeric: true },
]

function Figure({ label, value, strong }: { label: string; value: number; strong?: boolean }) {
  return (
    <div className="rounded-md border border-stone-200 bg-white px-4 py-2">
      <div className="text-sm text-stone-600">{label}</div>
      <div className={cn('text-2xl', strong && 'font-bold')}>{value.toLocaleString('en-US')}</div>
    </div>
  )
}

/** One part's balances and the moves that make them, newest first, with the balances after each move. */
export function StockLedgerView({ ledger }: { ledger: StockLedger }) {
  const { unit, format } = useLengthUnit()
  const b = ledger.balance
  return (
    <div className="space-y-4">
      <div className={cn('flex flex-wrap items-center gap-3 rounded-lg border p-4', b.low ? 'border-amber-600 bg-amber-50' : 'border-stone-300 bg-stone-50')}>
        <Figure label={`On hand (${b.unitOfMeasure})`} value={b.onHand} />
        <Figure label="Reserved" value={b.reserved} />
        <Figure label="Available" value={b.available} strong />
        <Figure label="Reorder at" value={b.reorderPoint} />
        <div className="text-stone-700">
          {PART_KIND_LABELS[b.kind]}
          {b.shelfLocation && ` · shelf ${b.shelfLocation}`}
          {b.low && <LowBadge />}
          {b.low && <span className="ml-2">Available is at or below the reorder point: reorder {b.reorderQuantity}.</span>}
        </div>
      </div>
      {b.kind === 'stock_length' && (
        <p className="text-stone-700">
          {b.sticks.map((s) => `${formatStickLength(s.stickLength, unit)}: ${s.onHand} on hand, ${s.reserved} reserved, ${s.available} available`).join(' · ')}
          {b.offcuts.count > 0 && ` · offcuts: ${b.offcuts.count} (${format(b.offcuts.totalLength)} in all)`}
        </p>
      )}
      {ledger.lots.length > 0 && (
        <p className="text-stone-700" aria-label="Stock by lot">
          By supplier's lot, oldest first:{' '}
          {ledger.lots.map((l) => `${l.code}: ${l.onHand} on hand${l.free !== l.onHand ? `, ${l.free} not yet fitted` : ''}`).join(' · ')}
        </p>
      )}
      <PlainTable label="Ledger" headers={LEDGER_HEADERS}>
        {ledger.moves.map((m) => (
          <tr key={m.id} className={rowClass()}>
            <td className="px-3 py-2 whitespace-nowrap">{formatDateTime(m.createdAt)}</td>
            <td className="px-3 py-2">{KIND_LABELS[m.kind]}</td>
            <td className="px-3 py-2 text-right font-bold">{m.quantity > 0 ? `+${m.quantity}` : m.quantity}</td>
            <td className="px-3 py-2">{m.stickLength !== null ? formatStickLength(m.stickLength, unit) : m.lotCode ? `lot ${m.lotCode}` : '—'}</td>
            <td className="px-3 py-2">{[m.reason, m.reference].filter(Boolean).join(' · ') || '—'}</td>
            <td className="px-3 py-2">{m.createdBy?.name ?? '—'}</td>
            <td className="px-3 py-2 text-right">{m.onHandAfter}</td>
            <td className="px-3 py-2 text-right">{m.reservedAfter}</td>
          </tr>
        ))}
        {ledger.moves.length === 0 && <EmptyRow columns={LEDGER_HEADERS.length}>No moves yet: receive stock to start this part's ledger</EmptyRow>}
      </PlainTable>
      {ledger.totalMoves > ledger.moves.length && (
        <p className="text-sm text-stone-600">
          Showing the newest {ledger.moves.length} of {ledger.totalMoves} moves.
        </p>
      )}
    </div>
  )
}
