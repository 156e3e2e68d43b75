/**
 * Where a return is: waiting for the customer's parcel, back in the shop (received, to decide), or
 * decided: sent to the build bench for repair, replaced by a new unit, or a refund noted.
 */
export const RETURN_STATUSES = ['awaiting_parcel', 'received', 'repair', 'replace', 'refund'] as const
/** What the shop decided for a received return. */
export const RETURN_DECISIONS = ['repair', 'replace', 'refund'] as const
/**
 * What becomes of a returned unit the customer no longer gets back (replaced or refunded): kept whole
 * on the spares shelf under its serial (`spare`), or thrown away (`scrapped`, with a reason). The
 * stock ledger counts parts, not finished units, so neither changes it: the unit's parts left the
 * ledger when it first shipped, and a spare is kept on its build record, not added back as parts.
 */
export const RETURN_DISPOSITIONS = ['spare', 'scrapped'] as const

/**
 * Where the return label is: none bought, being bought (the purchase recorded with its idempotency
 * key and the carrier being asked), or bought.
 */
export const RETURN_LABEL_STATUSES = ['none', 'buying', 'bought'] as const

/** The shop's reasons until an owner sets its own list (settings). */
export const DEFAULT_RETURN_REASONS = ['Leaks', 'Arrived damaged', 'Missing part', 'Changed mind'] as const
