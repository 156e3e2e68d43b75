import { zodResolver } from '@hookform/resolvers/zod'
import { useForm } from 'react-hook-form'
import { toast } from 'sonner'
import { ROLES, ROLE_LABELS } from '@kitwright/shared/roles'
import { CreateUserSchema, type CreateUser } from '@kitwright/shared/users'
import { Button } from '../../../components/ui/button'
import { Field, Input, Select } from '../../../components/ui/field'
import { applyServerErrors } from '../../../lib/form-errors'
import { useCreateUser } from '../api/user-queries'

export function CreateUserForm() {
  const create = useCreateUser()
  const form = useForm<CreateUser>({
    resolver: zodResolver(CreateUserSchema),
    defaultValues: { email: '', name: '', role: 'assembler', password: '', pin: undefined },
  })
  const { errors } = form.formState
  const submit = (input: CreateUser) =>
    create.mutate(input, {
      onSuccess: (user) => {
        toast.success(`${user.name} can now sign in`)
        form.reset()
      },
      onError: (err) => applyServerErrors(err, form.setError),
    })
  return (
    <form onSubmit={form.handleSubmit(submit)} className="grid gap-4 rounded-lg border border-stone-300 bg-white p-4 md:grid-cols-3" noValidate aria-label="New user">
      <Field label="Name" error={errors.name?.message}>
        <Input aria-invalid={!!errors.name} {...form.register('name')} />
      </Field>
      <Field label="E-mail" error={errors.email?.message}>
        <Input type="email" aria-invalid={!!errors.email} {...form.register('email')} />
      </Field>
      <Field label="Role" error={errors.role?.message}>
        <Select {...form.register('role')}>
          {ROLES.map((r) => (
            <option key={r} value={r}>
              {ROLE_LABELS[r]}
            </option>
          ))}
        </Select>
      </Field>
      <Field label="Password" hint="At least 10 characters" error={errors.password?.message}>
        <Input type="password" autoComplete="new-password" aria-invalid={!!errors.password} {...form.register('password')} />
      </Field>
      <Field label="Bench PIN (optional)" hint="4 to 6 digits, for signing in at a bench" error={errors.pin?.message}>
        <Input inputMode="numeric" aria-invalid={!!errors.pin} {...form.register('pin', { setValueAs: (v: string) => (v === '' ? undefined : v) })} />
      </Field>
      <div className="flex items-end">
        <Button type="submit" disabled={create.isPending}>
          Add user
        </Button>
      </div>
    </form>
  )
}
