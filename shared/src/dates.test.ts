import { describe, expect, it } from 'vitest'
import { formatDateOf, formatDateTime, formatDay, formatDayWithWeekday } from './dates'

describe('one date format', () => {
  it('writes a day as "Dec 3, 2026", whatever the time zone of the machine', () => {
    expect(formatDay('2026-12-03')).toBe('Dec 3, 2026')
    expect(formatDay('2026-01-31')).toBe('Jan 31, 2026')
    expect(formatDay(null)).toBe('—')
  })

  it('names the weekday of a day for letters', () => {
    // 3 December 2026 is a Thursday (proleptic Gregorian calendar, checked with Python's datetime.date(2026, 12, 3).strftime('%A')).
    expect(formatDayWithWeekday('2026-12-03')).toBe('Thursday, Dec 3, 2026')
  })

  it('writes a moment as the day then the time, in the zone asked for', () => {
    expect(formatDateTime('2026-12-03T16:05:00Z', 'UTC')).toBe('Dec 3, 2026, 4:05 PM')
    // UTC−05:00 in December in New York (no daylight saving then): 16:05 UTC is 11:05 in the morning.
    expect(formatDateTime('2026-12-03T16:05:00Z', 'America/New_York')).toBe('Dec 3, 2026, 11:05 AM')
    expect(formatDateTime('2026-12-03T02:00:00Z', 'America/New_York')).toBe('Dec 2, 2026, 9:00 PM')
    expect(formatDateTime(null)).toBe('—')
    expect(formatDateOf('2026-12-03T02:00:00Z', 'America/New_York')).toBe('Dec 2, 2026')
  })

  it('never writes the numeric form 12/3/2026', () => {
    expect(formatDateTime('2026-12-03T16:05:00Z')).not.toMatch(/\d+\/\d+\/\d+/)
  })
})
