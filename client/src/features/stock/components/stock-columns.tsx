import type { ColumnDef } from '@tanstack/react-table'
import { Link } from 'react-router-dom'
import { PART_KIND_LABELS } from '@kitwright/shared/parts'
import type { StockRow } from '@kitwright/shared/stock'
import { paths } from '../../../config/paths'
import { LowBadge } from './low-badge'

const number = (n: number) => n.toLocaleString('en-US')

/** Pipe: what is on hand per stick length, and offcuts; other kinds show nothing here. */
function SticksCell({ row, formatStick, formatLength }: { row: StockRow; formatStick: (v: number) => string; formatLength: (v: number) => string }) {
  if (row.kind !== 'stock_length') return <span className="text-stone-400">—</span>
  return (
    <ul className="text-sm leading-tight">
      {row.sticks.map((s) => (
        <li key={s.stickLength}>
          {formatStick(s.stickLength)}: {number(s.available)} of {number(s.onHand)}
        </li>
      ))}
      {row.offcuts.count > 0 && (
        <li className="text-stone-600">
          Offcuts: {row.offcuts.count} ({formatLength(row.offcuts.totalLength)})
        </li>
      )}
    </ul>
  )
}

export function getStockColumns(formatStick: (v: number) => string, formatLength: (v: number) => string): ColumnDef<StockRow, unknown>[] {
  return [
    {
      accessorKey: 'sku',
      header: 'SKU',
      cell: ({ row }) => (
        <span className="whitespace-nowrap">
          <Link to={paths.stockPart.href(row.original.partId)} className="font-bold text-brand-700 underline-offset-2 hover:underline" onClick={(e) => e.stopPropagation()}>
            {row.original.sku}
          </Link>
          {row.original.low && <LowBadge />}
        </span>
      ),
    },
    { accessorKey: 'name', header: 'Part' },
    { accessorKey: 'kind', header: 'Kind', cell: ({ row }) => PART_KIND_LABELS[row.original.kind] },
    { accessorKey: 'shelfLocation', header: 'Shelf', cell: ({ row }) => row.original.shelfLocation ?? '—' },
    { accessorKey: 'onHand', header: 'On hand', cell: ({ row }) => `${number(row.original.onHand)} ${row.original.unitOfMeasure}` },
    { accessorKey: 'reserved', header: 'Reserved', cell: ({ row }) => number(row.original.reserved) },
    { accessorKey: 'available', header: 'Available', cell: ({ row }) => <span className="font-bold">{number(row.original.available)}</span> },
    { accessorKey: 'reorderPoint', header: 'Reorder at', cell: ({ row }) => number(row.original.reorderPoint) },
    { id: 'sticks', header: 'Sticks (available of on hand)', enableSorting: false, cell: ({ row }) => <SticksCell row={row.original} formatStick={formatStick} formatLength={formatLength} /> },
  ]
}
