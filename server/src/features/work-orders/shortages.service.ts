import type { Shortages, ShortagesQuery } from '@kitwright/shared/work-orders'
import type { Db } from '../../db/client'
import { countOpenWorkOrders, selectShortages } from './shortages.queries'

/** What the open work orders need against what is reserved and free, per part (see selectShortages). */
export async function listShortages(db: Db, q: ShortagesQuery): Promise<Shortages> {
  const [rows, openWorkOrders] = await Promise.all([selectShortages(db, q), countOpenWorkOrders(db)])
  return {
    rows: rows.map((r) => ({ ...r, cutLength: r.cutLength === null ? null : Number(r.cutLength) })),
    openWorkOrders,
  }
}
