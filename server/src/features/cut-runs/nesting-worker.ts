// Worker thread body: runs the nesting engine off the request thread (HiGHS blocks while it
// solves). A worker of the pool (nesting-pool.ts) lives on between plans, so HiGHS loads once per
// worker: it receives { id, input, options } messages and answers each with one NestingWorkerReply.
import { parentPort } from 'node:worker_threads'
import { nest, NestingInputError } from '@kitwright/shared/domain/nesting/index'
import type { NestInput, NestOptions, NestPlan } from '@kitwright/shared/domain/nesting/index'

/** One plan asked of a worker. */
export interface NestingTask {
  id: number
  input: NestInput
  options: NestOptions
}

/** What the worker posts back for a task. */
export type NestingWorkerReply = { id: number } & (
  | { ok: true; plan: NestPlan }
  | { ok: false; error: { name: string; message: string; field?: string } }
)

async function run(task: NestingTask): Promise<NestingWorkerReply> {
  try {
    return { id: task.id, ok: true, plan: await nest(task.input, task.options) }
  } catch (err) {
    if (err instanceof NestingInputError) return { id: task.id, ok: false, error: { name: err.name, message: err.message, field: err.field } }
    const e = err instanceof Error ? err : new Error(String(err))
    return { id: task.id, ok: false, error: { name: e.name, message: e.message } }
  }
}

const port = parentPort
if (!port) throw new Error('nesting-worker.ts must run as a worker thread')
port.on('message', (task: NestingTask) => {
  void run(task).then((reply) => port.postMessage(reply))
})
