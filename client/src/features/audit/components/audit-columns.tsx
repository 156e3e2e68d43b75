import { formatDateTime } from '@kitwright/shared/dates'
import type { ColumnDef } from '@tanstack/react-table'
import type { AuditEvent } from '@kitwright/shared/audit'

export function getAuditColumns(): ColumnDef<AuditEvent, unknown>[] {
  return [
    {
      accessorKey: 'at',
      header: 'When',
      enableSorting: false,
      // A change a bench kept while the network was down: when it was tapped there, and when it arrived.
      cell: ({ row }) =>
        row.original.takenAt && Date.parse(row.original.at) - Date.parse(row.original.takenAt) > 5_000 ? (
          <>
            {formatDateTime(row.original.takenAt)} <span className="block text-sm text-stone-600">on the bench; reached the server {formatDateTime(row.original.at)}</span>
          </>
        ) : (
          formatDateTime(row.original.at)
        ),
    },
    { id: 'who', header: 'Who', enableSorting: false, cell: ({ row }) => row.original.actorName ?? row.original.actorEmail ?? '—' },
    { accessorKey: 'bench', header: 'Bench', enableSorting: false, cell: ({ row }) => row.original.bench ?? '—' },
    { accessorKey: 'action', header: 'Change', enableSorting: false },
    { accessorKey: 'summary', header: 'What', enableSorting: false },
    { accessorKey: 'address', header: 'From address', enableSorting: false, cell: ({ row }) => row.original.address ?? '—' },
  ]
}
