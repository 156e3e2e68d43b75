/** One prefixed line per set-up step, so a slow or failing step is easy to spot. */
export function step(message) {
  console.log(`[kitwright] ${message}`)
}
export function fail(message) {
  console.error(`[kitwright] ${message}`)
  process.exit(1)
}
