import { CreateUserSchema, IdParamsSchema, ResetCredentialsSchema, UpdateUserSchema } from '@kitwright/shared/users'
import type { Deps } from '../../deps'
import { currentUser } from '../../lib/auth'
import type { RouteTable } from '../../lib/routes'
import { createUser, listUsers, resetCredentials, updateUser } from './users.service'

export function usersRouter(deps: Deps, routes: RouteTable) {
  const r = routes.router('/api/users')
  const admin = ['admin'] as const
  r.get('/', admin, async (_req, res) => {
    res.json(await listUsers(deps.db))
  })
  r.post('/', admin, async (req, res) => {
    res.status(201).json(await createUser(deps.db, CreateUserSchema.parse(req.body)))
  })
  r.patch('/:id', admin, async (req, res) => {
    const { id } = IdParamsSchema.parse(req.params)
    res.json(await updateUser(deps.db, id, UpdateUserSchema.parse(req.body), currentUser(req)))
  })
  r.post('/:id/credentials', admin, async (req, res) => {
    const { id } = IdParamsSchema.parse(req.params)
    res.json(await resetCredentials(deps.db, id, ResetCredentialsSchema.parse(req.body)))
  })
  return r
}
