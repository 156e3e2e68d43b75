import { eq } from 'drizzle-orm'
import { defaultBuildSteps } from '@kitwright/shared/domain/safety-cautions'
import type { CreateKit, Kit, RevisionContent, RevisionDetail } from '@kitwright/shared/kits'
import type { Db, Tx } from '../../db/client'
import { bomLines, buildSteps, cutParts, kitRevisions, kits, type KitRevisionRow } from '../../db/schema/index'
import type { SessionUser } from '../../lib/auth'
import { BadRequest, Conflict, NotFound } from '../../lib/http-errors'
import { getShopSettings } from '../settings/settings.service'
import { toKit, toRevisionDetail } from './kits.mapper'
import { findRevision, loadKits, loadRevisionTree, lockRevision, partsByIds } from './kits.queries'
import { nextRevisionCode } from './revision-codes'
import { checkRevisionContent, releaseProblems } from './revision-content'
import { REVISION_STATUS_LABELS, statusInSentence } from '@kitwright/shared/status-words'

export async function listKits(db: Db): Promise<Kit[]> {
  return (await loadKits(db)).map(toKit)
}

export async function getKit(db: Db, id: string): Promise<Kit> {
  const [kit] = await loadKits(db, id)
  if (!kit) throw new NotFound('No such kit')
  return toKit(kit)
}

export async function createKit(db: Db, input: CreateKit): Promise<Kit> {
  const id = await db.transaction(async (tx) => {
    const [clash] = await tx.select({ id: kits.id }).from(kits).where(eq(kits.sku, input.sku))
    if (clash) throw new Conflict(`A kit with SKU ${input.sku} already exists`, { sku: 'Already in use' })
    if (input.storeProductId) {
      const [mapped] = await tx.select({ sku: kits.sku }).from(kits).where(eq(kits.storeProductId, input.storeProductId))
      if (mapped) throw new Conflict(`Store product ${input.storeProductId} already maps to kit ${mapped.sku}`, { storeProductId: 'Already mapped' })
    }
    const [kit] = await tx.insert(kits).values(input).returning()
    const [revision] = await tx.insert(kitRevisions).values({ kitId: kit!.id, code: 'A' }).returning({ id: kitRevisions.id })
    await insertDefaultSteps(tx, revision!.id)
    return kit!.id
  })
  return getKit(db, id)
}

export async function setKitPrice(db: Db, id: string, priceCents: number | null): Promise<Kit> {
  const [row] = await db.update(kits).set({ priceCents, updatedAt: new Date() }).where(eq(kits.id, id)).returning({ id: kits.id })
  if (!row) throw new NotFound('No such kit')
  return getKit(db, id)
}

export async function getRevision(db: Db | Tx, id: string): Promise<RevisionDetail> {
  const tree = await loadRevisionTree(db, id)
  if (!tree) throw new NotFound('No such kit revision')
  const { kerf } = await getShopSettings(db)
  return toRevisionDetail(tree, kerf)
}

function contentOf(detail: RevisionDetail): RevisionContent {
  return {
    notes: detail.notes,
    frame: detail.frame,
    leakTest: detail.leakTest,
    bomLines: detail.bomLines.map(({ partId, quantity, note }) => ({ partId, quantity, note })),
    cutParts: detail.cutParts.map(({ partId, label, length, quantity, frameKey, overrideReason }) => ({ partId, label, length, quantity, frameKey, overrideReason })),
    buildSteps: detail.buildSteps.map(({ id: _id, position: _p, ...step }) => step),
  }
}

async function writeContent(tx: Tx, revisionId: string, content: RevisionContent) {
  const ids = [...content.bomLines.map((l) => l.partId), ...content.cutParts.map((c) => c.partId), ...(content.frame ? [content.frame.pipePartId] : [])]
  const found = await partsByIds(tx, [...new Set(ids)])
  const calculated = checkRevisionContent(content, new Map(found.map((p) => [p.id, p])))
  const lt = content.leakTest
  await tx
    .update(kitRevisions)
    .set({
      notes: content.notes,
      frameInputs: content.frame,
      leakTestMinPressurePa: lt?.minPressurePa ?? null,
      leakTestMaxPressurePa: lt?.maxPressurePa ?? null,
      leakTestHoldMinutes: lt?.holdMinutes ?? null,
      leakTestMaxDropPa: lt?.maxDropPa ?? null,
      leakTestWaterVolumeMl: lt?.waterVolumeMl ?? null,
      updatedAt: new Date(),
    })
    .where(eq(kitRevisions.id, revisionId))
  await tx.delete(bomLines).where(eq(bomLines.revisionId, revisionId))
  await tx.delete(cutParts).where(eq(cutParts.revisionId, revisionId))
  await tx.delete(buildSteps).where(eq(buildSteps.revisionId, revisionId))
  if (content.bomLines.length) await tx.insert(bomLines).values(content.bomLines.map((l, i) => ({ ...l, revisionId, position: i + 1 })))
  if (content.cutParts.length) {
    await tx.insert(cutParts).values(
      content.cutParts.map((c, i) => ({
        ...c,
        revisionId,
        position: i + 1,
        calculatedLength: calculated[i] ?? null,
        // A reason is kept only where the length really differs from the calculation.
        overrideReason: calculated[i] !== null && calculated[i] !== c.length ? c.overrideReason : null,
      })),
    )
  }
  if (content.buildSteps.length) {
    await tx.insert(buildSteps).values(
      content.buildSteps.map((s, i) => ({
        ...s,
        revisionId,
        position: i + 1,
        measurementMin: s.measurementMin === null ? null : String(s.measurementMin),
        measurementMax: s.measurementMax === null ? null : String(s.measurementMax),
      })),
    )
  }
}

