import { describe, expect, it } from 'vitest'
import { compareWorklist, formatWaited, isLate } from './worklist'

const item = (id: string, rush: boolean, promisedShipDate: string | null, waitingSince: string) => ({ id, rush, promisedShipDate, waitingSince })

describe('compareWorklist', () => {
  it('puts rush first, then the earliest promise, no promise last, then the longest wait', () => {
    const items = [
      item('normal-late-promise', false, '2026-12-10', '2026-12-01T08:00:00Z'),
      item('normal-no-promise', false, null, '2026-11-20T08:00:00Z'),
      item('rush-late-promise', true, '2026-12-09', '2026-12-03T08:00:00Z'),
      item('normal-early-promise-new', false, '2026-12-05', '2026-12-03T09:00:00Z'),
      item('normal-early-promise-old', false, '2026-12-05', '2026-12-02T09:00:00Z'),
      item('rush-early-promise', true, '2026-12-04', '2026-12-03T10:00:00Z'),
      item('rush-no-promise', true, null, '2026-12-01T10:00:00Z'),
    ]
    expect([...items].sort(compareWorklist).map((i) => i.id)).toEqual([
      'rush-early-promise',
      'rush-late-promise',
      'rush-no-promise',
      'normal-early-promise-old',
      'normal-early-promise-new',
      'normal-late-promise',
      'normal-no-promise',
    ])
  })
})

describe('isLate', () => {
  it('is late only when the promised day is before today', () => {
    expect(isLate('2026-12-03', '2026-12-04')).toBe(true)
    expect(isLate('2026-12-04', '2026-12-04')).toBe(false)
    expect(isLate(null, '2026-12-04')).toBe(false)
  })
})

describe('formatWaited', () => {
  it('reads minutes, hours and days', () => {
    const now = new Date('2026-12-04T12:00:00Z')
    expect(formatWaited('2026-12-04T11:55:00Z', now)).toBe('5 min')
    expect(formatWaited('2026-12-04T08:40:00Z', now)).toBe('3 h 20 min')
    expect(formatWaited('2026-12-04T10:00:00Z', now)).toBe('2 h')
    expect(formatWaited('2026-12-02T08:00:00Z', now)).toBe('2 d 4 h')
    expect(formatWaited('2026-12-05T08:00:00Z', now)).toBe('0 min')
  })
})
