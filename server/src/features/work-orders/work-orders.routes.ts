import { ReleaseOrdersSchema, ShortagesQuerySchema } from '@kitwright/shared/work-orders'
import type { Deps } from '../../deps'
import { currentUser } from '../../lib/auth'
import type { RouteTable } from '../../lib/routes'
import { releaseOrders } from './release.service'
import { listShortages } from './shortages.service'

/** Releasing orders into work orders; mounted beside the orders routes. */
export function releaseRouter(deps: Deps, routes: RouteTable) {
  const r = routes.router('/api/orders')
  r.post('/release', ['admin', 'planner'], async (req, res) => {
    res.json(await releaseOrders(deps.db, ReleaseOrdersSchema.parse(req.body), currentUser(req)))
  })
  return r
}

export function shortagesRouter(deps: Deps, routes: RouteTable) {
  const r = routes.router('/api/shortages')
  r.get('/', ['admin', 'planner'], async (req, res) => {
    res.json(await listShortages(deps.db, ShortagesQuerySchema.parse(req.query)))
  })
  return r
}
