import { describe, expect, it } from 'vitest'
import { daysInRange, ReportRangeQuerySchema, resolveRange } from './reports'

describe('report ranges (UTC calendar days, both ends included)', () => {
  it('defaults to the last 30 days, today included', () => {
    expect(resolveRange({}, '2026-03-15')).toEqual({ ok: true, range: { from: '2026-02-14', to: '2026-03-15' } })
    expect(daysInRange({ from: '2026-02-14', to: '2026-03-15' })).toBe(30) // 15 days of February (14–28) + 15 of March
  })

  it('fills in the missing end', () => {
    expect(resolveRange({ to: '2026-01-10' }, '2026-03-15')).toEqual({ ok: true, range: { from: '2025-12-12', to: '2026-01-10' } })
    expect(resolveRange({ from: '2026-03-01' }, '2026-03-15')).toEqual({ ok: true, range: { from: '2026-03-01', to: '2026-03-15' } })
    expect(resolveRange({ from: '2026-04-01' }, '2026-03-15')).toEqual({ ok: true, range: { from: '2026-04-01', to: '2026-04-01' } })
  })

  it('counts a leap day: 2024 has 366 days (Gregorian calendar)', () => {
    expect(daysInRange({ from: '2024-01-01', to: '2024-12-31' })).toBe(366)
    expect(resolveRange({ from: '2024-01-01', to: '2024-12-31' }, '2026-03-15').ok).toBe(true)
    expect(resolveRange({ from: '2024-01-01', to: '2025-01-01' }, '2026-03-15')).toEqual({ ok: false, message: 'Choose at most 366 days (this range has 367)' })
  })

  it('refuses a backwards range and malformed dates', () => {
    expect(resolveRange({ from: '2026-03-15', to: '2026-03-14' }, '2026-03-15')).toEqual({ ok: false, message: 'The range must start on or before its end' })
    expect(ReportRangeQuerySchema.safeParse({ from: '2026-03-15', to: '2026-03-14' }).success).toBe(false)
    expect(ReportRangeQuerySchema.safeParse({ from: '15/03/2026' }).success).toBe(false)
    expect(ReportRangeQuerySchema.safeParse({ from: '2026-02-30' }).success).toBe(false)
    expect(ReportRangeQuerySchema.safeParse({ days: '7' }).success).toBe(false)
  })
})
