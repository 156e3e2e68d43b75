import { z } from 'zod'
import { formatMoney } from '@kitwright/shared/money'
import { CreateKitSchema, NewRevisionSchema, RevisionContentSchema, UpdateKitPriceSchema } from '@kitwright/shared/kits'
import { seesCosts } from '@kitwright/shared/roles'
import { IdParamsSchema } from '@kitwright/shared/users'
import type { Deps } from '../../deps'
import { auditContext, recordAudit } from '../../lib/audit'
import { currentUser } from '../../lib/auth'
import type { RouteTable } from '../../lib/routes'
import { revisionWithoutCosts } from './kits.mapper'
import { createKit, getKit, setKitPrice, getRevision, listKits, newRevision, releaseRevision, retireRevision, saveRevision } from './kits.service'

const catalogEditors = ['admin', 'planner'] as const

export function kitsRouter(deps: Deps, routes: RouteTable) {
  const r = routes.router('/api/kits')
  // Every bench reads kits: the build bench shows a revision's steps, the pack bench its contents.
  r.get('/', 'signed-in', async (_req, res) => {
    res.json(await listKits(deps.db))
  })
  r.post('/', catalogEditors, async (req, res) => {
    const kit = await createKit(deps.db, CreateKitSchema.parse(req.body))
    await recordAudit(deps.db, auditContext(req), { action: 'kit.create', entityType: 'kit', entityId: kit.id, summary: `Added kit ${kit.sku} with draft revision A` })
    res.status(201).json(kit)
  })
  r.get('/:id', 'signed-in', async (req, res) => {
    res.json(await getKit(deps.db, IdParamsSchema.parse(req.params).id))
  })
  r.put('/:id/price', catalogEditors, async (req, res) => {
    const { id } = IdParamsSchema.parse(req.params)
    const { priceCents } = UpdateKitPriceSchema.parse(req.body)
    const kit = await setKitPrice(deps.db, id, priceCents)
    await recordAudit(
      deps.db,
      auditContext(req),
      { action: 'kit.price', entityType: 'kit', entityId: id, summary: `Set the list price of ${kit.sku} to ${priceCents === null ? 'none' : formatMoney(priceCents)}` },
    )
    res.json(kit)
  })
  r.post('/:id/revisions', catalogEditors, async (req, res) => {
    const { id } = IdParamsSchema.parse(req.params)
    const { copyFrom } = NewRevisionSchema.parse(req.body ?? {})
    const rev = await newRevision(deps.db, id, copyFrom)
    await recordAudit(deps.db, auditContext(req), { action: 'kit_revision.create', entityType: 'kit_revision', entityId: rev.id, summary: `Started revision ${rev.code} of ${rev.kit.sku}` })
    res.status(201).json(rev)
  })
  return r
}

export function revisionsRouter(deps: Deps, routes: RouteTable) {
  const r = routes.router('/api/revisions')
  // Every bench reads a revision (steps, contents); its costs are the office's.
  r.get('/:id', 'signed-in', async (req, res) => {
    const rev = await getRevision(deps.db, IdParamsSchema.parse(req.params).id)
    res.json(seesCosts(currentUser(req).role) ? rev : revisionWithoutCosts(rev))
  })
  r.put('/:id', catalogEditors, async (req, res) => {
    const { id } = IdParamsSchema.parse(req.params)
    const rev = await saveRevision(deps.db, id, RevisionContentSchema.parse(req.body))
    await recordAudit(deps.db, auditContext(req), { action: 'kit_revision.save', entityType: 'kit_revision', entityId: id, summary: `Saved draft revision ${rev.code} of ${rev.kit.sku}` })
    res.json(rev)
  })
  r.post('/:id/release', catalogEditors, async (req, res) => {
    const { id } = IdParamsSchema.parse(req.params)
    z.object({}).strict().parse(req.body ?? {})
    const rev = await releaseRevision(deps.db, id, currentUser(req))
    await recordAudit(deps.db, auditContext(req), { action: 'kit_revision.release', entityType: 'kit_revision', entityId: id, summary: `Released revision ${rev.code} of ${rev.kit.sku}` })
    res.json(rev)
  })
  r.post('/:id/retire', catalogEditors, async (req, res) => {
    const { id } = IdParamsSchema.parse(req.params)
    const rev = await retireRevision(deps.db, id)
    await recordAudit(deps.db, auditContext(req), { action: 'kit_revision.retire', entityType: 'kit_revision', entityId: id, summary: `Retired revision ${rev.code} of ${rev.kit.sku}` })
    res.json(rev)
  })
  return r
}
