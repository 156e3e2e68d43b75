import type { Deps } from './deps'
import { deliverMail } from './features/mail/mail.service'
import { processStoreEvent } from './features/webhooks/store-event.processor'

/** What the job workers need: no HTTP, no sessions. */
export type WorkerDeps = Pick<Deps, 'db' | 'jobs' | 'mail' | 'logger'>

/** Registers a handler for every queue, in this process. The API process does it unless RUN_WORKERS=false. */
export async function startWorkers(deps: WorkerDeps) {
  await deps.jobs.work('store-event', (data) => processStoreEvent(deps, data.storeEventId))
  await deps.jobs.work('send-mail', (data, job) => deliverMail(deps, data.mailId, job))
}
