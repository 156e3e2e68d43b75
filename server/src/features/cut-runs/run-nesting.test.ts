import { describe, expect, it } from 'vitest'
import { NestingInputError } from '@kitwright/shared/domain/nesting/index'
import { NestingPool } from './nesting-pool'
import { runNesting } from './run-nesting'

describe('runNesting (worker thread)', { timeout: 60_000 }, () => {
  it('plans a cut run in a worker and returns the plan', async () => {
    // Hand-worked: 10 ft = 120 in sticks, base unit 1/1000 in, kerf 1/8 in (125).
    // Four 29 in pieces take 4 × 29 000 + 3 × 125 = 116 375 <= 120 000, so one stick holds them;
    // six pieces need two sticks (continuous bound: 6 × 29 125 / 120 125 > 1).
    // An explicit time limit (a budget, not a target): the default 2 s on a busy machine must not decide whether it is proven.
    const plan = await runNesting({ pieces: [{ length: 29_000, quantity: 6, workOrderRef: 'WO-1' }], stock: [{ length: 120_000 }], kerf: 125 }, { timeLimitMs: 30_000 })
    expect(plan.sticks).toHaveLength(2)
    expect(plan.sticks.flatMap((s) => s.cuts).every((c) => c.workOrderRef === 'WO-1')).toBe(true)
    expect(plan.status).toBe('optimal')
  })

  it('passes input errors back as NestingInputError with the field to fix', async () => {
    const err = await runNesting({ pieces: [{ length: 0, quantity: 1 }], stock: [{ length: 100 }] }).catch((e: unknown) => e)
    expect(err).toBeInstanceOf(NestingInputError)
    expect((err as NestingInputError).field).toBe('pieces.0.length')
  })
})

describe('NestingPool', { timeout: 60_000 }, () => {
  // Two cut runs planned at once each get a worker of their own; a third waits for one to free.
  it('runs plans side by side, one per worker, and queues the rest', async () => {
    const pool = new NestingPool(2)
    try {
      // Triplet-style run (each 1000 stick filled exactly by three pieces): enough work to watch.
      const pieces = [380, 310, 310, 400, 300, 300, 450, 275, 275, 490, 255, 255].map((length) => ({ length, quantity: 3 }))
      const input = { pieces, stock: [{ length: 1000 }] }
      const plans = [pool.run(input, { timeLimitMs: 2000 }), pool.run(input, { timeLimitMs: 2000 }), pool.run(input, { timeLimitMs: 2000 })]
      expect(pool.load()).toEqual({ busy: 2, waiting: 1 })
      const done = await Promise.all(plans)
      // 36 pieces summing to 12 000: at least 12 sticks of 1000, and the triplets give exactly 12.
      for (const plan of done) expect(plan.sticks).toHaveLength(12)
      expect(pool.load()).toEqual({ busy: 0, waiting: 0 })
    } finally {
      await pool.close()
    }
  })
})
