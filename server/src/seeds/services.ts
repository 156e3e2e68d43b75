/**
 * The demo seeds' one door into the server: the database handle, the tables they fill and the feature
 * services they call. Seeds import from here and nowhere else in server/src, so a feature can change
 * its insides without the demo data noticing; a seed that needs a new service adds one line here.
 */
export type { Db } from '../db/client'
export type { SessionUser } from '../lib/auth'
export * as tables from '../db/schema/index'
export type { NewStockMoveRow } from '../db/schema/index'
export { createBins } from '../features/bins/bins.service'
export { createKit, newRevision, releaseRevision, saveRevision } from '../features/kits/kits.service'
export { addOrderEvent, createOrder } from '../features/orders/orders.service'
export type { Actor } from '../features/stock/stock.service'
export { hashSecret } from '../features/users/users.service'
export { openReturn } from '../features/returns/returns.service'
export { releaseOrder } from '../features/work-orders/release.service'
