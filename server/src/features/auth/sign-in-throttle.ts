import { and, count, eq, gt, lt, min } from 'drizzle-orm'
import type { Db } from '../../db/client'
import { signInFailures } from '../../db/schema/index'
import { TooManyRequests } from '../../lib/http-errors'

/** Failures allowed per account and address inside the window before sign-in is refused. */
export const MAX_FAILURES = 5
export const WINDOW_MINUTES = 15

/** `who` names the account in the message: the e-mail, or the display name where the screen shows names only. */
export async function assertNotThrottled(db: Db, email: string, address: string, now = new Date(), who = email) {
  const since = new Date(now.getTime() - WINDOW_MINUTES * 60_000)
  const [row] = await db
    .select({ failures: count(), oldest: min(signInFailures.failedAt) })
    .from(signInFailures)
    .where(and(eq(signInFailures.email, email), eq(signInFailures.address, address), gt(signInFailures.failedAt, since)))
  if (row && row.failures >= MAX_FAILURES && row.oldest) {
    const waitMs = row.oldest.getTime() + WINDOW_MINUTES * 60_000 - now.getTime()
    const minutes = Math.max(1, Math.ceil(waitMs / 60_000))
    throw new TooManyRequests(
      `Too many failed sign-ins for ${who} from this device. Try again in ${minutes} minute${minutes === 1 ? '' : 's'}, or ask the owner to reset your password or PIN.`,
    )
  }
}

export async function recordFailure(db: Db, email: string, address: string, now = new Date()) {
  await db.delete(signInFailures).where(lt(signInFailures.failedAt, new Date(now.getTime() - WINDOW_MINUTES * 60_000)))
  await db.insert(signInFailures).values({ email, address, failedAt: now })
}

export async function clearFailures(db: Db, email: string, address: string) {
  await db.delete(signInFailures).where(and(eq(signInFailures.email, email), eq(signInFailures.address, address)))
}
