import { PartInputSchema, PartListQuerySchema, PartPatchSchema } from '@kitwright/shared/parts'
import { PartCsvBodySchema } from '@kitwright/shared/parts-csv'
import { IdParamsSchema } from '@kitwright/shared/users'
import type { Deps } from '../../deps'
import type { RouteTable } from '../../lib/routes'
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
    res.json(await importParts(deps.db, PartCsvBodySchema.parse(req.body).csv))
  })
  r.get('/:id', 'signed-in', async (req, res) => {
    const { id } = IdParamsSchema.parse(req.params)
    res.json(await getPart(deps.db, id))
  })
  r.post('/', editors, async (req, res) => {
    res.status(201).json(await createPart(deps.db, PartInputSchema.parse(req.body)))
  })
  r.patch('/:id', editors, async (req, res) => {
    const { id } = IdParamsSchema.parse(req.params)
    res.json(await updatePart(deps.db, id, PartPatchSchema.parse(req.body)))
  })
  return r
}
