import { zodResolver } from '@hookform/resolvers/zod'
import { useForm } from 'react-hook-form'
import { useNavigate } from 'react-router-dom'
import { toast } from 'sonner'
import { CreateKitSchema } from '@kitwright/shared/kits'
import type { z } from 'zod'
import { Button } from '../../../components/ui/button'
import { Field, Input } from '../../../components/ui/field'
import { paths } from '../../../config/paths'
import { applyServerErrors } from '../../../lib/form-errors'
import { useCreateKit } from '../api/kit-queries'

export function CreateKitForm() {
  const create = useCreateKit()
  const navigate = useNavigate()
  const form = useForm<z.input<typeof CreateKitSchema>, unknown, z.output<typeof CreateKitSchema>>({
    resolver: zodResolver(CreateKitSchema),
    defaultValues: { sku: '', name: '', storeProductId: '', description: '' },
  })
  const { errors } = form.formState
  return (
    <form
      aria-label="New kit"
      noValidate
      className="grid gap-3 rounded-lg border border-stone-300 bg-white p-4 md:grid-cols-4"
      onSubmit={form.handleSubmit((input) =>
        create.mutate(input, {
          onSuccess: (kit) => {
            toast.success(`${kit.name} created with draft revision A`)
            void navigate(paths.revision.href(kit.revisions[0]!.id))
          },
          onError: (err) => applyServerErrors(err, form.setError),
        }),
      )}
    >
      <Field label="Kit SKU" error={errors.sku?.message}>
        <Input {...form.register('sku')} />
      </Field>
      <Field label="Name" error={errors.name?.message}>
        <Input {...form.register('name')} />
      </Field>
      <Field label="Store product id" hint="How the web store names this product" error={errors.storeProductId?.message}>
        <Input {...form.register('storeProductId')} />
      </Field>
      <div className="flex items-end">
        <Button type="submit" disabled={create.isPending}>
          Create kit
        </Button>
      </div>
    </form>
  )
}
