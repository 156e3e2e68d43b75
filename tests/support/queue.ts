import { sql } from 'drizzle-orm'
import type { Db } from '../../server/src/db/client'
import { waitFor } from './store-webhook'

/**
 * Waits until the job queue has nothing left to do: no job waiting, waiting to be retried or running
 * (pg-boss's `created`, `retry` and `active` states). Count what the jobs did only after this, so a
 * duplicate that would land late is counted too; never sleep a fixed time instead.
 */
export async function waitForQueueIdle(db: Db, timeoutMs = 30_000): Promise<void> {
  await waitFor(
    'the job queue to be idle',
    async () => {
      const { rows } = await db.execute<{ n: number }>(sql`select count(*)::int as n from pgboss.job where state in ('created', 'retry', 'active')`)
      return rows[0]?.n === 0 ? true : undefined
    },
    timeoutMs,
  )
}
