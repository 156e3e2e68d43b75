import type { Deps } from '../../deps'
import type { RouteTable } from '../../lib/routes'
import { tableCsv } from './reports.csv'
import { exportUnit, REPORTS, reportContext } from './reports.service'

/**
 * The owner's reports, for the admin and the planner: each at `/api/reports/<name>` as JSON and at
 * `/api/reports/<name>/export.csv` as the same numbers in a spreadsheet file.
 */
export function reportsRouter(deps: Deps, routes: RouteTable) {
  const r = routes.router('/api/reports')
  const office = ['admin', 'planner'] as const
  for (const report of REPORTS) {
    if (report.json) {
      r.get(`/${report.path}`, office, async (req, res) => {
        const { result } = await report.answer(deps.db, req.query, reportContext(false, deps.now?.()))
        res.json(result)
      })
    }
    r.get(`/${report.path}/export.csv`, office, async (req, res) => {
      const ctx = reportContext(true, deps.now?.())
      const [{ table }, unit] = await Promise.all([report.answer(deps.db, req.query, ctx), exportUnit(deps.db)])
      res.type('text/csv; charset=utf-8')
      res.attachment(`kitwright-${report.path}-${ctx.today}.csv`)
      res.send(tableCsv(table(unit)))
    })
  }
  return r
}