/**
 * A new, empty revision starts with the usual build steps and their cautions (cutting, drilling,
 * solvent cement, mains power near water, leak test with water only), so no shop's kit goes without
 * them; the planner edits or removes them like any other step. A revision copied from another keeps
 * the steps it was copied from.
 */
async function insertDefaultSteps(tx: Tx, revisionId: string) {
  await tx.insert(buildSteps).values(defaultBuildSteps().map((s, i) => ({ ...s, revisionId, position: i + 1, measurementMin: null, measurementMax: null })))
}

function assertDraft(row: KitRevisionRow | undefined): asserts row is KitRevisionRow {
  if (!row) throw new NotFound('No such kit revision')
  if (row.status !== 'draft') {
    throw new Conflict(`Revision ${row.code} is ${statusInSentence(REVISION_STATUS_LABELS, row.status)} and can no longer change; start a new revision from it to make changes`)
  }
}

/** Replaces a draft's content whole. Released and retired revisions never change. */
export async function saveRevision(db: Db, id: string, content: RevisionContent): Promise<RevisionDetail> {
  await db.transaction(async (tx) => {
    assertDraft(await lockRevision(tx, id))
    await writeContent(tx, id, content)
  })
  return getRevision(db, id)
}

export async function releaseRevision(db: Db, id: string, actor: SessionUser): Promise<RevisionDetail> {
  await db.transaction(async (tx) => {
    assertDraft(await lockRevision(tx, id))
    const problems = releaseProblems(contentOf(await getRevision(tx, id)))
    if (problems.length > 0) throw new BadRequest(`This revision cannot be released yet: ${problems.join('; ')}`)
    await tx.update(kitRevisions).set({ status: 'released', releasedAt: new Date(), releasedBy: actor.id, updatedAt: new Date() }).where(eq(kitRevisions.id, id))
  })
  return getRevision(db, id)
}

export async function retireRevision(db: Db, id: string): Promise<RevisionDetail> {
  await db.transaction(async (tx) => {
    const row = await lockRevision(tx, id)
    if (!row) throw new NotFound('No such kit revision')
    if (row.status !== 'released') throw new Conflict(`Only a released revision can be retired; ${row.code} is ${statusInSentence(REVISION_STATUS_LABELS, row.status)}`)
    await tx.update(kitRevisions).set({ status: 'retired', retiredAt: new Date(), updatedAt: new Date() }).where(eq(kitRevisions.id, id))
  })
  return getRevision(db, id)
}

/** Starts the kit's next revision as a draft, copied from `copyFrom` (a revision of the same kit) or new with the default steps. */
export async function newRevision(db: Db, kitId: string, copyFrom: string | null | undefined): Promise<RevisionDetail> {
  const id = await db.transaction(async (tx) => {
    const [kit] = await tx.select().from(kits).where(eq(kits.id, kitId)).for('update')
    if (!kit) throw new NotFound('No such kit')
    const existing = await tx.select().from(kitRevisions).where(eq(kitRevisions.kitId, kitId))
    const draft = existing.find((r) => r.status === 'draft')
    if (draft) throw new Conflict(`Revision ${draft.code} is already a draft; finish or edit it first`)
    let content: RevisionContent | null = null
    if (copyFrom) {
      const source = await findRevision(tx, copyFrom)
      if (!source || source.kitId !== kitId) throw new BadRequest('Copy from a revision of this kit', { copyFrom: 'Not a revision of this kit' })
      content = contentOf(await getRevision(tx, copyFrom))
    }
    const [row] = await tx.insert(kitRevisions).values({ kitId, code: nextRevisionCode(existing.map((r) => r.code)) }).returning()
    if (content) await writeContent(tx, row!.id, content)
    else await insertDefaultSteps(tx, row!.id)
    return row!.id
  })
  return getRevision(db, id)
}
