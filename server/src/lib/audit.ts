import type { Request } from 'express'
import { BENCHES, type Bench } from '@kitwright/shared/audit'
import type { Db, Tx } from '../db/client'
import { auditEvents } from '../db/schema/index'
import { benchActionOf } from './client-actions'

/** Who made a change and from where, read once from the request. */
export interface AuditContext {
  actorId: string | null
  actorEmail: string | null
  bench: Bench | null
  address: string | null
  /** For an action sent from a bench's queue: when it was taken on the bench (`at` is when it reached the server). */
  takenAt?: Date | null
  clientActionId?: string | null
}

export function auditContext(req: Request, actor?: { id: string; email: string } | null): AuditContext {
  const header = req.get('x-kitwright-bench')
  const who = actor ?? req.user ?? null
  return {
    actorId: who?.id ?? null,
    actorEmail: who?.email ?? null,
    bench: (BENCHES as readonly string[]).includes(header ?? '') ? (header as Bench) : null,
    address: req.ip ?? null,
    takenAt: benchActionOf(req)?.takenAt ?? null,
    clientActionId: benchActionOf(req)?.id ?? null,
  }
}

export interface AuditEntry {
  action: string
  entityType: string
  entityId?: string | null
  summary: string
  data?: unknown
}

/**
 * Records one change in the audit trail. Call it inside the transaction that makes the change, so
 * the trail and the change land together or not at all.
 */
export async function recordAudit(db: Db | Tx, ctx: AuditContext, entry: AuditEntry) {
  await db.insert(auditEvents).values({ ...ctx, ...entry, entityId: entry.entityId ?? null, data: entry.data ?? null })
}
