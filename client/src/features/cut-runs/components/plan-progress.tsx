import { useEffect, useState } from 'react'

/** While the engine runs on the server: a bar that fills towards the time limit, and the seconds so far. */
export function PlanProgress({ limitSeconds }: { limitSeconds: number }) {
  const [started] = useState(() => Date.now())
  const [now, setNow] = useState(started)
  useEffect(() => {
    const timer = setInterval(() => setNow(Date.now()), 200)
    return () => clearInterval(timer)
  }, [])
  const seconds = (now - started) / 1000
  const percent = Math.min(99, Math.round((seconds / (limitSeconds + 2)) * 100))
  return (
    <div role="status" aria-live="polite" className="space-y-2 rounded-lg border border-brand-600 bg-brand-50 p-4">
      <p className="font-bold">Nesting the pieces… {seconds.toFixed(1)} s (at most about {limitSeconds} s)</p>
      <div className="h-3 overflow-hidden rounded bg-white" role="progressbar" aria-label="Nesting progress" aria-valuemin={0} aria-valuemax={100} aria-valuenow={percent}>
        <div className="h-full bg-brand-600 transition-[width]" style={{ width: `${percent}%` }} />
      </div>
    </div>
  )
}
