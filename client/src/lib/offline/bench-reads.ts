/** The service worker's cache of the bench reads (its name is set in client/vite.config.ts). */
const BENCH_READS_CACHE = 'kitwright-bench-reads'

/**
 * Drops the service worker's copies of the bench reads at sign-out, so the next person on the
 * tablet sees only their own. Its own small module: the sign-in page loads it without the queue.
 */
export async function forgetBenchReads(): Promise<void> {
  if (typeof caches !== 'undefined') await caches.delete(BENCH_READS_CACHE)
}
