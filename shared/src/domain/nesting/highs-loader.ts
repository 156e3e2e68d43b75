import type { Highs } from 'highs'

let loading: Promise<Highs> | null = null

/**
 * Loads the HiGHS WebAssembly solver once per thread (≈ 80 ms) and shares it. HiGHS is
 * single-threaded and blocks while it solves, so servers call the engine from a worker.
 */
export function loadHighs(): Promise<Highs> {
  if (!loading) {
    loading = import('highs').then((mod) => mod.default()).catch((err: unknown) => {
      loading = null
      throw err
    })
  }
  return loading
}
