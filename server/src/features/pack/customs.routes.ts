import { z } from 'zod'
import type { Deps } from '../../deps'
import type { RouteTable } from '../../lib/routes'
import { customsDeclaration, customsSummary } from './customs.service'

const BENCH = ['admin', 'planner', 'packer'] as const
const ShipmentParams = z.object({ shipmentId: z.string().uuid('Not a valid shipment id') })

/** A shipment's customs paperwork: whether it needs a declaration, and the declaration printed with the label. */
export function customsRouter(deps: Deps, routes: RouteTable) {
  const r = routes.router('/api/shipments')
  r.get('/:shipmentId/customs', BENCH, async (req, res) => {
    res.json(await customsSummary(deps.db, ShipmentParams.parse(req.params).shipmentId))
  })
  r.get('/:shipmentId/customs-declaration.pdf', BENCH, async (req, res) => {
    const { shipmentId } = ShipmentParams.parse(req.params)
    res.type('application/pdf').set('content-disposition', 'inline; filename="customs-declaration.pdf"').send(await customsDeclaration(deps.db, shipmentId))
  })
  return r
}
