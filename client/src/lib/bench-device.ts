import { BENCH_DEVICES, type BenchDevice } from '@kitwright/shared/auth'

const KEY = 'kitwright.bench'

/** The bench this device stands at ("this tablet is the pack bench"), remembered in the browser; null for an office computer. */
export function deviceBench(): BenchDevice | null {
  try {
    const value = window.localStorage.getItem(KEY)
    return (BENCH_DEVICES as readonly string[]).includes(value ?? '') ? (value as BenchDevice) : null
  } catch (err) {
    // Storage switched off (a locked-down browser): the device is simply not remembered as a bench.
    if (err instanceof DOMException) return null
    throw err
  }
}

/** Remembers (or, with null, forgets) the bench this device stands at. */
export function setDeviceBench(bench: BenchDevice | null): void {
  if (bench) window.localStorage.setItem(KEY, bench)
  else window.localStorage.removeItem(KEY)
  window.dispatchEvent(new Event('kitwright:bench-device'))
}

/** Names of the benches as the screens say them. */
export const BENCH_NAMES: Record<BenchDevice, string> = { cut: 'cut bench', build: 'build bench', pack: 'pack bench' }
