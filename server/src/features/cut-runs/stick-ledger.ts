import { and, eq } from 'drizzle-orm'
import type { Tx } from '../../db/client'
import { cutRunSticks, offcuts, type CutRunRow, type CutRunStickRow } from '../../db/schema/index'
import type { SessionUser } from '../../lib/auth'
import { insertMoves } from '../stock/stock.queries'
import { releaseReservation } from '../stock/stock.service'

type Actor = Pick<SessionUser, 'id' | 'name'>

const why = (run: CutRunRow, stick: CutRunStickRow) => `Cut run ${run.number}, stick ${stick.position}`

/**
 * Takes a stick off the rack as it goes on the saw: a new stick leaves the run's reservation and is
 * consumed (consume move with its stick length); an offcut leaves stock (offcut_out) and is used.
 * Only the caller that moves the stick from pending to in progress writes the ledger, so two cutters
 * starting the same stick consume it once.
 */
export async function startStick(tx: Tx, run: CutRunRow, stick: CutRunStickRow, actor: Actor): Promise<boolean> {
  if (stick.status !== 'pending') return false
  const [won] = await tx
    .update(cutRunSticks)
    .set({ status: 'in_progress', startedBy: actor.id, startedAt: new Date() })
    .where(and(eq(cutRunSticks.id, stick.id), eq(cutRunSticks.status, 'pending')))
    .returning({ id: cutRunSticks.id })
  if (!won) return false
  if (stick.stickLength !== null) {
    await releaseReservation(tx, { workOrderId: null, lines: [{ partId: stick.partId, quantity: 1, stickLength: stick.stickLength }], reason: why(run, stick) }, actor)
    await insertMoves(tx, [{ partId: stick.partId, kind: 'consume', quantity: -1, stickLength: stick.stickLength, reason: why(run, stick), createdBy: actor.id }])
  } else if (stick.sourceOffcutId) {
    await insertMoves(tx, [{ partId: stick.partId, kind: 'offcut_out', quantity: -1, offcutId: stick.sourceOffcutId, reason: why(run, stick), createdBy: actor.id }])
    await tx.update(offcuts).set({ status: 'used' }).where(eq(offcuts.id, stick.sourceOffcutId))
  }
  return true
}

/** A finished stick's remnant at or above the run's minimum goes into stock as an offcut (offcut_in move and offcuts row). */
export async function stockRemnant(tx: Tx, run: CutRunRow, stick: CutRunStickRow, actor: Actor): Promise<string | null> {
  if (!stick.remnantIsOffcut || stick.remnant < run.minOffcut || stick.offcutId) return stick.offcutId
  const [offcut] = await tx.insert(offcuts).values({ partId: stick.partId, length: stick.remnant, note: `From ${why(run, stick).toLowerCase()}` }).returning()
  await insertMoves(tx, [{ partId: stick.partId, kind: 'offcut_in', quantity: 1, offcutId: offcut!.id, reason: why(run, stick), createdBy: actor.id }])
  await tx.update(cutRunSticks).set({ offcutId: offcut!.id }).where(eq(cutRunSticks.id, stick.id))
  return offcut!.id
}

/**
 * Takes back the offcut a stick made when its last cut is undone: the remnant is part of the stick
 * on the saw again (offcut_out, offcut used). Returns false when the offcut is already planned or
 * used elsewhere, so it can no longer be taken back.
 */
export async function unstockRemnant(tx: Tx, run: CutRunRow, stick: CutRunStickRow, actor: Actor): Promise<boolean> {
  if (!stick.offcutId) return true
  const [offcut] = await tx.select().from(offcuts).where(eq(offcuts.id, stick.offcutId)).for('update')
  if (!offcut || offcut.status !== 'in_stock') return false
  await insertMoves(tx, [{ partId: stick.partId, kind: 'offcut_out', quantity: -1, offcutId: offcut.id, reason: `${why(run, stick)}: cut undone`, createdBy: actor.id }])
  await tx.update(offcuts).set({ status: 'used', note: `${offcut.note ?? ''} (taken back: cut undone)`.trim() }).where(eq(offcuts.id, offcut.id))
  await tx.update(cutRunSticks).set({ offcutId: null }).where(eq(cutRunSticks.id, stick.id))
  return true
}
