import { PackCodeSchema, PackItemKeySchema, type PackItem, type PackView } from '@kitwright/shared/pack'
import type { QueuedAction } from '../../../lib/offline/action-store'

/** The pack bench's actions the packing list shows while they wait in the tablet's queue (a label shows in the banner). */
export const PACK_ACTIONS = ['pack.scan', 'pack.tick', 'pack.undo'] as const

/** What this tablet has done to an item and not yet had the server's answer for: put in the box, or taken out. */
export interface PackWaiting {
  put: 'in' | 'out'
  /** How it was put in (an undo counts as a tick). */
  method: 'scan' | 'tick'
  /** The scanned bin or serial, for a scan. */
  code: string | null
  /** When it was taken, by the tablet's clock. */
  at: string
}

/** An item as the bench shows it: the server's, with what waits on this tablet for it. */
export type ShownPackItem = PackItem & { waiting?: PackWaiting }
/** The pack view as the bench shows it. */
export type ShownPackView = Omit<PackView, 'items'> & { items: ShownPackItem[] }

/**
 * Whether a queued action is about this item, and which way: a tick or scan puts it in the box, an
 * undo takes it out. A scan names a unit (or spare pack) by its bin or serial, as the server reads
 * it (trimmed, upper case); never a bag.
 */
export function waitingDirection(item: PackItem, action: QueuedAction): 'in' | 'out' | null {
  if (action.kind === 'pack.scan') {
    const scanned = PackCodeSchema.safeParse(action.body)
    if (!scanned.success || item.kind === 'bag') return null
    const code = scanned.data.code.toUpperCase()
    return item.binCode === code || item.serial === code ? 'in' : null
  }
  if (action.kind === 'pack.tick' || action.kind === 'pack.undo') {
    const picked = PackItemKeySchema.safeParse(action.body)
    if (!picked.success || picked.data.itemKey !== item.key) return null
    return action.kind === 'pack.tick' ? 'in' : 'out'
  }
  return null
}

/**
 * The order's packing list as the bench should show it: the server's last answer (or, offline, the
 * last one kept) with this person's scans, ticks and undos that wait in the queue marked on their
 * items, so what went in the box offline shows as waiting to send, even after a reload. The last
 * action on an item decides; one the server's answer already agrees with shows as confirmed. An
 * item with a problem is left as it is: the server will refuse what waits for it.
 */
export function overlayWaiting(view: PackView, waiting: readonly QueuedAction[]): ShownPackView {
  const packing = view.shipment === null || view.shipment.status === 'packing'
  const mine = waiting.filter((a) => a.target.orderId === view.order.id && (PACK_ACTIONS as readonly string[]).includes(a.kind))
  if (!packing || mine.length === 0) return view
  let changed = false
  const items = view.items.map((item): ShownPackItem => {
    if (item.problem) return item
    const about = mine.flatMap((a) => {
      const put = waitingDirection(item, a)
      return put ? [{ a, put }] : []
    })
    const last = about.at(-1)
    if (!last) return item
    // Agreeing with the server is not news unless something the other way waits before it (an undo, then a tick again).
    const server = item.check ? 'in' : 'out'
    if (last.put === server && about.every((x) => x.put === server)) return item
    changed = true
    const code = last.a.kind === 'pack.scan' ? (PackCodeSchema.safeParse(last.a.body).data?.code.toUpperCase() ?? null) : null
    return { ...item, waiting: { put: last.put, method: last.a.kind === 'pack.scan' ? 'scan' : 'tick', code, at: last.a.takenAt } }
  })
  return changed ? { ...view, items } : view
}
