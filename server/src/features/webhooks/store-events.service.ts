import type { StoreEvent } from '@kitwright/shared/store-events'
import type { Deps } from '../../deps'
import { storeEvents } from '../../db/schema/index'

/**
 * Stores one accepted delivery and enqueues its processing in the same transaction: the job exists
 * exactly when the stored event does, so a crash between the two cannot lose an event. A delivery
 * whose event id is already stored creates nothing and reports itself a duplicate.
 */
export async function receiveStoreEvent(deps: Pick<Deps, 'db' | 'jobs'>, event: StoreEvent, payload: unknown): Promise<{ duplicate: boolean }> {
  return deps.db.transaction(async (tx) => {
    const [row] = await tx
      .insert(storeEvents)
      .values({ eventId: event.eventId, type: event.type, orderNumber: event.orderNumber, payload })
      .onConflictDoNothing({ target: storeEvents.eventId })
      .returning({ id: storeEvents.id })
    if (!row) return { duplicate: true }
    await deps.jobs.send('store-event', { storeEventId: row.id }, { singletonKey: event.eventId, tx })
    return { duplicate: false }
  })
}
