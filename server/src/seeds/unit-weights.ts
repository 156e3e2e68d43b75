import { inArray } from 'drizzle-orm'
import { sampleUnitWeight, spreadFromSingles } from '@kitwright/shared/domain/bag-weight'
import { DEMO_PART_SKUS } from './catalog'
import { tables, type Db, type SessionUser } from './services'

const { parts, unitWeightSamples } = tables
const S = DEMO_PART_SKUS

/**
 * The demo shop's counted samples (invented figures, in the range such parts weigh): how many pieces
 * went on the scale, what they weighed in milligrams, and the spread — a few single pieces, or a
 * typed tolerance per piece. Net cups and collars go loose in a built kit's hardware bag; sprayers and
 * fittings are fitted at the build bench (and go in the bag only in a spare pack).
 */
export const DEMO_UNIT_WEIGHTS: { sku: string; count: number; sampleMg: number; singlesMg?: number[]; spreadMg?: number; packedLoose: boolean }[] = [
  { sku: S.netCup, count: 20, sampleMg: 122_000, singlesMg: [6_040, 6_170, 6_120], packedLoose: true },
  { sku: S.collar, count: 50, sampleMg: 212_400, singlesMg: [4_210, 4_300, 4_240], packedLoose: true },
  { sku: S.sprayer, count: 25, sampleMg: 101_500, spreadMg: 60, packedLoose: false },
  { sku: S.elbowHalfInch, count: 10, sampleMg: 112_300, spreadMg: 150, packedLoose: false },
  { sku: S.teeHalfInch, count: 10, sampleMg: 138_600, spreadMg: 180, packedLoose: false },
  { sku: S.pumpAdapter, count: 10, sampleMg: 121_700, spreadMg: 150, packedLoose: false },
  { sku: S.grommet, count: 20, sampleMg: 98_800, spreadMg: 100, packedLoose: false },
  { sku: S.drainFitting, count: 5, sampleMg: 140_200, spreadMg: 300, packedLoose: false },
  { sku: S.hardwareBag, count: 20, sampleMg: 64_000, spreadMg: 100, packedLoose: false },
]

/** Adds the demo's unit weights to parts that have none yet; a part weighed since is left as it is. */
export async function seedDemoUnitWeights(db: Db, owner: SessionUser) {
  const rows = await db.select({ id: parts.id, sku: parts.sku, name: parts.name }).from(parts).where(inArray(parts.sku, DEMO_UNIT_WEIGHTS.map((w) => w.sku)))
  const weighed = new Set((await db.selectDistinct({ partId: unitWeightSamples.partId }).from(unitWeightSamples)).map((r) => r.partId))
  for (const w of DEMO_UNIT_WEIGHTS) {
    const part = rows.find((r) => r.sku === w.sku)
    if (!part || weighed.has(part.id)) continue
    const { unitMg } = sampleUnitWeight(w.count, w.sampleMg, part.name)
    const singles = w.singlesMg ?? []
    await db.insert(unitWeightSamples).values({
      partId: part.id,
      sampleCount: w.count,
      sampleMg: w.sampleMg,
      unitMg,
      spreadMg: singles.length >= 2 ? spreadFromSingles(unitMg, singles) : w.spreadMg!,
      spreadSource: singles.length >= 2 ? 'singles' : 'typed',
      singlesMg: singles,
      packedLoose: w.packedLoose,
      recordedBy: owner.id,
    })
  }
}
