import { describe, expect, it } from 'vitest'
import type { NestPlan } from '@kitwright/shared/domain/nesting/index'
import { sumPlans } from './plan-rows'

/** Just the parts of a plan `sumPlans` reads. */
function plan(status: NestPlan['status'], solverUnavailable: string | null): NestPlan {
  const totals = { stockCost: 10, sticksUsed: 1, offcutsUsed: 0, offcutsMade: 0, lengthUsed: 10, pieceLength: 8, kerfLoss: 0, trimLoss: 0, offcutLength: 0, scrapLength: 2 }
  return { status, totals, bounds: { cost: 10, sticks: 1 }, seconds: 0.5, stats: { solverUnavailable } } as unknown as NestPlan
}

describe('sumPlans', () => {
  it('keeps why a part had no solver, so the run page can say its plan is unproven', () => {
    const run = sumPlans([{ partId: 'a', plan: plan('optimal', null) }, { partId: 'b', plan: plan('feasible', 'highs.wasm could not be read') }])
    expect(run.solverNote).toBe('highs.wasm could not be read')
    expect(run.planStatus).toBe('feasible')
    expect(run.sticksUsed).toBe(2)
  })

  it('has no note when every part had its solver', () => {
    expect(sumPlans([{ partId: 'a', plan: plan('optimal', null) }]).solverNote).toBeNull()
  })
})
