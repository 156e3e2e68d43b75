import { formatDateTime } from '@kitwright/shared/dates'
import type { ColumnDef } from '@tanstack/react-table'
import type { AuditEvent } from '@kitwright/shared/audit'

export function getAuditColumns(): ColumnDef<AuditEvent, unknown>[] {
  return [
    { accessorKey: 'at', header: 'When', enableSorting: false, cell: ({ row }) => formatDateTime(row.original.at) },
    { id: 'who', header: 'Who', enableSorting: false, cell: ({ row }) => row.original.actorName ?? row.original.actorEmail ?? '—' },
    { accessorKey: 'bench', header: 'Bench', enableSorting: false, cell: ({ row }) => row.original.bench ?? '—' },
    { accessorKey: 'action', header: 'Change', enableSorting: false },
    { accessorKey: 'summary', header: 'What', enableSorting: false },
    { accessorKey: 'address', header: 'From address', enableSorting: false, cell: ({ row }) => row.original.address ?? '—' },
  ]
}
