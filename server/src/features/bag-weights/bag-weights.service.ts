import { z } from 'zod'
import { bagExpectation, judgeBag, sampleUnitWeight, spreadFromSingles, type BagLine } from '@kitwright/shared/domain/bag-weight'
import type {
  BagCheck,
  BagLineView,
  BagWeighing,
  PartUnitWeight,
  RecordUnitWeightSchema,
  UnitWeight,
  WeighBagResult,
  WeighBagSchema,
} from '@kitwright/shared/bag-weights'
import { ExplanationSchema } from '@kitwright/shared/bag-weights'
import type { Db, Tx } from '../../db/client'
import { bagWeighings, unitWeightSamples } from '../../db/schema/index'
import type { Deps } from '../../deps'
import type { SessionUser } from '../../lib/auth'
import { recordAudit, type AuditContext } from '../../lib/audit'
import { Conflict, HttpError, NotFound } from '../../lib/http-errors'
import { loadPackData } from '../pack/pack-view'
import { bomOfRevisions } from '../pack/pack.queries'
import { tickItem, undoItem } from '../pack/pack.service'
import {
  countableParts,
  findPart,
  latestSamples,
  latestWeighingsOfOrder,
  samplesOfPart,
  weighingByRequestKey,
  type SampleWithNames,
  type WeighingWithName,
} from './bag-weights.queries'

type Conn = Db | Tx
type PackDeps = Pick<Deps, 'db' | 'carrier'>

function toUnitWeight(s: SampleWithNames): UnitWeight {
  return {
    id: s.id,
    partId: s.partId,
    sampleCount: s.sampleCount,
    sampleMg: s.sampleMg,
    unitMg: s.unitMg,
    spreadMg: s.spreadMg,
    spreadSource: s.spreadSource,
    singlesMg: s.singlesMg,
    packedLoose: s.packedLoose,
    division: sampleUnitWeight(s.sampleCount, s.sampleMg, s.partName).words,
    recordedBy: { id: s.recordedBy, name: s.recordedByName },
    recordedAt: s.recordedAt.toISOString(),
  }
}

/** Every part that can be counted by weight, with its unit weight (null until a sample is weighed). */
export async function listUnitWeights(db: Conn): Promise<PartUnitWeight[]> {
  const rows = await countableParts(db)
  const latest = new Map((await latestSamples(db)).map((s) => [s.partId, s]))
  return rows.map((p) => {
    const s = latest.get(p.id)
    return { partId: p.id, sku: p.sku, name: p.name, kind: p.kind, current: s ? toUnitWeight(s) : null }
  })
}

/** Every sample of one part, newest first: who weighed how many pieces, when. */
export async function unitWeightHistory(db: Conn, partId: string): Promise<UnitWeight[]> {
  if (!(await findPart(db, partId))) throw new NotFound('No such part')
  return (await samplesOfPart(db, partId)).map(toUnitWeight)
}

/**
 * Records a part's unit weight from a counted sample: divides, keeps it to 0.01 g, takes the spread
 * from the single pieces or the typed tolerance. Only parts stocked "each" can be counted.
 */
export async function recordUnitWeight(
  db: Db,
  partId: string,
  input: z.output<typeof RecordUnitWeightSchema>,
  actor: SessionUser,
  ctx: AuditContext,
): Promise<UnitWeight> {
  const part = await findPart(db, partId)
  if (!part) throw new NotFound('No such part')
  if (part.kind === 'stock_length' || part.unitOfMeasure !== 'each') {
    throw new Conflict(`${part.name} is stocked by the ${part.unitOfMeasure}, not counted in pieces: only parts stocked "each" get a unit weight`)
  }
  const sample = sampleUnitWeight(input.sampleCount, input.sampleWeight.mg, part.name)
  const singlesMg = (input.singles ?? []).map((w) => w.mg)
  const spreadMg = singlesMg.length >= 2 ? spreadFromSingles(sample.unitMg, singlesMg) : input.spread!.mg
  return db.transaction(async (tx) => {
    const [row] = await tx
      .insert(unitWeightSamples)
      .values({
        partId,
        sampleCount: input.sampleCount,
        sampleMg: input.sampleWeight.mg,
        unitMg: sample.unitMg,
        spreadMg,
        spreadSource: singlesMg.length >= 2 ? 'singles' : 'typed',
        singlesMg,
        packedLoose: input.packedLoose,
        recordedBy: actor.id,
      })
      .returning()
    await recordAudit(tx, ctx, {
      action: 'unit_weight.recorded',
      entityType: 'part',
      entityId: partId,
      summary: `${sample.words}; spread ±${(spreadMg / 1000).toFixed(2)} g`,
      data: { unitMg: sample.unitMg, spreadMg, sampleCount: input.sampleCount, sampleMg: input.sampleWeight.mg },
    })
    return toUnitWeight({ ...row!, recordedByName: actor.name, partName: part.name })
  })
}

