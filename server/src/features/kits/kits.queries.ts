import { asc, eq, inArray } from 'drizzle-orm'
import type { Db, Tx } from '../../db/client'
import { bomLines, buildSteps, cutParts, kitRevisions, kits, parts } from '../../db/schema/index'

type Conn = Db | Tx

export async function findRevision(db: Conn, id: string) {
  const [row] = await db.select().from(kitRevisions).where(eq(kitRevisions.id, id))
  return row
}

export async function lockRevision(tx: Tx, id: string) {
  const [row] = await tx.select().from(kitRevisions).where(eq(kitRevisions.id, id)).for('update')
  return row
}

/** A revision with its kit and lines, each line with its part, in one round trip per table. */
export async function loadRevisionTree(db: Conn, id: string) {
  return db.query.kitRevisions.findFirst({
    where: eq(kitRevisions.id, id),
    with: {
      kit: true,
      bomLines: { with: { part: true }, orderBy: asc(bomLines.position) },
      cutParts: { with: { part: true }, orderBy: asc(cutParts.position) },
      buildSteps: { orderBy: asc(buildSteps.position) },
    },
  })
}

export async function loadKits(db: Conn, kitId?: string) {
  return db.query.kits.findMany({
    where: kitId ? eq(kits.id, kitId) : undefined,
    orderBy: asc(kits.name),
    with: { revisions: { orderBy: asc(kitRevisions.createdAt) } },
  })
}

export async function partsByIds(db: Conn, ids: string[]) {
  if (ids.length === 0) return []
  return db.select().from(parts).where(inArray(parts.id, ids))
}
