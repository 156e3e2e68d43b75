import type { ORDER_STATUSES, WORK_ORDER_STATUSES } from './orders-status'

/**
 * Where an order is in its life, as the orders list and detail show it. The stored order status
 * records what a person (or the store) decided: open (received), released, partly shipped, shipped,
 * cancelled; on hold is a planner's mark on top of it. In production and ready to pack are read from
 * the order's work orders, so they can never disagree with the benches.
 */
export const ORDER_STAGES = ['received', 'released', 'in_production', 'ready_to_pack', 'partially_shipped', 'shipped', 'on_hold', 'cancelled'] as const
/** Where an order is in its life. */
export type OrderStage = (typeof ORDER_STAGES)[number]

/** What each stage is called on screen (one map of words for every state: status-words.ts). */
export { ORDER_STAGE_LABELS } from './status-words'

/** Work order statuses past the cut bench's queue: the unit is being made. */
export const STARTED_WORK_ORDER_STATUSES = ['cut', 'building', 'rework', 'built', 'packed', 'shipped'] as const
/** Work order statuses of a finished unit: built and leak-tested (or a spare pack), packed or shipped. */
export const FINISHED_WORK_ORDER_STATUSES = ['built', 'packed', 'shipped'] as const

/**
 * The stage of an order from its status, its hold and the statuses of its work orders (cancelled ones
 * ignored). Cancelled and shipped win over a hold; a hold wins over the rest. A released order is
 * ready to pack when every unit is finished, in production once any unit is past waiting for cutting.
 */
export function orderStage(input: {
  status: (typeof ORDER_STATUSES)[number]
  onHold: boolean
  workOrderStatuses: readonly (typeof WORK_ORDER_STATUSES)[number][]
}): OrderStage {
  if (input.status === 'cancelled') return 'cancelled'
  if (input.status === 'shipped') return 'shipped'
  if (input.onHold) return 'on_hold'
  if (input.status === 'partially_shipped') return 'partially_shipped'
  if (input.status === 'open') return 'received'
  const live = input.workOrderStatuses.filter((s) => s !== 'cancelled')
  const finished = new Set<string>(FINISHED_WORK_ORDER_STATUSES)
  const started = new Set<string>(STARTED_WORK_ORDER_STATUSES)
  if (live.length > 0 && live.every((s) => finished.has(s))) return 'ready_to_pack'
  if (live.some((s) => started.has(s))) return 'in_production'
  return 'released'
}
