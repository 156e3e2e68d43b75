import { BinLabelQuerySchema, CreateBinsSchema } from '@kitwright/shared/bins'
import type { Deps } from '../../deps'
import type { RouteTable } from '../../lib/routes'
import { binLabelsPdf } from '../labels/bin-labels.pdf'
import { getShopSettings } from '../settings/settings.service'
import { createBins, listBinRange, listBins } from './bins.service'

export function binsRouter(deps: Deps, routes: RouteTable) {
  const r = routes.router('/api/bins')
  const office = ['admin', 'planner'] as const
  r.get('/', office, async (_req, res) => {
    res.json(await listBins(deps.db))
  })
  r.post('/', office, async (req, res) => {
    res.status(201).json(await createBins(deps.db, CreateBinsSchema.parse(req.body)))
  })
  // The cut bench reprints a bin's label, so the cutter may print too.
  r.get('/labels.pdf', ['admin', 'planner', 'cutter'], async (req, res) => {
    const query = BinLabelQuerySchema.parse(req.query)
    const found = query.from || query.to ? await listBinRange(deps.db, query.from, query.to) : await listBins(deps.db, query.ids)
    const settings = await getShopSettings(deps.db)
    const pdf = await binLabelsPdf(found, query.size, settings.shopName)
    res.type('application/pdf').attachment(`bin-labels-${query.size}.pdf`).send(pdf)
  })
  return r
}
