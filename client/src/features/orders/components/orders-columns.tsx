import type { ColumnDef } from '@tanstack/react-table'
import { Link } from 'react-router-dom'
import { ORDER_PRIORITY_LABELS, ORDER_SORT_FIELDS, type Order } from '@kitwright/shared/orders'
import { paths } from '../../../config/paths'
import { formatDateTime, formatDay, formatMoney } from './format'
import { OrderStageBadge } from './order-stage-badge'
import { PaymentText } from './order-status-badge'

const sortable = new Set<string>(ORDER_SORT_FIELDS)

/** Which open orders are ticked for release. */
export interface OrderSelection {
  selected: ReadonlySet<string>
  toggle: (id: string) => void
}

/** The orders table's columns; ids of sortable columns are the API's sort fields. */
export function getOrdersColumns({ selected, toggle }: OrderSelection): ColumnDef<Order, unknown>[] {
  const columns: ColumnDef<Order, unknown>[] = [
    {
      id: 'select',
      header: () => <span className="sr-only">Choose to release</span>,
      cell: ({ row }) =>
        row.original.status === 'open' && !row.original.onHold ? (
          <input
            type="checkbox"
            className="size-5 accent-brand-700"
            aria-label={`Choose ${row.original.number} to release`}
            checked={selected.has(row.original.id)}
            onChange={() => toggle(row.original.id)}
          />
        ) : null,
    },
    {
      id: 'number',
      header: 'Order',
      cell: ({ row }) => (
        <Link to={paths.order.href(row.original.id)} className="font-bold text-brand-700 underline-offset-2 hover:underline">
          {row.original.number}
        </Link>
      ),
    },
    { id: 'placedAt', header: 'Placed', cell: ({ row }) => <span className="whitespace-nowrap">{formatDateTime(row.original.placedAt)}</span> },
    {
      id: 'customer',
      header: 'Customer',
      cell: ({ row }) => (
        <span className="block leading-tight">
          <span className="block">{row.original.customerName}</span>
          <span className="block text-sm text-stone-500">{row.original.customerEmail}</span>
        </span>
      ),
    },
    {
      id: 'lines',
      header: 'Kits',
      cell: ({ row }) => (
        <span className="block leading-tight">
          <span className="block">{row.original.summary}</span>
          {row.original.unmappedLines > 0 && (
            <span className="block text-sm font-bold text-amber-800">
              {row.original.unmappedLines} line{row.original.unmappedLines === 1 ? '' : 's'} with no kit
            </span>
          )}
        </span>
      ),
    },
    { id: 'total', header: 'Total', cell: ({ row }) => <span className="tabular-nums">{formatMoney(row.original.totalCents, row.original.currency)}</span> },
    {
      id: 'status',
      header: 'Status',
      cell: ({ row }) => (
        <span className="block space-y-0.5 leading-tight">
          <OrderStageBadge stage={row.original.stage} late={row.original.late} priority={row.original.priority} />
          {row.original.onHold && row.original.holdReason && <span className="block text-sm text-orange-900">{row.original.holdReason}</span>}
          <span className="block text-sm">
            <PaymentText status={row.original.paymentStatus} />
            {row.original.workOrderCount > 0 ? ` · ${row.original.workOrderCount} WO` : ''}
          </span>
        </span>
      ),
    },
    {
      id: 'priority',
      header: 'Priority',
      cell: ({ row }) => <span className={row.original.priority === 'rush' ? 'font-bold text-red-800' : undefined}>{ORDER_PRIORITY_LABELS[row.original.priority]}</span>,
    },
    { id: 'promisedShipDate', header: 'Ship by', cell: ({ row }) => <span className="whitespace-nowrap">{formatDay(row.original.promisedShipDate)}</span> },
  ]
  return columns.map((c) => ({ ...c, enableSorting: sortable.has(c.id ?? '') }))
}
