/**
 * Customs declarations of a shipment: what is in it, part by part, with quantity, net weight, value,
 * HS tariff number and country of origin, and which UPU form it goes on (CN 22 or CN 23). Pure: the
 * server gathers the units, their parts and the order line prices, and prints the result.
 */
import type { CustomsForm } from '../customs'

/** The customs facts of one part, as the catalog holds them. */
export interface CustomsPartFacts {
  sku: string
  name: string
  /** Plain words for the declaration; the part's name when not set. */
  customsDescription: string | null
  /** HS tariff number, digits only. */
  hsCode: string | null
  /** ISO 3166-1 alpha-2. */
  originCountry: string | null
}

/** How much of one part a unit holds: pieces, net grams, and its cost (the weight its share of the price is split by). */
export interface DeclaredContent {
  part: CustomsPartFacts
  quantity: number
  netGrams: number
  costCents: number
}

/** One unit going in the shipment: what the customer paid for it (its order line's unit price) and what it holds. */
export interface DeclaredUnit {
  serial: string
  priceCents: number
  contents: DeclaredContent[]
}

/** One line of the declaration: one part, summed over the units. */
export interface CustomsLine {
  sku: string
  description: string
  quantity: number
  netGrams: number
  valueCents: number
  hsCode: string | null
  originCountry: string | null
}

/** The declaration's lines and totals, and what is missing to complete it. */
export interface CustomsDeclaration {
  lines: CustomsLine[]
  /** The sum of the lines' (rounded) net weights, so the printed column adds up. */
  totalNetGrams: number
  /** The sum of the lines' values: exactly the units' prices. */
  totalValueCents: number
  /** Units whose order line had no price: declared at the cost of their parts instead. */
  valuedAtCost: string[]
  /** Parts without an HS code or a country of origin: the declaration cannot go until they are set. */
  missing: { sku: string; name: string; fields: ('HS code' | 'country of origin')[] }[]
}

/**
 * Splits `total` cents over `weights` in proportion, in whole cents that add up to `total` exactly:
 * each share rounded down, the cents left over going to the largest remainders (the largest remainder
 * or Hamilton method), ties to the earlier share. All-zero weights split evenly.
 */
export function apportionCents(total: number, weights: readonly number[]): number[] {
  if (weights.length === 0) return []
  const w = weights.every((x) => x <= 0) ? weights.map(() => 1) : weights.map((x) => Math.max(0, x))
  const sum = w.reduce((a, b) => a + b, 0)
  const exact = w.map((x) => (total * x) / sum)
  const shares = exact.map((x) => Math.floor(x))
  let left = total - shares.reduce((a, b) => a + b, 0)
  const order = exact.map((x, i) => ({ i, r: x - Math.floor(x) })).sort((a, b) => b.r - a.r || a.i - b.i)
  for (const { i } of order) {
    if (left <= 0) break
    shares[i]! += 1
    left -= 1
  }
  return shares
}

/**
 * The declaration of the units going. Each unit's price is split over its parts by their cost
 * (by net weight when no part has a cost), so the declared total is what the customer paid; a unit
 * with no price is declared at the cost of its parts. Lines are one per part (SKU), in the order
 * first met; net weights are rounded to whole grams per line.
 */
export function declareContents(units: readonly DeclaredUnit[]): CustomsDeclaration {
  const lines = new Map<string, CustomsLine & { grams: number }>()
  const valuedAtCost: string[] = []
  for (const unit of units) {
    const contents = unit.contents.filter((c) => c.quantity > 0)
    if (contents.length === 0) continue
    const cost = contents.reduce((s, c) => s + c.costCents, 0)
    let values: number[]
    if (unit.priceCents > 0) {
      values = apportionCents(unit.priceCents, cost > 0 ? contents.map((c) => c.costCents) : contents.map((c) => c.netGrams))
    } else {
      valuedAtCost.push(unit.serial)
      values = contents.map((c) => Math.round(c.costCents))
    }
    contents.forEach((c, i) => {
      const line = lines.get(c.part.sku) ?? {
        sku: c.part.sku,
        description: c.part.customsDescription ?? c.part.name,
        quantity: 0,
        netGrams: 0,
        grams: 0,
        valueCents: 0,
        hsCode: c.part.hsCode,
        originCountry: c.part.originCountry,
      }
      line.quantity += c.quantity
      line.grams += c.netGrams
      line.valueCents += values[i]!
      lines.set(c.part.sku, line)
    })
  }
  const out: CustomsLine[] = [...lines.values()].map(({ grams, ...l }) => ({ ...l, netGrams: Math.round(grams) }))
  const missing = out
    .map((l) => ({ l, fields: [...(l.hsCode ? [] : ['HS code' as const]), ...(l.originCountry ? [] : ['country of origin' as const])] }))
    .filter((m) => m.fields.length > 0)
    .map(({ l, fields }) => ({ sku: l.sku, name: units.flatMap((u) => u.contents).find((c) => c.part.sku === l.sku)!.part.name, fields }))
  return {
    lines: out,
    totalNetGrams: out.reduce((s, l) => s + l.netGrams, 0),
    totalValueCents: out.reduce((s, l) => s + l.valueCents, 0),
    valuedAtCost,
    missing,
  }
}

/**
 * The CN 22 limit: UPU Convention Regulations (Letter Post Regulations, article on customs
 * declarations): items whose contents are worth up to 300 SDR (special drawing rights) carry a
 * CN 22; above that a CN 23. The sender may use a CN 23 for lower values too (from memory).
 */
export const CN22_LIMIT_SDR = 300

/**
 * Units of each currency per SDR, fixed figures from memory (the IMF publishes the rate daily; in
 * 2024–2025 one SDR was worth roughly 1.33–1.37 USD). Rounded down, so a value near the limit gets
 * the fuller CN 23 rather than a CN 22 it may not be allowed. A currency not listed always gets a CN 23.
 */
export const CURRENCY_PER_SDR_FROM_MEMORY: Readonly<Record<string, number>> = { USD: 1.3, CAD: 1.8, EUR: 1.15, GBP: 1 }

/** Which form a declaration goes on, by its total value, and the limit used in the currency's cents (null: currency not listed). */
export function chooseCustomsForm(totalValueCents: number, currency: string): { form: CustomsForm; limitCents: number | null } {
  const rate = CURRENCY_PER_SDR_FROM_MEMORY[currency.toUpperCase()]
  if (rate === undefined) return { form: 'CN 23', limitCents: null }
  const limitCents = Math.round(CN22_LIMIT_SDR * rate * 100)
  return { form: totalValueCents <= limitCents ? 'CN 22' : 'CN 23', limitCents }
}
