import { useCallback, useEffect, useRef, useState } from 'react'

/** What a bench does with one scanned code; a promise keeps the next code waiting until it settles. */
export type ScanHandler = (code: string) => unknown

export interface ScanQueueState {
  /** A code is being handled now. */
  busy: boolean
  /** Codes scanned while one was being handled, waiting their turn. */
  waiting: number
  /** Why the last code failed, when its handler threw and did not show the problem itself. */
  error: string | null
}

/**
 * Scans in order, none lost: a keyboard-wedge scanner types faster than a request comes back, so
 * every code goes into a queue and is handled one after the other, each once the one before it has
 * settled. The handler always runs in its newest version (it may read state the last answer changed).
 */
export function useScanQueue(handler: ScanHandler) {
  const latest = useRef(handler)
  useEffect(() => {
    latest.current = handler
  })
  const queue = useRef<string[]>([])
  const running = useRef(false)
  const [state, setState] = useState<ScanQueueState>({ busy: false, waiting: 0, error: null })

  const drain = useCallback(async () => {
    if (running.current) return
    running.current = true
    setState((s) => ({ ...s, busy: true }))
    while (queue.current.length > 0) {
      const code = queue.current.shift()!
      setState((s) => ({ ...s, waiting: queue.current.length }))
      try {
        await latest.current(code)
      } catch (e) {
        // The bench did not show this failure itself: show it beside the scan field.
        const message = e instanceof Error ? e.message : String(e)
        setState((s) => ({ ...s, error: `${code}: ${message}` }))
      }
      // Let the answer render before the next code is handled, so its handler sees it.
      await new Promise((resolve) => setTimeout(resolve, 0))
    }
    running.current = false
    setState((s) => ({ ...s, busy: false, waiting: 0 }))
  }, [])

  const enqueue = useCallback(
    (code: string) => {
      queue.current.push(code)
      setState((s) => ({ ...s, error: null, waiting: queue.current.length }))
      void drain()
    },
    [drain],
  )
  return { enqueue, ...state }
}
