/**
 * Roll-ups of a kit revision: what one unit costs, weighs and uses of pipe. Pure code.
 * Pipe is bought in sticks; a pipe part's unit cost and weight are those of one stick of its
 * shortest stick length, so they are prorated by length over that stick. Each cut also uses one
 * kerf of material.
 */
import type { Length } from './units'

/** What the roll-up needs of a part. */
export interface RollupPart {
  sku: string
  kind: 'stock_length' | 'hardware' | 'packaging'
  unitCostCents: number
  weightGrams: number
  stickLengths: Length[]
}

/** The lines of a revision with their parts. */
export interface RollupInput {
  bomLines: { part: RollupPart; quantity: number }[]
  cutParts: { part: RollupPart; length: Length; quantity: number }[]
  /** Material lost per cut (shop setting). */
  kerf: Length
}

/** One unit's cost (cents), weight (grams), pipe cut and used (base units), and what could not be rolled up. */
export interface Rollup {
  costCents: number
  weightGrams: number
  cutLength: Length
  stickLengthUsed: Length
  pieceCount: number
  problems: string[]
}

/** Rolls up one unit of a revision. Costs and weights round to whole cents and grams at the end. */
export function rollUp(input: RollupInput): Rollup {
  let cost = 0
  let weight = 0
  let cutLength = 0
  let used = 0
  let pieces = 0
  const problems: string[] = []
  for (const line of input.bomLines) {
    cost += line.part.unitCostCents * line.quantity
    weight += line.part.weightGrams * line.quantity
  }
  for (const cut of input.cutParts) {
    const lineUsed = (cut.length + input.kerf) * cut.quantity
    cutLength += cut.length * cut.quantity
    used += lineUsed
    pieces += cut.quantity
    const stick = cut.part.stickLengths.length > 0 ? Math.min(...cut.part.stickLengths) : 0
    if (stick === 0) {
      problems.push(`${cut.part.sku} has no stick length, so its pipe is left out of cost and weight`)
      continue
    }
    cost += (cut.part.unitCostCents * lineUsed) / stick
    weight += (cut.part.weightGrams * lineUsed) / stick
  }
  return { costCents: Math.round(cost), weightGrams: Math.round(weight), cutLength, stickLengthUsed: used, pieceCount: pieces, problems }
}
