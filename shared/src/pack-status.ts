/** Where a shipment is: being packed, labelled (the carrier sold a label), or gone. */
export const SHIPMENT_STATUSES = ['packing', 'labelled', 'shipped'] as const
/** How an item was confirmed at the pack bench: scanned, or ticked by hand. */
export const PACK_CHECK_METHODS = ['scan', 'tick'] as const
