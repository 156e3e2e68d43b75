/**
 * Who gets the free stock when several orders are released at once. Orders go in priority order —
 * rush first, then the oldest promised ship date (an order with no promise after those with one),
 * then the oldest placed — so a late order is never starved by a newer one that happened to be ticked
 * first. Each order takes what its units need from what is still free; an order that cannot have
 * everything is refused and leaves the stock for the orders after it, unless the planner releases
 * short, in which case it takes what is free and records the rest as short.
 */

export interface ReleaseCandidate {
  orderId: string
  number: string
  priority: 'normal' | 'rush'
  /** YYYY-MM-DD, or null when the order has no promise. */
  promisedShipDate: string | null
  /** ISO 8601. */
  placedAt: string
  /** Why this order cannot be released at all (on hold, unpaid, no released revision…), or null. */
  blocked: string | null
  /** What its units need, per part. */
  needs: { partId: string; sku: string; name: string; quantity: number }[]
}

export interface PlannedPart {
  partId: string
  sku: string
  name: string
  needed: number
  /** Free when this order's turn came. */
  freeBefore: number
  /** What the order takes (all it needs, or what is free when released short; 0 when refused). */
  takes: number
  short: number
}

export interface PlannedRelease {
  orderId: string
  number: string
  priority: 'normal' | 'rush'
  promisedShipDate: string | null
  /** 1, 2, 3… the order in which stock is given out. */
  turn: number
  outcome: 'release' | 'release_short' | 'refuse'
  /** For a refusal: why, in words. */
  reason: string | null
  parts: PlannedPart[]
}

/** Rush first, then the oldest promised date (none last), then the oldest placed, then the number. */
export function compareReleasePriority(a: Omit<ReleaseCandidate, 'needs' | 'blocked' | 'orderId'>, b: Omit<ReleaseCandidate, 'needs' | 'blocked' | 'orderId'>): number {
  if (a.priority !== b.priority) return a.priority === 'rush' ? -1 : 1
  if (a.promisedShipDate !== b.promisedShipDate) {
    if (a.promisedShipDate === null) return 1
    if (b.promisedShipDate === null) return -1
    return a.promisedShipDate < b.promisedShipDate ? -1 : 1
  }
  if (a.placedAt !== b.placedAt) return Date.parse(a.placedAt) - Date.parse(b.placedAt)
  return a.number.localeCompare(b.number)
}

/** Plans a bulk release against `free` stock per part id (on hand − every reservation). */
export function planRelease(candidates: readonly ReleaseCandidate[], free: ReadonlyMap<string, number>, options: { allowShort: boolean }): PlannedRelease[] {
  const left = new Map(free)
  const ordered = [...candidates].sort(compareReleasePriority)
  return ordered.map((c, i) => {
    const base = { orderId: c.orderId, number: c.number, priority: c.priority, promisedShipDate: c.promisedShipDate, turn: i + 1 }
    const parts = c.needs.map((n) => {
      const freeBefore = Math.max(0, left.get(n.partId) ?? 0)
      return { partId: n.partId, sku: n.sku, name: n.name, needed: n.quantity, freeBefore, takes: Math.min(n.quantity, freeBefore), short: Math.max(0, n.quantity - freeBefore) }
    })
    if (c.blocked) return { ...base, outcome: 'refuse' as const, reason: c.blocked, parts: parts.map((p) => ({ ...p, takes: 0 })) }
    const short = parts.filter((p) => p.short > 0)
    if (short.length > 0 && !options.allowShort) {
      const words = short.map((p) => `${p.sku} ${p.name}: needs ${p.needed}, ${p.freeBefore} free`).join('; ')
      return { ...base, outcome: 'refuse' as const, reason: `Not enough stock: ${words}`, parts: parts.map((p) => ({ ...p, takes: 0 })) }
    }
    for (const p of parts) left.set(p.partId, p.freeBefore - p.takes)
    return { ...base, outcome: short.length > 0 ? ('release_short' as const) : ('release' as const), reason: null, parts }
  })
}
