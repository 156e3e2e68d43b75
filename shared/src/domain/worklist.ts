/** What a bench worklist sorts by: rush first, then the promised ship date, then who has waited longest. */
export interface WorklistSortable {
  rush: boolean
  /** `YYYY-MM-DD`, or null when nothing was promised (sorts after every promise). */
  promisedShipDate: string | null
  /** ISO time since when it has waited for this bench. */
  waitingSince: string
}

/**
 * The order of every bench worklist: rush orders first; then the earliest promised ship date (no
 * promise last); then the longest wait. Stable for equal items, so `Array.prototype.sort` keeps
 * the server's order among ties.
 */
export function compareWorklist(a: WorklistSortable, b: WorklistSortable): number {
  if (a.rush !== b.rush) return a.rush ? -1 : 1
  if (a.promisedShipDate !== b.promisedShipDate) {
    if (a.promisedShipDate === null) return 1
    if (b.promisedShipDate === null) return -1
    return a.promisedShipDate < b.promisedShipDate ? -1 : 1
  }
  return Date.parse(a.waitingSince) - Date.parse(b.waitingSince)
}

/** Late: a promised ship date before `today` (both `YYYY-MM-DD`, the shop's report day). */
export function isLate(promisedShipDate: string | null, today: string): boolean {
  return promisedShipDate !== null && promisedShipDate < today
}

/** How long something has waited, as a bench reads it at a glance: `5 min`, `3 h 20 min`, `2 d 4 h`. */
export function formatWaited(sinceIso: string, now: Date): string {
  const minutes = Math.max(0, Math.floor((now.getTime() - Date.parse(sinceIso)) / 60_000))
  if (minutes < 60) return `${minutes} min`
  const hours = Math.floor(minutes / 60)
  if (hours < 24) return minutes % 60 === 0 ? `${hours} h` : `${hours} h ${minutes % 60} min`
  const days = Math.floor(hours / 24)
  return hours % 24 === 0 ? `${days} d` : `${days} d ${hours % 24} h`
}
