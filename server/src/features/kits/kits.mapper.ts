import { rollUp } from '@kitwright/shared/domain/rollup'
import { RevisionFrameSchema, type Kit, type RevisionDetail } from '@kitwright/shared/kits'
import type { KitRevisionRow, KitRow, PartRow } from '../../db/schema/index'
import type { loadRevisionTree } from './kits.queries'

type Tree = NonNullable<Awaited<ReturnType<typeof loadRevisionTree>>>

export function toKit(row: KitRow & { revisions: KitRevisionRow[] }): Kit {
  return {
    id: row.id,
    sku: row.sku,
    name: row.name,
    storeProductId: row.storeProductId,
    description: row.description,
    priceCents: row.priceCents,
    revisions: row.revisions.map((r) => ({
      id: r.id,
      code: r.code,
      status: r.status,
      releasedAt: r.releasedAt?.toISOString() ?? null,
      createdAt: r.createdAt.toISOString(),
    })),
  }
}

function partRef(p: PartRow) {
  return { sku: p.sku, name: p.name, kind: p.kind, unitCostCents: p.unitCostCents, weightGrams: p.weightGrams }
}

function toLeakTest(r: KitRevisionRow): RevisionDetail['leakTest'] {
  const { leakTestMinPressurePa: min, leakTestMaxPressurePa: max, leakTestHoldMinutes: hold, leakTestMaxDropPa: drop, leakTestWaterVolumeMl: water } = r
  if (min === null || max === null || hold === null || drop === null || water === null) return null
  return { minPressurePa: min, maxPressurePa: max, holdMinutes: hold, maxDropPa: drop, waterVolumeMl: water }
}

export function toRevisionDetail(tree: Tree, kerf: number): RevisionDetail {
  const frame = tree.frameInputs === null ? null : RevisionFrameSchema.parse(tree.frameInputs)
  return {
    id: tree.id,
    kit: { id: tree.kit.id, sku: tree.kit.sku, name: tree.kit.name },
    code: tree.code,
    status: tree.status,
    notes: tree.notes,
    frame,
    leakTest: toLeakTest(tree),
    bomLines: tree.bomLines.map((l) => ({ id: l.id, partId: l.partId, part: partRef(l.part), quantity: l.quantity, note: l.note })),
    cutParts: tree.cutParts.map((c) => ({
      id: c.id,
      partId: c.partId,
      part: partRef(c.part),
      label: c.label,
      length: c.length,
      quantity: c.quantity,
      frameKey: c.frameKey,
      calculatedLength: c.calculatedLength,
      overrideReason: c.overrideReason,
    })),
    buildSteps: tree.buildSteps.map((s) => ({
      id: s.id,
      position: s.position,
      text: s.text,
      caution: s.caution,
      photoRequired: s.photoRequired,
      measurementRequired: s.measurementRequired,
      measurementUnit: s.measurementUnit,
      measurementMin: s.measurementMin === null ? null : Number(s.measurementMin),
      measurementMax: s.measurementMax === null ? null : Number(s.measurementMax),
      freeOrder: s.freeOrder,
      outOfLimitsRework: s.outOfLimitsRework,
    })),
    rollup: rollUp({ bomLines: tree.bomLines, cutParts: tree.cutParts, kerf }),
    releasedAt: tree.releasedAt?.toISOString() ?? null,
    releasedBy: tree.releasedBy,
    createdAt: tree.createdAt.toISOString(),
    updatedAt: tree.updatedAt.toISOString(),
  }
}

/** A revision as a bench role sees it: parts and roll-ups without what they cost (see `seesCosts`). */
export function revisionWithoutCosts(rev: RevisionDetail): RevisionDetail {
  return {
    ...rev,
    bomLines: rev.bomLines.map((l) => ({ ...l, part: { ...l.part, unitCostCents: null } })),
    cutParts: rev.cutParts.map((c) => ({ ...c, part: { ...c.part, unitCostCents: null } })),
    rollup: { ...rev.rollup, costCents: null },
  }
}
