import { z } from 'zod'
import { BENCH_ACTION_ID_HEADER, BENCH_ACTION_TAKEN_AT_HEADER } from '@kitwright/shared/bench-actions'
import { ApiError, NetworkError, apiFetch } from '../api-client'
import { addAction, allActions, putAction, removeAction, type QueueBench, type QueuedAction } from './action-store'
import { newActionId } from './uuid'

/**
 * The bench's queue of actions. Every bench action (a tick, a measurement, a scan at the pack
 * bench, a leak test, a photo, a label) is kept in the tablet's IndexedDB first, with an id made
 * here, then sent; actions go one at a time in the order they were taken. When the network is
 * down they wait, and are sent when it is back (the `online` event, or a retry every 15 s); the
 * server applies each id once, so sending one twice (the answer was lost) does no harm. An action
 * the server refuses meanwhile (the unit was cancelled) is kept with its reason for the bench to
 * show to the person.
 */

/** What a screen gets back: the server's answer, or "kept on the tablet, not sent yet". */
export type Outcome<T> = { sent: true; data: T } | { sent: false; action: QueuedAction }

export interface BenchActionSpec {
  bench: QueueBench
  kind: string
  label: string
  path: string
  body?: unknown
  target?: Record<string, string>
  needsServer?: boolean
  photo?: Blob
}

export interface QueueState {
  /** Whether the tablet can reach the server: the browser's own idea, corrected by the last send. */
  online: boolean
  /** When the network last came back (ms), for "back online". */
  backOnlineAt: number | null
  /** Waiting and refused actions of every user of this tablet, oldest first. */
  actions: readonly QueuedAction[]
  /** How many actions went through from the queue (not while the person watched): screens refresh then. */
  replayed: number
  /**
   * Actions that went through in the last few seconds: the screens keep showing them as taken until
   * their own copy of the server's answer has caught up (a tick must not flash back to "not cut").
   */
  recent: readonly QueuedAction[]
  /** The last send stopped for want of the network or the server: what waits is shown as waiting. */
  stalled: boolean
  userId: string | null
}

const RETRY_MS = 15_000
/** How long an action that went through is still shown as taken (the screen's data catches up well within it). */
const RECENT_MS = 10_000
/** A send with no answer in this time counts as "no network" (a weak Wi-Fi can hang a request for minutes). */
const SEND_TIMEOUT_MS = 20_000

let state: QueueState = {
  online: typeof navigator === 'undefined' ? true : navigator.onLine,
  backOnlineAt: null,
  actions: [],
  recent: [],
  replayed: 0,
  stalled: false,
  userId: null,
}
const listeners = new Set<() => void>()

function update(patch: Partial<QueueState>) {
  state = { ...state, ...patch }
  for (const listener of listeners) listener()
}

/** For `useSyncExternalStore`. */
export function subscribeQueue(listener: () => void): () => void {
  listeners.add(listener)
  return () => listeners.delete(listener)
}
export function queueSnapshot(): QueueState {
  return state
}

function markOnline() {
  if (!state.online) update({ online: true, backOnlineAt: Date.now() })
}
function markOffline() {
  if (state.online) update({ online: false })
}

type Settled = { sent: true; data: unknown } | { sent: false }
const waiters = new Map<string, { resolve: (s: Settled) => void; reject: (e: unknown) => void }>()
let sendingId: string | null = null
let running: Promise<void> | null = null
let again = false
let started = false

/**
 * Starts the queue for the signed-in user (called by the app shell): reads what the tablet kept,
 * listens for the network, and sends what waits. Actions taken by someone else on this tablet wait
 * until they sign in again: the server records every action under the person who took it.
 */
export async function startBenchQueue(userId: string | null): Promise<void> {
  update({ userId })
  if (!started) {
    started = true
    window.addEventListener('online', () => {
      markOnline()
      void flushQueue()
    })
    window.addEventListener('offline', markOffline)
    window.setInterval(() => {
      if (state.actions.some((a) => a.state === 'waiting' && a.userId === state.userId)) void flushQueue()
    }, RETRY_MS)
  }
  update({ actions: await allActions() })
  await flushQueue()
}

/**
 * Keeps a bench action on the tablet, then sends it in its turn. Resolves with the server's answer
 * (parsed by `schema`) when it went through now, or with `sent: false` when it waits for the
 * network; rejects with the server's refusal when the server said no while the person watched.
 */
export async function submitBenchAction<S extends z.ZodType>(spec: BenchActionSpec, schema: S): Promise<Outcome<z.infer<S>>> {
  const userId = state.userId
  if (!userId) throw new Error('Sign in again: this tablet does not know who is working')
  const action = await addAction({
    id: newActionId(),
    userId,
    bench: spec.bench,
    kind: spec.kind,
    label: spec.label,
    path: spec.path,
    body: spec.body ?? {},
    takenAt: new Date().toISOString(),
    needsServer: spec.needsServer ?? false,
    target: spec.target ?? {},
    state: 'waiting',
    ...(spec.photo ? { photo: spec.photo } : {}),
  })
  update({ actions: [...state.actions, action] })
  const settled = new Promise<Settled>((resolve, reject) => waiters.set(action.id, { resolve, reject }))
  void flushQueue()
  const outcome = await settled
  return outcome.sent ? { sent: true, data: schema.parse(outcome.data) } : { sent: false, action }
}

