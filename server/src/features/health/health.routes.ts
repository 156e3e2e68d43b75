import { sql } from 'drizzle-orm'
import type { Deps } from '../../deps'
import type { RouteTable } from '../../lib/routes'

export function healthRouter(deps: Deps, routes: RouteTable) {
  const r = routes.router('/api/health')
  r.get('/', 'public', async (req, res) => {
    try {
      await deps.db.execute(sql`select 1`)
      res.json({ ok: true, db: 'up' })
    } catch (err) {
      req.log.warn({ err }, 'health: database down')
      res.status(503).json({ ok: false, db: 'down' })
    }
  })
  return r
}
