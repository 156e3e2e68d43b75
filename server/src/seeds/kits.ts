import { eq } from 'drizzle-orm'
import {
  computeFrame,
  DEMO_COMPACT_6_ENCLOSURE,
  DEMO_COMPACT_6_FRAME,
  DEMO_TOTE_12_REV_A_ENCLOSURE,
  DEMO_TOTE_12_REV_A_FRAME,
  DEMO_TOTE_12_REV_B_ENCLOSURE,
  DEMO_TOTE_12_REV_B_FRAME,
  type FrameInputs,
} from '@kitwright/shared/domain/frame'
import type { EnclosureShape } from '@kitwright/shared/domain/reservoir'
import { DRILLING_CAUTION, MAINS_NEAR_WATER_CAUTION, SOLVENT_CEMENT_CAUTION } from '@kitwright/shared/domain/safety-cautions'
import { inches } from '@kitwright/shared/domain/units'
import { PASCALS_PER_PSI, type RevisionContent } from '@kitwright/shared/kits'
import { createKit, newRevision, releaseRevision, saveRevision, tables, type Db, type SessionUser } from './services'
import { DEMO_PART_SKUS as S } from './catalog'

const { kits, parts } = tables

type Step = RevisionContent['buildSteps'][number]
const step = (text: string, extra: Partial<Step> = {}): Step => ({
  text,
  caution: null,
  photoRequired: false,
  measurementRequired: false,
  measurementUnit: null,
  measurementMin: null,
  measurementMax: null,
  freeOrder: false,
  outOfLimitsRework: false,
  ...extra,
})

// The shop-wide caution words (shared/src/domain/safety-cautions.ts), so the demo kits say what every new kit's default steps say.
const EYES = DRILLING_CAUTION
const MAINS = MAINS_NEAR_WATER_CAUTION

/** Build steps of a manifold kit; `insideWidth` is the tote's inside width at the manifold height. */
function manifoldSteps(insideWidth: number): Step[] {
  const width = insideWidth / inches(1)
  return [
    step('Check the tote: measure its inside width at the manifold height (2 in below the rim).', {
      measurementRequired: true,
      measurementUnit: 'in',
      measurementMin: Math.round((width - 0.25) * 100) / 100,
      measurementMax: Math.round((width + 0.25) * 100) / 100,
      // The wrong tote cannot be built into this revision: the unit waits in rework for the right one.
      outOfLimitsRework: true,
      caution: 'A tote outside these limits is the wrong tote for this revision: stop and ask the planner.',
    }),
    step('Dry-fit the manifold from the bin: elbows at the corners, tees for the cross runs and the riser. Check every piece against its label.'),
    step('Drill the sprayer holes at the marked positions, 11/32 in bit.', { caution: EYES }),
    step('Tap each hole 1/8 in NPT, then flush the swarf out of the pipe.', { caution: `${EYES} Swarf left in the pipe blocks the sprayers.` }),
    step('Prime and cement every joint; let it cure as the cement maker directs.', {
      caution: SOLVENT_CEMENT_CAUTION,
    }),
    step('Thread in the sprayers, hand tight plus a quarter turn.'),
    step('Drill the drain hole low on the short side, fit the grommet and the drain fitting.', { caution: EYES }),
    step('Fit the pump on the floor of the tote, push the riser onto the pump adapter, and route the cord out with a drip loop.', { caution: MAINS }),
    step('Photograph the finished unit from above with the lid off.', { photoRequired: true }),
  ]
}

/** A leak test suited to the demo manifolds; invented demo values, not a published protocol. */
function leakTest(waterLitres: number): RevisionContent['leakTest'] {
  return {
    minPressurePa: Math.round(10 * PASCALS_PER_PSI),
    maxPressurePa: Math.round(20 * PASCALS_PER_PSI),
    holdMinutes: 10,
    maxDropPa: Math.round(0.5 * PASCALS_PER_PSI),
    waterVolumeMl: waterLitres * 1000,
  }
}

function frameCutParts(pipePartId: string, inputs: FrameInputs): RevisionContent['cutParts'] {
  const result = computeFrame(inputs)
  if (!result.ok) throw new Error(`demo frame does not compute: ${result.warnings.map((w) => w.message).join('; ')}`)
  return result.cutList.map((l) => ({ partId: pipePartId, label: l.label, length: l.length, quantity: l.quantity, frameKey: l.key, overrideReason: null }))
}

