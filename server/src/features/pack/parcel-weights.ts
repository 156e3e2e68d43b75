import { parcelWeights, type DimDivisor } from '@kitwright/shared/domain/weights'
import type { Parcel } from '@kitwright/shared/pack'
import type { BoxRow } from '../../db/schema/index'

/** One unit's contribution to a parcel: what it weighs without a shipping box, and the box its BOM names. */
export interface UnitWeight {
  workOrderId: string
  serial: string
  /** BOM hardware and packaging (less any shipping box) plus its pipe, in grams. */
  grams: number
  /** The shipping box its BOM includes (a carton linked to a box), if any. */
  boxId: string | null
}

interface BomPart {
  partId: string
  quantity: number
  weightGrams: number
}

interface CutPiece {
  length: number
  quantity: number
  stickWeightGrams: number
  stickLengths: number[]
}

/**
 * What one unit weighs out of its box: every BOM line except shipping boxes (the chosen box is added
 * per parcel), plus its pipe pieces at the stick's weight per length (the first stick length the
 * pipe is bought in).
 */
export function unitGrams(bom: readonly BomPart[], pieces: readonly CutPiece[], boxPartIds: ReadonlySet<string>): number {
  const hardware = bom.filter((b) => !boxPartIds.has(b.partId)).reduce((sum, b) => sum + b.quantity * b.weightGrams, 0)
  const pipe = pieces.reduce((sum, p) => {
    const stick = p.stickLengths[0]
    return stick ? sum + (p.length * p.quantity * p.stickWeightGrams) / stick : sum
  }, 0)
  return Math.round(hardware + pipe)
}

/**
 * The parcels the bench proposes: one per unit whose BOM names a shipping box, in that box; units
 * with no box of their own (spare-parts packs) ride in the first parcel, or, when no unit has a box,
 * in one parcel in the smallest box.
 */
export function proposeParcels(units: readonly UnitWeight[], boxes: readonly BoxRow[]): { workOrderIds: string[]; boxId: string }[] {
  if (boxes.length === 0 || units.length === 0) return []
  const known = new Set(boxes.map((b) => b.id))
  const boxed = units.filter((u) => u.boxId && known.has(u.boxId))
  const loose = units.filter((u) => !u.boxId || !known.has(u.boxId))
  const proposal = boxed.map((u) => ({ workOrderIds: [u.workOrderId], boxId: u.boxId! }))
  if (loose.length === 0) return proposal
  if (proposal.length > 0) {
    proposal[0]!.workOrderIds.push(...loose.map((u) => u.workOrderId))
    return proposal
  }
  const smallest = [...boxes].sort((a, b) => a.length * a.width * a.height - b.length * b.width * b.height)[0]!
  return [{ workOrderIds: loose.map((u) => u.workOrderId), boxId: smallest.id }]
}

/** A parcel's weights: the estimate (units + box), the scale reading when taken, dimensional and billable. */
export function weighParcel(
  input: { position: number; workOrderIds: string[]; boxId: string; scaleGrams: number | null },
  box: BoxRow,
  units: ReadonlyMap<string, UnitWeight>,
  divisor: DimDivisor,
): Omit<Parcel, 'sscc' | 'trackingNumber'> & { boxId: string } {
  const contents = input.workOrderIds.map((id) => units.get(id)!)
  const estimatedGrams = contents.reduce((sum, u) => sum + u.grams, 0) + box.weightGrams
  const actual = input.scaleGrams ?? Math.max(1, estimatedGrams)
  const w = parcelWeights(actual, { length: box.length, width: box.width, height: box.height }, divisor)
  return {
    position: input.position,
    boxId: box.id,
    boxName: box.name,
    length: box.length,
    width: box.width,
    height: box.height,
    workOrderIds: input.workOrderIds,
    serials: contents.map((u) => u.serial),
    estimatedGrams,
    scaleGrams: input.scaleGrams,
    actualGrams: w.actualGrams,
    dimensionalGrams: w.dimensionalGrams,
    billableGrams: w.billableGrams,
  }
}
