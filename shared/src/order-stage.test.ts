import { describe, expect, it } from 'vitest'
import { ORDER_STAGES, orderStage } from './order-stage'

describe('the stage of an order', () => {
  const released = (workOrderStatuses: Parameters<typeof orderStage>[0]['workOrderStatuses'], onHold = false) =>
    orderStage({ status: 'released', onHold, workOrderStatuses })

  it('reads received, released, in production and ready to pack from the work orders', () => {
    expect(orderStage({ status: 'open', onHold: false, workOrderStatuses: [] })).toBe('received')
    expect(released(['waiting_cut', 'waiting_cut'])).toBe('released')
    expect(released(['waiting_cut', 'cut'])).toBe('in_production')
    expect(released(['building', 'rework'])).toBe('in_production')
    expect(released(['built', 'waiting_cut'])).toBe('in_production')
    expect(released(['built', 'built'])).toBe('ready_to_pack')
    expect(released(['built', 'packed'])).toBe('ready_to_pack')
  })

  it('ignores cancelled units', () => {
    expect(released(['built', 'cancelled'])).toBe('ready_to_pack')
    expect(released(['waiting_cut', 'cancelled'])).toBe('released')
    expect(released(['cancelled'])).toBe('released')
  })

  it('puts a hold above the rest, and shipped or cancelled above a hold', () => {
    expect(released(['building'], true)).toBe('on_hold')
    expect(orderStage({ status: 'open', onHold: true, workOrderStatuses: [] })).toBe('on_hold')
    expect(orderStage({ status: 'partially_shipped', onHold: true, workOrderStatuses: ['shipped', 'built'] })).toBe('on_hold')
    expect(orderStage({ status: 'partially_shipped', onHold: false, workOrderStatuses: ['shipped', 'built'] })).toBe('partially_shipped')
    expect(orderStage({ status: 'shipped', onHold: true, workOrderStatuses: ['shipped'] })).toBe('shipped')
    expect(orderStage({ status: 'cancelled', onHold: true, workOrderStatuses: ['cancelled'] })).toBe('cancelled')
  })

  it('names every stage once', () => {
    expect(new Set(ORDER_STAGES).size).toBe(ORDER_STAGES.length)
  })
})
