import { PartInputSchema, PartListQuerySchema, PartPatchSchema } from '@kitwright/shared/parts'
import { PartCsvBodySchema } from '@kitwright/shared/parts-csv'
import { IdParamsSchema } from '@kitwright/shared/users'
import type { Deps } from '../../deps'
import type { RouteTable } from '../../lib/routes'
import { auditContext, recordAudit } from '../../lib/audit'
import { createPart, exportPartsCsv, getPart, importParts, listParts, previewPartsImport, updatePart } from './parts.service'

export function partsRouter(deps: Deps, routes: RouteTable) {
  const r = routes.router('/api/parts')
  const editors = ['admin', 'planner'] as const
  // Every bench reads parts (names, shelf locations); only the catalog's keepers change them.
  r.get('/', 'signed-in', async (req, res) => {
    res.json(await listParts(deps.db, PartListQuerySchema.parse(req.query)))
  })
  r.get('/export.csv', 'signed-in', async (_req, res) => {
    const csv = await exportPartsCsv(deps.db)
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
    res.json(await getPart(deps.db, id))
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
