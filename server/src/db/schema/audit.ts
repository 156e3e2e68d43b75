import { index, jsonb, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core'
import { id } from './columns'
import { users } from './users'

/**
 * The audit trail: every change of consequence, with who, when and from which bench. Rows are
 * only ever inserted. `action` is `<thing>.<verb>` (e.g. `kit_revision.release`).
 */
export const auditEvents = pgTable(
  'audit_events',
  {
    id: id(),
    at: timestamp({ withTimezone: true }).notNull().defaultNow(),
    actorId: uuid().references(() => users.id),
    /** Kept as typed at the time, so the trail still reads after the user changes their e-mail. */
    actorEmail: text(),
    action: text().notNull(),
    entityType: text().notNull(),
    entityId: text(),
    summary: text().notNull(),
    data: jsonb(),
    /** The screen the change came from: office, cut, build or pack (sent by the client). */
    bench: text(),
    address: text(),
  },
  (t) => [index().on(t.at), index().on(t.actorId, t.at), index().on(t.action, t.at), index().on(t.entityType, t.entityId)],
)
export type AuditEventRow = typeof auditEvents.$inferSelect
