import { useEffect, useMemo } from 'react'
import { FormProvider, useForm, type Path } from 'react-hook-form'
import { useNavigate } from 'react-router-dom'
import { toast } from 'sonner'
import type { RevisionDetail } from '@kitwright/shared/kits'
import { REVISION_STATUS_LABELS } from '@kitwright/shared/status-words'
import type { Part } from '@kitwright/shared/parts'
import { Button } from '../../../components/ui/button'
import { Field } from '../../../components/ui/field'
import { paths } from '../../../config/paths'
import { ApiError } from '../../../lib/api-client'
import { useLengthUnit } from '../../../lib/shop-settings'
import { useNewRevision, useReleaseRevision, useRetireRevision, useSaveRevision } from '../api/kit-queries'
import { BomSection } from './bom-section'
import { CutPartsSection } from './cut-parts-section'
import { FramePanel } from './frame-panel'
import { LeakTestSection } from './leak-test-section'
import { ReservoirPanel } from './reservoir-panel'
import { RollupPanel } from './rollup-panel'
import { formFieldFor, toContent, toFormValues, type RevisionFormValues } from './revision-form-model'
import { StepsSection } from './steps-section'

const STATUS_STYLE = {
  draft: 'bg-amber-100 text-amber-900',
  released: 'bg-brand-100 text-brand-900',
  retired: 'bg-stone-200 text-stone-700',
} as const

export function RevisionEditor({ revision, parts, canEdit }: { revision: RevisionDetail; parts: Part[]; canEdit: boolean }) {
  const { formatInput, parse } = useLengthUnit()
  const navigate = useNavigate()
  const readOnly = !canEdit || revision.status !== 'draft'
  const defaults = useMemo(() => toFormValues(revision, formatInput), [revision, formatInput])
  const form = useForm<RevisionFormValues>({ defaultValues: defaults })
  useEffect(() => form.reset(defaults), [defaults, form])
  const save = useSaveRevision()
  const release = useReleaseRevision()
  const retire = useRetireRevision()
  const startNew = useNewRevision()
  const pipes = parts.filter((p) => p.kind === 'stock_length')
  const others = parts.filter((p) => p.kind !== 'stock_length')

  const showErrors = (fields: Record<string, string>) => {
    for (const [path, message] of Object.entries(fields)) form.setError(formFieldFor(path) as Path<RevisionFormValues>, { message })
  }
  const onError = (err: unknown) => {
    if (err instanceof ApiError) {
      showErrors(err.body.fields ?? {})
      toast.error(err.message)
    } else toast.error('Could not reach Kitwright; check the connection and try again')
  }
  const onSave = form.handleSubmit((values) => {
    const converted = toContent(values, parse)
    if (!converted.value) {
      showErrors(converted.errors)
      toast.error(`Fix ${Object.keys(converted.errors).length} field(s) before saving`)
      return
    }
    save.mutate({ id: revision.id, content: converted.value }, { onSuccess: () => toast.success('Saved'), onError })
  })

  const title = `${revision.kit.sku} · ${revision.kit.name}`
  return (
    <FormProvider {...form}>
      <form onSubmit={onSave} className="space-y-4" noValidate aria-label={`Revision ${revision.code}`}>
        <div className="flex flex-wrap items-center gap-3">
          <div className="mr-auto">
            <p className="text-stone-600">{title}</p>
            <h1 className="text-3xl font-bold">
              Revision {revision.code}{' '}
              <span className={`ml-2 rounded-md px-2 py-1 align-middle text-base ${STATUS_STYLE[revision.status]}`}>{REVISION_STATUS_LABELS[revision.status]}</span>
            </h1>
          </div>
          {canEdit && revision.status === 'draft' && (
            <>
              <Button type="submit" disabled={save.isPending}>
                Save draft
              </Button>
              <Button
                variant="secondary"
                disabled={release.isPending || form.formState.isDirty}
                title={form.formState.isDirty ? 'Save the draft first' : undefined}
                onClick={() => release.mutate(revision.id, { onSuccess: () => toast.success(`Revision ${revision.code} released`), onError })}
              >
                Release
              </Button>
            </>
          )}
          {canEdit && revision.status !== 'draft' && (
            <Button
              onClick={() =>
                startNew.mutate(
                  { kitId: revision.kit.id, copyFrom: revision.id },
                  { onSuccess: (rev) => void navigate(paths.revision.href(rev.id)), onError },
                )
              }
            >
              Start a new revision from {revision.code}
            </Button>
          )}
          {canEdit && revision.status === 'released' && (
            <Button variant="secondary" onClick={() => retire.mutate(revision.id, { onSuccess: () => toast.success(`Revision ${revision.code} retired`), onError })}>
              Retire
            </Button>
          )}
        </div>
        {revision.status !== 'draft' && (
          <p className="rounded-md bg-stone-200 p-3">
            A {REVISION_STATUS_LABELS[revision.status].toLowerCase()} revision never changes; work orders keep the revision they were released with.
            {canEdit && ' To change it, start a new revision from it.'}
          </p>
        )}
        <RollupPanel rollup={revision.rollup} stale={form.formState.isDirty} />
        <fieldset disabled={readOnly} className="space-y-4">
          <FramePanel pipes={pipes} readOnly={readOnly} />
          <CutPartsSection pipes={pipes} readOnly={readOnly} />
          <BomSection parts={others} readOnly={readOnly} />
          <StepsSection readOnly={readOnly} />
          <LeakTestSection readOnly={readOnly} />
          <ReservoirPanel readOnly={readOnly} />
          <Field label="Notes">
            <textarea className="min-h-20 w-full rounded-md border border-stone-300 p-2" {...form.register('notes')} />
          </Field>
        </fieldset>
      </form>
    </FormProvider>
  )
}
