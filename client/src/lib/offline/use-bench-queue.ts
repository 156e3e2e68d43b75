import { useSyncExternalStore } from 'react'
import type { QueuedAction } from './action-store'
import { queueSnapshot, subscribeQueue, type QueueState } from './bench-queue'

/** The queue as it stands: network, waiting and refused actions; re-renders on every change. */
export function useBenchQueue(): QueueState {
  return useSyncExternalStore(subscribeQueue, queueSnapshot)
}

/** The signed-in person's actions still waiting to be sent, oldest first. */
export function waitingOf(state: QueueState): QueuedAction[] {
  return state.actions.filter((a) => a.state === 'waiting' && a.userId === state.userId)
}

/** The signed-in person's waiting actions of these kinds (to show them on the bench as taken). */
export function useWaitingActions(kinds: readonly string[]): QueuedAction[] {
  return waitingOf(useBenchQueue()).filter((a) => kinds.includes(a.kind))
}