function toWeighing(w: WeighingWithName): BagWeighing {
  const r = w.weighing
  return {
    id: r.id,
    itemKey: r.itemKey,
    workOrderId: r.workOrderId,
    measuredMg: r.measuredMg,
    enteredAs: r.enteredAs,
    source: r.source,
    expectedMg: r.expectedMg,
    toleranceMg: r.toleranceMg,
    differenceMg: r.differenceMg,
    accepted: r.accepted,
    explanations: z.array(ExplanationSchema).parse(r.explanations),
    words: r.words,
    weighedBy: { id: r.weighedBy, name: w.weighedByName },
    weighedAt: r.weighedAt.toISOString(),
  }
}

interface BagFacts {
  check: BagCheck
  lines: BagLine[]
  orderNumber: string
  packProblem: string | null
  confirmed: boolean
}

/**
 * The bags of an order's packing list and what each should hold: a pack (no build) holds all its
 * parts in its bag; a built unit's bag holds the parts marked to go loose (net cups, collars). The
 * bag itself (its packaging part) is weighed with them.
 */
async function bagFacts(db: Conn, orderId: string): Promise<BagFacts[]> {
  const data = await loadPackData(db, orderId)
  const revisionOf = new Map(data.units.map((u) => [u.workOrder.id, u.revision.id]))
  const bom = await bomOfRevisions(db, [...new Set(revisionOf.values())])
  const samples = new Map((await latestSamples(db, [...new Set(bom.map((b) => b.partId))])).map((s) => [s.partId, s]))
  const weighings = new Map((await latestWeighingsOfOrder(db, orderId)).map((w) => [`${w.weighing.workOrderId} ${w.weighing.itemKey}`, w]))
  const boxParts = new Set(data.boxes.flatMap((b) => (b.partId ? [b.partId] : [])))
  const facts: BagFacts[] = []
  for (const item of data.items.filter((i) => i.kind === 'bag' || i.kind === 'pack')) {
    const revBom = bom.filter((b) => b.revisionId === revisionOf.get(item.workOrderId))
    const isBagPart = (b: (typeof revBom)[number]) => b.kind === 'packaging' && b.unitOfMeasure === 'each' && !boxParts.has(b.partId)
    let chosen: { b: (typeof revBom)[number]; isBag: boolean }[]
    if (item.kind === 'pack') {
      chosen = revBom.filter((b) => b.kind !== 'packaging' || isBagPart(b)).map((b) => ({ b, isBag: b.kind === 'packaging' }))
    } else {
      const bagSku = item.key.split(':').slice(2).join(':')
      const bagLine = revBom.find((b) => isBagPart(b) && b.sku === bagSku)
      const loose = revBom.filter((b) => b.kind === 'hardware' && samples.get(b.partId)?.packedLoose)
      chosen = [...loose.map((b) => ({ b, isBag: false })), ...(bagLine ? [{ b: bagLine, isBag: true }] : [])]
    }
    const views: BagLineView[] = chosen.map(({ b, isBag }) => {
      const s = samples.get(b.partId)
      return { partId: b.partId, sku: b.sku, name: b.name, quantity: b.quantity, unitMg: s?.unitMg ?? null, spreadMg: s?.spreadMg ?? null, isBag }
    })
    let problem: string | null = null
    const notEach = chosen.find(({ b }) => b.unitOfMeasure !== 'each')
    const unweighed = views.filter((v) => v.unitMg === null)
    if (views.filter((v) => !v.isBag).length === 0)
      problem = `No parts are marked to go loose in this bag: a planner ticks "goes loose in the hardware bag" on the parts' unit weights`
    else if (notEach) problem = `${notEach.b.name} is stocked by the ${notEach.b.unitOfMeasure}: this bag cannot be checked by weight`
    else if (unweighed.length > 0)
      problem = `No unit weight yet for ${unweighed.map((v) => v.name).join(', ')}: a planner weighs a counted sample on the Unit weights page`
    const lines: BagLine[] = problem
      ? []
      : views.map((v) => ({ partId: v.partId, sku: v.sku, name: v.name, quantity: v.quantity, unitMg: v.unitMg!, spreadMg: v.spreadMg!, isBag: v.isBag }))
    const e = problem ? null : bagExpectation(lines)
    const last = weighings.get(`${item.workOrderId} ${item.key}`)
    facts.push({
      check: {
        itemKey: item.key,
        workOrderId: item.workOrderId,
        serial: item.serial,
        description: item.description,
        lines: views,
        expectation: e && {
          expectedMg: e.expectedMg,
          toleranceMg: e.toleranceMg,
          summedSpreadMg: e.summedSpreadMg,
          floorMg: e.floorMg,
          missingPartCouldPass: e.missingPartCouldPass,
          reasoning: e.reasoning,
        },
        problem,
        lastWeighing: last ? toWeighing(last) : null,
      },
      lines,
      orderNumber: data.order.number,
      packProblem: item.problem,
      confirmed: item.check !== null,
    })
  }
  return facts
}

