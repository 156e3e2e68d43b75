import { createHash } from 'node:crypto'
import type { Request, RequestHandler } from 'express'
import { and, eq, isNull } from 'drizzle-orm'
import {
  BENCH_ACTION_ID_HEADER,
  BENCH_ACTION_REPLAYED_HEADER,
  BENCH_ACTION_TAKEN_AT_HEADER,
  BenchActionHeadersSchema,
  TAKEN_AT_MAX_AGE_MS,
  TAKEN_AT_MAX_AHEAD_MS,
} from '@kitwright/shared/bench-actions'
import type { Db } from '../db/client'
import { clientActions } from '../db/schema/index'
import { BadRequest, Conflict, Unavailable } from './http-errors'

/** The bench action a request carries: the tablet's id for it and when it was taken there. */
export interface BenchAction {
  id: string
  takenAt: Date
}

const actions = new WeakMap<Request, BenchAction>()

/** The bench action of this request, or null for an ordinary request (the office, a test). */
export function benchActionOf(req: Request): BenchAction | null {
  return actions.get(req) ?? null
}

/** A claim older than this with no answer is from a request that died half-way: the action is applied again. */
const STALE_CLAIM_MS = 60_000

/**
 * Answers that are not kept: the person was signed out or may not do it (signing in again, or a
 * manager, fixes that), too many requests, or the server failed. The action can then be sent again
 * under the same id. Every other answer, a refusal included, is the action's answer for good.
 */
function keepsAnswer(status: number): boolean {
  return status < 500 && status !== 401 && status !== 403 && status !== 429
}

/**
 * Applies each bench action once. A request without the action headers passes untouched. One with
 * them is checked (a malformed id or time is refused with what to fix), then claimed in
 * `client_actions` before its route runs; the route's answer is kept with the claim. The same id
 * sent again with the same content gets the kept answer (marked replayed) and changes nothing; the
 * same id with other content, or by another person, is refused and changes nothing.
 *
 * The claim and the route's own transaction are not one transaction: if the server dies between
 * them, the claim is taken over after a minute and the action applied again. The bench actions are
 * written to be safe to apply twice (a piece already cut stays cut once; a step ticked alike is
 * left as it is), so the worst case is an extra line in the audit trail.
 */
export function benchActions(db: Db): RequestHandler {
  return async (req, res, next) => {
    const rawId = req.get(BENCH_ACTION_ID_HEADER)
    const rawTakenAt = req.get(BENCH_ACTION_TAKEN_AT_HEADER)
    if (rawId === undefined && rawTakenAt === undefined) return next()
    if (req.method === 'GET' || req.method === 'HEAD') return next()
    // Not signed in: the route's access rule answers 401, and nothing is claimed.
    if (!req.user) return next()
    const parsed = BenchActionHeadersSchema.safeParse({ id: rawId ?? '', takenAt: rawTakenAt ?? '' })
    if (!parsed.success) {
      const fields: Record<string, string> = {}
      for (const issue of parsed.error.issues) {
        const header = issue.path[0] === 'id' ? BENCH_ACTION_ID_HEADER : BENCH_ACTION_TAKEN_AT_HEADER
        fields[header] ??= issue.message
      }
      throw new BadRequest(`This bench action cannot be applied: ${Object.values(fields).join('; ')}`, fields)
    }
    const id = parsed.data.id.toLowerCase()
    const takenAt = new Date(parsed.data.takenAt)
    const now = Date.now()
    if (takenAt.getTime() > now + TAKEN_AT_MAX_AHEAD_MS) {
      throw new BadRequest(
        `The tablet says this action was taken at ${takenAt.toISOString()}, later than now on the server; set the tablet's clock right, then do it again on the bench`,
        {
          [BENCH_ACTION_TAKEN_AT_HEADER]: 'Later than the server’s clock',
        },
      )
    }
    if (takenAt.getTime() < now - TAKEN_AT_MAX_AGE_MS) {
      throw new BadRequest(
        `This action was taken on ${takenAt.toISOString().slice(0, 10)}, more than 30 days ago; it is too old to apply now. Do it again on the bench if it still holds`,
        {
          [BENCH_ACTION_TAKEN_AT_HEADER]: 'More than 30 days old',
        },
      )
    }
    const path = req.originalUrl
    const fingerprint = createHash('sha256')
      .update(JSON.stringify([req.method, path, req.body ?? null]))
      .digest('hex')
    const user = req.user
    const bench = req.get('x-kitwright-bench') ?? null

    const [claimed] = await db
      .insert(clientActions)
      .values({ id, userId: user.id, method: req.method, path, fingerprint, takenAt, bench })
      .onConflictDoNothing()
      .returning({ id: clientActions.id })
    if (!claimed) {
      const [first] = await db.select().from(clientActions).where(eq(clientActions.id, id))
      if (!first) throw new Unavailable('This action was being applied and then let go; it is sent again in a moment')
      if (first.userId !== user.id || first.fingerprint !== fingerprint) {
        throw new Conflict(
          `The bench action id ${id} was already used for ${first.userId === user.id ? `another action (${first.method} ${first.path})` : "another person's action"}; nothing was changed. Every new action on the bench needs a new id`,
          { [BENCH_ACTION_ID_HEADER]: 'Already used for a different action' },
        )
      }
      if (first.status !== null) {
        res.set(BENCH_ACTION_REPLAYED_HEADER, '1')
        res.status(first.status).json(first.result)
        return
      }
      // Another request with this id is being applied right now: the bench sends it again shortly.
      if (now - first.receivedAt.getTime() < STALE_CLAIM_MS)
        throw new Unavailable('This action is being applied right now; the bench sends it again in a moment')
    }
    actions.set(req, { id, takenAt })

    // Keep the route's answer with the claim before it goes out, so a replay that follows at once finds it.
    const send = res.json.bind(res)
    let kept = false
    res.json = (body: unknown) => {
      kept = true
      const status = res.statusCode
      const settle = keepsAnswer(status)
        ? db
            .update(clientActions)
            .set({ status, result: body ?? null, answeredAt: new Date() })
            .where(eq(clientActions.id, id))
        : db.delete(clientActions).where(and(eq(clientActions.id, id), isNull(clientActions.answeredAt)))
      settle.then(
        () => send(body),
        (err: unknown) => {
          // The action itself went through or was refused: say so; only a replay will not find the answer.
          req.log.error({ err, clientActionId: id }, 'could not keep the answer to a bench action')
          send(body)
        },
      )
      return res
    }
    // An answer that is not JSON (a 204): keep its status, so a replay answers alike.
    res.on('finish', () => {
      if (kept) return
      const status = res.statusCode
      const settle = keepsAnswer(status)
        ? db.update(clientActions).set({ status, result: null, answeredAt: new Date() }).where(eq(clientActions.id, id))
        : db.delete(clientActions).where(and(eq(clientActions.id, id), isNull(clientActions.answeredAt)))
      settle.catch((err: unknown) => req.log.error({ err, clientActionId: id }, 'could not keep the answer to a bench action'))
    })
    next()
  }
}
