import { describe, expect, it } from 'vitest'
import { addWorkingDays, isWorkingDay, utcDay, workingDayOnOrAfter } from './working-days'

describe('working days', () => {
  it('knows the weekdays of dates from a printed calendar', () => {
    // Gregorian calendar: 1 January 2026 was a Thursday, 4 July 1976 a Sunday, 29 February 2028 a Tuesday.
    expect(isWorkingDay('2026-01-01')).toBe(true)
    expect(isWorkingDay('2026-01-03')).toBe(false) // Saturday
    expect(isWorkingDay('1976-07-04')).toBe(false) // Sunday
    expect(isWorkingDay('2028-02-29')).toBe(true)
  })

  // The rule claimed: the spreadsheet WORKDAY(start, days) function with no holiday list, as its
  // documentation describes it (from memory of the spreadsheet makers' function reference): it returns
  // the date `days` working days (Monday to Friday) after `start`, the start itself not counted; with
  // 0 days it returns `start` unchanged, even when `start` is a Saturday or a Sunday.
  it('adds working days like WORKDAY(start, days): weekends skipped, the start day not counted', () => {
    // From a Monday (2026-03-02), 7 working days: Tue..Fri (4), Mon..Wed (3) → Wednesday 2026-03-11.
    expect(addWorkingDays('2026-03-02', 7)).toBe('2026-03-11')
    // From a Friday, 1 working day is the Monday after.
    expect(addWorkingDays('2026-03-06', 1)).toBe('2026-03-09')
    // From a Saturday or Sunday, the Monday is the first working day counted.
    expect(addWorkingDays('2026-03-07', 1)).toBe('2026-03-09')
    expect(addWorkingDays('2026-03-08', 2)).toBe('2026-03-10')
    // 5 working days is one calendar week from a weekday; across a month end and a leap day.
    expect(addWorkingDays('2028-02-24', 5)).toBe('2028-03-02')
    expect(addWorkingDays('2026-12-31', 10)).toBe('2027-01-14')
  })

  it('returns the start itself for 0 days, even on a weekend, as WORKDAY(start, 0) does', () => {
    expect(addWorkingDays('2026-03-04', 0)).toBe('2026-03-04') // a Wednesday
    expect(addWorkingDays('2026-03-07', 0)).toBe('2026-03-07') // a Saturday
    expect(addWorkingDays('2026-03-08', 0)).toBe('2026-03-08') // a Sunday
  })

  it('rolls a weekend day forward to the Monday only when asked (workingDayOnOrAfter)', () => {
    expect(workingDayOnOrAfter('2026-03-04')).toBe('2026-03-04')
    expect(workingDayOnOrAfter('2026-03-07')).toBe('2026-03-09')
    expect(workingDayOnOrAfter('2026-03-08')).toBe('2026-03-09')
    expect(() => workingDayOnOrAfter('2026-02-30')).toThrow('No such date: 2026-02-30')
  })

  it('agrees with a day-by-day count for every start in a year and lead times up to 30', () => {
    for (let d = Date.UTC(2026, 0, 1); d < Date.UTC(2027, 0, 1); d += 86_400_000) {
      const start = new Date(d).toISOString().slice(0, 10)
      for (const n of [1, 7, 30]) {
        const end = addWorkingDays(start, n)
        // Count the weekdays strictly after the start up to and including the end: exactly n, and the end is a weekday.
        let count = 0
        for (let t = d + 86_400_000; t <= Date.parse(`${end}T00:00:00Z`); t += 86_400_000) {
          const w = new Date(t).getUTCDay()
          if (w !== 0 && w !== 6) count += 1
        }
        expect(count, `${start} + ${n}`).toBe(n)
        expect(isWorkingDay(end)).toBe(true)
      }
    }
  })

  it('refuses what is not a date or a day count, saying why', () => {
    expect(() => addWorkingDays('2026-02-30', 1)).toThrow('No such date: 2026-02-30')
    expect(() => addWorkingDays('3/2/2026', 1)).toThrow('Not a calendar date')
    expect(() => addWorkingDays('2026-03-02', -1)).toThrow('0 or more')
    expect(() => addWorkingDays('2026-03-02', 1.5)).toThrow('whole number')
  })

  it('reads the UTC date of an instant', () => {
    expect(utcDay('2026-03-01T23:30:00-05:00')).toBe('2026-03-02')
    expect(utcDay(new Date(Date.UTC(2026, 2, 1, 0, 0)))).toBe('2026-03-01')
  })
})
