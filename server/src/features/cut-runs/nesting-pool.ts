import { createRequire } from 'node:module'
import { availableParallelism } from 'node:os'
import { pathToFileURL } from 'node:url'
import { Worker } from 'node:worker_threads'
import { NestingInputError } from '@kitwright/shared/domain/nesting/index'
import type { NestInput, NestOptions, NestPlan } from '@kitwright/shared/domain/nesting/index'
import type { NestingTask, NestingWorkerReply } from './nesting-worker'

// The worker body is a TypeScript file. A small bootstrap registers tsx's ESM hooks inside the
// worker thread first, so it loads the same way under tsx (the server) and under vitest (tests).
const tsxApi = pathToFileURL(
  createRequire(import.meta.url).resolve('tsx/package.json').replace(/package\.json$/, 'dist/esm/api/index.mjs'),
).href
const workerFile = new URL('./nesting-worker.ts', import.meta.url).href
const bootstrap = `import(${JSON.stringify(tsxApi)}).then((tsx) => { tsx.register(); return import(${JSON.stringify(workerFile)}) })`
/** Extra time past the engine's own limit before a worker is stopped as hung (and replaced). */
const GRACE_MS = 30_000

interface Job {
  task: NestingTask
  resolve: (plan: NestPlan) => void
  reject: (err: Error) => void
}

interface Slot {
  worker: Worker
  job: Job | null
  timer: NodeJS.Timeout | null
}

/**
 * A small pool of nesting worker threads, sized to the machine: plans for several cut runs run at
 * once, one per worker, and the API thread never blocks on the solver. Extra plans wait in line.
 * Idle workers do not keep the process alive; a worker that hangs past its time limit (plus a
 * grace) or dies is replaced, and only its own plan fails.
 */
export class NestingPool {
  readonly size: number
  private readonly slots: Slot[] = []
  private readonly queue: Job[] = []
  private nextId = 1

  /** @param size workers (default: the machine's cores, at least 2) */
  constructor(size = Math.max(2, availableParallelism())) {
    this.size = size
  }

  /** Plans in a worker; rejects with NestingInputError for input the engine refuses. */
  run(input: NestInput, options: NestOptions): Promise<NestPlan> {
    return new Promise<NestPlan>((resolve, reject) => {
      this.queue.push({ task: { id: this.nextId++, input, options }, resolve, reject })
      this.pump()
    })
  }

  /** Workers busy now, and plans waiting for one. */
  load(): { busy: number; waiting: number } {
    return { busy: this.slots.filter((s) => s.job).length, waiting: this.queue.length }
  }

  /** Stops every worker (plans in progress fail). */
  async close(): Promise<void> {
    const slots = this.slots.splice(0)
    for (const job of this.queue.splice(0)) job.reject(new Error('The nesting pool was closed'))
    await Promise.all(slots.map((s) => this.retire(s, new Error('The nesting pool was closed'))))
  }

  private pump(): void {
    while (this.queue.length > 0) {
      let slot = this.slots.find((s) => !s.job)
      if (!slot && this.slots.length < this.size) slot = this.spawn()
      if (!slot) return
      const job = this.queue.shift()
      if (!job) return
      this.start(slot, job)
    }
  }

  private spawn(): Slot {
    const worker = new Worker(bootstrap, { eval: true })
    const slot: Slot = { worker, job: null, timer: null }
    worker.on('message', (reply: NestingWorkerReply) => {
      const job = slot.job
      if (!job || reply.id !== job.task.id) return
      this.finish(slot)
      if (reply.ok) job.resolve(reply.plan)
      else if (reply.error.name === 'NestingInputError') job.reject(new NestingInputError(reply.error.field ?? '', reply.error.message))
      else job.reject(new Error(reply.error.message))
      this.pump()
    })
    const lost = (err: Error): void => {
      const i = this.slots.indexOf(slot)
      if (i >= 0) this.slots.splice(i, 1)
      const job = slot.job
      this.finish(slot)
      job?.reject(err)
      this.pump()
    }
    worker.on('error', (err) => lost(err))
    worker.on('exit', (code) => lost(new Error(`Nesting worker stopped (exit code ${code}) without a plan`)))
    worker.unref()
    this.slots.push(slot)
    return slot
  }

  private start(slot: Slot, job: Job): void {
    slot.job = job
    slot.worker.ref()
    slot.timer = setTimeout(() => {
      const i = this.slots.indexOf(slot)
      if (i >= 0) this.slots.splice(i, 1)
      void this.retire(slot, new Error('Nesting worker did not answer in time'))
      this.pump()
    }, (job.task.options.timeLimitMs ?? 2_000) + GRACE_MS)
    slot.worker.postMessage(job.task)
  }

  private finish(slot: Slot): void {
    if (slot.timer) clearTimeout(slot.timer)
    slot.timer = null
    slot.job = null
    slot.worker.unref()
  }

  private async retire(slot: Slot, err: Error): Promise<void> {
    const job = slot.job
    this.finish(slot)
    slot.worker.removeAllListeners('exit')
    slot.worker.removeAllListeners('error')
    job?.reject(err)
    await slot.worker.terminate()
  }
}
