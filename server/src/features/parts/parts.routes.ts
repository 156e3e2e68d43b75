import { PartInputSchema, PartListQuerySchema, PartPatchSchema } from '@kitwright/shared/parts'
import { PartCsvBodySchema } from '@kitwright/shared/parts-csv'
import { seesCosts } from '@kitwright/shared/roles'
import { IdParamsSchema } from '@kitwright/shared/users'
import type { Deps } from '../../deps'
import type { RouteTable } from '../../lib/routes'
import { auditContext, recordAudit } from '../../lib/audit'
import { currentUser } from '../../lib/auth'
import { BadRequest } from '../../lib/http-errors'
import { withoutCost } from './parts.mapper'
import { createPart, exportPartsCsv, getPart, importParts, listParts, previewPartsImport, updatePart } from './parts.service'

export function partsRouter(deps: Deps, routes: RouteTable) {
  const r = routes.router('/api/parts')
  const editors = ['admin', 'planner'] as const
  // Every bench reads parts (names, shelf locations) but not what they cost; only the catalog's keepers change them.
  r.get('/', 'signed-in', async (req, res) => {
    const query = PartListQuerySchema.parse(req.query)
    const costs = seesCosts(currentUser(req).role)
    if (!costs && query.sort === 'unitCost') throw new BadRequest('Unit costs are shown to the office only: sort by another column')
    const page = await listParts(deps.db, query)
    res.json(costs ? page : { ...page, items: page.items.map(withoutCost) })
  })
  r.get('/export.csv', 'signed-in', async (req, res) => {
    const csv = await exportPartsCsv(deps.db, { costs: seesCosts(currentUser(req).role) })
    const day = new Date().toISOString().slice(0, 10)
    res.type('text/csv; charset=utf-8').attachment(`parts-${day}.csv`).send(csv)
  })
  r.post('/import/preview', editors, async (req, res) => {
    res.json(await previewPartsImport(deps.db, PartCsvBodySchema.parse(req.body).csv))
  })
  r.post('/import', editors, async (req, res) => {
    const result = await importParts(deps.db, PartCsvBodySchema.parse(req.body).csv)
    await recordAudit(deps.db, auditContext(req), { action: 'part.import', entityType: 'part', summary: 'Imported parts from a CSV file', data: result })
    res.json(result)
  })
  r.get('/:id', 'signed-in', async (req, res) => {
    const { id } = IdParamsSchema.parse(req.params)
    const part = await getPart(deps.db, id)
    res.json(seesCosts(currentUser(req).role) ? part : withoutCost(part))
  })
  r.post('/', editors, async (req, res) => {
    const part = await createPart(deps.db, PartInputSchema.parse(req.body))
    await recordAudit(deps.db, auditContext(req), { action: 'part.create', entityType: 'part', entityId: part.id, summary: `Added part ${part.sku}` })
    res.status(201).json(part)
  })
  r.patch('/:id', editors, async (req, res) => {
    const { id } = IdParamsSchema.parse(req.params)
    const change = PartPatchSchema.parse(req.body)
    const part = await updatePart(deps.db, id, change)
    await recordAudit(deps.db, auditContext(req), { action: 'part.update', entityType: 'part', entityId: id, summary: `Changed ${Object.keys(change).join(', ')} of part ${part.sku}`, data: change })
    res.json(part)
  })
  return r
}
