import { useQuery } from '@tanstack/react-query'
import { useMemo } from 'react'
import { DataTable } from '../../../components/ui/data-table'
import { usersListOptions } from '../../../features/users/api/user-queries'
import { CreateUserForm } from '../../../features/users/components/create-user-form'
import { getUsersColumns } from '../../../features/users/components/users-columns'

export function Component() {
  const users = useQuery(usersListOptions())
  const columns = useMemo(() => getUsersColumns(), [])
  return (
    <div className="space-y-6">
      <h1 className="text-3xl font-bold">Users</h1>
      <CreateUserForm />
      {users.isError ? (
        <p role="alert" className="text-red-700">{users.error.message}</p>
      ) : (
        <DataTable data={users.data ?? []} columns={columns} searchLabel="Search users" />
      )}
    </div>
  )
}
