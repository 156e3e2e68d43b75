import { createRequire } from 'node:module'
import { pathToFileURL } from 'node:url'
import { Worker } from 'node:worker_threads'
import { NestingInputError } from '@kitwright/shared/domain/nesting/index'
import type { NestInput, NestOptions, NestPlan } from '@kitwright/shared/domain/nesting/index'
import type { NestingWorkerData, NestingWorkerReply } from './nesting-worker'

// The worker body is a TypeScript file. A small bootstrap registers tsx's ESM hooks inside the
// worker thread first, so it loads the same way under tsx (the server) and under vitest (tests).
const tsxApi = pathToFileURL(
  createRequire(import.meta.url).resolve('tsx/package.json').replace(/package\.json$/, 'dist/esm/api/index.mjs'),
).href
const workerFile = new URL('./nesting-worker.ts', import.meta.url).href
const bootstrap = `import(${JSON.stringify(tsxApi)}).then((tsx) => { tsx.register(); return import(${JSON.stringify(workerFile)}) })`
/** Extra time past the engine's own limit before the worker is stopped as hung. */
const GRACE_MS = 30_000

/**
 * Runs the nesting engine in a worker thread so the server keeps answering requests.
 * @returns the plan
 * @throws NestingInputError for input the engine rejects; Error for anything else
 */
export function runNesting(input: NestInput, options: NestOptions = {}): Promise<NestPlan> {
  const data: NestingWorkerData = { input, options }
  return new Promise<NestPlan>((resolve, reject) => {
    const worker = new Worker(bootstrap, { eval: true, workerData: data })
    let settled = false
    const finish = (fn: () => void): void => {
      if (settled) return
      settled = true
      clearTimeout(timer)
      fn()
      void worker.terminate()
    }
    const timer = setTimeout(
      () => finish(() => reject(new Error('Nesting worker did not answer in time'))),
      (options.timeLimitMs ?? 10_000) + GRACE_MS,
    )
    worker.once('message', (reply: NestingWorkerReply) => {
      finish(() => {
        if (reply.ok) resolve(reply.plan)
        else if (reply.error.name === 'NestingInputError') reject(new NestingInputError(reply.error.field ?? '', reply.error.message))
        else reject(new Error(reply.error.message))
      })
    })
    worker.once('error', (err) => finish(() => reject(err)))
    worker.once('exit', (code) => finish(() => reject(new Error(`Nesting worker stopped (exit code ${code}) without a plan`))))
  })
}
