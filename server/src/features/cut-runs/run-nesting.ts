import type { NestInput, NestOptions, NestPlan } from '@kitwright/shared/domain/nesting/index'
import { NestingPool } from './nesting-pool'

/** The process's pool of nesting workers (created on first use). */
let pool: NestingPool | null = null

/** The shared nesting pool of this process. */
export function nestingPool(): NestingPool {
  pool ??= new NestingPool()
  return pool
}

/**
 * Runs the nesting engine in a worker of the process's pool so the server keeps answering
 * requests and several cut runs plan at once.
 * @returns the plan
 * @throws NestingInputError for input the engine rejects; Error for anything else
 */
export async function runNesting(input: NestInput, options: NestOptions = {}): Promise<NestPlan> {
  const plan = await nestingPool().run(input, options)
  if (plan.stats.solverUnavailable) console.warn(`[nesting] the LP solver could not be loaded (${plan.stats.solverUnavailable}); this plan is the greedy one, without proof`)
  return plan
}