/** The bags of an order at the pack bench, with what each should weigh and its last weighing. */
export async function bagChecks(db: Conn, orderId: string): Promise<BagCheck[]> {
  return (await bagFacts(db, orderId)).map((f) => f.check)
}

/**
 * Weighs one bag: records the weighing (accepted or refused, by whom, when), then confirms an accepted
 * bag on the packing list, or takes back the confirmation of a refused one. A bag that cannot be
 * weighed (no unit weight, not on the list) is refused with what to fix and nothing is recorded.
 * With a request key a retry returns the first answer.
 */
export async function weighBag(deps: PackDeps, orderId: string, input: z.output<typeof WeighBagSchema>, actor: SessionUser): Promise<WeighBagResult> {
  if (input.requestKey) {
    const earlier = await weighingByRequestKey(deps.db, input.requestKey)
    if (earlier) {
      if (earlier.weighing.orderId !== orderId || earlier.weighing.itemKey !== input.itemKey)
        throw new Conflict('That request key was used for another bag: send a new one')
      const facts = (await bagFacts(deps.db, orderId)).find((f) => f.check.itemKey === input.itemKey)
      return { weighing: toWeighing(earlier), confirmed: facts?.confirmed ?? false, confirmProblem: null }
    }
  }
  const facts = await bagFacts(deps.db, orderId)
  const bag = facts.find((f) => f.check.itemKey === input.itemKey)
  if (!bag) throw new NotFound(`No bag "${input.itemKey}" on this order's packing list`)
  if (bag.packProblem) throw new Conflict(bag.packProblem)
  if (bag.check.problem || !bag.check.expectation) throw new Conflict(bag.check.problem ?? 'This bag cannot be weighed')
  const expectation = bagExpectation(bag.lines)
  const verdict = judgeBag(bag.lines, expectation, input.weight.mg)
  const [row] = await deps.db
    .insert(bagWeighings)
    .values({
      requestKey: input.requestKey ?? null,
      orderId,
      workOrderId: bag.check.workOrderId,
      itemKey: bag.check.itemKey,
      measuredMg: input.weight.mg,
      enteredAs: input.weight.text,
      source: input.source,
      expectedMg: expectation.expectedMg,
      toleranceMg: expectation.toleranceMg,
      differenceMg: verdict.differenceMg,
      accepted: verdict.accepted,
      contents: bag.lines,
      explanations: verdict.explanations,
      words: verdict.words,
      weighedBy: actor.id,
    })
    .onConflictDoNothing({ target: bagWeighings.requestKey })
    .returning()
  if (!row) {
    // The same request key landed at the same moment from a retry: answer with that one.
    const earlier = await weighingByRequestKey(deps.db, input.requestKey!)
    return { weighing: toWeighing(earlier!), confirmed: bag.confirmed, confirmProblem: null }
  }
  const weighing = toWeighing({ weighing: row, weighedByName: actor.name })
  let confirmed = bag.confirmed
  let confirmProblem: string | null = null
  try {
    if (verdict.accepted && !bag.confirmed) {
      await tickItem(deps, orderId, bag.check.itemKey, actor)
      confirmed = true
    } else if (!verdict.accepted && bag.confirmed) {
      await undoItem(deps, orderId, bag.check.itemKey, actor)
      confirmed = false
    }
  } catch (err) {
    // The weighing stands (the scale said what it said); the packing list could not follow, and the bench is told why.
    if (!(err instanceof HttpError)) throw err
    confirmProblem = err.message
  }
  return { weighing, confirmed, confirmProblem }
}

/** A bag's label facts: what it holds and its accepted weight. */
export async function bagLabelFacts(db: Conn, orderId: string, itemKey: string) {
  const bag = (await bagFacts(db, orderId)).find((f) => f.check.itemKey === itemKey)
  if (!bag) throw new NotFound(`No bag "${itemKey}" on this order's packing list`)
  const last = bag.check.lastWeighing
  if (!last || !last.accepted) throw new Conflict('Weigh the bag first: its label carries the accepted weight')
  return { itemKey, serial: bag.check.serial, orderNumber: bag.orderNumber, lines: bag.check.lines, measuredMg: last.measuredMg, weighedAt: last.weighedAt }
}
