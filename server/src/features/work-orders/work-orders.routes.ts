import { ReleaseOrdersSchema, ShortagesQuerySchema } from '@kitwright/shared/work-orders'
import type { Deps } from '../../deps'
import { auditContext, recordAudit } from '../../lib/audit'
import { currentUser } from '../../lib/auth'
import type { RouteTable } from '../../lib/routes'
import { previewRelease, releaseOrders } from './release.service'
import { listShortages } from './shortages.service'

/** Releasing orders into work orders; mounted beside the orders routes. */
export function releaseRouter(deps: Deps, routes: RouteTable) {
  const r = routes.router('/api/orders')
  r.post('/release', ['admin', 'planner'], async (req, res) => {
    const result = await releaseOrders(deps.db, ReleaseOrdersSchema.parse(req.body), currentUser(req))
    for (const order of result.released) {
      const serials = order.workOrders.map((w) => w.serial).join(', ')
      await recordAudit(
        deps.db,
        auditContext(req),
        { action: 'order.release', entityType: 'order', entityId: order.orderId, summary: `Released order ${order.number} into ${order.workOrders.length} work order(s): ${serials}` },
      )
    }
    res.json(result)
  })
  r.post('/release/preview', ['admin', 'planner'], async (req, res) => {
    res.json(await previewRelease(deps.db, ReleaseOrdersSchema.parse(req.body)))
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
