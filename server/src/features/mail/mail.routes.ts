import { MailListQuerySchema } from '@kitwright/shared/mail'
import { IdParamsSchema } from '@kitwright/shared/users'
import type { Deps } from '../../deps'
import type { RouteTable } from '../../lib/routes'
import { auditContext, recordAudit } from '../../lib/audit'
import { getMail, listMail, resendMail } from './mail.service'

/** The outbox: every e-mail the shop sent or will send. Customers' addresses are in it, so the office roles only. */
export function mailRouter(deps: Deps, routes: RouteTable) {
  const r = routes.router('/api/mail')
  const readers = ['admin', 'planner'] as const
  r.get('/', readers, async (req, res) => {
    res.json(await listMail(deps.db, MailListQuerySchema.parse(req.query)))
  })
  r.get('/:id', readers, async (req, res) => {
    const { id } = IdParamsSchema.parse(req.params)
    res.json(await getMail(deps.db, id))
  })
  // A message that failed for good goes back in the queue; it is still sent at most once.
  r.post('/:id/resend', readers, async (req, res) => {
    const { id } = IdParamsSchema.parse(req.params)
    const mail = await resendMail(deps, id)
    await recordAudit(deps.db, auditContext(req), { action: 'mail.resend', entityType: 'mail', entityId: id, summary: `E-mail to ${mail.to} sent again: ${mail.subject}` })
    res.json(mail)
  })
  return r
}
