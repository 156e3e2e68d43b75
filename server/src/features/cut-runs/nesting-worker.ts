// Worker thread body: runs the nesting engine off the request thread (HiGHS blocks while it
// solves). Receives { input, options } as workerData and posts back one NestingWorkerReply.
import { parentPort, workerData } from 'node:worker_threads'
import { nest, NestingInputError } from '@kitwright/shared/domain/nesting/index'
import type { NestInput, NestOptions, NestPlan } from '@kitwright/shared/domain/nesting/index'

/** What the worker receives. */
export interface NestingWorkerData {
  input: NestInput
  options: NestOptions
}

/** What the worker posts back, once. */
export type NestingWorkerReply =
  | { ok: true; plan: NestPlan }
  | { ok: false; error: { name: string; message: string; field?: string } }

async function run(): Promise<void> {
  const port = parentPort
  if (!port) throw new Error('nesting-worker.ts must run as a worker thread')
  const data = workerData as NestingWorkerData
  let reply: NestingWorkerReply
  try {
    reply = { ok: true, plan: await nest(data.input, data.options) }
  } catch (err) {
    if (err instanceof NestingInputError) {
      reply = { ok: false, error: { name: err.name, message: err.message, field: err.field } }
    } else {
      const e = err instanceof Error ? err : new Error(String(err))
      reply = { ok: false, error: { name: e.name, message: e.message } }
    }
  }
  port.postMessage(reply)
}

void run()
