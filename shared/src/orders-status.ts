/** Where an order is: received from the store, released into work orders, shipped, or cancelled. */
export const ORDER_STATUSES = ['open', 'released', 'partially_shipped', 'shipped', 'cancelled'] as const
/** The payment state the store reports; Kitwright takes no payments itself. */
export const PAYMENT_STATUSES = ['pending', 'paid', 'refunded'] as const
/** Where an order came from; `replacement` is an order a return's decision made (a new unit for a returned one). */
export const ORDER_SOURCES = ['store', 'csv', 'phone', 'replacement'] as const
/** Where one unit (work order) is on its way from the cut bench to the customer. */
export const WORK_ORDER_STATUSES = ['waiting_cut', 'cut', 'building', 'rework', 'built', 'packed', 'shipped', 'cancelled'] as const
/** The life of an e-mail in the outbox. */
export const MAIL_STATUSES = ['queued', 'sent', 'failed'] as const
/** How urgent an order is; a planner sets it and rush orders sort first. */
export const ORDER_PRIORITIES = ['normal', 'rush'] as const
