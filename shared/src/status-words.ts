import type { OrderStage } from './order-stage'
import type { BIN_STATUSES, CUT_RUN_STATUSES, CUT_STICK_STATUSES } from './cut-runs-status'
import type { REVISION_STATUSES } from './kits'
import type { MAIL_STATUSES, ORDER_SOURCES, ORDER_STATUSES, PAYMENT_STATUSES, WORK_ORDER_STATUSES } from './orders-status'
import type { OFFCUT_STATUSES } from './stock'
import type { RETURN_DECISIONS, RETURN_DISPOSITIONS, RETURN_LABEL_STATUSES, RETURN_STATUSES } from './returns-status'

/**
 * The one word for each state, on every screen, CSV file and e-mail. A state that an order's stage
 * and its stored status share (an open order is "Received") has the same word in both.
 */

/** What each order status is called. `open` is an order received and not yet released. */
export const ORDER_STATUS_LABELS: Record<(typeof ORDER_STATUSES)[number], string> = {
  open: 'Received',
  released: 'Released',
  partially_shipped: 'Partly shipped',
  shipped: 'Shipped',
  cancelled: 'Cancelled',
}

/**
 * What each work order (unit) status is called. `built` is a unit finished at the build bench
 * (leak-tested) or a spare pack made up: "Built"; "Ready to pack" is the stage of an order whose
 * units are all built.
 */
export const WORK_ORDER_STATUS_LABELS: Record<(typeof WORK_ORDER_STATUSES)[number], string> = {
  waiting_cut: 'Waiting for cutting',
  cut: 'Cut',
  building: 'Building',
  rework: 'Rework',
  built: 'Built',
  packed: 'Packed',
  shipped: 'Shipped',
  cancelled: 'Cancelled',
}

/** What each stage of an order is called; the stages that are also order statuses take the status's word. */
export const ORDER_STAGE_LABELS: Record<OrderStage, string> = {
  received: ORDER_STATUS_LABELS.open,
  released: ORDER_STATUS_LABELS.released,
  in_production: 'In production',
  ready_to_pack: 'Ready to pack',
  partially_shipped: ORDER_STATUS_LABELS.partially_shipped,
  shipped: ORDER_STATUS_LABELS.shipped,
  on_hold: 'On hold',
  cancelled: ORDER_STATUS_LABELS.cancelled,
}

/** What each payment state the store reports is called. */
export const PAYMENT_STATUS_LABELS: Record<(typeof PAYMENT_STATUSES)[number], string> = {
  pending: 'Payment pending',
  paid: 'Paid',
  refunded: 'Refunded',
}

/** Where an order came from, in words. */
export const ORDER_SOURCE_LABELS: Record<(typeof ORDER_SOURCES)[number], string> = {
  store: 'Web store',
  csv: 'CSV import',
  phone: 'Phone or counter',
  replacement: 'Replacement for a return',
}

/** What each cut run status is called. */
export const CUT_RUN_STATUS_LABELS: Record<(typeof CUT_RUN_STATUSES)[number], string> = {
  draft: 'Draft',
  published: 'Published',
  done: 'All cut',
  cancelled: 'Cancelled',
}

/** Where one stick of a cut run is at the saw, in words. */
export const CUT_STICK_STATUS_LABELS: Record<(typeof CUT_STICK_STATUSES)[number], string> = {
  pending: 'To cut',
  in_progress: 'On the saw',
  done: 'Cut',
  damaged: 'Damaged',
}

/** Whether a bin is on the rack or travelling with a unit, in words. */
export const BIN_STATUS_LABELS: Record<(typeof BIN_STATUSES)[number], string> = {
  free: 'Free',
  in_use: 'Holding a unit',
}

/** Where an offcut is in its life, in words. */
export const OFFCUT_STATUS_LABELS: Record<(typeof OFFCUT_STATUSES)[number], string> = {
  in_stock: 'In stock',
  reserved: 'Reserved',
  used: 'Used',
  scrapped: 'Scrapped',
}

/** What each kit revision status is called. */
export const REVISION_STATUS_LABELS: Record<(typeof REVISION_STATUSES)[number], string> = {
  draft: 'Draft',
  released: 'Released',
  retired: 'Retired',
}

/** What each mail status is called. */
export const MAIL_STATUS_LABELS: Record<(typeof MAIL_STATUSES)[number], string> = {
  queued: 'Waiting to send',
  sent: 'Sent',
  failed: 'Gave up',
}

/**
 * What each return status is called: waiting for the customer's parcel, back in the shop and to be
 * decided, or the decision taken.
 */
export const RETURN_STATUS_LABELS: Record<(typeof RETURN_STATUSES)[number], string> = {
  awaiting_parcel: 'Waiting for the parcel',
  received: 'Back in the shop',
  repair: 'Sent for repair',
  replace: 'Replacement made',
  refund: 'Refund noted',
}

/** What each decision on a return is called, as the buttons and the record say it. */
export const RETURN_DECISION_LABELS: Record<(typeof RETURN_DECISIONS)[number], string> = {
  repair: 'Repair',
  replace: 'Replace',
  refund: 'Refund noted',
}

/** What became of a replaced or refunded unit, as the buttons and the build record say it. */
export const RETURN_DISPOSITION_LABELS: Record<(typeof RETURN_DISPOSITIONS)[number], string> = {
  spare: 'Back to stock as a spare',
  scrapped: 'Scrapped',
}

/** Where a return label is, in words. */
export const RETURN_LABEL_STATUS_LABELS: Record<(typeof RETURN_LABEL_STATUSES)[number], string> = {
  none: 'No label yet',
  buying: 'Buying the label',
  bought: 'Label bought',
}

/** A status as it reads inside a sentence: "Order 1001 is partly shipped". */
export function statusInSentence<K extends string>(labels: Record<K, string>, code: string): string {
  return wordFor(labels, code).toLowerCase()
}

/** The word for a code read from the database as plain text; an unknown code is shown as it is. */
export function wordFor<K extends string>(labels: Record<K, string>, code: string): string {
  return Object.hasOwn(labels, code) ? labels[code as K] : code
}
