import type { ColumnDef } from '@tanstack/react-table'
import { Link } from 'react-router-dom'
import type { Length } from '@kitwright/shared/domain/units'
import { PART_KIND_LABELS, PART_SORT_FIELDS, type Part } from '@kitwright/shared/parts'
import { paths } from '../../../config/paths'
import { formatDollars } from './money'

const sortable = new Set<string>(PART_SORT_FIELDS)

/** The parts table's columns; ids of sortable columns are the API's sort fields. */
export function getPartsColumns(formatLength: (v: Length) => string): ColumnDef<Part, unknown>[] {
  const columns: ColumnDef<Part, unknown>[] = [
    {
      id: 'sku',
      accessorKey: 'sku',
      header: 'SKU',
      cell: ({ row }) => (
        <Link to={paths.part.href(row.original.id)} className="font-bold text-brand-700 underline-offset-2 hover:underline">
          {row.original.sku}
        </Link>
      ),
    },
    { id: 'name', accessorKey: 'name', header: 'Name' },
    { id: 'kind', accessorKey: 'kind', header: 'Kind', cell: ({ row }) => PART_KIND_LABELS[row.original.kind] },
    {
      id: 'unitCost',
      accessorKey: 'unitCostCents',
      header: 'Unit cost',
      cell: ({ row }) => (
        <span className="tabular-nums">
          {formatDollars(row.original.unitCostCents)} / {row.original.unitOfMeasure}
        </span>
      ),
    },
    {
      id: 'sticks',
      header: 'Sticks',
      cell: ({ row }) => (row.original.stickLengths.length ? row.original.stickLengths.map((l) => formatLength(l)).join(', ') : '—'),
    },
    { id: 'weight', header: 'Weight', cell: ({ row }) => <span className="tabular-nums">{row.original.weightGrams} g</span> },
    { id: 'supplier', accessorKey: 'supplier', header: 'Supplier', cell: ({ row }) => row.original.supplier ?? '—' },
    { id: 'shelfLocation', accessorKey: 'shelfLocation', header: 'Shelf', cell: ({ row }) => row.original.shelfLocation ?? '—' },
    {
      id: 'active',
      header: 'Status',
      cell: ({ row }) => (row.original.active ? 'Active' : <span className="text-stone-500">Deactivated</span>),
    },
  ]
  return columns.map((c) => ({ ...c, enableSorting: sortable.has(c.id ?? '') }))
}
