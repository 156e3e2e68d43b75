import { CreateUserSchema, IdParamsSchema, ResetCredentialsSchema, UpdateUserSchema } from '@kitwright/shared/users'
import type { Deps } from '../../deps'
import { auditContext, recordAudit } from '../../lib/audit'
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
    const user = await createUser(deps.db, CreateUserSchema.parse(req.body))
    await recordAudit(deps.db, auditContext(req), { action: 'user.create', entityType: 'user', entityId: user.id, summary: `Added ${user.name} (${user.email}) as ${user.role}` })
    res.status(201).json(user)
  })
  r.patch('/:id', admin, async (req, res) => {
    const { id } = IdParamsSchema.parse(req.params)
    const change = UpdateUserSchema.parse(req.body)
    const user = await updateUser(deps.db, id, change, currentUser(req))
    await recordAudit(deps.db, auditContext(req), { action: 'user.update', entityType: 'user', entityId: id, summary: `Changed ${user.name}: ${JSON.stringify(change)}`, data: change })
    res.json(user)
  })
  r.post('/:id/credentials', admin, async (req, res) => {
    const { id } = IdParamsSchema.parse(req.params)
    const input = ResetCredentialsSchema.parse(req.body)
    const user = await resetCredentials(deps.db, id, input)
    const what = [input.password !== undefined && 'password', input.pin !== undefined && (input.pin === null ? 'PIN removed' : 'PIN')].filter(Boolean).join(' and ')
    await recordAudit(deps.db, auditContext(req), { action: 'user.credentials', entityType: 'user', entityId: id, summary: `Reset ${what} of ${user.name}` })
    res.json(user)
  })
  return r
}
