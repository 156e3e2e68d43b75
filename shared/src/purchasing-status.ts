/** The states of a purchase order, in the order it goes through them. */
export const PURCHASE_ORDER_STATUSES = ['draft', 'sent', 'partly_received', 'received', 'cancelled'] as const
/** A purchase order's state. */
export type PurchaseOrderStatus = (typeof PURCHASE_ORDER_STATUSES)[number]

/** One word (or two) per state, the same on screens, PDFs and e-mails. */
export const PURCHASE_ORDER_STATUS_WORDS: Record<PurchaseOrderStatus, string> = {
  draft: 'Draft',
  sent: 'Sent',
  partly_received: 'Partly received',
  received: 'Received',
  cancelled: 'Cancelled',
}

/** States whose goods are still on their way: they count as "on order" in shortages. */
export const OPEN_PURCHASE_ORDER_STATUSES = ['sent', 'partly_received'] as const
