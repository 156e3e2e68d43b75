import { useQuery } from '@tanstack/react-query'
import { useParams } from 'react-router-dom'
import { meOptions } from '../../../features/auth/api/auth-queries'
import { partChoicesOptions, revisionOptions } from '../../../features/kits/api/kit-queries'
import { RevisionEditor } from '../../../features/kits/components/revision-editor'

export function Component() {
  const { revisionId = '' } = useParams()
  const revision = useQuery(revisionOptions(revisionId))
  const parts = useQuery(partChoicesOptions())
  const me = useQuery(meOptions())
  if (revision.isError) return <p role="alert">{revision.error.message}</p>
  if (parts.isError) return <p role="alert">{parts.error.message}</p>
  if (!revision.data || !parts.data || !me.data) return <p>Loading…</p>
  const canEdit = me.data.role === 'admin' || me.data.role === 'planner'
  return <RevisionEditor key={revision.data.id} revision={revision.data} parts={parts.data} canEdit={canEdit} />
}
