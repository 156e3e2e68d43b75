import { useQueryClient } from '@tanstack/react-query'
import { useEffect, useState } from 'react'
import { dismissAction, startBenchQueue } from '../../lib/offline/bench-queue'
import { useBenchQueue, waitingOf } from '../../lib/offline/use-bench-queue'
import { Button } from './button'

const BACK_ONLINE_SHOWN_MS = 8_000

const clock = (iso: string) => new Date(iso).toLocaleTimeString([], { hour: '2-digit', minute: '2-digit', second: '2-digit' })
const actions = (n: number) => `${n} action${n === 1 ? '' : 's'}`

/**
 * The network as the bench sees it: offline (what is tapped is kept on the tablet), back online,
 * how many actions wait; each action that waits for the server (a leak test, a label, a photo) with
 * its badge; and every action the server refused when it was sent later, with why, until the
 * person has read it. Starts the tablet's queue for the signed-in person.
 */
export function OfflineBanner({ userId }: { userId: string }) {
  const queue = useBenchQueue()
  const qc = useQueryClient()
  const [now, setNow] = useState(() => Date.now())
  useEffect(() => {
    void startBenchQueue(userId)
  }, [userId])
  // Actions sent from the queue changed what the server has: every screen reads it again.
  useEffect(() => {
    if (queue.replayed > 0) void qc.invalidateQueries()
  }, [queue.replayed, qc])
  // While online, an action on its way for a moment is not news: only one held back by the network is.
  const waiting = queue.online && !queue.stalled ? [] : waitingOf(queue)
  const refused = queue.actions.filter((a) => a.state === 'refused' && a.userId === userId)
  const others = queue.actions.filter((a) => a.state === 'waiting' && a.userId !== userId).length
  const backOnline = queue.online && queue.backOnlineAt !== null && now - queue.backOnlineAt < BACK_ONLINE_SHOWN_MS
  useEffect(() => {
    if (queue.backOnlineAt === null) return
    setNow(Date.now())
    const timer = window.setTimeout(() => setNow(Date.now()), BACK_ONLINE_SHOWN_MS)
    return () => window.clearTimeout(timer)
  }, [queue.backOnlineAt])
  const forServer = waiting.filter((a) => a.needsServer)
  if (queue.online && waiting.length === 0 && refused.length === 0 && !backOnline && others === 0) return null
  return (
    <div className="sticky top-0 z-40 space-y-2 px-4 py-2">
      <div
        role="status"
        aria-label="Network"
        className={
          queue.online
            ? 'mx-auto max-w-7xl rounded-lg border-2 border-brand-700 bg-brand-50 px-4 py-3 text-xl text-brand-900'
            : 'mx-auto max-w-7xl rounded-lg border-4 border-amber-600 bg-amber-100 px-4 py-3 text-xl text-amber-950'
        }
      >
        {!queue.online ? (
          <p>
            <strong>Offline.</strong> What you tap is kept on this tablet and sent when the network is back.
            {waiting.length > 0 && <strong> {actions(waiting.length)} waiting.</strong>}
          </p>
        ) : waiting.length > 0 ? (
          <p>
            <strong>{actions(waiting.length)} waiting</strong> to be sent{backOnline ? ': back online, sending…' : '.'}
          </p>
        ) : backOnline ? (
          <p>
            <strong>Back online.</strong> Everything taken on this tablet has reached the server.
          </p>
        ) : null}
        {others > 0 && <p className="text-lg">{actions(others)} taken by someone else on this tablet wait for them to sign in here again.</p>}
        {waiting.length > forServer.length && (
          <details className="mt-1 text-lg">
            <summary className="min-h-12 cursor-pointer py-2 font-bold">What is kept on this tablet</summary>
            <ul aria-label="Kept on this tablet" className="space-y-1">
              {waiting
                .filter((a) => !a.needsServer)
                .map((a) => (
                  <li key={a.id}>
                    {a.label} <span className="text-stone-600">(taken {clock(a.takenAt)})</span>
                  </li>
                ))}
            </ul>
          </details>
        )}
        {forServer.length > 0 && (
          <ul aria-label="Waiting for the network" className="mt-2 space-y-1 text-lg">
            {forServer.map((a) => (
              <li key={a.id} className="flex flex-wrap items-center gap-2">
                <span className="rounded-md bg-amber-600 px-2 py-0.5 text-base font-bold text-white">waiting for the network</span>
                {a.label} <span className="text-stone-600">(taken {clock(a.takenAt)})</span>
              </li>
            ))}
          </ul>
        )}
      </div>
      {refused.length > 0 && (
        <div role="alert" aria-label="Refused actions" className="mx-auto max-w-7xl space-y-2 rounded-lg border-4 border-red-700 bg-red-50 px-4 py-3 text-xl text-red-950">
          <p className="font-bold">
            The server refused {actions(refused.length)} taken while the network was down. Nothing else was lost; check each on the bench:
          </p>
          <ul className="space-y-2">
            {refused.map((a) => (
              <li key={a.id} className="flex flex-wrap items-center gap-3">
                <span className="min-w-0 flex-1">
                  <strong>{a.label}</strong> (taken {clock(a.takenAt)}): {a.refusal}
                </span>
                <Button size="bench" variant="secondary" aria-label={`Seen: ${a.label}`} onClick={() => void dismissAction(a.seq!)}>
                  Seen
                </Button>
              </li>
            ))}
          </ul>
        </div>
      )}
    </div>
  )
}
