import { index, integer, jsonb, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core'
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
    /**
     * For an action a bench took while it may have been offline: when the person tapped it, by the
     * tablet's clock (`at` is when it reached the server), and the bench's id for the action.
     */
    takenAt: timestamp({ withTimezone: true }),
    clientActionId: uuid(),
  },
  (t) => [index().on(t.at), index().on(t.actorId, t.at), index().on(t.action, t.at), index().on(t.entityType, t.entityId)],
)
export type AuditEventRow = typeof auditEvents.$inferSelect

/**
 * Bench actions sent with an id made on the tablet (a UUID), so that a tablet which lost the
 * network can send its queue again and each action is applied once: the first answer is kept and
 * a replay of the same id gets it back and changes nothing. A different action under an id already
 * used is refused.
 */
export const clientActions = pgTable(
  'client_actions',
  {
    id: uuid().primaryKey(),
    userId: uuid()
      .notNull()
      .references(() => users.id),
    method: text().notNull(),
    path: text().notNull(),
    /** SHA-256 of the method, the path and the body: what the id was first used for. */
    fingerprint: text().notNull(),
    bench: text(),
    /** When the person tapped it, by the tablet's clock. */
    takenAt: timestamp({ withTimezone: true }).notNull(),
    /** When it first reached the server. */
    receivedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    /** Set once the first answer is kept; null while it is being applied. */
    answeredAt: timestamp({ withTimezone: true }),
    /** The first answer: its HTTP status and body (a refusal is kept too, so a replay is refused alike). */
    status: integer(),
    result: jsonb(),
  },
  (t) => [index().on(t.userId, t.receivedAt)],
)
export type ClientActionRow = typeof clientActions.$inferSelect
