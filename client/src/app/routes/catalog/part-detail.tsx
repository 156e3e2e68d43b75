import { useQuery } from '@tanstack/react-query'
import { Link, useNavigate, useParams } from 'react-router-dom'
import { toast } from 'sonner'
import type { Part } from '@kitwright/shared/parts'
import { Button } from '../../../components/ui/button'
import { paths } from '../../../config/paths'
import { ApiError } from '../../../lib/api-client'
import { partDetailOptions, useCreatePart, useUpdatePart } from '../../../features/parts/api/part-queries'
import { PartForm } from '../../../features/parts/components/part-form'

function NewPart() {
  const create = useCreatePart()
  const navigate = useNavigate()
  return (
    <PartForm
      submitLabel="Add part"
      pending={create.isPending}
      onSubmit={async (input) => {
        const part = await create.mutateAsync(input)
        toast.success(`${part.sku} added`)
        await navigate(paths.parts.href())
      }}
    />
  )
}

function EditPart({ part }: { part: Part }) {
  const update = useUpdatePart()
  const toggle = () =>
    update.mutate(
      { id: part.id, patch: { active: !part.active } },
      {
        onSuccess: (p) => toast.success(p.active ? `${p.sku} is active again` : `${p.sku} is deactivated; kits already using it keep it`),
        onError: (err) => toast.error(err instanceof ApiError ? err.message : 'Could not reach Kitwright'),
      },
    )
  return (
    <div className="space-y-4">
      <p className="flex flex-wrap items-center gap-3">
        <span className={part.active ? 'font-bold text-brand-700' : 'font-bold text-stone-500'}>{part.active ? 'Active' : 'Deactivated'}</span>
        <Button size="sm" variant="secondary" disabled={update.isPending} onClick={toggle}>
          {part.active ? 'Deactivate' : 'Reactivate'}
        </Button>
      </p>
      <PartForm
        key={part.updatedAt}
        part={part}
        submitLabel="Save changes"
        pending={update.isPending}
        onSubmit={async (input) => {
          const saved = await update.mutateAsync({ id: part.id, patch: input })
          toast.success(`${saved.sku} saved`)
        }}
      />
    </div>
  )
}

function LoadPart({ id }: { id: string }) {
  const part = useQuery(partDetailOptions(id))
  if (part.isError) return <p role="alert" className="text-red-700">{part.error.message}</p>
  if (!part.data) return <p>Loading…</p>
  return <EditPart part={part.data} />
}

/** A new part (/catalog/parts/new) or one part to edit (/catalog/parts/:partId). */
export function Component() {
  const { partId } = useParams()
  return (
    <div className="space-y-6">
      <p>
        <Link to={paths.parts.href()} className="font-bold text-brand-700 hover:underline">
          ← Parts
        </Link>
      </p>
      <h1 className="text-3xl font-bold">{partId ? 'Part' : 'New part'}</h1>
      {partId ? <LoadPart id={partId} /> : <NewPart />}
    </div>
  )
}
