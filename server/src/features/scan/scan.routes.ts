import { ScanParamsSchema } from '@kitwright/shared/scan'
import type { Deps } from '../../deps'
import { currentUser } from '../../lib/auth'
import type { RouteTable } from '../../lib/routes'
import { resolveScan } from './scan.service'

export function scanRouter(deps: Deps, routes: RouteTable) {
  const r = routes.router('/api/scan')
  // Every bench scans; the answer says only what the code is and where it goes next (a return's id
  // only to those who may open returns).
  r.get('/:code', 'signed-in', async (req, res) => {
    const { code } = ScanParamsSchema.parse(req.params)
    res.json(await resolveScan(deps.db, code, currentUser(req).role))
  })
  return r
}
