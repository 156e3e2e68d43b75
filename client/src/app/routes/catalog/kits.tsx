import { useQuery } from '@tanstack/react-query'
import type { ColumnDef } from '@tanstack/react-table'
import { useMemo } from 'react'
import { Link } from 'react-router-dom'
import type { Kit } from '@kitwright/shared/kits'
import { REVISION_STATUS_LABELS } from '@kitwright/shared/status-words'
import { DataTable } from '../../../components/ui/data-table'
import { paths } from '../../../config/paths'
import { kitsListOptions } from '../../../features/kits/api/kit-queries'
import { CreateKitForm } from '../../../features/kits/components/create-kit-form'
import { KitPriceCell } from '../../../features/kits/components/kit-price-cell'

function getKitColumns(): ColumnDef<Kit, unknown>[] {
  return [
    { accessorKey: 'sku', header: 'SKU' },
    { accessorKey: 'name', header: 'Kit' },
    { accessorKey: 'storeProductId', header: 'Store product', cell: ({ row }) => row.original.storeProductId ?? '—' },
    { id: 'price', header: 'List price', enableSorting: false, cell: ({ row }) => <KitPriceCell kit={row.original} /> },
    {
      id: 'revisions',
      header: 'Revisions',
      enableSorting: false,
      cell: ({ row }) => (
        <span className="flex flex-wrap gap-2">
          {row.original.revisions.map((r) => (
            <Link key={r.id} to={paths.revision.href(r.id)} className="rounded-md border border-stone-300 px-2 py-1 font-bold text-brand-700 hover:bg-brand-50">
              {r.code} · {REVISION_STATUS_LABELS[r.status]}
            </Link>
          ))}
        </span>
      ),
    },
  ]
}

export function Component() {
  const kits = useQuery(kitsListOptions())
  const columns = useMemo(() => getKitColumns(), [])
  return (
    <div className="space-y-6">
      <h1 className="text-3xl font-bold">Kits</h1>
      <CreateKitForm />
      {kits.isError ? <p role="alert">{kits.error.message}</p> : <DataTable data={kits.data ?? []} columns={columns} searchLabel="Search kits" />}
    </div>
  )
}
