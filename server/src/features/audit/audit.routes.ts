import { and, count, desc, eq, gte, ilike, like, lt, or, type SQL } from 'drizzle-orm'
import { AuditQuerySchema, type AuditQuery } from '@kitwright/shared/audit'
import type { Db } from '../../db/client'
import { auditEvents, users } from '../../db/schema/index'
import type { Deps } from '../../deps'
import type { RouteTable } from '../../lib/routes'

function escapeLike(text: string) {
  return text.replace(/[\\%_]/g, (c) => `\\${c}`)
}

async function listAudit(db: Db, q: AuditQuery) {
  const where: SQL[] = []
  if (q.action) where.push(like(auditEvents.action, `${escapeLike(q.action)}%`))
  if (q.actorId) where.push(eq(auditEvents.actorId, q.actorId))
  if (q.entityType) where.push(eq(auditEvents.entityType, q.entityType))
  if (q.bench) where.push(eq(auditEvents.bench, q.bench))
  if (q.from) where.push(gte(auditEvents.at, new Date(`${q.from}T00:00:00Z`)))
  if (q.to) where.push(lt(auditEvents.at, new Date(new Date(`${q.to}T00:00:00Z`).getTime() + 86_400_000)))
  if (q.q) {
    const pattern = `%${escapeLike(q.q)}%`
    where.push(or(ilike(auditEvents.summary, pattern), ilike(auditEvents.actorEmail, pattern), ilike(auditEvents.entityId, pattern))!)
  }
  const filter = where.length ? and(...where) : undefined
  const [rows, [total]] = await Promise.all([
    db
      .select({ event: auditEvents, actorName: users.name })
      .from(auditEvents)
      .leftJoin(users, eq(users.id, auditEvents.actorId))
      .where(filter)
      .orderBy(desc(auditEvents.at), desc(auditEvents.id))
      .limit(q.pageSize)
      .offset((q.page - 1) * q.pageSize),
    db.select({ n: count() }).from(auditEvents).where(filter),
  ])
  return {
    items: rows.map(({ event: e, actorName }) => ({
      id: e.id,
      at: e.at.toISOString(),
      actorId: e.actorId,
      actorEmail: e.actorEmail,
      actorName,
      action: e.action,
      entityType: e.entityType,
      entityId: e.entityId,
      summary: e.summary,
      bench: e.bench,
      address: e.address,
      takenAt: e.takenAt?.toISOString() ?? null,
    })),
    total: total?.n ?? 0,
    page: q.page,
    pageSize: q.pageSize,
  }
}

export function auditRouter(deps: Deps, routes: RouteTable) {
  const r = routes.router('/api/audit')
  r.get('/', ['admin'], async (req, res) => {
    res.json(await listAudit(deps.db, AuditQuerySchema.parse(req.query)))
  })
  return r
}
