import { afterEach, beforeEach, vi } from 'vitest'

// console.error in a test fails it, unless the test expects it (it can mock console.error itself).
let errors: unknown[][] = []
beforeEach(() => {
  errors = []
  vi.spyOn(console, 'error').mockImplementation((...args: unknown[]) => {
    errors.push(args)
  })
})
afterEach(() => {
  const seen = errors
  vi.restoreAllMocks()
  if (seen.length > 0) throw new Error(`console.error was called:\n${seen.map((a) => a.map(String).join(' ')).join('\n')}`)
})
