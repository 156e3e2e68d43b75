import { z } from 'zod'
import { CreateKitSchema, NewRevisionSchema, RevisionContentSchema } from '@kitwright/shared/kits'
import { IdParamsSchema } from '@kitwright/shared/users'
import type { Deps } from '../../deps'
import { currentUser } from '../../lib/auth'
import type { RouteTable } from '../../lib/routes'
import { createKit, getKit, getRevision, listKits, newRevision, releaseRevision, retireRevision, saveRevision } from './kits.service'

const catalogEditors = ['admin', 'planner'] as const

export function kitsRouter(deps: Deps, routes: RouteTable) {
  const r = routes.router('/api/kits')
  // Every bench reads kits: the build bench shows a revision's steps, the pack bench its contents.
  r.get('/', 'signed-in', async (_req, res) => {
    res.json(await listKits(deps.db))
  })
  r.post('/', catalogEditors, async (req, res) => {
    res.status(201).json(await createKit(deps.db, CreateKitSchema.parse(req.body)))
  })
  r.get('/:id', 'signed-in', async (req, res) => {
    res.json(await getKit(deps.db, IdParamsSchema.parse(req.params).id))
  })
  r.post('/:id/revisions', catalogEditors, async (req, res) => {
    const { id } = IdParamsSchema.parse(req.params)
    const { copyFrom } = NewRevisionSchema.parse(req.body ?? {})
    res.status(201).json(await newRevision(deps.db, id, copyFrom))
  })
  return r
}

export function revisionsRouter(deps: Deps, routes: RouteTable) {
  const r = routes.router('/api/revisions')
  r.get('/:id', 'signed-in', async (req, res) => {
    res.json(await getRevision(deps.db, IdParamsSchema.parse(req.params).id))
  })
  r.put('/:id', catalogEditors, async (req, res) => {
    const { id } = IdParamsSchema.parse(req.params)
    res.json(await saveRevision(deps.db, id, RevisionContentSchema.parse(req.body)))
  })
  r.post('/:id/release', catalogEditors, async (req, res) => {
    const { id } = IdParamsSchema.parse(req.params)
    z.object({}).strict().parse(req.body ?? {})
    res.json(await releaseRevision(deps.db, id, currentUser(req)))
  })
  r.post('/:id/retire', catalogEditors, async (req, res) => {
    const { id } = IdParamsSchema.parse(req.params)
    res.json(await retireRevision(deps.db, id))
  })
  return r
}
