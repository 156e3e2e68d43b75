import type { ColumnDef } from '@tanstack/react-table'
import { useState } from 'react'
import { toast } from 'sonner'
import { PasswordSchema, PinSchema } from '@kitwright/shared/auth'
import { ROLES, ROLE_LABELS, type Role } from '@kitwright/shared/roles'
import type { User } from '@kitwright/shared/users'
import { Button } from '../../../components/ui/button'
import { Input, Select } from '../../../components/ui/field'
import { ApiError } from '../../../lib/api-client'
import { useResetCredentials, useUpdateUser } from '../api/user-queries'

function showError(err: unknown) {
  toast.error(err instanceof ApiError ? err.message : 'Could not reach Kitwright')
}

function RoleCell({ user }: { user: User }) {
  const update = useUpdateUser()
  return (
    <Select
      aria-label={`Role of ${user.name}`}
      value={user.role}
      disabled={update.isPending}
      onChange={(e) =>
        update.mutate(
          { id: user.id, role: e.target.value as Role },
          { onSuccess: (u) => toast.success(`${u.name} is now ${ROLE_LABELS[u.role]}`), onError: showError },
        )
      }
      className="h-9 w-44"
    >
      {ROLES.map((r) => (
        <option key={r} value={r}>
          {ROLE_LABELS[r]}
        </option>
      ))}
    </Select>
  )
}

function ActiveCell({ user }: { user: User }) {
  const update = useUpdateUser()
  return (
    <Button
      size="sm"
      variant={user.active ? 'secondary' : 'primary'}
      disabled={update.isPending}
      onClick={() =>
        update.mutate(
          { id: user.id, active: !user.active },
          { onSuccess: (u) => toast.success(u.active ? `${u.name} is active again` : `${u.name} is deactivated`), onError: showError },
        )
      }
    >
      {user.active ? 'Deactivate' : 'Reactivate'}
    </Button>
  )
}

function ResetCell({ user }: { user: User }) {
  const reset = useResetCredentials()
  const [open, setOpen] = useState(false)
  const [kind, setKind] = useState<'password' | 'pin'>('password')
  const [value, setValue] = useState('')
  const [error, setError] = useState<string | null>(null)
  if (!open) {
    return (
      <Button size="sm" variant="ghost" onClick={() => setOpen(true)}>
        Reset password or PIN
      </Button>
    )
  }
  const submit = () => {
    const parsed = (kind === 'password' ? PasswordSchema : PinSchema).safeParse(value)
    if (!parsed.success) return setError(parsed.error.issues[0]?.message ?? 'Check the value')
    reset.mutate(
      { id: user.id, [kind]: parsed.data },
      {
        onSuccess: () => {
          toast.success(`New ${kind === 'pin' ? 'PIN' : 'password'} saved for ${user.name}`)
          setOpen(false)
          setValue('')
          setError(null)
        },
        onError: showError,
      },
    )
  }
  return (
    <div className="flex flex-wrap items-center gap-2">
      <Select aria-label="What to reset" value={kind} onChange={(e) => setKind(e.target.value as 'password' | 'pin')} className="h-9 w-28">
        <option value="password">Password</option>
        <option value="pin">PIN</option>
      </Select>
      <Input aria-label={`New ${kind}`} type="password" value={value} onChange={(e) => setValue(e.target.value)} className="h-9 w-40" />
      <Button size="sm" onClick={submit} disabled={reset.isPending}>
        Save
      </Button>
      <Button size="sm" variant="ghost" onClick={() => setOpen(false)}>
        Cancel
      </Button>
      {error && <span role="alert" className="w-full text-sm text-red-700">{error}</span>}
    </div>
  )
}

export function getUsersColumns(): ColumnDef<User, unknown>[] {
  return [
    { accessorKey: 'name', header: 'Name' },
    { accessorKey: 'email', header: 'E-mail' },
    { accessorKey: 'role', header: 'Role', cell: ({ row }) => <RoleCell user={row.original} /> },
    {
      accessorKey: 'active',
      header: 'Status',
      cell: ({ row }) => (
        <span className={row.original.active ? 'text-brand-700 font-bold' : 'text-stone-500'}>{row.original.active ? 'Active' : 'Deactivated'}</span>
      ),
    },
    { accessorKey: 'hasPin', header: 'PIN', cell: ({ row }) => (row.original.hasPin ? 'Set' : '—') },
    { id: 'active-toggle', header: '', enableSorting: false, cell: ({ row }) => <ActiveCell user={row.original} /> },
    { id: 'reset', header: '', enableSorting: false, cell: ({ row }) => <ResetCell user={row.original} /> },
  ]
}
