import { useSyncExternalStore } from 'react'
import type { BenchDevice } from '@kitwright/shared/auth'
import { BENCH_NAMES, deviceBench, setDeviceBench } from '../../lib/bench-device'
import { cn } from '../../lib/cn'

function subscribe(onChange: () => void) {
  window.addEventListener('kitwright:bench-device', onChange)
  window.addEventListener('storage', onChange)
  return () => {
    window.removeEventListener('kitwright:bench-device', onChange)
    window.removeEventListener('storage', onChange)
  }
}

/** The bench this device stands at, kept current when it is changed here or in another tab. */
export function useDeviceBench(): BenchDevice | null {
  return useSyncExternalStore(subscribe, deviceBench, () => null)
}

/**
 * "This tablet is the pack bench": one tap makes the device remember its bench, so its sign-in
 * screen lists this bench's people and the audit records sign-ins here under this bench.
 */
export function BenchDeviceToggle({ bench }: { bench: BenchDevice }) {
  const current = useDeviceBench()
  const mine = current === bench
  return (
    <button
      type="button"
      aria-pressed={mine}
      onClick={() => setDeviceBench(mine ? null : bench)}
      className={cn(
        'inline-flex min-h-12 items-center gap-2 rounded-md border-2 px-4 text-lg font-bold',
        mine ? 'border-brand-700 bg-brand-50 text-brand-900' : 'border-stone-400 bg-white text-stone-800',
      )}
    >
      <span aria-hidden className="text-2xl">{mine ? '☑' : '☐'}</span>
      This tablet is the {BENCH_NAMES[bench]}
    </button>
  )
}
