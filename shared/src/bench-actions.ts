import { z } from 'zod'

/**
 * A bench action (a tick, a measurement, a scan at the pack bench…) may be taken while the tablet
 * has no network; it then waits in the tablet's queue and is sent later. It carries an id made on
 * the tablet and the time it was taken, in these two headers. The server applies each id once and
 * answers a replay of it with the first answer.
 */
export const BENCH_ACTION_ID_HEADER = 'x-kitwright-action-id'
/** When the person took the action on the bench (ISO 8601, the tablet's clock). */
export const BENCH_ACTION_TAKEN_AT_HEADER = 'x-kitwright-taken-at'
/** Set on an answer that repeats the first answer to the same action id. */
export const BENCH_ACTION_REPLAYED_HEADER = 'x-kitwright-replayed'

/** How far ahead of the server's clock a tablet's clock may run before its time is refused. */
export const TAKEN_AT_MAX_AHEAD_MS = 5 * 60 * 1000
/** How old a queued action may be: older ones are refused (a tablet left in a drawer for a season). */
export const TAKEN_AT_MAX_AGE_MS = 30 * 24 * 60 * 60 * 1000

/** The two headers of a bench action, as the server reads them. */
export const BenchActionHeadersSchema = z.object({
  id: z.uuid({ error: 'The bench action id must be a UUID made by the tablet (e.g. 3f2b…-…); send the action again from the bench' }),
  takenAt: z.iso.datetime({ offset: true, error: 'When the action was taken must be an ISO 8601 time, e.g. 2026-12-04T10:15:00Z' }),
})
/** The two headers of a bench action. */
export type BenchActionHeaders = z.infer<typeof BenchActionHeadersSchema>