/**
 * Takes back the latest waiting action that matches (an undo of a tick not sent yet): it is
 * dropped from the queue rather than sent and undone. False when none waits, or it is on its way.
 */
export async function cancelWaiting(match: (a: QueuedAction) => boolean): Promise<boolean> {
  const found = [...state.actions].reverse().find((a) => a.state === 'waiting' && a.userId === state.userId && a.id !== sendingId && match(a))
  if (!found?.seq) return false
  await removeAction(found.seq)
  update({ actions: state.actions.filter((a) => a.seq !== found.seq) })
  return true
}

/** The person has read a refusal: it leaves the tablet. */
export async function dismissAction(seq: number): Promise<void> {
  await removeAction(seq)
  update({ actions: state.actions.filter((a) => a.seq !== seq) })
}

const sentAt = new WeakMap<QueuedAction, number>()
let forgetTimer: number | null = null

/** Drops the recently sent actions once they are old enough (one timer at a time). */
function forgetRecentLater() {
  if (forgetTimer !== null) return
  forgetTimer = window.setTimeout(() => {
    forgetTimer = null
    const now = Date.now()
    const keep = state.recent.filter((a) => now - (sentAt.get(a) ?? 0) < RECENT_MS)
    if (keep.length !== state.recent.length) update({ recent: keep })
    if (keep.length > 0) forgetRecentLater()
  }, RECENT_MS)
}

/** Sends what waits, oldest first; one pass at a time (a call during a pass asks for another). */
export function flushQueue(): Promise<void> {
  if (running) {
    again = true
    return running
  }
  running = (async () => {
    try {
      do {
        again = false
        await sendWaiting()
      } while (again)
    } finally {
      running = null
    }
  })()
  return running
}

async function sendWaiting() {
  for (;;) {
    const next = state.actions.find((a) => a.state === 'waiting' && a.userId === state.userId)
    if (!next) {
      if (state.stalled) update({ stalled: false })
      return
    }
    if ((await sendOne(next)) === 'stop') {
      if (!state.stalled) update({ stalled: true })
      // Everything taken now waits too: the screens show it as kept, not as failed.
      for (const [id, waiter] of waiters) {
        waiters.delete(id)
        waiter.resolve({ sent: false })
      }
      return
    }
  }
}

/** 502–504: a proxy or the database is down, or the same action is being applied right now. */
function worthRetrying(err: unknown): boolean {
  if (err instanceof NetworkError) return true
  return err instanceof ApiError && [429, 502, 503, 504].includes(err.status)
}

async function sendOne(action: QueuedAction): Promise<'next' | 'stop'> {
  sendingId = action.id
  const waiter = waiters.get(action.id)
  try {
    const headers = { [BENCH_ACTION_ID_HEADER]: action.id, [BENCH_ACTION_TAKEN_AT_HEADER]: action.takenAt, 'x-kitwright-bench': action.bench }
    const signal = AbortSignal.timeout(SEND_TIMEOUT_MS)
    // The photo sender (and the build contract it reads) loads only when a photo is sent.
    const data = action.photo
      ? await (await import('./photo-upload')).sendPhoto(action, headers, signal)
      : await apiFetch(action.path, z.unknown(), { method: 'POST', body: action.body, headers, signal })
    await removeAction(action.seq!)
    const now = Date.now()
    const sent: QueuedAction = { ...action }
    delete sent.photo
    sentAt.set(sent, now)
    update({
      actions: state.actions.filter((a) => a.seq !== action.seq),
      recent: [...state.recent.filter((a) => now - (sentAt.get(a) ?? 0) < RECENT_MS), sent],
    })
    forgetRecentLater()
    markOnline()
    if (waiter) {
      waiters.delete(action.id)
      waiter.resolve({ sent: true, data })
    } else update({ replayed: state.replayed + 1 })
    return 'next'
  } catch (err) {
    if (worthRetrying(err)) {
      if (err instanceof NetworkError) markOffline()
      return 'stop'
    }
    // Signed out meanwhile: what the queue sends by itself waits for the person to sign in again.
    if (err instanceof ApiError && err.status === 401 && !waiter) return 'stop'
    markOnline()
    if (waiter) {
      // The person is looking: the screen says why, as it always has; nothing is left queued.
      waiters.delete(action.id)
      await removeAction(action.seq!)
      update({ actions: state.actions.filter((a) => a.seq !== action.seq) })
      waiter.reject(err)
    } else {
      const refused: QueuedAction = { ...action, state: 'refused', refusal: err instanceof Error ? err.message : String(err) }
      delete refused.photo
      await putAction(refused)
      update({ actions: state.actions.map((a) => (a.seq === action.seq ? refused : a)) })
    }
    return 'next'
  } finally {
    sendingId = null
  }
}
