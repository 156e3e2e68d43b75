import type { Part, PartInput } from '@kitwright/shared/parts'
import type { PartRow } from '../../db/schema/index'

export function toPart(row: PartRow): Part {
  return {
    id: row.id,
    sku: row.sku,
    name: row.name,
    kind: row.kind,
    unitOfMeasure: row.unitOfMeasure,
    unitCostCents: row.unitCostCents,
    weightGrams: row.weightGrams,
    electrical: row.electrical,
    lotTracked: row.lotTracked,
    supplier: row.supplier,
    leadTimeDays: row.leadTimeDays,
    reorderPoint: row.reorderPoint,
    reorderQuantity: row.reorderQuantity,
    shelfLocation: row.shelfLocation,
    nominalSize: row.nominalSize,
    outsideDiameter: row.outsideDiameter,
    stickLengths: row.stickLengths,
    hsCode: row.hsCode,
    originCountry: row.originCountry,
    customsDescription: row.customsDescription,
    active: row.active,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
  }
}

/** A part as a bench role sees it: no cost (see `seesCosts`). */
export function withoutCost(part: Part): Part {
  return { ...part, unitCostCents: null }
}

/** The editable fields of a stored part, to apply a change to and check the result as a whole. */
export function toPartInput(part: Part): PartInput {
  const { id: _id, active: _active, createdAt: _c, updatedAt: _u, unitCostCents, ...input } = part
  // A part read from the database always has its cost; only a bench role's copy is blanked.
  return { ...input, unitCostCents: unitCostCents ?? 0 }
}
