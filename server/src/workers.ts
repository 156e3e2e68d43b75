import type { Deps } from './deps'
import { deliverMail, sweepFailedMail } from './features/mail/mail.service'
import { processStoreEvent } from './features/webhooks/store-event.processor'

/** What the job workers need: no HTTP, no sessions. */
export type WorkerDeps = Pick<Deps, 'db' | 'jobs' | 'mail' | 'logger'>

/**
 * Registers a handler for every queue, and the periodic failed-mail sweep, in this process. The API
 * process does it unless RUN_WORKERS=false. Returns a function that stops the sweep.
 */
export async function startWorkers(deps: WorkerDeps, options: { mailSweepMs?: number } = {}) {
  await deps.jobs.work('store-event', (data) => processStoreEvent(deps, data.storeEventId))
  await deps.jobs.work('send-mail', (data, job) => deliverMail(deps, data.mailId, job))
  return startMailSweep(deps, options.mailSweepMs)
}

/** How often the sweep puts e-mail that failed for good back in the queue. */
export const MAIL_SWEEP_MS = 10 * 60 * 1000

/**
 * Runs `sweepFailedMail` every `everyMs` in this process, so mail that ran out of retries during a
 * long relay outage goes out once the relay is back. Safe in every process at once (the requeue is
 * one atomic update per message). Returns a stop function.
 */
export function startMailSweep(deps: WorkerDeps, everyMs = MAIL_SWEEP_MS): () => void {
  const timer = setInterval(() => {
    sweepFailedMail(deps).catch((err: unknown) => deps.logger.warn({ err }, 'the failed-mail sweep could not run; it tries again next round'))
  }, everyMs)
  timer.unref()
  return () => clearInterval(timer)
}
