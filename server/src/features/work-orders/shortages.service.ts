import type { Shortages, ShortagesQuery } from '@kitwright/shared/work-orders'
import type { Db } from '../../db/client'
import { countOpenDemand, selectShortages } from './shortages.queries'

/** What the open demand needs against what is reserved and free, per part (see selectShortages). */
export async function listShortages(db: Db, q: ShortagesQuery): Promise<Shortages> {
  const [rows, counts] = await Promise.all([selectShortages(db, q), countOpenDemand(db)])
  return {
    rows: rows.map((r) => ({ ...r, cutLength: r.cutLength === null ? null : Number(r.cutLength) })),
    ...counts,
  }
}