function manifoldContent(
  sku: (key: keyof typeof S) => string,
  frame: FrameInputs,
  tote: EnclosureShape,
  toteSku: keyof typeof S,
  sites: number,
  tees: number,
  carton: keyof typeof S,
  waterLitres: number,
  notes: string,
): RevisionContent {
  const bom = (key: keyof typeof S, quantity: number) => ({ partId: sku(key), quantity, note: null })
  return {
    notes,
    frame: { pipePartId: sku('pipeHalfInch'), inputs: frame, tote },
    leakTest: leakTest(waterLitres),
    bomLines: [
      bom(toteSku, 1),
      bom('elbowHalfInch', 4),
      bom('teeHalfInch', tees),
      bom('pumpAdapter', 1),
      bom('sprayer', sites),
      bom('netCup', sites),
      bom('collar', sites),
      bom('drainFitting', 1),
      bom('grommet', 1),
      bom('pump', 1),
      bom(carton, 1),
      bom('kraftPaper', 6),
      bom('hardwareBag', 1),
    ],
    cutParts: frameCutParts(sku('pipeHalfInch'), frame),
    buildSteps: manifoldSteps(frame.enclosure.insideWidth),
  }
}

/**
 * The demo kits of Mistwell Tote Works (invented): the 12-site tote kit with revision A and a
 * revision B for a wider tote, a compact 6-site kit, and two spare-parts packs. Skipped when the
 * kits exist already.
 */
export async function seedDemoKits(db: Db, owner: SessionUser) {
  const partRows = await db.select({ id: parts.id, sku: parts.sku }).from(parts)
  const ids = new Map(partRows.map((p) => [p.sku, p.id]))
  const sku = (key: keyof typeof S) => {
    const id = ids.get(S[key])
    if (!id) throw new Error(`demo part ${S[key]} is missing; seed the parts first`)
    return id
  }
  const exists = async (kitSku: string) => (await db.select({ id: kits.id }).from(kits).where(eq(kits.sku, kitSku))).length > 0

  if (!(await exists('MW-TOTE-12'))) {
    const kit = await createKit(db, {
      sku: 'MW-TOTE-12',
      name: 'Grow tote kit, 12 sites',
      storeProductId: 'mw-store-1012',
      description: 'A 27 gal tote with a 12-sprayer manifold, pump, net cups and collars.',
      priceCents: 18900, // invented demo prices
    })
    const revA = kit.revisions[0]!.id
    await saveRevision(db, revA, manifoldContent(sku, DEMO_TOTE_12_REV_A_FRAME, DEMO_TOTE_12_REV_A_ENCLOSURE, 'tote27A', 12, 9, 'cartonLarge', 40, 'First release.'))
    await releaseRevision(db, revA, owner)
    const revB = await newRevision(db, kit.id, revA)
    await saveRevision(
      db,
      revB.id,
      manifoldContent(sku, DEMO_TOTE_12_REV_B_FRAME, DEMO_TOTE_12_REV_B_ENCLOSURE, 'tote27B', 12, 9, 'cartonLarge', 42, 'The tote supplier replaced the tote with one 1 in wider.'),
    )
    await releaseRevision(db, revB.id, owner)
  }

  if (!(await exists('MW-TOTE-6C'))) {
    const kit = await createKit(db, {
      sku: 'MW-TOTE-6C',
      name: 'Compact grow tote kit, 6 sites',
      storeProductId: 'mw-store-1006',
      description: 'A 10 gal tote with a 6-sprayer manifold for a windowsill or a shelf.',
      priceCents: 12900,
    })
    const rev = kit.revisions[0]!.id
    await saveRevision(db, rev, manifoldContent(sku, DEMO_COMPACT_6_FRAME, DEMO_COMPACT_6_ENCLOSURE, 'tote10', 6, 3, 'cartonSmall', 15, 'First release.'))
    await releaseRevision(db, rev, owner)
  }

  const packs = [
    { kitSku: 'MW-SPARE-SPR6', name: 'Spare sprayer pack (6)', storeProductId: 'mw-store-2006', priceCents: 1800, lines: [['sprayer', 6]] as const },
    { kitSku: 'MW-SPARE-CUP12', name: 'Spare cups and collars pack (12)', storeProductId: 'mw-store-2012', priceCents: 1400, lines: [['netCup', 12], ['collar', 12]] as const },
  ]
  for (const pack of packs) {
    if (await exists(pack.kitSku)) continue
    const kit = await createKit(db, { sku: pack.kitSku, name: pack.name, storeProductId: pack.storeProductId, description: null, priceCents: pack.priceCents })
    const rev = kit.revisions[0]!.id
    await saveRevision(db, rev, {
      notes: 'Packed at the pack bench; no build.',
      frame: null,
      leakTest: null,
      bomLines: [...pack.lines.map(([key, quantity]) => ({ partId: sku(key), quantity, note: null })), { partId: sku('hardwareBag'), quantity: 1, note: null }],
      cutParts: [],
      buildSteps: [step('Count the parts into the hardware bag and seal it.')],
    })
    await releaseRevision(db, rev, owner)
  }
}
