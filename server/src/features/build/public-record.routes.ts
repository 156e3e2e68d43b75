import { PublicRecordParamsSchema } from '@kitwright/shared/public-record'
import type { Deps } from '../../deps'
import type { RouteTable } from '../../lib/routes'
import { readPublicRecord } from './public-record'

/** The customer's view of a unit's build record: public, but only through a signed link. */
export function publicRecordRouter(deps: Deps, routes: RouteTable) {
  const r = routes.router('/api/public/unit-records')
  r.get('/:token', 'public', async (req, res) => {
    const { token } = PublicRecordParamsSchema.parse(req.params)
    res.json(await readPublicRecord(deps.db, deps.storage, deps.tokens, token))
  })
  return r
}
