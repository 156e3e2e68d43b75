import { lazy, Suspense, type ComponentType } from 'react'

/**
 * A chart whose drawing code (recharts, the largest library of the client) is fetched only when a
 * chart is shown, so no other page pays for it and the home page's figures show before it arrives.
 * The placeholder keeps the chart's height, so nothing jumps when it is drawn.
 */
export function lazyChart<P extends object>(load: () => Promise<ComponentType<P>>) {
  const Drawing = lazy(async () => ({ default: await load() }))
  return function LazyChart(props: P) {
    return (
      <Suspense fallback={<div className="flex h-72 items-center justify-center text-stone-500">Drawing the chart…</div>}>
        <Drawing {...props} />
      </Suspense>
    )
  }
}
