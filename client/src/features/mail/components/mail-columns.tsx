import { formatDateTime } from '@kitwright/shared/dates'
import type { ColumnDef } from '@tanstack/react-table'
import type { MailSummary } from '@kitwright/shared/mail'
import { MailStatusBadge } from './mail-status-badge'

export function getMailColumns(onOpen: (id: string) => void): ColumnDef<MailSummary, unknown>[] {
  return [
    { accessorKey: 'createdAt', header: 'Queued', enableSorting: false, cell: ({ row }) => formatDateTime(row.original.createdAt) },
    { accessorKey: 'to', header: 'To', enableSorting: false },
    {
      accessorKey: 'subject',
      header: 'Subject',
      enableSorting: false,
      cell: ({ row }) => (
        <button type="button" className="text-left font-bold text-brand-700 underline hover:text-brand-900" onClick={() => onOpen(row.original.id)}>
          {row.original.subject}
        </button>
      ),
    },
    { accessorKey: 'status', header: 'Status', enableSorting: false, cell: ({ row }) => <MailStatusBadge status={row.original.status} /> },
    { accessorKey: 'sentAt', header: 'Sent', enableSorting: false, cell: ({ row }) => formatDateTime(row.original.sentAt) },
    { accessorKey: 'attempts', header: 'Tries', enableSorting: false },
  ]
}
