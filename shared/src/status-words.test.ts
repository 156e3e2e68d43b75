import { describe, expect, it } from 'vitest'
import { ORDER_STAGES } from './order-stage'
import { ORDER_STATUSES, WORK_ORDER_STATUSES } from './orders-status'
import { ORDER_STAGE_LABELS, ORDER_STATUS_LABELS, WORK_ORDER_STATUS_LABELS } from './status-words'

describe('one word per state', () => {
  it('gives a stage the same word as the order status it stands for', () => {
    // The stage of an order read from its stored status alone (order-stage.ts): open → received, the others by name.
    const stageOf = { open: 'received', released: 'released', partially_shipped: 'partially_shipped', shipped: 'shipped', cancelled: 'cancelled' } as const
    for (const status of ORDER_STATUSES) expect(ORDER_STAGE_LABELS[stageOf[status]], status).toBe(ORDER_STATUS_LABELS[status])
    expect(ORDER_STATUS_LABELS.open).toBe('Received')
  })

  it('never gives two different states of one kind the same word, nor a unit the word of an order stage it is not', () => {
    expect(new Set(ORDER_STATUSES.map((s) => ORDER_STATUS_LABELS[s])).size).toBe(ORDER_STATUSES.length)
    expect(new Set(WORK_ORDER_STATUSES.map((s) => WORK_ORDER_STATUS_LABELS[s])).size).toBe(WORK_ORDER_STATUSES.length)
    expect(new Set(ORDER_STAGES.map((s) => ORDER_STAGE_LABELS[s])).size).toBe(ORDER_STAGES.length)
    // A built unit is "Built"; "Ready to pack" is the stage of an order whose every unit is built.
    expect(WORK_ORDER_STATUS_LABELS.built).toBe('Built')
    expect(ORDER_STAGE_LABELS.ready_to_pack).toBe('Ready to pack')
  })

  it('writes words, not codes', () => {
    for (const word of [...Object.values(ORDER_STATUS_LABELS), ...Object.values(WORK_ORDER_STATUS_LABELS), ...Object.values(ORDER_STAGE_LABELS)]) {
      expect(word).toMatch(/^[A-Z][a-z]+( [a-z]+)*$/)
    }
  })
})
