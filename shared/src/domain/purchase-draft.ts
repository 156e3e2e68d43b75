/**
 * Pure rules of a draft purchase order: quantities rounded up to whole packs and to the supplier's
 * minimum order value, each line priced by the supplier's price breaks. No I/O.
 */

/** From `minQuantity` units on one order, each costs `unitPriceCents`. */
export interface PriceBreakRule {
  minQuantity: number
  unitPriceCents: number
}

/** The unit price for `quantity` units: the break with the largest minimum at or below it (the first break when below all). */
export function unitPriceFor(breaks: readonly PriceBreakRule[], quantity: number): number {
  const sorted = [...breaks].sort((a, b) => a.minQuantity - b.minQuantity)
  let price = sorted[0]?.unitPriceCents ?? 0
  for (const b of sorted) if (quantity >= b.minQuantity) price = b.unitPriceCents
  return price
}

/** `quantity` rounded up to a whole number of packs (a pack size below 1 counts as 1). */
export function roundUpToPack(quantity: number, packSize: number): number {
  const pack = Math.max(1, Math.floor(packSize))
  return Math.ceil(Math.max(0, quantity) / pack) * pack
}

export interface DraftLineInput {
  partId: string
  /** What to buy (the shortage's suggestion), before packs and the minimum order. */
  suggested: number
  packSize: number
  priceBreaks: readonly PriceBreakRule[]
}

export interface DraftLine {
  partId: string
  quantity: number
  unitPriceCents: number
}

/** A line's value in cents. */
export function lineTotal(l: Pick<DraftLine, 'quantity' | 'unitPriceCents'>): number {
  return l.quantity * l.unitPriceCents
}

/**
 * The lines of one supplier's draft. Each suggestion is rounded up to whole packs and priced by its
 * breaks. While the order is worth less than `minimumOrderCents`, one more pack is added to the line
 * whose next pack adds least to the total (the first line on a tie; crossing a price break may even lower it), re-pricing it by its breaks, so the draft
 * reaches the minimum at the lowest extra cost one pack at a time.
 */
export function draftLines(inputs: readonly DraftLineInput[], minimumOrderCents: number): DraftLine[] {
  const lines = inputs.map((i) => {
    const quantity = Math.max(roundUpToPack(i.suggested, i.packSize), Math.max(1, Math.floor(i.packSize)))
    return { input: i, quantity, unitPriceCents: unitPriceFor(i.priceBreaks, quantity) }
  })
  const total = () => lines.reduce((s, l) => s + lineTotal(l), 0)
  // A bounded loop: each step adds one pack. A step may cost less than nothing (crossing a break);
  // parts that are free at every quantity can never raise the total and are left alone.
  const payable = lines.filter((l) => l.input.priceBreaks.some((b) => b.unitPriceCents > 0))
  for (let step = 0; step < 100_000 && total() < minimumOrderCents; step++) {
    let best: (typeof lines)[number] | null = null
    let bestCost = Number.POSITIVE_INFINITY
    for (const l of payable) {
      const pack = Math.max(1, Math.floor(l.input.packSize))
      const next = l.quantity + pack
      const cost = next * unitPriceFor(l.input.priceBreaks, next) - lineTotal(l)
      if (cost < bestCost) {
        best = l
        bestCost = cost
      }
    }
    if (!best) break
    best.quantity += Math.max(1, Math.floor(best.input.packSize))
    best.unitPriceCents = unitPriceFor(best.input.priceBreaks, best.quantity)
  }
  return lines.map((l) => ({ partId: l.input.partId, quantity: l.quantity, unitPriceCents: l.unitPriceCents }))
}

/**
 * The moving weighted average unit cost after a receipt: what the stock on hand was worth at the old
 * cost plus what was paid for the receipt, over the new quantity, rounded to the cent (half up).
 * Stock below zero on hand counts as none. With nothing on hand after all, the price paid.
 */
export function movingAverageCost(onHandBefore: number, costBefore: number, received: number, pricePaid: number): number {
  const held = Math.max(0, onHandBefore)
  const quantity = held + received
  if (quantity <= 0) return pricePaid
  return Math.round((held * costBefore + received * pricePaid) / quantity)
}
