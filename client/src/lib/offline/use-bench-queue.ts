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

/**
 * The signed-in person's actions of these kinds to show on the bench as taken, oldest first: those
 * waiting, and those sent in the last few seconds (until the screen's copy of the server's answer
 * has caught up, so a tick never flashes back).
 */
export function useWaitingActions(kinds: readonly string[]): QueuedAction[] {
  const state = useBenchQueue()
  return [...state.recent.filter((a) => a.userId === state.userId), ...waitingOf(state)].filter((a) => kinds.includes(a.kind))
}
