/**
 * Where a shipment is: being packed, buying (the label purchase is recorded with its idempotency key
 * and the carrier is being asked), labelled (the carrier sold a label), or gone.
 */
export const SHIPMENT_STATUSES = ['packing', 'buying', 'labelled', 'shipped'] as const
/** Where a bought label is: bought, or voided (its refund asked of the carrier). */
export const LABEL_STATUSES = ['bought', 'voided'] as const
/** How an item was confirmed at the pack bench: scanned, or ticked by hand. */
export const PACK_CHECK_METHODS = ['scan', 'tick'] as const
